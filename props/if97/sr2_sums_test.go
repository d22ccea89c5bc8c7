package if97

import (
	"math"
	"math/rand"
	"testing"
)

// srStraight pairs a coefficient table with its straight-line sum (sr*_sums.go); sum is set for
// srTable.sum, sum1 for srTable.sum1.
type srStraight struct {
	name string
	tab  *srTable
	sum  func(x, y float64) float64
	sum1 func(x float64) float64
}

// TestSRStraightSums checks that every straight-line sum gives the table's sum bit for bit, at
// random arguments of both signs and over several decades.
func TestSRStraightSums(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	arg := func() float64 {
		x := math.Exp(rng.Float64()*6 - 4)
		if rng.Intn(4) == 0 {
			x = -x
		}
		return x
	}
	for _, e := range srStraightIndex {
		for k := 0; k < 200; k++ {
			x, y := arg(), arg()
			var got, want float64
			if e.sum1 != nil {
				got, want = e.sum1(x), e.tab.sum1(x)
			} else {
				got, want = e.sum(x, y), e.tab.sum(x, y)
			}
			if math.Float64bits(got) != math.Float64bits(want) {
				t.Errorf("%s(%v, %v) = %v, table gives %v", e.name, x, y, got, want)
				break
			}
		}
	}
	if len(srStraightIndex) != 62 {
		t.Errorf("%d straight-line sums, want 62 (all tables but the saturation equation)", len(srStraightIndex))
	}
}
