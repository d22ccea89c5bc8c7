package qualify

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/units"

	"github.com/vouchcalc/vouch/internal/safefile"
)

// ExpectSuffix ends the name of the file that holds a calc's expected
// results: NAME.calc.md is checked against NAME.expect.yaml.
const ExpectSuffix = ".expect.yaml"

// expectation is one expected result of an acceptance case.
type expectation struct {
	name, expect, source string
	value                float64
	unit                 units.Unit
	unitText             string
	tol                  float64 // absolute, SI (tolerance) ...
	rel                  float64 // ... or relative (relative)
	tolText              string
	line, col            int
}

// posError is an error at a position of a file.
type posError struct {
	file      string
	line, col int
	msg       string
}

func (e posError) Error() string { return fmt.Sprintf("%s:%d:%d: %s", e.file, e.line, e.col, e.msg) }

// acceptanceChecks runs the firm's cases in opt.With: every NAME.calc.md
// with its NAME.expect.yaml. A file that does not parse, a calc with
// errors, a case naming no quantity of its calc, or a calc without
// expectations (or the reverse) is an error, never a skip.
func acceptanceChecks(opt Options) ([]Check, error) {
	if opt.With == "" {
		return nil, nil
	}
	calcs, err := filepath.Glob(filepath.Join(opt.With, "*.calc.md"))
	if err != nil {
		return nil, err
	}
	expects, err := filepath.Glob(filepath.Join(opt.With, "*"+ExpectSuffix))
	if err != nil {
		return nil, err
	}
	if len(calcs) == 0 {
		return nil, fmt.Errorf("%s: no acceptance cases (*.calc.md with a %s beside each)", opt.With, ExpectSuffix)
	}
	var errs []error
	for _, e := range expects {
		calc := strings.TrimSuffix(e, ExpectSuffix) + ".calc.md"
		if _, err := os.Stat(calc); err != nil {
			errs = append(errs, fmt.Errorf("%s: no calc %s for these expectations", e, filepath.Base(calc)))
		}
	}
	sort.Strings(calcs)
	var out []Check
	for _, calc := range calcs {
		cs, err := runCase(calc)
		if err != nil {
			errs = append(errs, err)
			continue
		}
		out = append(out, cs...)
	}
	if len(errs) > 0 {
		return nil, errors.Join(errs...)
	}
	return out, nil
}

// runCase evaluates one calc and compares it with its expectations; the
// calc's own check lines are reported too.
func runCase(calc string) ([]Check, error) {
	expFile := strings.TrimSuffix(calc, ".calc.md") + ExpectSuffix
	ysrc, err := safefile.Read(expFile, calcdoc.MaxFileBytes)
	if err != nil {
		return nil, fmt.Errorf("%s: no expected results: write them in %s", calc, filepath.Base(expFile))
	}
	exps, err := parseExpectations(expFile, ysrc)
	if err != nil {
		return nil, err
	}
	src, err := safefile.Read(calc, calcdoc.MaxFileBytes)
	if err != nil {
		return nil, err
	}
	d := calcdoc.Read(calc, src)
	d.Evaluate()
	if len(d.Errors) > 0 {
		return nil, fmt.Errorf("%s", strings.TrimRight(d.Errors.Format(calc, src), "\n"))
	}
	base := filepath.Base(calc)
	var out []Check
	for _, it := range d.Checks() {
		c := Check{Group: GroupFirm, ID: fmt.Sprintf("%s:%d", base, it.Stmt.Line), Source: base + " (the calc's own check)",
			What: "check " + it.Stmt.Expr, Expected: "true", ToleranceS: "as written", Verdict: Pass}
		if !it.Outcome.Pass {
			c.Verdict = Fail
		}
		out = append(out, c)
	}
	var errs []error
	for _, e := range exps {
		c, err := compare(d, e, base)
		if err != nil {
			errs = append(errs, posError{expFile, e.line, e.col, err.Error()})
			continue
		}
		out = append(out, c)
	}
	return out, errors.Join(errs...)
}

// compare checks one expectation against the calc's result of that name.
func compare(d *calcdoc.Doc, e expectation, base string) (Check, error) {
	var q *units.Quantity
	for _, it := range d.Results() {
		if v, ok := it.Outcome.Value.(units.Quantity); ok && it.Stmt.Name == e.name {
			q = &v
		}
	}
	if q == nil {
		return Check{}, fmt.Errorf("%s has no quantity %s", base, e.name)
	}
	if q.D != e.unit.Dim {
		return Check{}, fmt.Errorf("%s is %s, but the expectation %q is %s", e.name, q.D.Name(), e.expect, e.unit.Dim.Name())
	}
	got, err := q.In(e.unit, d.Front.Ctx)
	if err != nil {
		return Check{}, fmt.Errorf("%s: %v", e.name, err)
	}
	c := Check{Group: GroupFirm, ID: fmt.Sprintf("%s:%s", base, e.name), Source: e.source,
		What: fmt.Sprintf("%s: %s", base, e.name), Expected: strings.Fields(e.expect)[0],
		Unit: e.unitText, ExpectedV: e.value, ToleranceS: e.tolText}
	c.Tolerance = float64(e.rel * math.Abs(e.value))
	if e.rel == 0 {
		c.Tolerance = e.tol / e.unit.Factor
	}
	return judge(c, got, nil), nil
}
