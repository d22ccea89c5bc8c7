package review

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// FuzzParse: any bytes give a record or errors, never a panic, and a
// record that parses round-trips through Marshal to the same bytes.
func FuzzParse(f *testing.F) {
	seed, err := os.ReadFile(filepath.Join("..", "..", "examples", "rankine-simple.review.yaml"))
	if err != nil {
		f.Fatal(err)
	}
	f.Add(seed)
	f.Add([]byte("comments: []\n"))
	f.Add([]byte("comments:\n  - {id: C1, section: \"Heat \\u00b0C\", author: a, text: \"t\\n2\", status: open}\n"))
	f.Fuzz(func(t *testing.T, src []byte) {
		rec, err := Parse("x.review.yaml", src)
		if err != nil {
			return
		}
		out := rec.Marshal("x.calc.md")
		back, err := Parse("x.review.yaml", out)
		if err != nil {
			t.Fatalf("marshalled record does not parse: %v\n%s", err, out)
		}
		if again := back.Marshal("x.calc.md"); !bytes.Equal(again, out) {
			t.Fatalf("not stable:\n%s\n---\n%s", out, again)
		}
	})
}
