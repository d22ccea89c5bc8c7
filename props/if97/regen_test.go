package if97

import (
	"testing"

	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestRegenerateR7 holds the R7-97 code to its generator: the files that
// go generate writes from testdata/r7_coefficients equal the committed ones.
func TestRegenerateR7(t *testing.T) { testkit.Regenerate(t, "./gen/r7", 5) }

// TestRegenerateSR holds the supplementary releases' backward equations to
// their generator (testdata/sr_coefficients).
func TestRegenerateSR(t *testing.T) { testkit.Regenerate(t, "./gen/sr", 5) }
