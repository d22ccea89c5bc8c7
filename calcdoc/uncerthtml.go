package calcdoc

import (
	"html"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// uncMathML writes the ± part of an input line, as stated.
func uncMathML(s *eval.Stmt) string {
	u := s.Uncertainty()
	if u == nil {
		return ""
	}
	m := "<mo>±</mo><mrow>" + numberMathMLText(u.Num) + unitMathML(u.Unit) + "</mrow>"
	switch u.Kind {
	case eval.UncExpanded:
		m += "<mtext>\u2002(</mtext><mi>k</mi><mo>=</mo><mn>" + html.EscapeString(u.KText) + "</mn><mtext>)</mtext>"
	case eval.UncRect:
		m += "<mtext>\u2002rectangular</mtext>"
	}
	return m
}

// uncHTML writes the ± part of an input as stated, for the inputs table;
// "" when it has none.
func uncHTML(s *eval.Stmt) string {
	u := s.Uncertainty()
	if u == nil {
		return ""
	}
	t := " ± " + groupDigits(u.Num)
	if ut := unitText(u.Unit); ut != "" && u.Unit.Factor != 0 {
		t += "\u2009" + html.EscapeString(ut)
	}
	switch u.Kind {
	case eval.UncExpanded:
		t += " (<i>k</i> = " + html.EscapeString(u.KText) + ")"
	case eval.UncRect:
		t += " rectangular"
	}
	return t
}

// numberMathMLText writes a number as written.
func numberMathMLText(num string) string {
	return "<mn>" + groupDigits(num) + "</mn>"
}

// corrMathML writes corr(a, b) = r.
func corrMathML(s *eval.Stmt) string {
	a, b, _, _, _ := s.Corr()
	return "<mi>r</mi><mo>(</mo>" + nameMathML(a) + "<mo>,</mo>" + nameMathML(b) + "<mo>)</mo><mo>=</mo><mn>" + html.EscapeString(groupDigits(s.Expr)) + "</mn>"
}

// StdUnc returns the standard uncertainty of a defined quantity in SI
// units and in the difference unit of its display: stated for an input,
// propagated for a result. ok is false when it has none.
func (d *Doc) StdUnc(it *Item) (si, shown float64, unit units.Unit, ok bool) {
	if it.Outcome == nil || it.Stmt.Kind != eval.Def {
		return 0, 0, units.Unit{}, false
	}
	if u := it.Stmt.Uncertainty(); u != nil {
		si, ok = u.U, true
	} else {
		si, ok = d.Unc.U(it.Stmt.Name)
	}
	if !ok {
		return 0, 0, units.Unit{}, false
	}
	unit = diffUnit(it.Outcome.Display)
	if unit.Factor == 0 {
		return si, si, unit, true
	}
	return si, si / unit.Factor, unit, true
}

// uncLineHTML writes the propagated standard uncertainty under a result.
func (d *Doc) uncLineHTML(it *Item) string {
	if it.Stmt.Uncertainty() != nil {
		return ""
	}
	si, _, unit, ok := d.StdUnc(it)
	if !ok {
		return ""
	}
	return "<div class=\"desc\">combined standard uncertainty <i>u</i><sub>c</sub> = " + inUnit(si, unit, 3) + " (propagated from the inputs' uncertainties)</div>"
}
