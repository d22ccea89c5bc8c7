package qualify

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/units"
	"go.yaml.in/yaml/v3"
)

// expectKeys are the keys of one expected result.
var expectKeys = map[string]string{
	"name":      "the calc's quantity, e.g. eta_th",
	"expect":    "the expected value with its unit, e.g. 37.1 % or 2728.6 kJ/kg",
	"tolerance": "an absolute tolerance with a unit of the same kind, e.g. 0.1 % or 0.5 kJ/kg",
	"relative":  "a relative tolerance, a plain number, e.g. 0.003",
	"source":    "where the expected value comes from (document, table, page)",
}

// parseExpectations reads a NAME.expect.yaml file: a list of mappings with
// name, expect, source, and one of tolerance or relative. Every mistake is
// reported at its line and column.
func parseExpectations(file string, src []byte) ([]expectation, error) {
	var doc yaml.Node
	if err := yaml.Unmarshal(src, &doc); err != nil {
		return nil, fmt.Errorf("%s: %v", file, err)
	}
	if doc.Kind != yaml.DocumentNode || len(doc.Content) == 0 {
		return nil, posError{file, 1, 1, "no expected results: write a list of cases (- name: ..., expect: ..., tolerance: ..., source: ...)"}
	}
	list := doc.Content[0]
	if list.Kind != yaml.SequenceNode || len(list.Content) == 0 {
		return nil, posError{file, list.Line, list.Column, "expected a list of cases, each starting with \"- name:\""}
	}
	var out []expectation
	var errs []error
	seen := map[string]bool{}
	for _, n := range list.Content {
		e, err := parseExpectation(file, n)
		switch {
		case err != nil:
			errs = append(errs, err)
		case seen[e.name]:
			errs = append(errs, posError{file, e.line, e.col, "a second case for " + e.name + "; give each quantity one case"})
		default:
			seen[e.name] = true
			out = append(out, e)
		}
	}
	return out, errors.Join(errs...)
}

// parseExpectation reads one case mapping.
func parseExpectation(file string, n *yaml.Node) (expectation, error) {
	at := func(n *yaml.Node, format string, a ...any) error {
		return posError{file, n.Line, n.Column, fmt.Sprintf(format, a...)}
	}
	e := expectation{line: n.Line, col: n.Column}
	if n.Kind != yaml.MappingNode {
		return e, at(n, "a case is a mapping of name, expect, tolerance or relative, and source")
	}
	vals := map[string]*yaml.Node{}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		if _, ok := expectKeys[k.Value]; !ok {
			return e, at(k, "unknown key %q; the keys are name, expect, tolerance, relative and source", k.Value)
		}
		if v.Kind != yaml.ScalarNode || strings.TrimSpace(v.Value) == "" {
			return e, at(v, "%s must be a single value: %s", k.Value, expectKeys[k.Value])
		}
		vals[k.Value] = v
	}
	for _, k := range []string{"name", "expect", "source"} {
		if vals[k] == nil {
			return e, at(n, "missing %s: %s", k, expectKeys[k])
		}
	}
	e.name, e.expect, e.source = vals["name"].Value, vals["expect"].Value, vals["source"].Value
	var err error
	if e.value, e.unit, e.unitText, err = parseAmount(e.expect); err != nil {
		return e, at(vals["expect"], "%v; write %s", err, expectKeys["expect"])
	}
	tol, rel := vals["tolerance"], vals["relative"]
	switch {
	case (tol == nil) == (rel == nil):
		return e, at(n, "give exactly one of tolerance (%s) and relative (%s)", expectKeys["tolerance"], expectKeys["relative"])
	case rel != nil:
		e.rel, err = strconv.ParseFloat(rel.Value, 64)
		if err != nil || !(e.rel > 0 && e.rel < 1) {
			return e, at(rel, "relative must be a number between 0 and 1, e.g. 0.003; got %q", rel.Value)
		}
		e.tolText = fmt.Sprintf("±%g relative", e.rel)
	default:
		v, u, _, err := parseAmount(tol.Value)
		if err != nil || !(v > 0) || u.Dim != e.unit.Dim || u.Kind != units.Linear && u.Kind != units.AbsTemp {
			return e, at(tol, "tolerance must be a positive amount with a unit of the same kind as %q, e.g. 0.5 %s; got %q", e.expect, e.unitText, tol.Value)
		}
		e.tol, e.tolText = float64(v*u.Factor), "±"+tol.Value
	}
	return e, nil
}

// parseAmount reads "37.1 %", "2728.6 kJ/kg" or "0.8861" (no unit).
func parseAmount(s string) (float64, units.Unit, string, error) {
	num, unit, _ := strings.Cut(strings.TrimSpace(s), " ")
	v, err := strconv.ParseFloat(num, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, units.Unit{}, "", fmt.Errorf("%q does not start with a number", s)
	}
	unit = strings.TrimSpace(unit)
	if unit == "" {
		return v, units.Unit{Factor: 1}, "", nil
	}
	u, err := units.Parse(unit)
	if err != nil {
		return 0, units.Unit{}, "", fmt.Errorf("unit %q: %v", unit, err)
	}
	return v, u, unit, nil
}
