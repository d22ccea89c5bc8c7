package calcdoc

import (
	"strings"

	"github.com/vouchcalc/vouch/svgplot"
	"github.com/vouchcalc/vouch/units"
)

// nameRuns typesets a calc name for a plot as the package body does: the
// symbol in italics (a Greek letter when it names one, with a dot over it
// for "dot"), the rest as a subscript with further _ shown as commas.
func nameRuns(name string) svgplot.Text {
	base, sub, _ := strings.Cut(name, "_")
	sym := greekText(base)
	if rest, ok := cutWord(sub, "dot"); ok {
		sym += "\u0307"
		sub = rest
	}
	t := svgplot.Text{{Text: sym, Italic: true}}
	if sub != "" {
		t = append(t, svgplot.Run{Text: strings.ReplaceAll(sub, "_", ","), Sub: true})
	}
	return t
}

// symbolRuns is a one-letter quantity symbol in italics followed by plain
// text: "s [kJ/(kg·K)]".
func symbolRuns(sym, rest string) svgplot.Text {
	return svgplot.Text{{Text: sym, Italic: true}, {Text: rest}}
}

// axisText is the label of a plot axis: the typeset name and, when the
// unit has a symbol, the unit in brackets: η_th [%].
func axisText(name string, u units.Unit) svgplot.Text {
	t := nameRuns(name)
	if ut := unitText(u); ut != "" {
		t = append(t, svgplot.Run{Text: " [" + ut + "]"})
	}
	return t
}

// joinText joins typeset texts with plain separators between them.
func joinText(sep string, parts ...svgplot.Text) svgplot.Text {
	var out svgplot.Text
	for i, p := range parts {
		if i > 0 {
			out = append(out, svgplot.Run{Text: sep})
		}
		out = append(out, p...)
	}
	return out
}

// namedValue is "v_max = 3.00 m/s": a typeset name and its value in unit u
// with digits significant figures.
func namedValue(name string, q units.Quantity, u units.Unit, digits int, ctx units.Context) svgplot.Text {
	return append(nameRuns(name), svgplot.Run{Text: " = " + quantityPlain(q, u, digits, ctx)})
}

// quantityPlain is a quantity as plain text with a typeset unit, trailing
// zeros of the fraction dropped: "8 kPa",
// "540 °C"; in the SI unit of its dimension when u does not fit.
func quantityPlain(q units.Quantity, u units.Unit, digits int, ctx units.Context) string {
	v, err := q.In(u, ctx)
	if err != nil {
		u = units.DefaultUnit(units.Quantity{V: q.V, D: q.D})
		v = q.V / u.Factor
	}
	s := strings.Replace(trimZeros(units.FormatSig(v, digits)), "-", "−", 1)
	if t := unitText(u); t != "" {
		s += "\u2009" + t
	}
	return s
}

// trimZeros drops the trailing zeros of a fraction written in fixed
// notation, for labels on plots: "2.500" → "2.5", "8.00" → "8".
func trimZeros(s string) string {
	if strings.Contains(s, ".") && !strings.ContainsAny(s, "eE") {
		s = strings.TrimSuffix(strings.TrimRight(s, "0"), ".")
	}
	return s
}
