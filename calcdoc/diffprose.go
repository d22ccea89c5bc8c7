package calcdoc

import (
	"strings"

	gast "github.com/yuin/goldmark/ast"
)

// proseContext is the number of unchanged lines shown around a prose change.
const proseContext = 2

// ProseLine is one line of a prose hunk.
type ProseLine struct {
	Op      byte // ' ' unchanged, '-' removed, '+' added
	OldLine int  // 1-based line in the old file; 0 for an added line
	NewLine int  // 1-based line in the new file; 0 for a removed line
	Text    string
}

// Hunk is a run of prose changes with a few unchanged lines around it.
type Hunk struct {
	Lines []ProseLine
}

// proseText is the prose of a calc: every line outside the front matter
// and the calc blocks, with its 1-based line number.
type proseText struct {
	lines []string
	nums  []int
}

// prose returns the prose lines of a read calc.
func (d *Doc) prose() proseText {
	skip := d.calcFenceLines()
	var p proseText
	for i, line := range strings.Split(string(d.Src), "\n") {
		if n := i + 1; !skip[n] {
			p.lines = append(p.lines, strings.TrimRight(line, "\r"))
			p.nums = append(p.nums, n)
		}
	}
	if n := len(p.lines); n > 0 && p.lines[n-1] == "" {
		p.lines, p.nums = p.lines[:n-1], p.nums[:n-1]
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
	if d.MD == nil {
		return skip
	}
	gast.Walk(d.MD, func(n gast.Node, entering bool) (gast.WalkStatus, error) {
		if f, ok := n.(*gast.FencedCodeBlock); ok && entering && string(f.Language(d.body)) == "calc" {
			first, last := d.fenceSpan(f)
			for l := first; l <= last; l++ {
				skip[l] = true
			}
		}
		return gast.WalkContinue, nil
	})
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

// proseHunks compares the prose of two calcs and groups the changes into
// hunks with proseContext unchanged lines around each.
func proseHunks(a, b proseText) []Hunk {
	ops := diffLines(a.lines, b.lines)
	var lines []ProseLine
	for _, op := range ops {
		pl := ProseLine{Op: op.Op}
		switch op.Op {
		case ' ':
			pl.OldLine, pl.NewLine, pl.Text = a.nums[op.A], b.nums[op.B], b.lines[op.B]
		case '-':
			pl.OldLine, pl.Text = a.nums[op.A], a.lines[op.A]
		case '+':
			pl.NewLine, pl.Text = b.nums[op.B], b.lines[op.B]
		}
		lines = append(lines, pl)
	}
	return groupHunks(lines)
}

// groupHunks keeps the changed lines and proseContext lines around each,
// starting a new hunk where more unchanged lines lie between two changes.
func groupHunks(lines []ProseLine) []Hunk {
	keep := make([]bool, len(lines))
	for i, l := range lines {
		if l.Op == ' ' {
			continue
		}
		for j := max(0, i-proseContext); j <= min(len(lines)-1, i+proseContext); j++ {
			keep[j] = true
		}
	}
	var hunks []Hunk
	var cur *Hunk
	for i, l := range lines {
		if !keep[i] {
			cur = nil
			continue
		}
		if cur == nil {
			hunks = append(hunks, Hunk{})
			cur = &hunks[len(hunks)-1]
		}
		cur.Lines = append(cur.Lines, l)
	}
	return hunks
}
