package calcdoc

import (
	"bytes"
	"html"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/units"
)

// greek maps letter names to Greek letters (lower and upper case).
var greek = map[string]string{
	"alpha": "α", "beta": "β", "gamma": "γ", "delta": "δ", "epsilon": "ε", "zeta": "ζ", "eta": "η",
	"theta": "θ", "iota": "ι", "kappa": "κ", "lambda": "λ", "mu": "μ", "nu": "ν", "xi": "ξ", "pi": "π",
	"rho": "ρ", "sigma": "σ", "tau": "τ", "phi": "φ", "chi": "χ", "psi": "ψ", "omega": "ω",
	"Gamma": "Γ", "Delta": "Δ", "Theta": "Θ", "Lambda": "Λ", "Xi": "Ξ", "Pi": "Π", "Sigma": "Σ",
	"Phi": "Φ", "Psi": "Ψ", "Omega": "Ω",
}

// nameMathML typesets a calc name: the part before the first _ is the
// symbol (a Greek letter when it names one), the rest its subscript, with
// further _ shown as commas; "dot" right after the symbol puts a dot over
// it (m_dot → ṁ).
func nameMathML(name string) string {
	base, sub, _ := strings.Cut(name, "_")
	sym := greekOr(base)
	if rest, ok := cutWord(sub, "dot"); ok {
		// The letter and a combining dot above in one token: MathML
		// accents over identifiers are not drawn by every browser.
		sym = "<mi>" + html.EscapeString(greekText(base)) + "\u0307</mi>"
		sub = rest
	}
	if sub == "" {
		return sym
	}
	parts := strings.Split(sub, "_")
	for i, p := range parts {
		parts[i] = html.EscapeString(p)
	}
	return "<msub>" + sym + "<mi mathvariant=\"normal\">" + strings.Join(parts, ",") + "</mi></msub>"
}

// cutWord removes a leading word and the _ after it.
func cutWord(s, w string) (string, bool) {
	if s == w {
		return "", true
	}
	if strings.HasPrefix(s, w+"_") {
		return s[len(w)+1:], true
	}
	return s, false
}

func greekOr(base string) string {
	if g, ok := greek[base]; ok {
		return "<mi>" + g + "</mi>"
	}
	if len([]rune(base)) > 1 {
		return "<mi mathvariant=\"italic\">" + html.EscapeString(base) + "</mi>"
	}
	return "<mi>" + html.EscapeString(base) + "</mi>"
}

func greekText(s string) string {
	if g, ok := greek[s]; ok {
		return g
	}
	return s
}

// nameText is a name typeset as plain HTML text with a subscript, for
// tables outside MathML.
func nameText(name string) string {
	base, sub, _ := strings.Cut(name, "_")
	sym := html.EscapeString(greekText(base))
	if rest, ok := cutWord(sub, "dot"); ok {
		sym += "\u0307"
		sub = rest
	}
	if sub == "" {
		return "<i>" + sym + "</i>"
	}
	parts := strings.Split(sub, "_")
	for i, p := range parts {
		parts[i] = html.EscapeString(p)
	}
	return "<i>" + sym + "</i><sub>" + strings.Join(parts, ",") + "</sub>"
}

// groupDigits inserts thin spaces between groups of three digits (ISO
// 80000-1) in the integer part when it has five or more digits. Fractions
// are left whole: "0.076 30" would read as two numbers.
func groupDigits(s string) string {
	intLen := len(s)
	if i := strings.IndexByte(s, '.'); i >= 0 {
		intLen = i
	}
	if intLen < 5 && !strings.HasPrefix(s, "-") {
		return s // nothing to change: no sign, fewer than five integer digits
	}
	var b strings.Builder
	writeGroupDigits(&b, s)
	return b.String()
}

// writeGroupDigits is groupDigits written into b.
func writeGroupDigits(b *strings.Builder, s string) {
	if strings.HasPrefix(s, "-") {
		b.WriteString("−")
		s = s[1:]
	}
	intPart, frac, hasFrac := strings.Cut(s, ".")
	if len(intPart) >= 5 {
		for i, c := range intPart {
			if i > 0 && (len(intPart)-i)%3 == 0 {
				b.WriteString("\u2009")
			}
			b.WriteRune(c)
		}
	} else {
		b.WriteString(intPart)
	}
	if hasFrac {
		b.WriteString(".")
		b.WriteString(frac)
	}
}

// numberText formats a number with significant figures as an engineer
// writes it: grouped digits, and "1.234 × 10⁻⁵" where fixed notation would
// be unreadable. It returns HTML.
func numberText(v float64, digits int) string {
	s := units.FormatSig(v, digits)
	mant, exp, sci := strings.Cut(s, "e")
	if !sci {
		return groupDigits(s)
	}
	return groupDigits(mant) + "\u2009×\u200910<sup>" + strings.Replace(exp, "-", "−", 1) + "</sup>"
}

// numberMathML writes a number: with significant figures, or exactly as the
// shortest text that reads back to it when exact is set.
func numberMathML(v float64, digits int, exact bool) string {
	var b strings.Builder
	writeNumberMathML(&b, v, digits, exact)
	return b.String()
}

// writeNumberMathML is numberMathML written into b.
func writeNumberMathML(b *strings.Builder, v float64, digits int, exact bool) {
	var s string
	if exact {
		var buf [32]byte
		t := strconv.AppendFloat(buf[:0], v, 'g', -1, 64)
		if bytes.IndexByte(t, 'e') >= 0 && v >= 1e-3 && v < 1e15 {
			t = strconv.AppendFloat(buf[:0], v, 'f', -1, 64)
		}
		s = string(t)
	} else {
		s = units.FormatSig(v, digits)
	}
	mant, exp, sci := strings.Cut(s, "e")
	if !sci {
		b.WriteString("<mn>")
		writeGroupDigits(b, s)
		b.WriteString("</mn>")
		return
	}
	exp = strings.TrimPrefix(exp, "+")
	b.WriteString("<mrow><mn>")
	writeGroupDigits(b, mant)
	b.WriteString("</mn><mo>×</mo><msup><mn>10</mn><mn>")
	b.WriteString(strings.Replace(exp, "-", "−", 1))
	b.WriteString("</mn></msup></mrow>")
}

func parseNum(s string) float64 {
	v, _ := strconv.ParseFloat(s, 64)
	return v
}

var superscripts = strings.NewReplacer("-", "⁻", "0", "⁰", "1", "¹", "2", "²", "3", "³", "4", "⁴", "5", "⁵", "6", "⁶", "7", "⁷", "8", "⁸", "9", "⁹")

// unitText typesets a unit as text: kJ/(kg·K), m³/kg, °C. It returns plain
// text (escape it for HTML).
func unitText(u units.Unit) string {
	syms, pows := u.Symbols()
	var num, den []string
	for i, s := range syms {
		t := units.Typeset(s)
		n := pows[i]
		if n < 0 {
			n = -n
		}
		if n != 1 {
			t += superscripts.Replace(strconv.Itoa(n))
		}
		if pows[i] > 0 {
			num = append(num, t)
		} else {
			den = append(den, t)
		}
	}
	if len(num) == 0 && len(den) == 0 {
		return ""
	}
	return units.JoinFraction(num, den, "·")
}

// unitMathML writes a unit after a number.
func unitMathML(u units.Unit) string {
	t := unitText(u)
	if t == "" {
		return ""
	}
	if t == "%" || strings.HasPrefix(t, "°") {
		return "<mtext>\u2009" + html.EscapeString(t) + "</mtext>"
	}
	return "<mtext>\u2009" + html.EscapeString(t) + "</mtext>"
}

// quantityMathML writes a quantity in a unit with significant figures.
func quantityMathML(q units.Quantity, u units.Unit, digits int, ctx units.Context) string {
	v, err := q.In(u, ctx)
	if err != nil {
		u = units.DefaultUnit(units.Quantity{V: q.V, D: q.D})
		v = q.V / u.Factor
	}
	var b strings.Builder
	writeQuantity(&b, v, u, digits)
	return b.String()
}

// writeQuantityMathML is quantityMathML written into b.
func writeQuantityMathML(b *strings.Builder, q units.Quantity, u units.Unit, digits int, ctx units.Context) {
	v, err := q.In(u, ctx)
	if err != nil {
		u = units.DefaultUnit(units.Quantity{V: q.V, D: q.D})
		v = q.V / u.Factor
	}
	writeQuantity(b, v, u, digits)
}

// writeQuantity writes a number already in unit u, and the unit.
func writeQuantity(b *strings.Builder, v float64, u units.Unit, digits int) {
	b.WriteString("<mrow>")
	writeNumberMathML(b, v, digits, false)
	b.WriteString(unitMathML(u))
	b.WriteString("</mrow>")
}

// quantityText formats a quantity in a unit as HTML text: "3449 kJ/kg".
func quantityText(q units.Quantity, u units.Unit, digits int, ctx units.Context) string {
	v, err := q.In(u, ctx)
	if err != nil {
		return html.EscapeString(err.Error())
	}
	s := numberText(v, digits)
	if t := unitText(u); t != "" {
		s += "\u2009" + html.EscapeString(t)
	}
	return s
}
