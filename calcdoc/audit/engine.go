package audit

import (
	"fmt"
	"math"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// MaxULPs is how far, in units in the last place, a result reproduced by a
// different engine build may lie from the recorded one and still count as
// reproduced. Builds for different architectures round some operations
// differently (a fused multiply-add rounds once where two operations round
// twice); through the iterative property solvers that leaves differences of
// a few thousand ulps, about 1e-12 relative, far below any figure a package
// prints. The same build must reproduce every result bit for bit.
const MaxULPs = 16384

// The reproduction statuses a verification reports.
var (
	ReproducedExact  = "REPRODUCED bit for bit"
	ReproducedWithin = fmt.Sprintf("REPRODUCED within %d ulps by a different engine", MaxULPs)
	NotReproduced    = "NOT REPRODUCED"
)

// ulps is the distance between a and b in units in the last place: the
// number of float64 values between them, 0 when they are equal (+0 and -0
// included), and the largest distance when either is not a number.
func ulps(a, b float64) uint64 {
	if a == b {
		return 0
	}
	if math.IsNaN(a) || math.IsNaN(b) {
		return math.MaxUint64
	}
	x, y := ordered(a), ordered(b)
	if x > y {
		x, y = y, x
	}
	return uint64(y - x) // two's-complement difference: exact for any pair
}

// ordered maps a float64 to an integer that orders as the floats do, with
// +0 and -0 both at 0.
func ordered(f float64) int64 {
	i := int64(math.Float64bits(f))
	if i < 0 {
		return math.MinInt64 - i
	}
	return i
}

// sameEngine reports whether the package was made by this engine build:
// the recorded build equals this one, or, when either is not known, the
// engine names are equal.
func (v *verifier) sameEngine() bool {
	if v.m.Build != nil && v.opt.Build != nil {
		return *v.m.Build == *v.opt.Build
	}
	if (v.m.Build == nil) != (v.opt.Build == nil) {
		return false
	}
	return v.m.Engine == "vouch "+v.opt.Engine
}

// thisEngine describes the verifying engine.
func (v *verifier) thisEngine() string {
	if v.opt.Build != nil {
		return v.opt.Build.String()
	}
	return "vouch " + v.opt.Engine
}

// madeBy describes the engine the package records.
func (v *verifier) madeBy() string {
	if v.m.Build != nil {
		return v.m.Build.String()
	}
	return v.m.Engine + " (no build recorded)"
}

// compareEngine says first whether this engine build is the one that made
// the package, and what that means for the comparison of results.
func (v *verifier) compareEngine() bool {
	if v.sameEngine() {
		v.rep.add(Holds, "engine", "made by this engine build: %s; results must reproduce bit for bit", v.madeBy())
		return true
	}
	v.rep.Different = true
	v.rep.add(Note, "engine", "A DIFFERENT ENGINE: the package was made by %s, and this is %s. Each result is compared bit for bit and, failing that, within %d ulps; the package's own text is compared for information only. Verify with the recorded build for a bit-for-bit verdict.",
		v.madeBy(), v.thisEngine(), MaxULPs)
	return true
}

// checkQualification checks that the qualification report the package
// names is the one this engine build produces.
func (v *verifier) checkQualification() bool {
	want, got := v.m.Qualification, v.opt.Qualification
	switch {
	case got == "":
		return true
	case want == "":
		v.rep.add(Note, "qualify", "the package names no qualification report (rendered before packages recorded one); this engine's report digests to %s", got)
	case v.rep.Different:
		v.rep.add(Note, "qualify", "the package names qualification report %s of the engine that made it; this engine's report digests to %s", want, got)
	case want != got:
		v.rep.add(Fails, "qualify", "the package names qualification report %s, but this engine build's report (vouch qualify) digests to %s", want, got)
	default:
		v.rep.add(Holds, "qualify", "qualification report %s is what vouch qualify gives with this engine build", got)
	}
	return true
}

// resultLine is how one result compares with its reproduction.
type resultLine struct {
	name string
	a, b float64
	unit string
	ulps uint64
}

func (l resultLine) String() string {
	verdict := fmt.Sprintf("within %d ulps", l.ulps)
	if l.ulps > MaxULPs {
		verdict = "DIFFERS"
		if rel := math.Abs(l.a-l.b) / max(math.Abs(l.a), math.Abs(l.b)); !math.IsNaN(rel) {
			verdict = fmt.Sprintf("DIFFERS, relative difference %.1e", rel)
		}
	}
	return fmt.Sprintf("%s is %s %s in the package, %s %s in the reproduction: %s", l.name, num(l.a), l.unit, num(l.b), l.unit, verdict)
}

// tolerate compares results of the same names and units value by value: it
// returns the results that are not bit for bit equal, and the largest
// distance in ulps among them.
func tolerate(a, b []provenance.Result) (lines []resultLine, worst uint64) {
	for i := range a {
		u := ulps(a[i].SI, b[i].SI)
		if strings.HasPrefix(a[i].Name, "check:") && u != 0 {
			u = math.MaxUint64 // a check's verdict either agrees or not
		}
		if u == 0 {
			continue
		}
		lines = append(lines, resultLine{name: a[i].Name, a: a[i].SI, b: b[i].SI, unit: a[i].Unit, ulps: u})
		worst = max(worst, u)
	}
	return lines, worst
}

// listLines formats result lines, at most limit of them, the farthest
// first when they are many.
func listLines(lines []resultLine, limit int) string {
	var b strings.Builder
	for i, l := range lines {
		if i == limit {
			fmt.Fprintf(&b, "\n... and %d more", len(lines)-limit)
			break
		}
		b.WriteString("\n" + l.String())
	}
	return b.String()
}

// compareResults compares the recorded results with the reproduced ones:
// bit for bit, and for a package made by a different engine build within
// MaxULPs, result by result. Results within the tolerance take the
// recorded values in the reproduction, so that the manifest, the package
// and the signatures are then checked against what was recorded.
func (v *verifier) compareResults() bool {
	got := v.repro.record.Manifest
	if diffs := shapeDiffs(v.m.Results, got.Results); len(diffs) > 0 {
		v.rep.Reproduction = NotReproduced
		v.rep.add(Fails, "results", "the results do not reproduce: %s", strings.Join(diffs, "; "))
		return true
	}
	lines, worst := tolerate(v.m.Results, got.Results)
	n := len(got.Results)
	switch {
	case len(lines) == 0 && got.ResultsDigest != v.m.ResultsDigest:
		v.rep.Reproduction = NotReproduced
		v.rep.add(Fails, "results", "results digest %s in the package, %s reproduced", v.m.ResultsDigest, got.ResultsDigest)
	case len(lines) == 0:
		v.rep.Reproduction = ReproducedExact
		v.rep.add(Holds, "results", "all %d results reproduce bit for bit from the commit; results digest %s", n, got.ResultsDigest)
	case !v.rep.Different:
		v.rep.Reproduction = NotReproduced
		v.rep.add(Fails, "results", "%d of %d results do not reproduce bit for bit, and this is the engine build that made the package:%s", len(lines), n, listLines(lines, 20))
	case worst > MaxULPs:
		v.rep.Reproduction = NotReproduced
		v.rep.add(Fails, "results", "%d of %d results differ from the reproduction by a different engine; %d reproduce bit for bit, and a difference of up to %d ulps would be tolerated:%s", len(lines), n, n-len(lines), MaxULPs, listLines(lines, 20))
	default:
		v.rep.Reproduction = ReproducedWithin
		v.rep.add(Holds, "results", "%d of %d results reproduce bit for bit; %d differ in the last bits, by at most %d ulps (tolerated: %d):%s", n-len(lines), n, len(lines), worst, MaxULPs, listLines(lines, 20))
		got.Results, got.ResultsDigest = append([]provenance.Result{}, v.m.Results...), v.m.ResultsDigest
		check(v.repro.doc, v.repro.record, v.repro.trust)
	}
	if v.rep.Reproduction != NotReproduced {
		v.rep.DesignChecks = []DesignCheck{}
		for _, it := range v.repro.doc.Checks() {
			v.rep.DesignChecks = append(v.rep.DesignChecks, designCheck(v.repro.doc, it))
		}
	}
	return true
}

// shapeDiffs describes differences in the number, names or units of the
// results, which no engine difference explains.
func shapeDiffs(a, b []provenance.Result) []string {
	var out []string
	if len(a) != len(b) {
		out = append(out, fmt.Sprintf("%d results in the package, %d in the reproduction", len(a), len(b)))
	}
	for i := 0; i < len(a) && i < len(b) && len(out) < 5; i++ {
		x, y := a[i], b[i]
		switch {
		case x.Name != y.Name:
			out = append(out, fmt.Sprintf("result %d is %s in the package, %s in the reproduction", i+1, x.Name, y.Name))
		case x.Unit != y.Unit:
			out = append(out, fmt.Sprintf("%s is in %s in the package, %s in the reproduction", x.Name, x.Unit, y.Unit))
		}
	}
	return out
}
