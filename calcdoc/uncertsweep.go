package calcdoc

import (
	"strings"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/svgplot"
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

// bandK is the coverage factor of the band drawn around a plotted result.
const bandK = 2

// bandSeries draws y ± U (k = 2) around a plotted result when the sweep
// also shows u(NAME): two dashed lines sharing one legend row.
func (d *Doc) bandSeries(sw *Sweep, name string, s svgplot.Series, yu units.Unit) []svgplot.Series {
	col := -1
	for j, c := range sw.Show {
		if c.U && c.Name == name {
			col = j
		}
	}
	if col < 0 || len(s.Y) != len(sw.Rows) {
		return nil
	}
	label := joinText("", nameRuns(name), svgplot.Plain(" ± U (k = 2)"))
	up := svgplot.Series{Name: name + " ± U (k = 2)", Label: label, Style: svgplot.Dashed}
	lo := up
	du := diffUnit(yu)
	for i, y := range s.Y {
		U := bandK * sw.Rows[i][col].V / du.Factor
		up.X, up.Y = append(up.X, s.X[i]), append(up.Y, y+U)
		lo.X, lo.Y = append(lo.X, s.X[i]), append(lo.Y, y-U)
	}
	return []svgplot.Series{up, lo}
}
