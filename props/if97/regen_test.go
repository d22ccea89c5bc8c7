package if97

import (
	"testing"

	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestRegenerate holds the generated R7-97 and supplementary-release code
// to its generators: go generate (the R7 and SR generators, then the float
// guard) writes the committed files byte for byte.
func TestRegenerate(t *testing.T) { testkit.Regenerate(t, 20) }
