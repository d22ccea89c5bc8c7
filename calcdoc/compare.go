package calcdoc

import (
	"math"
	"strings"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// Comparison is one comparison inside a check (`p ≥ p_min`, or each part of
// `a < b and c > d` or `0 < x < 1`): both sides evaluated, shown in one unit
// with enough digits to tell them apart, and the margin by which it holds.
type Comparison struct {
	Node        *eval.Binary
	Op          string // <, <=, >, >=, ==, !=
	Left, Right units.Quantity
	Unit        units.Unit // the one unit both sides are shown in
	Digits      int        // significant digits that tell the sides apart
	Holds       bool
	// Margin is how far an ordering holds: left − right for > and >=,
	// right − left for < and <=, so a negative margin is a shortfall; for
	// == and != it is left − right.
	Margin     units.Quantity
	MarginUnit units.Unit
	// Relative is Margin over the size of the limit (the right side, or
	// the left where only the left is written as a number: 0 < x);
	// HasRelative is false where a ratio means nothing: absolute
	// temperatures, gauge pressures, a zero limit.
	Relative    float64
	HasRelative bool
}

// Comparisons evaluates each comparison of quantities in a check, in the
// order written. A comparison of texts or truth values is left out.
func (d *Doc) Comparisons(it *Item) []Comparison {
	if it.Stmt.Kind != eval.Check || it.Outcome == nil || it.Outcome.Skipped || d.engine == nil {
		return nil
	}
	var out []Comparison
	var walk func(n eval.Node)
	walk = func(n eval.Node) {
		switch v := n.(type) {
		case *eval.Binary:
			if isComparison(v.Op) {
				if c, ok := d.comparison(it.Stmt, v); ok {
					out = append(out, c)
				}
				return
			}
			walk(v.L)
			walk(v.R)
		case *eval.Unary:
			walk(v.X)
		}
	}
	walk(it.Stmt.Syntax())
	return out
}

func isComparison(op string) bool {
	switch op {
	case "<", "<=", ">", ">=", "==", "!=":
		return true
	}
	return false
}

// comparison evaluates both sides of one comparison node.
func (d *Doc) comparison(s *eval.Stmt, v *eval.Binary) (Comparison, bool) {
	l, errL := d.engine.EvalNode(s, v.L)
	r, errR := d.engine.EvalNode(s, v.R)
	lq, okL := l.(units.Quantity)
	rq, okR := r.(units.Quantity)
	if errL != nil || errR != nil || !okL || !okR || lq.D != rq.D {
		return Comparison{}, false
	}
	c := Comparison{Node: v, Op: v.Op, Left: lq, Right: rq, Holds: holds(v.Op, lq.V, rq.V)}
	c.Unit = d.sideUnit(v.R, rq)
	if c.Unit.Factor == 0 || c.Unit.Dim != rq.D {
		c.Unit = d.sideUnit(v.L, lq)
	}
	if _, err := lq.In(c.Unit, d.Front.Ctx); err != nil {
		c.Unit = plainUnit(lq)
	}
	if _, err := rq.In(c.Unit, d.Front.Ctx); err != nil {
		c.Unit = plainUnit(lq)
	}
	c.Digits = d.digitsApart(lq, rq, &c.Unit)
	limit := rq
	if isWritten(v.L) && !isWritten(v.R) {
		limit = lq // 0 < x: the limit is on the left
	}
	c.margin(limit)
	return c, true
}

func holds(op string, l, r float64) bool {
	switch op {
	case "<":
		return l < r
	case "<=":
		return l <= r
	case ">":
		return l > r
	case ">=":
		return l >= r
	case "==":
		return l == r
	}
	return l != r
}

// sideUnit is the unit a side is written or displayed in: a literal's
// unit, a name's display unit; the zero unit when it has none.
func (d *Doc) sideUnit(n eval.Node, q units.Quantity) units.Unit {
	switch v := n.(type) {
	case *eval.Quantity:
		return v.Lit.Unit
	case *eval.Name:
		if o, ok := d.outcomeOf(v.Name); ok {
			if o.Stmt != nil && o.Stmt.IsLiteralInput() {
				return o.Stmt.LoneLiteral().Unit
			}
			if o.Display.Dim == q.D && o.Display.Factor != 0 {
				return o.Display
			}
		}
	}
	return units.Unit{}
}

// plainUnit is the unit a quantity is shown in when nothing names one.
func plainUnit(q units.Quantity) units.Unit {
	if q.T == units.Abs {
		return celsius
	}
	return units.DefaultUnit(units.Quantity{V: q.V, D: q.D, T: q.T})
}

// digitsApart returns the significant digits, from the calc's own up to 17,
// at which two different values print differently in u; when u cannot
// tell them apart at all, it switches u to the SI unit.
func (d *Doc) digitsApart(l, r units.Quantity, u *units.Unit) int {
	digits := d.Front.Digits
	if l.V == r.V {
		return digits
	}
	lv, _ := l.In(*u, d.Front.Ctx)
	rv, _ := r.In(*u, d.Front.Ctx)
	if lv == rv {
		*u = units.DefaultUnit(units.Quantity{V: 1, D: l.D})
		lv, rv = l.V/u.Factor, r.V/u.Factor
	}
	for ; digits < 17; digits++ {
		if units.FormatSig(lv, digits) != units.FormatSig(rv, digits) {
			break
		}
	}
	return digits
}

// isWritten reports whether a node is a number or quantity as written.
func isWritten(n eval.Node) bool {
	switch n.(type) {
	case *eval.Number, *eval.Quantity:
		return true
	}
	return false
}

// margin sets the margin, its unit and the margin relative to the limit.
func (c *Comparison) margin(limit units.Quantity) {
	a, b := c.Left, c.Right
	if c.Op == "<" || c.Op == "<=" {
		a, b = b, a
	}
	m := units.Quantity{V: a.V - b.V, D: a.D} // a difference, whatever the sides' scales
	if m.D == units.DimPressure {
		m.P = units.DiffP
	}
	c.Margin, c.MarginUnit = m, differenceUnit(c.Unit, m)
	offset := c.Left.T == units.Abs || c.Right.T == units.Abs ||
		(c.Left.D == units.DimTemperature && (c.Left.T == units.Scale || c.Right.T == units.Scale)) ||
		c.Left.P == units.GaugeP || c.Right.P == units.GaugeP
	if !offset && limit.V != 0 {
		c.Relative, c.HasRelative = m.V/math.Abs(limit.V), true
	}
}

// differenceUnit is the unit a difference of values shown in u is shown
// in: u itself, or for a scale with its own zero (degC, barg) the unit of
// the same size that measures from no offset (K, bar).
func differenceUnit(u units.Unit, m units.Quantity) units.Unit {
	if u.Kind == units.Linear && u.Factor != 0 {
		return u
	}
	var text string
	switch s := u.String(); {
	case s == "degC":
		text = "K"
	case s == "degF":
		text = "Fdeg"
	case u.Kind == units.Gauge:
		text = strings.TrimSuffix(s, "g")
	}
	if v, err := units.Parse(text); err == nil && v.Dim == m.D {
		return v
	}
	return units.DefaultUnit(units.Quantity{V: m.V, D: m.D})
}

// SideTexts returns both sides as plain text in the comparison's one unit:
// "10.987 barg", "11.000 barg".
func (d *Doc) SideTexts(c Comparison) (left, right string) {
	return d.qtext(c.Left, c.Unit, c.Digits), d.qtext(c.Right, c.Unit, c.Digits)
}

// MarginText is the margin as plain text: "margin -1.325 kPa (-0.11 %)";
// "difference …" for == and !=.
func (d *Doc) MarginText(c Comparison) string {
	word := "margin "
	if c.Op == "==" || c.Op == "!=" {
		word = "difference "
	}
	s := word + d.qtext(c.Margin, c.MarginUnit, d.Front.Digits)
	if IsPercent(c.MarginUnit) {
		s = strings.TrimSuffix(s, " %") + " " + PercentagePoints
	}
	if c.HasRelative {
		s += " (" + units.FormatSig(float64(100*c.Relative), 3) + " %)"
	}
	return s
}

// ComparisonText is a comparison with its sides in one unit and its
// margin, as plain text: "10.99 barg >= 11.00 barg, margin -0.01325 bar".
func (d *Doc) ComparisonText(c Comparison) string {
	l, r := d.SideTexts(c)
	return l + " " + c.Op + " " + r + ", " + d.MarginText(c)
}

// CheckText lists a check's comparisons as ComparisonText does, joined by
// "; "; "" for a check that compares no quantities.
func (d *Doc) CheckText(it *Item) string {
	var parts []string
	for _, c := range d.Comparisons(it) {
		parts = append(parts, d.ComparisonText(c))
	}
	return strings.Join(parts, "; ")
}

// PercentagePoints names the unit of a difference of two values in %: the
// difference of 36.5 % and 30 % is 6.5 percentage points, not 6.5 % (which
// would read as a relative change).
const PercentagePoints = "percentage points"

// IsPercent reports whether a unit is the per cent sign alone.
func IsPercent(u units.Unit) bool { return u.String() == "%" }

func (d *Doc) qtext(q units.Quantity, u units.Unit, digits int) string {
	s, err := q.Text(u, digits, d.Front.Ctx)
	if err != nil {
		s, _ = q.Text(units.DefaultUnit(q), digits, d.Front.Ctx)
	}
	return s
}

// comparisonMathML writes a comparison with both sides evaluated in one
// unit: 10.987 barg ≥ 11.000 barg.
func (d *Doc) comparisonMathML(c Comparison) string {
	side := func(q units.Quantity) string {
		v, err := q.In(c.Unit, d.Front.Ctx)
		if err != nil {
			return quantityMathML(q, units.DefaultUnit(q), c.Digits, d.Front.Ctx)
		}
		return "<mrow>" + numberMathML(v, c.Digits, false) + unitMathML(c.Unit) + "</mrow>"
	}
	return "<mrow>" + side(c.Left) + "<mo>" + opText[c.Op] + "</mo>" + side(c.Right) + "</mrow>"
}

// marginHTML lists the margins of a check's comparisons as HTML text:
// "margin −0.01325 bar; …". When bare is set (a table column headed
// Margin) it leaves out the words, puts one comparison on a line and lets
// a line break only between a margin and its relative size.
func (d *Doc) marginHTML(cs []Comparison, bare bool) string {
	var parts []string
	for _, c := range cs {
		word := "margin "
		if c.Op == "==" || c.Op == "!=" {
			word = "difference "
		}
		if bare {
			word = ""
		}
		s := word + quantityText(c.Margin, c.MarginUnit, d.Front.Digits, d.Front.Ctx)
		if IsPercent(c.MarginUnit) {
			s = strings.TrimSuffix(s, "\u2009%") + "\u2009" + PercentagePoints
		}
		rel := ""
		if c.HasRelative {
			rel = "(" + numberText(float64(100*c.Relative), 3) + "\u2009%)"
		}
		if bare {
			// the summary's table: the column may break only between a
			// margin and its relative size, and between comparisons
			s = `<span class="nw">` + s + `</span>`
			if rel != "" {
				s += ` <span class="nw">` + rel + `</span>`
			}
		} else if rel != "" {
			s += " " + rel
		}
		parts = append(parts, s)
	}
	if bare {
		return strings.Join(parts, ";<br>")
	}
	return strings.Join(parts, "; ")
}
