package units

import (
	"fmt"

	"github.com/vouchcalc/vouch/internal/editdist"
)

// Nearest returns the candidate closest to s by edit distance, or "" when
// none is close enough to be a plausible typo.
func Nearest(s string, candidates []string) string {
	best, bestD := "", len(s)/4+2
	for _, c := range candidates {
		d := editdist.Bytes(s, c)
		if d < bestD || (d == bestD && c < best) {
			best, bestD = c, d
		}
	}
	return best
}

func sprintf(format string, args ...any) string { return fmt.Sprintf(format, args...) }
