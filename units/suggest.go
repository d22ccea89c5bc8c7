package units

import "fmt"

// Nearest returns the candidate closest to s by edit distance, or "" when
// none is close enough to be a plausible typo.
func Nearest(s string, candidates []string) string {
	best, bestD := "", len(s)/4+2
	for _, c := range candidates {
		d := editDistance(s, c)
		if d < bestD || (d == bestD && c < best) {
			best, bestD = c, d
		}
	}
	return best
}

// editDistance is the Levenshtein distance between two strings, by bytes.
// (props/helmholtz and calcdoc/provenance keep their own copies: the
// numerics import only math, and provenance does not depend on units.)
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}

func sprintf(format string, args ...any) string { return fmt.Sprintf(format, args...) }
