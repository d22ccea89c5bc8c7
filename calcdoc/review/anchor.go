package review

import (
	"fmt"
	"regexp"
	"strings"
	"unicode/utf8"
)

// MaxQuote is the longest quote, in characters, stored with a comment.
const MaxQuote = 48

// defPrefix matches the start of a calc definition, NAME [UNIT] =.
var defPrefix = regexp.MustCompile(`^[A-Za-z_][A-Za-z0-9_]*\s*(\[[^\]]*\])?\s*=`)

// QuoteOf is the quote stored with a comment on a line: for a calc
// definition its name up to the = sign (so a comment on a value stays on
// its line when the value is corrected), otherwise the start of the
// line's text, at most MaxQuote characters.
func QuoteOf(line string) string {
	s := strings.TrimSpace(line)
	if m := defPrefix.FindString(s); m != "" {
		return m
	}
	if utf8.RuneCountInString(s) > MaxQuote {
		s = string([]rune(s)[:MaxQuote])
	}
	return strings.TrimSpace(s)
}

// Place is where a comment stands in the calc as it is now.
type Place struct {
	Line int // the line it concerns now (the heading's line for a section)
	From int // the line the record names, when the comment moved; else 0
	Lost bool
}

// Lines splits a calc file into its lines, without line ends.
func Lines(src []byte) []string {
	s := strings.ReplaceAll(string(src), "\r\n", "\n")
	s = strings.TrimSuffix(s, "\n")
	return strings.Split(s, "\n")
}

// Anchor finds each comment in the calc's lines: at the line the record
// names when that line still starts with the quote, otherwise at the
// nearest line that does (a comment follows its line when lines are
// inserted or removed above it), a section at its heading. A comment that
// is not closed and cannot be found is an error naming the comment; a
// closed one is marked Lost, its resolution kept. name is the calc's name
// for messages.
func (f *File) Anchor(name string, lines []string) ([]Place, error) {
	out := make([]Place, len(f.Items))
	var errs ErrorList
	for i, it := range f.Items {
		p, msg := it.place(lines, name)
		if msg != "" && it.Status != Closed {
			errs = append(errs, &Error{File: PathFor(name), Line: max(it.pos, 1), Col: 1, Item: it.ID, Msg: msg})
		}
		out[i] = p
	}
	return out, errs.Err()
}

// place finds one comment, or says why it cannot.
func (it *Item) place(lines []string, name string) (Place, string) {
	if it.Section != "" {
		for i, l := range lines {
			if headingText(l) == it.Section {
				return Place{Line: i + 1}, ""
			}
		}
		return Place{Lost: true}, fmt.Sprintf("%s has no heading %q any more; the section was renamed or removed: add the comment again where it belongs, or close it", name, it.Section)
	}
	at := func(n int) bool { return n >= 1 && n <= len(lines) && matches(lines[n-1], it.Quote) }
	if at(it.Line) {
		return Place{Line: it.Line}, ""
	}
	for d := 1; d < len(lines)+it.Line; d++ {
		for _, n := range []int{it.Line - d, it.Line + d} {
			if at(n) {
				return Place{Line: n, From: it.Line}, ""
			}
		}
	}
	where := fmt.Sprintf("line %d no longer reads %q", it.Line, it.Quote)
	if it.Line > len(lines) {
		where = fmt.Sprintf("it names line %d, but %s has %d lines", it.Line, name, len(lines))
	}
	return Place{Lost: true}, where + ", and no line of the calc starts so: the line it concerned was changed or removed; add the comment again at the line it now concerns, or close it"
}

// matches reports whether a line's text starts with the quote.
func matches(line, quote string) bool {
	return quote != "" && strings.HasPrefix(strings.TrimSpace(line), quote)
}

// headingText is the text of a Markdown ATX heading line, or "".
func headingText(line string) string {
	s := strings.TrimSpace(line)
	t := strings.TrimLeft(s, "#")
	if n := len(s) - len(t); n == 0 || n > 6 || (t != "" && t[0] != ' ' && t[0] != '\t') {
		return ""
	}
	return strings.TrimSpace(strings.TrimRight(strings.TrimSpace(t), "#"))
}

// Reanchor moves each comment the calc's edit displaced to the line it
// stands on now, so the record names the calc's current lines. The quote
// is kept. Call it with the places Anchor returned.
func (f *File) Reanchor(places []Place) {
	for i, it := range f.Items {
		if p := places[i]; it.Line > 0 && !p.Lost && p.From != 0 {
			it.Line = p.Line
		}
	}
}
