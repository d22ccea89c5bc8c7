// Package compare is vouch compare: the results two independent calcs of
// one design share (an original and a checker's alternate calculation),
// pair by pair, each within a relative tolerance, as terminal text and as
// an HTML report (it owns templates/compare.html). A pair is the same
// name in both calcs, or a name the alternate maps onto the original's in
// its front matter (compare: maps:). It reads nothing: the caller hands it
// two evaluated calcs and the default tolerance from vouch.yaml.
package compare

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/units"
)

// Side is one calc of a comparison, as the report names it.
type Side struct {
	Path, Title, Number, Revision string
	Blob                          string // git blob hash of the source compared
}

// Pair is one result both calcs give.
type Pair struct {
	Name, Other string // the original's name, and the alternate's
	A, B        string // each value as its calc shows it
	Diff        string // B − A, in A's display unit where it can show a difference
	RelDiff     float64
	Rel         string // the relative difference, in percent
	Tolerance   float64
	Tol         string // the tolerance, in percent, and where it comes from
	Pass        bool
}

// Result is a comparison of two calcs.
type Result struct {
	A, B      Side
	Default   float64 // the default tolerance (a fraction)
	Pairs     []Pair
	OnlyA     []string // results of the original the alternate does not give
	Failed    int
	Errors    []string
	Caution   string
	ReportFor string // the original's path, for the report's title
}

// Options are the inputs of a comparison besides the two calcs.
type Options struct {
	APath, BPath string  // as the user named them
	Tolerance    float64 // default relative tolerance, e.g. 0.005
}

// Compare pairs the results of a (the original) and b (the alternate),
// both evaluated without errors, and checks each pair against its
// tolerance. A mapping or tolerance naming a result neither calc gives, a
// pair of different dimensions, and no shared result at all are errors.
func Compare(a, b *calcdoc.Doc, opt Options) *Result {
	r := &Result{A: side(a, opt.APath), B: side(b, opt.BPath), Default: opt.Tolerance, Caution: calcdoc.Caution}
	bByName := map[string]*calcdoc.Item{}
	for _, it := range b.Results() {
		bByName[it.Stmt.Name] = it
	}
	other := r.mapNames(a, b, bByName)
	for _, it := range a.Results() {
		bn := it.Stmt.Name
		if m, ok := other[bn]; ok {
			bn = m
		}
		bi := bByName[bn]
		if bi == nil {
			r.OnlyA = append(r.OnlyA, it.Stmt.Name)
			continue
		}
		if p, err := pair(a, b, it, bi, r.tolerance(b, it.Stmt.Name, bn)); err != "" {
			r.Errors = append(r.Errors, err)
		} else {
			r.Pairs = append(r.Pairs, p)
			if !p.Pass {
				r.Failed++
			}
		}
	}
	r.checkTolerances(b)
	if len(r.Pairs) == 0 && len(r.Errors) == 0 {
		r.Errors = append(r.Errors, fmt.Sprintf("%s and %s share no result: give the same names, or map the alternate's names in its front matter, such as compare: {maps: {eta: eta_th}}", opt.APath, opt.BPath))
	}
	return r
}

func side(d *calcdoc.Doc, path string) Side {
	return Side{Path: path, Title: d.Front.Title, Number: d.Front.Number, Revision: d.Front.Revision, Blob: provenance.BlobHash(d.Src)}
}

// mapNames reads the alternate's maps: the original's name → the
// alternate's. A map whose names either calc does not define is an error.
func (r *Result) mapNames(a, b *calcdoc.Doc, bByName map[string]*calcdoc.Item) map[string]string {
	aNames := map[string]bool{}
	for _, it := range a.Results() {
		aNames[it.Stmt.Name] = true
	}
	out := map[string]string{}
	for _, m := range b.Front.Compare.Maps {
		switch {
		case bByName[m.Name] == nil:
			r.Errors = append(r.Errors, fmt.Sprintf("%s:%d: compare maps %s, which %s does not define as a quantity", r.B.Path, m.Line, m.Name, r.B.Path))
		case !aNames[m.Other]:
			r.Errors = append(r.Errors, fmt.Sprintf("%s:%d: compare maps %s onto %s, which %s does not define as a quantity", r.B.Path, m.Line, m.Name, m.Other, r.A.Path))
		default:
			out[m.Other] = m.Name
		}
	}
	return out
}

// tolerance is the pair's tolerance: the alternate's, by either name, or
// the default.
func (r *Result) tolerance(b *calcdoc.Doc, aName, bName string) calcdoc.Tolerance {
	for _, t := range b.Front.Compare.Tolerances {
		if t.Name == aName || t.Name == bName {
			return t
		}
	}
	return calcdoc.Tolerance{Rel: r.Default}
}

// checkTolerances refuses a tolerance for a name no pair has.
func (r *Result) checkTolerances(b *calcdoc.Doc) {
	for _, t := range b.Front.Compare.Tolerances {
		found := false
		for _, p := range r.Pairs {
			found = found || p.Name == t.Name || p.Other == t.Name
		}
		if !found {
			r.Errors = append(r.Errors, fmt.Sprintf("%s:%d: compare sets a tolerance for %s, which is not a result both calcs give", r.B.Path, t.Line, t.Name))
		}
	}
}

// pair compares one result, or says why the two cannot be compared.
func pair(a, b *calcdoc.Doc, ai, bi *calcdoc.Item, tol calcdoc.Tolerance) (Pair, string) {
	qa, qb := ai.Outcome.Value.(units.Quantity), bi.Outcome.Value.(units.Quantity)
	if qa.D != qb.D {
		return Pair{}, fmt.Sprintf("%s in %s and %s in the alternate have different dimensions (%s and %s)",
			ai.Stmt.Name, "the original", bi.Stmt.Name, siText(qa.D), siText(qb.D))
	}
	p := Pair{Name: ai.Stmt.Name, Other: bi.Stmt.Name, A: a.ValueText(ai.Outcome), B: b.ValueText(bi.Outcome), Tolerance: tol.Rel}
	p.Diff = diffText(qa, qb, ai.Outcome.Display, a)
	delta := math.Abs(qb.V - qa.V)
	switch {
	case delta == 0:
		p.RelDiff = 0
	case qa.V == 0:
		p.RelDiff = math.Inf(1)
	default:
		p.RelDiff = delta / math.Abs(qa.V)
	}
	p.Pass = p.RelDiff <= tol.Rel
	p.Rel = percent(p.RelDiff)
	p.Tol = percent(tol.Rel)
	if tol.Text == "" {
		p.Tol += " (default)"
	}
	return p, ""
}

// diffText is B − A in A's display unit, or in the default unit of the
// difference where A's unit cannot show one (an absolute temperature).
func diffText(qa, qb units.Quantity, display units.Unit, a *calcdoc.Doc) string {
	d, err := units.Sub(qb, qa)
	if err != nil {
		d = units.Quantity{V: qb.V - qa.V, D: qa.D}
	}
	digits, ctx := a.Front.Digits, a.Front.Ctx
	if s, err := d.Text(display, digits, ctx); err == nil {
		return s
	}
	if s, err := d.Text(units.DefaultUnit(d), digits, ctx); err == nil {
		return s
	}
	return units.FormatSig(d.V, digits) + " " + siText(d.D)
}

func siText(d units.Dim) string {
	if s := units.SIUnitText(d); s != "1" {
		return s
	}
	return "1"
}

// percent writes a fraction as a percentage to three significant figures.
func percent(x float64) string {
	if math.IsInf(x, 1) {
		return "infinite (the original is zero)"
	}
	return units.FormatSig(float64(x*100), 3) + " %"
}

// Text is the comparison for the terminal: one line a pair, then the
// verdict.
func (r *Result) Text() string {
	var b strings.Builder
	fmt.Fprintf(&b, "original:  %s  %s %s rev %s  blob %s\n", r.A.Path, r.A.Number, r.A.Title, dash(r.A.Revision), r.A.Blob)
	fmt.Fprintf(&b, "alternate: %s  %s %s rev %s  blob %s\n\n", r.B.Path, r.B.Number, r.B.Title, dash(r.B.Revision), r.B.Blob)
	for _, p := range r.Pairs {
		name := p.Name
		if p.Other != p.Name {
			name += " = " + p.Other
		}
		fmt.Fprintf(&b, "%-4s  %s: %s against %s; difference %s (%s, tolerance %s)\n", verdict(p.Pass), name, p.B, p.A, p.Diff, p.Rel, p.Tol)
	}
	if len(r.OnlyA) > 0 {
		fmt.Fprintf(&b, "\nnot in the alternate: %s\n", strings.Join(sortedCopy(r.OnlyA), ", "))
	}
	pairs := fmt.Sprintf("%d pairs", len(r.Pairs))
	if len(r.Pairs) == 1 {
		pairs = "1 pair"
	}
	fmt.Fprintf(&b, "\n%s, %d within tolerance, %d outside\n", pairs, len(r.Pairs)-r.Failed, r.Failed)
	return b.String()
}

// OK reports a comparison with no errors and every pair within tolerance.
func (r *Result) OK() bool { return len(r.Errors) == 0 && r.Failed == 0 }

func verdict(pass bool) string {
	if pass {
		return "PASS"
	}
	return "FAIL"
}

func dash(s string) string {
	if s == "" {
		return "-"
	}
	return s
}

func sortedCopy(s []string) []string {
	out := append([]string(nil), s...)
	sort.Strings(out)
	return out
}
