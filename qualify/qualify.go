// Package qualify runs the engine's verification suite inside the binary:
// every published check value the test suite uses (IAPWS-IF97 and its
// supplementary releases, the transport and surface-tension releases, the
// organic-fluid equations' published values, the unit factors), the
// textbook cycle cases, and a firm's own acceptance cases. It returns a
// report with the engine's identity and a digest of the report's canonical
// JSON, and renders it as self-contained HTML.
package qualify

import (
	"bytes"
	"crypto/sha256"
	"embed"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/internal/engine"
)

//go:embed refdata/*.csv refdata/textbook/*.calc.md
var refdata embed.FS

// Verdict is the outcome of one check.
type Verdict string

// The verdicts. NotRun is a published value the engine does not claim to
// reproduce (the reason is in the check's note); it is neither a pass nor
// a failure, and the report counts it apart.
const (
	Pass   Verdict = "PASS"
	Fail   Verdict = "FAIL"
	NotRun Verdict = "NOT RUN"
)

// Check is one verification value: what was computed, from which source,
// what the source prints, what the engine gives, and the verdict.
type Check struct {
	Group      string   `json:"group"`
	ID         string   `json:"id"`
	Source     string   `json:"source"`
	What       string   `json:"what"`
	Expected   string   `json:"expected"`
	Unit       string   `json:"unit"`
	ExpectedV  float64  `json:"expected_value"`
	Computed   *float64 `json:"computed_value,omitempty"`
	Tolerance  float64  `json:"tolerance"`
	ToleranceS string   `json:"tolerance_rule"`
	Verdict    Verdict  `json:"verdict"`
	Note       string   `json:"note,omitempty"`
}

// Summary counts the checks by verdict.
type Summary struct {
	Total  int `json:"total"`
	Passed int `json:"passed"`
	Failed int `json:"failed"`
	NotRun int `json:"not_run"`
}

// Report is the whole qualification record. Digest is the SHA-256 of the
// report's canonical JSON (CanonicalJSON) with Digest empty and without
// Signatures, the firm's signatures of the report (signature.go).
type Report struct {
	Format  string          `json:"format"`
	Engine  engine.Identity `json:"engine"`
	With    string          `json:"with,omitempty"`
	Summary Summary         `json:"summary"`
	Groups  []string        `json:"groups"`
	Checks  []Check         `json:"checks"`
	Digest  string          `json:"digest_sha256"`
	// Signatures are written only when there are any, so an unsigned
	// report keeps its bytes.
	Signatures []Signature `json:"signatures,omitempty"`
}

// FormatName names the report's JSON format and its version.
const FormatName = "vouch-qualification/1"

// Options configure a run. Water nil means the engine's own functions
// (DefaultWater); tests pass perturbed ones.
type Options struct {
	Version string           // the engine's release number, recorded with its identity
	With    string           // a folder of the firm's acceptance cases, or ""
	Water   WaterFuncs       // the water and steam functions to check; nil: DefaultWater()
	Fluids  FluidLookup      // the organic-fluid equations to check; nil: helmholtz.LookupEquation
	Ident   *engine.Identity // the identity to record; nil: engine.Identify(Version)
}

// Run runs the whole suite and returns the report, failures first. An
// error means the suite could not run (a malformed acceptance case, an
// unreadable folder); it never stands for a failed value.
func Run(opt Options) (*Report, error) {
	if opt.Water == nil {
		opt.Water = DefaultWater()
	}
	if opt.Fluids == nil {
		opt.Fluids = defaultFluids
	}
	var checks []Check
	for _, part := range []func(Options) ([]Check, error){waterChecks, fluidChecks, unitChecks, cycleChecks, acceptanceChecks} {
		cs, err := part(opt)
		if err != nil {
			return nil, err
		}
		checks = append(checks, cs...)
	}
	id := engine.Identify(opt.Version)
	if opt.Ident != nil {
		id = *opt.Ident
	}
	r := &Report{Format: FormatName, Engine: id, With: opt.With, Checks: checks}
	r.order()
	r.Digest = r.ComputeDigest()
	return r, nil
}

// groupOrder is the order of the groups in the report.
var groupOrder = []string{GroupIF97, GroupSupp, GroupTransport, GroupFluids, GroupUnits, GroupCycle, GroupFirm}

// The groups of checks.
const (
	GroupIF97      = "IAPWS-IF97 basic and backward equations (IAPWS R7-97(2012))"
	GroupSupp      = "IAPWS-IF97 supplementary releases (SR2-01, SR3-03, SR4-04, SR5-05)"
	GroupTransport = "Water transport properties and surface tension (IAPWS R12-08, R15-11, R1-76(2014))"
	GroupFluids    = "Organic working fluids: published values of the equations of state"
	GroupUnits     = "Unit factors (NIST SP 811)"
	GroupCycle     = "Cycle-level cases: textbook worked examples"
	GroupFirm      = "Acceptance cases of the firm (--with)"
)

// order counts the verdicts and sorts the checks: failures first, then the
// rest by group, each group in the order of its source file.
func (r *Report) order() {
	rank := map[string]int{}
	for i, g := range groupOrder {
		rank[g] = i
	}
	sort.SliceStable(r.Checks, func(i, j int) bool {
		a, b := r.Checks[i], r.Checks[j]
		if (a.Verdict == Fail) != (b.Verdict == Fail) {
			return a.Verdict == Fail
		}
		return rank[a.Group] < rank[b.Group]
	})
	r.Summary = Summary{Total: len(r.Checks)}
	seen := map[string]bool{}
	r.Groups = nil
	for _, c := range r.Checks {
		switch c.Verdict {
		case Pass:
			r.Summary.Passed++
		case Fail:
			r.Summary.Failed++
		default:
			r.Summary.NotRun++
		}
		seen[c.Group] = true
	}
	for _, g := range groupOrder {
		if seen[g] {
			r.Groups = append(r.Groups, g)
		}
	}
}

// Passed reports whether no check failed.
func (r *Report) Passed() bool { return r.Summary.Failed == 0 }

// CanonicalJSON returns the report as indented JSON with a final newline:
// fields in declaration order, floats in Go's shortest form, so the same
// report gives the same bytes.
func (r *Report) CanonicalJSON() []byte {
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(r); err != nil {
		panic("qualify: a report always encodes: " + err.Error()) // only finite floats are stored
	}
	return b.Bytes()
}

// ComputeDigest returns the hex SHA-256 of the canonical JSON of the report
// with its Digest field empty and without its signatures.
func (r *Report) ComputeDigest() string {
	c := *r
	c.Digest, c.Signatures = "", nil
	sum := sha256.Sum256(c.CanonicalJSON())
	return hex.EncodeToString(sum[:])
}

// judge fills the computed value, tolerance and verdict of c from got (in
// the same unit as c.ExpectedV) or err.
func judge(c Check, got float64, err error) Check {
	switch {
	case err != nil:
		c.Verdict, c.Note = Fail, joinNote(c.Note, "error: "+err.Error())
	case math.IsNaN(got) || math.IsInf(got, 0):
		c.Verdict, c.Note = Fail, joinNote(c.Note, "the engine gave no finite value")
	default:
		c.Computed = &got
		c.Verdict = Pass
		if !(math.Abs(got-c.ExpectedV) <= c.Tolerance) {
			c.Verdict = Fail
		}
	}
	return c
}

func joinNote(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}

// halfLastDigit returns half a unit of the last printed digit of s
// ("0.100215168e-2" → 0.5e-11).
func halfLastDigit(s string) (float64, error) {
	mant, exp := s, 0
	if i := strings.IndexAny(s, "eE"); i >= 0 {
		mant = s[:i]
		e, err := strconv.Atoi(s[i+1:])
		if err != nil {
			return 0, fmt.Errorf("bad exponent in %q", s)
		}
		exp = e
	}
	dec := 0
	if i := strings.IndexByte(mant, '.'); i >= 0 {
		dec = len(mant) - i - 1
	}
	return float64(0.5 * math.Pow10(exp-dec)), nil
}
