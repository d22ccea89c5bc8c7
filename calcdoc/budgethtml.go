package calcdoc

import (
	"html"
	"math"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/internal/fpmath"
	"github.com/vouchcalc/vouch/units"
)

// budgetHTML draws a budget block: one table per line.
func (d *Doc) budgetHTML(bg *Budget) string {
	var b strings.Builder
	for _, e := range bg.Entries {
		switch {
		case e.Sens && len(e.Rows) > 0:
			b.WriteString(d.sensHTML(e))
		case !e.Sens && e.Display.Factor != 0:
			b.WriteString(d.gumHTML(e))
		}
	}
	return b.String()
}

// gumHTML draws the budget table of one result.
func (d *Doc) gumHTML(e *BudgetEntry) string {
	var b strings.Builder
	yu := diffUnit(e.Display)
	b.WriteString(sprintf("<figure class=\"budget\" id=\"L%d\"><figcaption>Uncertainty budget of %s (line %d), by the law of propagation of uncertainty (JCGM 100)</figcaption>", e.line, nameText(e.Name), e.line))
	b.WriteString("<table><thead><tr><th>input</th><th>value</th><th><i>u</i>(<i>x</i><sub>i</sub>)</th><th>stated as</th><th>source</th><th><i>c</i><sub>i</sub></th><th><i>c</i><sub>i</sub>·<i>u</i>(<i>x</i><sub>i</sub>)</th><th>share of <i>u</i><sub>c</sub>²</th></tr></thead><tbody>\n")
	var notes []string
	for _, r := range e.Rows {
		xu := diffUnit(r.In.Item.Outcome.Display)
		b.WriteString("<tr><td>" + nameText(r.In.Name) + "</td><td class=\"num\">" + d.valueHTML(r.In.Item.Outcome) + "</td>")
		b.WriteString("<td class=\"num\">" + inUnit(r.In.U, xu, 3) + "</td><td>" + html.EscapeString(r.In.Unc.How()) + "</td>")
		b.WriteString("<td>" + d.inputSource(r.In.Item) + "</td>")
		b.WriteString("<td class=\"num\">" + coefHTML(r.Coef.C, xu, yu) + "</td><td class=\"num\">" + inUnit(r.CU, yu, 3) + "</td>")
		b.WriteString("<td class=\"num\">" + pct(r.Share) + "</td></tr>\n")
		notes = append(notes, stepNote(r)...)
	}
	if math.Abs(e.CovFrac) > 5e-4 {
		b.WriteString("<tr><td colspan=\"7\">correlation terms, 2 Σ <i>c</i><sub>i</sub><i>c</i><sub>j</sub><i>u</i>(<i>x</i><sub>i</sub>)<i>u</i>(<i>x</i><sub>j</sub>)<i>r</i>(<i>x</i><sub>i</sub>, <i>x</i><sub>j</sub>)</td><td class=\"num\">" + pct(e.CovFrac) + "</td></tr>\n")
	}
	U := float64(e.K * e.Uc)
	b.WriteString("</tbody></table>\n<p class=\"budget-result\">")
	b.WriteString("combined standard uncertainty <i>u</i><sub>c</sub> = " + inUnit(e.Uc, yu, 3))
	b.WriteString("; coverage factor <i>k</i> = " + html.EscapeString(e.KText) + "; expanded uncertainty <i>U</i> = " + inUnit(U, yu, 3) + "<br>")
	b.WriteString("<strong>" + nameText(e.Name) + " = " + d.resultWithU(e.Y, e.Display, U) + " (<i>k</i> = " + html.EscapeString(e.KText) + ")</strong></p>\n")
	if e.MCRes != nil {
		b.WriteString(d.mcHTML(e, yu))
	}
	notes = append(notes, "The budget holds the uncertainties stated for the inputs only; the uncertainty of the property formulations and of the model itself is not included.")
	for _, n := range notes {
		b.WriteString("<p class=\"note\">" + n + "</p>\n")
	}
	b.WriteString("</figure>\n")
	return b.String()
}

// mcHTML draws the Monte Carlo check beside the GUM figures.
func (d *Doc) mcHTML(e *BudgetEntry, yu units.Unit) string {
	m := e.MCRes
	var b strings.Builder
	b.WriteString(sprintf("<table class=\"mc\"><caption>Monte Carlo check (JCGM 101): %s draws, fixed seed</caption>", groupDigits(strconv.Itoa(m.N))))
	b.WriteString("<thead><tr><th></th><th>GUM</th><th>Monte Carlo</th></tr></thead><tbody>\n")
	b.WriteString("<tr><td>estimate</td><td class=\"num\">" + d.inDisplay(e.Y.V, e) + "</td><td class=\"num\">" + d.inDisplay(m.Mean, e) + "</td></tr>\n")
	b.WriteString("<tr><td>standard uncertainty</td><td class=\"num\">" + inUnit(e.Uc, yu, 3) + "</td><td class=\"num\">" + inUnit(m.Std, yu, 3) + "</td></tr>\n")
	b.WriteString("<tr><td>95 % coverage interval</td><td class=\"num\">[" + d.inDisplay(m.GLow, e) + ", " + d.inDisplay(m.GHigh, e) + "]</td><td class=\"num\">[" + d.inDisplay(m.Low, e) + ", " + d.inDisplay(m.High, e) + "]</td></tr>\n")
	b.WriteString("</tbody></table>\n<p class=\"note\">")
	b.WriteString("GUM interval: <i>y</i> ± 1.96 <i>u</i><sub>c</sub>; Monte Carlo interval: the probabilistically symmetric 95 % interval of the sorted draws. ")
	b.WriteString("Validation tolerance δ = " + inUnit(m.Delta, yu, 2) + " (half a unit in the second significant digit of <i>u</i><sub>c</sub>); the ends differ by " + inUnit(m.DLow, yu, 2) + " and " + inUnit(m.DHi, yu, 2) + ": ")
	if m.Agree {
		b.WriteString("the GUM figures are validated by the Monte Carlo check (JCGM 101, 8.2).")
	} else {
		b.WriteString("<strong>the GUM figures and the Monte Carlo check disagree by more than δ</strong>; the Monte Carlo interval is the better statement where the model is non-linear or the result's distribution is not normal (JCGM 101, 8.2), provided the number of draws is large enough for δ.")
	}
	b.WriteString(" Standard deviation of the Monte Carlo mean: " + inUnit(m.SEMean, yu, 2) + ".</p>\n")
	return b.String()
}

// sensHTML draws a sensitivity table.
func (d *Doc) sensHTML(e *BudgetEntry) string {
	var b strings.Builder
	yu := diffUnit(e.Display)
	b.WriteString(sprintf("<figure class=\"budget\" id=\"L%d\"><figcaption>Sensitivity of %s (line %d) to its inputs, largest relative sensitivity first</figcaption>", e.line, nameText(e.Name), e.line))
	b.WriteString("<table><thead><tr><th>input</th><th>value</th><th><i>c</i><sub>i</sub> = ∂<i>y</i>/∂<i>x</i><sub>i</sub></th><th>(∂<i>y</i>/<i>y</i>)/(∂<i>x</i><sub>i</sub>/<i>x</i><sub>i</sub>)</th></tr></thead><tbody>\n")
	var notes []string
	for _, r := range e.Rows {
		xu := diffUnit(r.In.Item.Outcome.Display)
		rel := "—"
		if r.HasRel {
			rel = numberText(r.Rel, 3)
		}
		b.WriteString("<tr><td>" + nameText(r.In.Name) + "</td><td class=\"num\">" + d.valueHTML(r.In.Item.Outcome) + "</td><td class=\"num\">" + coefHTML(r.Coef.C, xu, yu) + "</td><td class=\"num\">" + rel + "</td></tr>\n")
		notes = append(notes, stepNote(r)...)
	}
	b.WriteString("</tbody></table>\n")
	b.WriteString("<p class=\"note\">Relative sensitivities use absolute values (temperatures in kelvin, pressures absolute).</p>\n")
	for _, n := range notes {
		b.WriteString("<p class=\"note\">" + n + "</p>\n")
	}
	b.WriteString("</figure>\n")
	return b.String()
}

// stepNote says when a coefficient did not settle as its step was halved.
func stepNote(r BudgetRow) []string {
	if r.Coef.Stable {
		return nil
	}
	return []string{sprintf("The coefficient of %s changed by %s relative when its step was last halved (to %s in SI units), more than %s: the result is not smooth near this value (a table, a phase boundary or a solver's tolerance); the finest estimate is shown.",
		nameText(r.In.Name), numberText(r.Coef.Change, 2), numberText(r.Coef.Step, 3), numberText(StabilityTol, 1))}
}

// diffUnit is the unit a difference or an uncertainty of a value shown in u
// is written in: kelvin or Fdeg for a temperature scale, the absolute unit
// for a gauge unit.
func diffUnit(u units.Unit) units.Unit {
	text := ""
	switch {
	case u.Kind == units.AbsTemp && u.Factor == 1:
		text = "K"
	case u.Kind == units.AbsTemp:
		text = "Fdeg"
	case u.Kind == units.Gauge:
		text = strings.TrimSuffix(u.String(), "g")
	default:
		return u
	}
	if v, err := units.ParseCached(text); err == nil {
		return v
	}
	return units.DefaultUnit(units.Quantity{V: 1, D: u.Dim})
}

// inUnit writes an SI difference in a linear unit.
func inUnit(v float64, u units.Unit, digits int) string {
	s := numberText(v/u.Factor, digits)
	if t := unitText(u); t != "" {
		s += "\u2009" + html.EscapeString(t)
	}
	return s
}

// inDisplay writes an SI value of a budget's result in its display unit.
func (d *Doc) inDisplay(v float64, e *BudgetEntry) string {
	q := e.Y
	q.V = v
	return quantityText(q, e.Display, d.Front.Digits+1, d.Front.Ctx)
}

// coefHTML writes a sensitivity coefficient in (unit of y)/(unit of x).
func coefHTML(c float64, xu, yu units.Unit) string {
	s := numberText(float64(c*xu.Factor)/yu.Factor, 4)
	yt, xt := unitText(yu), unitText(xu)
	if yt == "" {
		yt = "1"
	}
	if strings.ContainsAny(yt, "/· ") {
		yt = "(" + yt + ")"
	}
	if strings.ContainsAny(xt, "/· ") {
		xt = "(" + xt + ")"
	}
	if xt == "" {
		if yt == "1" {
			return s
		}
		return s + "\u2009" + html.EscapeString(strings.Trim(yt, "()"))
	}
	return s + "\u2009" + html.EscapeString(yt+"/"+xt)
}

// pct writes a fraction as a percentage with one decimal.
func pct(f float64) string {
	return strings.Replace(strconv.FormatFloat(float64(100*f), 'f', 1, 64), "-", "−", 1) + " %"
}

// resultWithU writes y ± U with U to two significant digits and y to the
// same decimal place (JCGM 100, 7.2.6).
func (d *Doc) resultWithU(y units.Quantity, disp units.Unit, U float64) string {
	yv, err := y.In(disp, d.Front.Ctx)
	if err != nil {
		return html.EscapeString(err.Error())
	}
	du := diffUnit(disp)
	uv := U / du.Factor
	ys, us := roundPair(yv, uv)
	s := groupDigits(ys) + " ± " + groupDigits(us)
	if t := unitText(disp); t != "" {
		s = "(" + s + ")\u2009" + html.EscapeString(t)
	}
	return s
}

// roundPair rounds U to two significant digits and y to the same place.
func roundPair(y, u float64) (string, string) {
	if !(u > 0) {
		return numberText(y, 6), "0"
	}
	l := int(math.Floor(fpmath.Log10(u))) - 1
	if l >= 0 {
		p := fpmath.Pow(10, float64(l))
		return strconv.FormatFloat(float64(math.Round(y/p)*p), 'f', 0, 64), strconv.FormatFloat(float64(math.Round(u/p)*p), 'f', 0, 64)
	}
	return strconv.FormatFloat(y, 'f', -l, 64), strconv.FormatFloat(u, 'f', -l, 64)
}
