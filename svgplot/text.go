package svgplot

import (
	"strings"
	"unicode/utf8"
)

// subScale is the size of a subscript relative to the text around it;
// subDrop is how far, in em of the text around it, a subscript reaches
// below the baseline.
const (
	subScale = 0.75
	subDrop  = 0.3
)

// Run is a stretch of label text in one style.
type Run struct {
	// Text is the text of the run, drawn as given (escaped).
	Text string
	// Italic sets the run in italics, as a symbol: "η", "T".
	Italic bool
	// Sub lowers the run and sets it smaller, as a subscript: "th".
	Sub bool
}

// Text is a label made of runs, such as η (italic) followed by th
// (subscript) followed by " [%]". The zero value is empty.
type Text []Run

// Plain returns s as one upright run; the empty string gives empty Text.
func Plain(s string) Text {
	if s == "" {
		return nil
	}
	return Text{{Text: s}}
}

// String returns the text without its styles, a subscript written after
// an underscore: "η_th [%]". It is used where markup cannot go (accessible
// names, tooltips).
func (t Text) String() string {
	var b strings.Builder
	for _, r := range t {
		if r.Sub {
			b.WriteByte('_')
		}
		b.WriteString(r.Text)
	}
	return b.String()
}

// empty reports whether the text has no characters.
func (t Text) empty() bool {
	for _, r := range t {
		if r.Text != "" {
			return false
		}
	}
	return true
}

// drop returns how far below the baseline the text reaches at font size
// fs: subDrop em when it has a subscript, else nothing (descenders are
// ignored, as they are for every label).
func (t Text) drop(fs float64) float64 {
	for _, r := range t {
		if r.Sub && r.Text != "" {
			return float64(subDrop * fs)
		}
	}
	return 0
}

// width estimates the width in px of the text at font size fs.
func (t Text) width(fs float64) float64 {
	w := 0.0
	for _, r := range t {
		n := float64(utf8.RuneCountInString(r.Text))
		if r.Sub {
			n = float64(n * subScale)
		}
		w += float64(charEm * fs * n)
	}
	return w
}

// orText returns t, or s as plain text when t is empty.
func orText(t Text, s string) Text {
	if !t.empty() {
		return t
	}
	return Plain(s)
}

// rich writes a <text> element holding the runs of t, each styled run in a
// <tspan>; a subscript is shifted with baseline-shift so the runs after it
// return to the baseline by themselves.
func (w *writer) rich(t Text, attrs ...string) {
	w.tag("text", attrs)
	w.b.WriteByte('>')
	for _, r := range t {
		if r.Text == "" {
			continue
		}
		var a []string
		if r.Italic {
			a = append(a, "font-style", "italic")
		}
		if r.Sub {
			a = append(a, "baseline-shift", "sub", "font-size", "75%")
		}
		if len(a) == 0 {
			w.b.WriteString(escape(r.Text))
			continue
		}
		w.tag("tspan", a)
		w.b.WriteByte('>')
		w.b.WriteString(escape(r.Text))
		w.b.WriteString("</tspan>")
	}
	w.end("text")
}
