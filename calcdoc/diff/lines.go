package diff

// Line diff (Myers' O(ND) algorithm) for the prose of two revisions and for
// the similarity of renamed calc files.

// maxEdits bounds the edit distance searched for; texts further apart than
// this are shown as one removal and one addition.
const maxEdits = 1000

// editOp is one line of an edit script: ' ' keeps line A of the old text
// (which is line B of the new one), '-' removes line A, '+' adds line B.
type editOp struct {
	Op   byte
	A, B int // 0-based line indexes into the old and new texts
}

// diffLines returns an edit script that turns a into b, with as few
// removals and additions as the search bound allows.
func diffLines(a, b []string) []editOp {
	pre := 0
	for pre < len(a) && pre < len(b) && a[pre] == b[pre] {
		pre++
	}
	suf := 0
	for suf < len(a)-pre && suf < len(b)-pre && a[len(a)-1-suf] == b[len(b)-1-suf] {
		suf++
	}
	var ops []editOp
	for i := 0; i < pre; i++ {
		ops = append(ops, editOp{' ', i, i})
	}
	for _, op := range myers(a[pre:len(a)-suf], b[pre:len(b)-suf]) {
		ops = append(ops, editOp{op.Op, op.A + pre, op.B + pre})
	}
	for i := suf; i > 0; i-- {
		ops = append(ops, editOp{' ', len(a) - i, len(b) - i})
	}
	return ops
}

// myers finds a shortest edit script, keeping for each step d the furthest
// reaching x on diagonals -d-1..d+1 so the path can be traced back.
func myers(a, b []string) []editOp {
	n, m := len(a), len(b)
	if n == 0 || m == 0 {
		return replaceAll(n, m)
	}
	off := n + m + 1
	v := make([]int, 2*off+1)
	var trace [][]int
	for d := 0; d <= min(n+m, maxEdits); d++ {
		trace = append(trace, append([]int(nil), v[off-d-1:off+d+2]...))
		for k := -d; k <= d; k += 2 {
			x := v[off+k-1] + 1
			if k == -d || k != d && v[off+k-1] < v[off+k+1] {
				x = v[off+k+1]
			}
			y := x - k
			for x < n && y < m && a[x] == b[y] {
				x, y = x+1, y+1
			}
			v[off+k] = x
			if x >= n && y >= m {
				return backtrack(trace, n, m)
			}
		}
	}
	return replaceAll(n, m)
}

// backtrack walks the trace from the end to the start and returns the
// edit script in order.
func backtrack(trace [][]int, x, y int) []editOp {
	var rev []editOp
	for d := len(trace) - 1; d >= 0; d-- {
		at := func(k int) int { return trace[d][k+d+1] }
		k := x - y
		prevK := k - 1
		if k == -d || k != d && at(k-1) < at(k+1) {
			prevK = k + 1
		}
		prevX := at(prevK)
		prevY := prevX - prevK
		for x > prevX && y > prevY {
			x, y = x-1, y-1
			rev = append(rev, editOp{' ', x, y})
		}
		if d > 0 {
			if x == prevX {
				rev = append(rev, editOp{'+', x, y - 1})
			} else {
				rev = append(rev, editOp{'-', x - 1, y})
			}
		}
		x, y = prevX, prevY
	}
	for i, j := 0, len(rev)-1; i < j; i, j = i+1, j-1 {
		rev[i], rev[j] = rev[j], rev[i]
	}
	return rev
}

// replaceAll removes every old line and adds every new one.
func replaceAll(n, m int) []editOp {
	var ops []editOp
	for i := 0; i < n; i++ {
		ops = append(ops, editOp{'-', i, 0})
	}
	for j := 0; j < m; j++ {
		ops = append(ops, editOp{'+', n, j})
	}
	return ops
}

// similarity is the share of lines two texts have in common, from 0 to 1:
// twice the kept lines over the lines of both.
func similarity(a, b []string) float64 {
	if len(a)+len(b) == 0 {
		return 1
	}
	kept := 0
	for _, op := range diffLines(a, b) {
		if op.Op == ' ' {
			kept++
		}
	}
	return 2 * float64(kept) / float64(len(a)+len(b))
}
