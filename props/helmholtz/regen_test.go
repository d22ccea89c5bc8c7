package helmholtz

import (
	"testing"

	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestRegenerateTables holds the organic-fluid coefficient tables to their
// generator: the files go generate writes from testdata/eos equal the
// committed ones.
func TestRegenerateTables(t *testing.T) { testkit.Regenerate(t, 2) }
