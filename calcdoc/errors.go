package calcdoc

import (
	"fmt"
	"sort"
	"strings"
	"unicode/utf8"
)

// Pos is a position in a calc file: byte offset, 1-based line and 1-based
// column counted in characters.
type Pos struct {
	Off  int
	Line int
	Col  int
}

// Error is a message at a position of a calc file.
type Error struct {
	Pos Pos
	Msg string
}

// Error returns "line:col: message".
func (e *Error) Error() string {
	return fmt.Sprintf("%d:%d: %s", e.Pos.Line, e.Pos.Col, e.Msg)
}

// ErrorList gathers every error of a file. Like go/scanner's list it is an
// error itself; Err returns nil for an empty list.
type ErrorList []*Error

// Error returns the first error and the number of others.
func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0], len(l)-1)
}

// Err returns the list as an error, or nil when it is empty.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}

// Sort orders the errors by position.
func (l ErrorList) Sort() {
	sort.SliceStable(l, func(i, j int) bool { return l[i].Pos.Off < l[j].Pos.Off })
}

// Format prints each error as file:line:col: message, then the source line
// and a caret under the column.
func (l ErrorList) Format(file string, src []byte) string {
	var b strings.Builder
	lines := newLineIndex(src)
	for _, e := range l {
		fmt.Fprintf(&b, "%s:%d:%d: %s\n", file, e.Pos.Line, e.Pos.Col, e.Msg)
		if e.Pos.Line < 1 || e.Pos.Line > lines.count() {
			continue
		}
		text := lines.text(src, e.Pos.Line)
		if len(text) > 200 || !utf8.ValidString(text) {
			continue
		}
		fmt.Fprintf(&b, "    %s\n    %s^\n", text, caretPad(text, e.Pos.Col))
	}
	return b.String()
}

// caretPad returns the blanks (tabs kept) that put a caret under column col.
func caretPad(text string, col int) string {
	var b strings.Builder
	n := 1
	for _, r := range text {
		if n >= col {
			break
		}
		if r == '\t' {
			b.WriteByte('\t')
		} else {
			b.WriteByte(' ')
		}
		n++
	}
	return b.String()
}

// lineIndex maps byte offsets to lines and columns.
type lineIndex struct{ starts []int }

func newLineIndex(src []byte) lineIndex {
	starts := []int{0}
	for i, c := range src {
		if c == '\n' {
			starts = append(starts, i+1)
		}
	}
	return lineIndex{starts}
}

func (x lineIndex) count() int { return len(x.starts) }

// pos converts a byte offset to a position.
func (x lineIndex) pos(src []byte, off int) Pos {
	off = min(max(off, 0), len(src))
	i := sort.Search(len(x.starts), func(i int) bool { return x.starts[i] > off }) - 1
	col := utf8.RuneCount(src[x.starts[i]:off]) + 1
	if i == 0 && off >= bomLen(src) && bomLen(src) > 0 {
		col-- // the byte-order mark takes no column
	}
	return Pos{Off: off, Line: i + 1, Col: col}
}

// text returns line n (1-based) without its line break.
func (x lineIndex) text(src []byte, n int) string {
	start := x.starts[n-1]
	end := len(src)
	if n < len(x.starts) {
		end = x.starts[n] - 1
	}
	if n == 1 {
		start += bomLen(src)
	}
	return strings.TrimRight(string(src[start:end]), "\r")
}

// UsageError is a command that cannot start: a file that cannot be read,
// a bad allowed-signers file, a role or key that cannot be used, an
// unknown revision. The CLI exits with its usage code.
type UsageError struct{ Err error }

// Error returns the underlying error's message.
func (e *UsageError) Error() string { return e.Err.Error() }

// Unwrap returns the underlying error.
func (e *UsageError) Unwrap() error { return e.Err }
