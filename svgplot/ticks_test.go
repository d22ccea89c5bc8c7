package svgplot

import (
	"fmt"
	"math"
	"slices"
	"testing"
)

func TestNiceTicks(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	tests := []struct {
		lo, hi float64
		max    int
		want   []float64
	}{
		{0, 10, 6, []float64{0, 2, 4, 6, 8, 10}},
		{0, 10, 11, []float64{0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10}},
		{0, 1, 5, []float64{0, 0.5, 1}},
		{0, 0.3, 4, []float64{0, 0.1, 0.2, 0.3}}, // 0.3 exactly, not 0.30000000000000004
		{-1.3, 2.7, 5, []float64{-1, 0, 1, 2}},
		{-7, -3, 3, []float64{-6, -4}},
		{0.001, 0.0042, 5, []float64{0.001, 0.002, 0.003, 0.004}},
		{0.57, 9.16, 6, []float64{2, 4, 6, 8}},
		{1e6, 5e6, 5, []float64{1e6, 2e6, 3e6, 4e6, 5e6}},
		{-0.25, 0.25, 3, []float64{-0.2, 0, 0.2}},
		{0, 1, 2, []float64{0, 1}},
		{0, 1, 1, nil},
		{5, 5, 3, []float64{5}},
		{5, 5, 1, nil},
		{2, 1, 5, nil},
		{0, 1, 0, nil},
		{nan, 1, 5, nil},
		{0, inf, 5, nil},
		{-math.MaxFloat64, math.MaxFloat64, 5, nil}, // span overflows
		{1e15, 1e15 + 1, 5, nil},                    // float64 cannot tell the ticks apart
	}
	for _, tt := range tests {
		t.Run(fmt.Sprintf("%g_%g_%d", tt.lo, tt.hi, tt.max), func(t *testing.T) {
			got := NiceTicks(tt.lo, tt.hi, tt.max)
			if !slices.Equal(got, tt.want) {
				t.Errorf("NiceTicks(%g, %g, %d) = %v, want %v", tt.lo, tt.hi, tt.max, got, tt.want)
			}
		})
	}
}

func TestNiceTicksNoNegativeZero(t *testing.T) {
	for _, v := range NiceTicks(-1, 1, 5) {
		if v == 0 && math.Signbit(v) {
			t.Errorf("NiceTicks(-1, 1, 5) holds -0")
		}
	}
}

func TestNiceTicksBounds(t *testing.T) {
	// Whatever the range, ticks lie in it, ascend, and are at most maxTicks.
	for _, lo := range []float64{-1234.5, -1, -0.003, 0, 0.1, 7, 1e9} {
		for _, span := range []float64{1e-6, 0.07, 1, 3.3, 99, 12345} {
			if math.Abs(lo) > maxRelSpan*span {
				continue // too narrow for float64; NiceTicks returns nil
			}
			for maxTicks := 2; maxTicks <= 12; maxTicks++ {
				hi := lo + span
				got := NiceTicks(lo, hi, maxTicks)
				if len(got) == 0 || len(got) > maxTicks {
					t.Fatalf("NiceTicks(%g, %g, %d) = %v: want 1 to %d ticks", lo, hi, maxTicks, got, maxTicks)
				}
				if got[0] < lo || got[len(got)-1] > hi || !slices.IsSorted(got) {
					t.Fatalf("NiceTicks(%g, %g, %d) = %v: not ascending inside the range", lo, hi, maxTicks, got)
				}
			}
		}
	}
}

func TestAutoRange(t *testing.T) {
	tests := []struct {
		lo, hi, wantLo, wantHi float64
		max                    int
	}{
		{0.57, 9.16, 0, 10, 8},
		{0, 540, 0, 600, 8},
		{40, 41, 40, 41, 8},
		{-0.31, 0.24, -0.4, 0.3, 8},
		{5, 5, 4.4, 5.6, 8},
		{0, 0, -1, 1, 8},
		{101.3, 101.3, 90, 120, 4},
	}
	for _, tt := range tests {
		lo, hi, _, ok := autoRange(tt.lo, tt.hi, tt.max)
		if !ok || lo != tt.wantLo || hi != tt.wantHi {
			t.Errorf("autoRange(%g, %g, %d) = %g, %g, %v; want %g, %g", tt.lo, tt.hi, tt.max, lo, hi, ok, tt.wantLo, tt.wantHi)
		}
	}
}

func TestTickLabels(t *testing.T) {
	tests := []struct {
		lo, hi float64
		s      step
		want   []string
	}{
		{0, 0.3, step{1, -1}, []string{"0", "0.1", "0.2", "0.3"}},
		{-0.4, 0.4, step{2, -1}, []string{"-0.4", "-0.2", "0", "0.2", "0.4"}},
		{0, 600, step{1, 2}, []string{"0", "100", "200", "300", "400", "500", "600"}},
		{0.5, 1.5, step{5, -1}, []string{"0.5", "1.0", "1.5"}},
		{0, 3e7, step{1, 7}, []string{"0", "1e7", "2e7", "3e7"}},
		{1e7, 2e7, step{5, 6}, []string{"1.0e7", "1.5e7", "2.0e7"}},
		{-2e-5, 2e-5, step{2, -5}, []string{"-2e-5", "0", "2e-5"}},
	}
	for _, tt := range tests {
		got := tickLabels(tt.s.ticks(tt.lo, tt.hi), tt.s)
		if !slices.Equal(got, tt.want) {
			t.Errorf("tickLabels(%g..%g by %de%d) = %q, want %q", tt.lo, tt.hi, tt.s.m, tt.s.exp, got, tt.want)
		}
	}
}

func TestNum(t *testing.T) {
	tests := map[float64]string{
		0: "0", -0.001: "0", math.Copysign(0, -1): "0", 1.5: "1.5", 2.25: "2.25",
		640: "640", -3.999: "-4", 12.3456: "12.35", 100.10: "100.1",
	}
	for v, want := range tests {
		if got := num(v); got != want {
			t.Errorf("num(%g) = %q, want %q", v, got, want)
		}
	}
}

func ExampleNiceTicks() {
	fmt.Println(NiceTicks(0, 540, 8))
	fmt.Println(NiceTicks(0.57, 9.16, 8))
	fmt.Println(NiceTicks(0, 0.3, 4))
	// Output:
	// [0 100 200 300 400 500]
	// [2 4 6 8]
	// [0 0.1 0.2 0.3]
}
