package diff

import "github.com/vouchcalc/vouch/calcdoc"

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

// proseHunks compares the prose of two calcs and groups the changes into
// hunks with proseContext unchanged lines around each.
func proseHunks(a, b calcdoc.Prose) []Hunk {
	ops := diffLines(a.Lines, b.Lines)
	var lines []ProseLine
	for _, op := range ops {
		pl := ProseLine{Op: op.Op}
		switch op.Op {
		case ' ':
			pl.OldLine, pl.NewLine, pl.Text = a.Nums[op.A], b.Nums[op.B], b.Lines[op.B]
		case '-':
			pl.OldLine, pl.Text = a.Nums[op.A], a.Lines[op.A]
		case '+':
			pl.NewLine, pl.Text = b.Nums[op.B], b.Lines[op.B]
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
