package excerpt

import (
	"strings"
	"testing"
	"unicode/utf8"
)

func TestQuote(t *testing.T) {
	if got := Quote("12.5 MPa"); got != `"12.5 MPa"` {
		t.Errorf("short: %s", got)
	}
	long := strings.Repeat("é", 10_000)
	got := Quote(long)
	if len(got) > 200 || !strings.Contains(got, "… (20000 bytes)") {
		t.Errorf("long: %s", got)
	}
}

// FuzzQuote: a quote is short and valid UTF-8 whatever the text.
func FuzzQuote(f *testing.F) {
	f.Add("abc")
	f.Add(strings.Repeat("x\xff", 100))
	f.Fuzz(func(t *testing.T, s string) {
		q := Quote(s)
		if len(q) > 4*Max*4+40 || !utf8.ValidString(q) {
			t.Fatalf("Quote(%q) = %q", s, q)
		}
	})
}

func TestCut(t *testing.T) {
	if got := Cut("data/feed.csv"); got != "data/feed.csv" {
		t.Errorf("short path: %s", got)
	}
	if got := Cut("a\x1b[8mb"); got != `"a\x1b[8mb"` {
		t.Errorf("control characters: %s", got)
	}
	if got := Cut(strings.Repeat("d/", 1000)); !strings.HasSuffix(got, "… (2000 bytes)") {
		t.Errorf("long path: %s", got)
	}
}
