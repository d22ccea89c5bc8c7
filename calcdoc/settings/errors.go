package settings

import (
	"fmt"
	"sort"
	"strings"
	"unicode/utf8"
)

// Error is a message at a line and column of the settings file.
type Error struct {
	File string
	Line int // 1-based
	Col  int // 1-based, in characters
	Msg  string
}

// Error prints file:line:col: message.
func (e *Error) Error() string {
	return fmt.Sprintf("%s:%d:%d: %s", e.File, e.Line, e.Col, e.Msg)
}

// ErrorList gathers every error of the settings file, in file order.
type ErrorList []*Error

// Error prints one error per line.
func (l ErrorList) Error() string {
	s := make([]string, len(l))
	for i, e := range l {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

func (l ErrorList) sort() {
	sort.SliceStable(l, func(i, j int) bool {
		if l[i].Line != l[j].Line {
			return l[i].Line < l[j].Line
		}
		return l[i].Col < l[j].Col
	})
}

// Format prints each error as file:line:col: message, then the source line
// and a caret under the column, as the calc file's errors are printed.
func (l ErrorList) Format(src []byte) string {
	var b strings.Builder
	lines := strings.Split(string(src), "\n")
	for _, e := range l {
		fmt.Fprintf(&b, "%s\n", e.Error())
		if e.Line < 1 || e.Line > len(lines) {
			continue
		}
		text := strings.TrimRight(lines[e.Line-1], "\r")
		if len(text) > 200 || !utf8.ValidString(text) {
			continue
		}
		pad := []rune{}
		for i, r := range []rune(text) {
			if i+1 >= e.Col {
				break
			}
			if r != '\t' {
				r = ' '
			}
			pad = append(pad, r)
		}
		fmt.Fprintf(&b, "    %s\n    %s^\n", text, string(pad))
	}
	return b.String()
}
