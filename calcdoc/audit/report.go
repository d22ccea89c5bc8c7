package audit

import (
	"bytes"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// Verdict grades one finding of a verification.
type Verdict int

// The verdicts. Only Fails makes a verification fail. (Holds and Fails,
// not Pass and Fail: a calc check's PASS is eval.Outcome.Pass.)
const (
	Holds    Verdict = iota // the check holds
	Fails                   // the check does not hold
	Note                    // information, such as a role not yet signed
	Unsigned                // a role without a signature
)

// String is the verdict as the report prints it.
func (v Verdict) String() string {
	return [...]string{"ok", "FAIL", "note", "--"}[v]
}

// Finding is one line of a verification report.
type Finding struct {
	Verdict Verdict
	Topic   string // what was checked: manifest, source, results, package, a role, head
	Role    string // the role a signature finding is about, or ""
	Text    string
}

// Report is the outcome of verifying a package, written to be pasted into
// an email (String).
type Report struct {
	Package  string               // the package file
	Manifest *provenance.Manifest // nil when the package holds none
	Calc     string               // number, revision and title of the calc
	Revision string               // the calc's revision letter at the package's commit
	Date     string               // the commit's date
	Signers  string               // the allowed-signers file, "" when none was given
	Status   string               // the stamp reached by signatures that hold
	// Different reports a package made by an engine build other than the
	// verifying one.
	Different bool
	// Reproduction says how the results reproduced: ReproducedExact,
	// ReproducedWithin or NotReproduced ("" when they were not compared).
	Reproduction string
	Findings     []Finding
	// DesignChecks are the calc's own checks (check lines), as the
	// reproduction evaluated them; nil until the results reproduce. They
	// are not verification steps: a package whose design check fails may
	// verify, and the report says both.
	DesignChecks []DesignCheck
}

// DesignCheck is one check line of the calc and its verdict.
type DesignCheck struct {
	Line   int
	Desc   string // the check's description, or its expression when it has none
	Pass   bool
	Detail string // each comparison's sides and margin: "10.99 barg >= 11.00 barg, margin -0.01325 bar"
}

// DesignFailed reports whether a design check of the calc fails.
func (r *Report) DesignFailed() bool {
	for _, c := range r.DesignChecks {
		if !c.Pass {
			return true
		}
	}
	return false
}

// designLines tallies the design checks and lists the failing ones.
func (r *Report) designLines(b *strings.Builder) {
	if r.DesignChecks == nil {
		return
	}
	failed := 0
	for _, c := range r.DesignChecks {
		if !c.Pass {
			failed++
		}
	}
	fmt.Fprintf(b, "design checks: %d passed, %d failed (the calc's check lines, not verification steps)\n", len(r.DesignChecks)-failed, failed)
	for _, c := range r.DesignChecks {
		if !c.Pass && c.Detail != "" {
			fmt.Fprintf(b, "  FAIL  line %d  %s (%s)\n", c.Line, c.Desc, c.Detail)
		} else if !c.Pass {
			fmt.Fprintf(b, "  FAIL  line %d  %s\n", c.Line, c.Desc)
		}
	}
}

// OK reports whether no finding failed.
func (r *Report) OK() bool { return len(r.Failures()) == 0 }

// Failures returns the failed findings.
func (r *Report) Failures() []Finding {
	var out []Finding
	for _, f := range r.Findings {
		if f.Verdict == Fails {
			out = append(out, f)
		}
	}
	return out
}

func (r *Report) add(v Verdict, topic, format string, args ...any) {
	r.Findings = append(r.Findings, Finding{Verdict: v, Topic: topic, Text: fmt.Sprintf(format, args...)})
}

func (r *Report) addRole(v Verdict, role, text string) {
	r.Findings = append(r.Findings, Finding{Verdict: v, Topic: role, Role: role, Text: text})
}

// String formats the report: a header naming the package, its calc, source,
// commit and engine, one line per finding, the status and the result.
func (r *Report) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "vouch verify %s\n", r.Package)
	r.header(&b)
	b.WriteString("\n")
	for _, f := range r.Findings {
		fmt.Fprintf(&b, "  %-5s %-9s %s\n", f.Verdict, f.Topic, indentRest(f.Text, 18))
	}
	b.WriteString("\n")
	if r.Reproduction != "" {
		fmt.Fprintf(&b, "results:  %s\n", r.Reproduction)
	}
	if r.Status != "" {
		fmt.Fprintf(&b, "status:   %s (from the signatures that hold)\n", r.Status)
	}
	r.designLines(&b)
	b.WriteString("result:   " + r.result() + "\n")
	return b.String()
}

func (r *Report) header(b *strings.Builder) {
	if r.Calc != "" {
		fmt.Fprintf(b, "calc:     %s\n", r.Calc)
	}
	m := r.Manifest
	if m == nil {
		return
	}
	if m.Commit != "" {
		fmt.Fprintf(b, "source:   %s at commit %s", m.Source, m.Commit)
		if r.Date != "" {
			fmt.Fprintf(b, " of %s", r.Date)
		}
		b.WriteString("\n")
	} else {
		fmt.Fprintf(b, "source:   %s, not under version control\n", m.Source)
	}
	fmt.Fprintf(b, "engine:   %s; %s\n", m.Engine, m.Formulation)
	if m.Build != nil {
		fmt.Fprintf(b, "build:    %s\n", m.Build)
	}
	if d, err := m.Digest(); err == nil {
		fmt.Fprintf(b, "manifest: sha256 %s\n", d)
	}
	if r.Signers != "" {
		fmt.Fprintf(b, "signers:  %s\n", r.Signers)
	} else {
		b.WriteString("signers:  no allowed-signers file given or committed: keys are not checked against people\n")
	}
}

func (r *Report) result() string {
	fails := r.Failures()
	if len(fails) == 0 && r.Different {
		within := "bit for bit"
		if r.Reproduction == ReproducedWithin {
			within = "within " + strconv.Itoa(MaxULPs) + " ulps"
		}
		return "VERIFIED by a different engine (results " + within + "): every verification step holds; verify with the recorded build for a byte-for-byte verdict on the package"
	}
	if len(fails) == 0 {
		return "VERIFIED: every verification step holds"
	}
	var topics []string
	for _, f := range fails {
		if !slices.Contains(topics, f.Topic) {
			topics = append(topics, f.Topic)
		}
	}
	return fmt.Sprintf("FAILED: %d %s (%s)", len(fails), plural(len(fails), "problem"), strings.Join(topics, ", "))
}

func plural(n int, word string) string {
	if n == 1 {
		return word
	}
	return word + "s"
}

// indentRest indents every line of s after the first.
func indentRest(s string, n int) string {
	return strings.ReplaceAll(strings.TrimRight(s, "\n"), "\n", "\n"+strings.Repeat(" ", n))
}

// resultDiffs describes how two result lists differ, at most max entries,
// naming the values as "a" and "b" label them.
func resultDiffs(a, b []provenance.Result, la, lb string, max int) []string {
	var out []string
	if len(a) != len(b) {
		out = append(out, fmt.Sprintf("%d results in %s, %d in %s", len(a), la, len(b), lb))
	}
	for i := 0; i < len(a) && i < len(b) && len(out) < max; i++ {
		x, y := a[i], b[i]
		switch {
		case x.Name != y.Name:
			out = append(out, fmt.Sprintf("result %d is %s in %s, %s in %s", i+1, x.Name, la, y.Name, lb))
		case x.SI != y.SI || x.Unit != y.Unit:
			out = append(out, fmt.Sprintf("%s is %s %s in %s, %s %s in %s", x.Name, num(x.SI), x.Unit, la, num(y.SI), y.Unit, lb))
		}
	}
	return out
}

func num(f float64) string { return strconv.FormatFloat(f, 'g', -1, 64) }

// manifestDiffs describes how two manifests differ outside their results
// and signatures.
func manifestDiffs(a, b *provenance.Manifest, la, lb string) []string {
	fields := []struct{ name, x, y string }{
		{"engine", a.Engine, b.Engine},
		{"formulation", a.Formulation, b.Formulation},
		{"formulation_version", a.FormulationVersion, b.FormulationVersion},
		{"source", a.Source, b.Source},
		{"source_hash", a.SourceHash, b.SourceHash},
		{"commit", a.Commit, b.Commit},
		{"clean", strconv.FormatBool(a.Clean), strconv.FormatBool(b.Clean)},
		{"data", dataText(a.Data), dataText(b.Data)},
		{"results_digest", a.ResultsDigest, b.ResultsDigest},
		{"signers_file", a.SignersFile, b.SignersFile},
		{"signers_hash", a.SignersHash, b.SignersHash},
		{"engine_build", buildText(a.Build), buildText(b.Build)},
		{"qualification_sha256", a.Qualification, b.Qualification},
		{"uses", strings.Join(a.Uses, ", "), strings.Join(b.Uses, ", ")},
		{"revision", a.Revision, b.Revision},
		{"draft", strconv.FormatBool(a.Draft), strconv.FormatBool(b.Draft)},
	}
	var out []string
	for _, f := range fields {
		if f.x != f.y {
			out = append(out, fmt.Sprintf("%s is %q in %s, %q in %s", f.name, f.x, la, f.y, lb))
		}
	}
	return out
}

// buildText describes an engine build, or says that none is recorded.
func buildText(b *provenance.EngineBuild) string {
	if b == nil {
		return "none recorded"
	}
	return b.String()
}

func dataText(files []provenance.DataFile) string {
	var parts []string
	for _, f := range files {
		parts = append(parts, f.Path+" "+f.Hash)
	}
	return strings.Join(parts, ", ")
}

// firstDifference finds where two texts first differ and returns the line
// number and a short excerpt of each from there.
func firstDifference(a, b []byte) (line int, x, y string) {
	i := 0
	for i < len(a) && i < len(b) && a[i] == b[i] {
		i++
	}
	line = bytes.Count(a[:i], []byte("\n")) + 1
	start := max(0, i-30)
	if k := bytes.LastIndexByte(a[:i], '\n'); k >= start {
		start = k + 1
	}
	return line, excerpt(a, start), excerpt(b, start)
}

// excerpt is up to 70 bytes of s from start, cut at the line's end and
// kept whole in UTF-8.
func excerpt(s []byte, start int) string {
	if start >= len(s) {
		return "(end of file)"
	}
	end := min(len(s), start+70)
	if k := bytes.IndexByte(s[start:end], '\n'); k >= 0 {
		end = start + k
	}
	return strings.ToValidUTF8(string(s[start:end]), "")
}
