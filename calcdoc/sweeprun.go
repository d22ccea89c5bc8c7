package calcdoc

import (
	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// runSweeps evaluates every sweep after the main pass.
func (d *Doc) runSweeps(eng *eval.Engine) {
	var budget sweepBudget
	for _, sw := range d.Sweeps {
		d.runSweep(eng, sw, &budget)
		switch {
		case sw.Texts != nil && len(sw.plots) > 0:
			d.errorf(sw.plots[0].off, "plot %s: a sweep over text values is shown as a table only", sw.plots[0].names[0].text)
		case len(sw.Rows) == len(sw.X) && len(sw.X) > 1:
			d.sweepPlots(sw)
		}
	}
}

func readsAny(deps []string, set map[string]bool) bool {
	for _, n := range deps {
		if set[n] {
			return true
		}
	}
	return false
}

func (d *Doc) runSweep(eng *eval.Engine, sw *Sweep, budget *sweepBudget) {
	input := d.itemOf(sw.Var)
	if input == nil {
		d.errorf(sw.VarOff, "vary %s: the calc does not define %s", sw.Var, sw.Var)
		return
	}
	if !d.checkInput(sw, input) {
		return
	}
	plan := d.planSweep(sw.Var)
	if !d.admit(budget, sw, plan) {
		return
	}
	if _, isText := input.Outcome.Value.(string); isText {
		d.runTextSweep(eng, sw, plan)
		return
	}
	xs, ok := d.sweepValues(eng, sw, input)
	if !ok {
		return
	}
	if !d.showDefined(eng, sw) {
		return
	}
	sw.X, sw.XUnit = xs, input.Outcome.Display
	vals := make([]any, len(xs))
	for i, x := range xs {
		vals[i] = x
	}
	d.sweepPoints(eng, sw, plan, vals)
}

// showDefined reports whether every shown name is defined.
func (d *Doc) showDefined(eng *eval.Engine, sw *Sweep) bool {
	for _, c := range sw.Show {
		if _, ok := eng.Value(c.Name); !ok {
			d.errorf(c.Off, "show %s: the calc does not define %s", c.Name, c.Name)
			return false
		}
	}
	return true
}

// runTextSweep varies a text input, such as the working fluid, over a list:
// vary wf over ["isopentane", "R-245fa"].
func (d *Doc) runTextSweep(eng *eval.Engine, sw *Sweep, plan sweepPlan) {
	if sw.steps != 0 {
		d.errorf(sw.VarOff, "vary %s: %s is text; list its values: vary %s over [\"A\", \"B\"]", sw.Var, sw.Var, sw.Var)
		return
	}
	var vals []any
	for _, b := range sw.bounds {
		out, err := eng.Exec(b)
		if err != nil {
			d.evalError(err, b.ExprOff)
			return
		}
		s, ok := out.Value.(string)
		if !ok {
			d.errorf(b.ExprOff, "vary %s: %s is %s, but %s is text", sw.Var, b.Expr, kindName(out.Value), sw.Var)
			return
		}
		sw.Texts = append(sw.Texts, s)
		vals = append(vals, s)
	}
	if !d.showDefined(eng, sw) {
		return
	}
	d.sweepPoints(eng, sw, plan, vals)
}

// sweepValues evaluates the bounds or the listed values.
func (d *Doc) sweepValues(eng *eval.Engine, sw *Sweep, input *Item) ([]units.Quantity, bool) {
	base, ok := input.Outcome.Value.(units.Quantity)
	if !ok {
		d.errorf(sw.VarOff, "vary %s: %s is not a number or quantity", sw.Var, sw.Var)
		return nil, false
	}
	var qs []units.Quantity
	for _, b := range sw.bounds {
		out, err := eng.Exec(b)
		if err != nil {
			d.evalError(err, b.ExprOff)
			return nil, false
		}
		q, isQ := out.Value.(units.Quantity)
		if !isQ || q.D != base.D {
			d.errorf(b.ExprOff, "vary %s: %s is %s, but %s is %s", sw.Var, b.Expr, kindName(out.Value), sw.Var, kindName(base))
			return nil, false
		}
		qs = append(qs, q)
	}
	if sw.steps == 0 {
		return qs, len(qs) > 0
	}
	tk, pk, ok := endKinds(qs[0], qs[1])
	if !ok {
		b := sw.bounds[1]
		d.errorf(b.ExprOff, "vary %s: %s is %s but %s is %s; write both ends as readings or both as differences",
			sw.Var, sw.bounds[0].Expr, kindOfReading(qs[0]), b.Expr, kindOfReading(qs[1]))
		return nil, false
	}
	out := make([]units.Quantity, sw.steps+1)
	for i := range out {
		t := float64(i) / float64(sw.steps)
		out[i] = units.Quantity{V: qs[0].V + float64(t*(qs[1].V-qs[0].V)), D: base.D, T: tk, P: pk}
	}
	return out, true
}

// endKinds is the kind of the values between two ends of a sweep: an
// absolute temperature or gauge pressure when either end is one, a
// difference when either end is one, else kelvin-scale or absolute
// pressure; an absolute end and a difference end do not go together.
func endKinds(a, b units.Quantity) (units.Temp, units.Press, bool) {
	t, p := a.T, a.P
	if t == units.Scale {
		t = b.T
	}
	if p == units.AnyP {
		p = b.P
	}
	ok := (a.T == b.T || a.T == units.Scale || b.T == units.Scale) && (a.P == b.P || a.P == units.AnyP || b.P == units.AnyP)
	return t, p, ok
}

// kindOfReading names a temperature's or pressure's kind for messages.
func kindOfReading(q units.Quantity) string {
	switch {
	case q.D == units.DimTemperature && q.T == units.Abs:
		return "an absolute temperature"
	case q.D == units.DimTemperature && q.T == units.Rel:
		return "a temperature difference"
	case q.D == units.DimPressure && q.P == units.GaugeP:
		return "a gauge pressure"
	case q.D == units.DimPressure && q.P == units.DiffP:
		return "a difference of gauge pressures"
	}
	return "a reading"
}

func kindName(v any) string {
	if q, ok := v.(units.Quantity); ok {
		return q.D.Name()
	}
	return "not a quantity"
}

// ColumnUnit is the unit a sweep column is shown in: its [UNIT], else the
// unit the name's own line is shown in, else the display system's.
func (d *Doc) ColumnUnit(c SweepColumn, q units.Quantity) units.Unit {
	if c.U {
		c.U = false
		return diffUnit(d.ColumnUnit(c, q))
	}
	if c.HasUnit {
		return c.Unit
	}
	if it := d.itemOf(c.Name); it != nil && it.Outcome.Display.Dim == q.D {
		return d.shownUnit(it.Outcome, q)
	}
	return d.systemUnit(q, units.DefaultUnit(q))
}

// SweepX is the varied input at point i as text, in its unit.
func (d *Doc) SweepX(sw *Sweep, i int) string {
	if sw.Texts != nil {
		return sw.Texts[i]
	}
	t, err := sw.X[i].Text(sw.XUnit, d.Front.Digits, d.Front.Ctx)
	if err != nil {
		return err.Error()
	}
	return t
}

// Len is the number of points of a sweep.
func (sw *Sweep) Len() int {
	if sw.Texts != nil {
		return len(sw.Texts)
	}
	return len(sw.X)
}
