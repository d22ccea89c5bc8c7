package calcdoc

import (
	"strings"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// A sweep's `show u(NAME)` column: the combined standard uncertainty of
// NAME at every point, propagated from the stated uncertainties of the
// inputs with the coefficients found at that point (four evaluations of
// each input's dependent lines per point).

// uColumn reads u(NAME) in a show line.
func uColumn(text string) (string, bool) {
	if inner, ok := strings.CutPrefix(text, "u("); ok && strings.HasSuffix(inner, ")") {
		return strings.TrimSpace(strings.TrimSuffix(inner, ")")), true
	}
	return "", false
}

// columnName is a sweep column's heading: NAME or u(NAME).
func columnName(c SweepColumn) string {
	if c.U {
		return "<i>u</i>(" + nameText(c.Name) + ")"
	}
	return nameText(c.Name)
}

// uncColumn replaces *q, NAME's value at sweep point i on f, by its
// combined standard uncertainty there, or says why it cannot. It only
// reads the Doc, so points may run it at once.
func (d *Doc) uncColumn(f *eval.Engine, sw *Sweep, c SweepColumn, i int, q *units.Quantity) string {
	p := &Propagation{}
	index := map[string]int{}
	for _, it := range d.quantityInputs() {
		unc := it.Stmt.Uncertainty()
		if unc == nil {
			continue
		}
		v, _ := f.Value(it.Stmt.Name)
		x, ok := v.(units.Quantity)
		if !ok {
			continue
		}
		index[it.Stmt.Name] = len(p.Inputs)
		p.Inputs = append(p.Inputs, &UncInput{Item: it, Name: it.Stmt.Name, X: x, U: unc.U, Unc: unc})
	}
	d.fillCorr(p, index)
	p.runs = d.allSensitivities(f, p.Inputs)
	for _, run := range p.runs {
		if run.err != "" {
			return sprintf("show u(%s) at %s = %s: %s", c.Name, sw.Var, d.SweepX(sw, i), run.err)
		}
	}
	u, ok := p.U(c.Name)
	if !ok {
		return sprintf("show u(%s): %s depends on no input with an uncertainty; state one on an input line, such as p_1 = 12.5 MPa ± 0.05 MPa", c.Name, c.Name)
	}
	*q = units.Quantity{V: u, D: q.D}
	return ""
}
