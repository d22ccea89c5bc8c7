// Package editdist measures how far apart two words are, for the "did you
// mean" hints of error messages. It imports nothing, so that any package may
// use it. (props/helmholtz keeps its own copy: the numerics import only math.)
package editdist

// Bytes is the Levenshtein distance between a and b, counted in bytes.
func Bytes(a, b string) int { return levenshtein([]byte(a), []byte(b)) }

// Runes is the Levenshtein distance between a and b, counted in runes.
func Runes(a, b string) int { return levenshtein([]rune(a), []rune(b)) }

// levenshtein is the fewest insertions, deletions and substitutions that turn
// a into b, computed with two rows.
func levenshtein[T comparable](a, b []T) int {
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
