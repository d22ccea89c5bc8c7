package helmholtz

import (
	"math"
	"testing"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// TestFastExp compares fastExp with fpmath.Exp (math.Exp's pure-Go form,
// the same on every architecture; amd64's assembly math.Exp overflows
// early, near 709.44) over the range the kernel
// uses and beyond, in units in the last place, and at the edges.
func TestFastExp(t *testing.T) {
	worst, at := 0.0, 0.0
	for x := -720.0; x < 720; x += 0.000123457 {
		got, want := fastExp(x), fpmath.Exp(x)
		if want == 0 || math.IsInf(want, 0) {
			if got != want {
				t.Fatalf("fastExp(%g) = %g, want %g", x, got, want)
			}
			continue
		}
		ulp := math.Nextafter(want, math.Inf(1)) - want
		if e := math.Abs(got-want) / ulp; e > worst {
			worst, at = e, x
		}
	}
	if worst > 2 {
		t.Errorf("fastExp: %g ulp from fpmath.Exp at x = %g", worst, at)
	}
	for _, x := range []float64{0, math.Copysign(0, -1), 1, -1, 708, -708, 709, -709, 709.7, 710, -745, -746, math.Inf(1), math.Inf(-1), 1e-300, -1e-300} {
		got, want := fastExp(x), fpmath.Exp(x)
		if want == 0 || math.IsInf(want, 0) || x == 0 {
			if got != want {
				t.Errorf("fastExp(%g) = %g, want %g", x, got, want)
			}
		} else if math.Abs(got/want-1) > 5e-16 {
			t.Errorf("fastExp(%g) = %.17g, want %.17g", x, got, want)
		}
	}
	if !math.IsNaN(fastExp(math.NaN())) {
		t.Error("fastExp(NaN) is not NaN")
	}
}
