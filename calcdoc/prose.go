package calcdoc

import (
	"github.com/vouchcalc/vouch/calcdoc/settings"
	"strings"

	gast "github.com/yuin/goldmark/ast"
)

// Prose is the prose of a calc: every line outside the front matter and
// the calc blocks, with its 1-based line number.
type Prose struct {
	Lines []string
	Nums  []int
}

// Prose returns the prose lines of a read calc.
func (d *Doc) Prose() Prose {
	skip := d.calcFenceLines()
	var p Prose
	for i, line := range strings.Split(string(d.Src), "\n") {
		if n := i + 1; !skip[n] {
			p.Lines = append(p.Lines, strings.TrimRight(line, "\r"))
			p.Nums = append(p.Nums, n)
		}
	}
	if n := len(p.Lines); n > 0 && p.Lines[n-1] == "" {
		p.Lines, p.Nums = p.Lines[:n-1], p.Nums[:n-1]
	}
	return p
}

// calcFenceLines marks the lines of the front matter and of every calc
// block, its fence lines included.
func (d *Doc) calcFenceLines() map[int]bool {
	skip := map[int]bool{}
	if _, _, end, err := splitFront(d.Src); err == nil && end > 0 {
		for n := 1; n <= d.lines.pos(d.Src, end-1).Line; n++ {
			skip[n] = true
		}
	}
	for _, f := range d.fences.calcs {
		first, last := d.fenceSpan(f)
		for l := first; l <= last; l++ {
			skip[l] = true
		}
	}
	return skip
}

// fenceSpan returns the first and last line of a fenced block, its opening
// and closing fences included.
func (d *Doc) fenceSpan(f *gast.FencedCodeBlock) (first, last int) {
	first = d.lines.pos(d.Src, f.Info.Segment.Start).Line
	last = first
	if n := f.Lines().Len(); n > 0 {
		last = d.lines.pos(d.Src, f.Lines().At(n-1).Start).Line
	}
	return first, min(last+1, d.lines.count())
}

// SourceLine returns line n (1-based) of the calc file as written, without
// its line break and surrounding blanks.
func (d *Doc) SourceLine(n int) string {
	if n < 1 || n > d.lines.count() {
		return ""
	}
	return strings.TrimSpace(d.lines.text(d.Src, n))
}

// FrontNumber is the calc number in a file's front matter, or "": a quick
// look that does not read the rest of the file.
func FrontNumber(src []byte) string {
	yml, _, end, err := splitFront(src)
	if err != nil || end == 0 {
		return ""
	}
	f, _ := parseFront(yml, settings.Default())
	return f.Number
}
