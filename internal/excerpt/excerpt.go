// Package excerpt quotes user text in messages: a value the user wrote or
// a data file holds is quoted in full when it is short and cut to a short
// excerpt when it is long, so a message never carries a whole field of a
// large file. Every message that quotes user text goes through Quote.
package excerpt

import (
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Max is the most runes of user text a message quotes.
const Max = 60

// Quote returns s quoted as %q would, cut to its first Max runes with
// "…" and the total length added when it is longer.
func Quote(s string) string {
	head, cut := split(s)
	if !cut {
		return strconv.Quote(s)
	}
	return strconv.Quote(head) + "… (" + strconv.Itoa(len(s)) + " bytes)"
}

// Cut returns s unquoted when it is at most Max runes and free of control
// characters (a path in a message), and otherwise Quote(s).
func Cut(s string) string {
	if _, cut := split(s); cut || strings.ContainsFunc(s, unicode.IsControl) || !utf8.ValidString(s) {
		return Quote(s)
	}
	return s
}

// split returns the first Max runes of s and whether s is longer.
func split(s string) (string, bool) {
	i := 0
	for k := 0; k < Max; k++ {
		if i == len(s) {
			return s, false
		}
		_, w := utf8.DecodeRuneInString(s[i:])
		i += w
	}
	return s[:i], i < len(s)
}
