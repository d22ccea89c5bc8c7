package calcdoc

import (
	"math"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/svgplot"
	"github.com/vouchcalc/vouch/units"
)

// readQuality parses the list of a `quality:` line of a diagram block:
// vapour qualities strictly between 0 and 1.
func (d *Doc) readQuality(list string, off int) ([]float64, bool) {
	var out []float64
	for _, f := range splitList(list, off) {
		x, err := strconv.ParseFloat(f.text, 64)
		if err != nil || !(x > 0 && x < 1) {
			d.errorf(f.off, "quality: %s is not a number between 0 and 1; write quality: 0.2, 0.4, 0.6, 0.8", f.text)
			return nil, false
		}
		out = append(out, x)
	}
	if len(out) == 0 {
		d.errorf(off, "write the qualities to draw: quality: 0.2, 0.4, 0.6, 0.8")
		return nil, false
	}
	return out, true
}

// qualityLines draws a line of constant vapour quality x inside the dome
// for each x, labelled "x = 0.4". The dome holds the saturated liquid up
// to the critical point and then the saturated vapour back down at the
// same temperatures, so the i-th liquid point pairs with the i-th vapour
// point from the end.
func (d *Doc) qualityLines(p *svgplot.Plot, qs []float64, dome []props.CurvePoint, y func(props.CurvePoint) float64) {
	n := len(dome) / 2
	for _, x := range qs {
		s := svgplot.Series{Name: "quality lines", Style: svgplot.Dashed}
		for i := range n {
			l, v := dome[i], dome[len(dome)-1-i]
			c := props.CurvePoint{T: l.T, S: l.S + float64(x*(v.S-l.S)), H: l.H + float64(x*(v.H-l.H))}
			s.X, s.Y = append(s.X, c.S/1000), append(s.Y, y(c))
		}
		p.Series = append(p.Series, s)
		text := svgplot.Text{{Text: "x", Italic: true}, {Text: " = " + strconv.FormatFloat(x, 'f', -1, 64)}}
		p.PathLabels = append(p.PathLabels, svgplot.PathLabel{Text: text, X: s.X, Y: s.Y})
	}
}

// isobarLabels labels each heat-exchange isobar with its pressure, once
// per pressure, along the longest step (in entropy) at that pressure.
func (d *Doc) isobarLabels(segs []heatSeg, y func(props.CurvePoint) float64) []svgplot.PathLabel {
	var texts []string
	longest := map[string]heatSeg{}
	for _, sg := range segs {
		t := d.pressureText(sg.a.p)
		if b := d.pressureText(sg.b.p); b != t {
			t = strings.TrimSuffix(t, unitSuffix(t)) + "–" + b
		}
		old, seen := longest[t]
		if !seen {
			texts = append(texts, t)
		}
		if !seen || math.Abs(sg.b.s-sg.a.s) > math.Abs(old.b.s-old.a.s) {
			longest[t] = sg
		}
	}
	var out []svgplot.PathLabel
	for _, t := range texts {
		pl := svgplot.PathLabel{Text: svgplot.Plain(t)}
		for _, c := range longest[t].path {
			pl.X, pl.Y = append(pl.X, c.S/1000), append(pl.Y, y(c))
		}
		out = append(out, pl)
	}
	return out
}

// unitSuffix is the unit part of "16.5 MPa": " MPa" (after a thin space).
func unitSuffix(s string) string {
	if i := strings.Index(s, "\u2009"); i >= 0 {
		return s[i:]
	}
	return ""
}

// pressureText is a pressure in Pa as an isobar label: in the unit of the
// calc line that has exactly this value, else in a sensible SI unit; three
// significant figures, trailing zeros dropped: "16.5 MPa", "8 kPa".
func (d *Doc) pressureText(p float64) string {
	q := units.Quantity{V: p, D: units.DimPressure}
	u := units.DefaultUnit(q)
	for _, it := range d.Items {
		if it.Outcome == nil {
			continue
		}
		if v, ok := it.Outcome.Value.(units.Quantity); ok && v.D == units.DimPressure && math.Abs(v.V-p) <= float64(1e-9*p) {
			q, u = v, it.Outcome.Display
			break
		}
	}
	v, err := q.In(u, d.Front.Ctx)
	if err != nil {
		u = units.DefaultUnit(q)
		v = p / u.Factor
	}
	return trimZeros(units.FormatSig(v, 3)) + "\u2009" + unitText(u)
}
