package svgplot

import (
	"bytes"
	"strconv"
	"strings"
	"unicode"
)

// writer accumulates SVG markup. Attributes are passed as name, value
// pairs; values and text are escaped here, names are trusted constants.
type writer struct{ b bytes.Buffer }

// start writes an opening tag.
func (w *writer) start(name string, attrs ...string) {
	w.tag(name, attrs)
	w.b.WriteString(">\n")
}

// empty writes a self-closing element.
func (w *writer) empty(name string, attrs ...string) {
	w.tag(name, attrs)
	w.b.WriteString("/>\n")
}

// end writes a closing tag.
func (w *writer) end(name string) {
	w.b.WriteString("</" + name + ">\n")
}

// text writes an element holding escaped text.
func (w *writer) text(name, content string, attrs ...string) {
	w.tag(name, attrs)
	w.b.WriteByte('>')
	w.b.WriteString(escape(content))
	w.end(name)
}

// title writes a <title> child, the tooltip and accessible name of its parent.
func (w *writer) title(s string) {
	if s != "" {
		w.text("title", s)
	}
}

func (w *writer) tag(name string, attrs []string) {
	w.b.WriteString("<" + name)
	for i := 0; i+1 < len(attrs); i += 2 {
		w.b.WriteString(" " + attrs[i] + `="`)
		w.b.WriteString(escape(attrs[i+1]))
		w.b.WriteByte('"')
	}
}

// num formats a coordinate with at most two decimals, without trailing
// zeros and never as "-0".
func num(v float64) string {
	s := strconv.FormatFloat(v, 'f', 2, 64)
	s = strings.TrimRight(s, "0")
	s = strings.TrimSuffix(s, ".")
	return noNegZero(s)
}

// points formats vertices in px for a points attribute.
func points(vs []vec) string {
	var sb strings.Builder
	for i, v := range vs {
		if i > 0 {
			sb.WriteByte(' ')
		}
		sb.WriteString(num(v.x))
		sb.WriteByte(',')
		sb.WriteString(num(v.y))
	}
	return sb.String()
}

// escaper escapes the characters special in XML and HTML text and attributes.
var escaper = strings.NewReplacer(
	"&", "&amp;", "<", "&lt;", ">", "&gt;", `"`, "&#34;", "'", "&#39;")

// escape makes user text safe as SVG text or attribute value: invalid
// UTF-8 becomes U+FFFD, control characters become spaces, and markup
// characters become character references.
func escape(s string) string {
	if plain(s) {
		return s
	}
	s = strings.ToValidUTF8(s, "\uFFFD")
	s = strings.Map(func(r rune) rune {
		if unicode.IsControl(r) {
			return ' '
		}
		return r
	}, s)
	return escaper.Replace(s)
}

// plain reports whether s is printable ASCII without markup characters, as
// numbers and most attribute values are, and so needs no escaping.
func plain(s string) bool {
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c < 0x20, c >= 0x7f, c == '&', c == '<', c == '>', c == '"', c == '\'':
			return false
		}
	}
	return true
}
