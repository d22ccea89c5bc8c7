package fpmath

import (
	"math"
	"testing"
)

// sink keeps the benchmarked results alive.
var sink float64

// benchFunc times f over a spread of arguments in [lo, hi].
func benchFunc(b *testing.B, f func(float64) float64, lo, hi float64) {
	xs := samples(lo, hi, 1024)
	s := 0.0
	for i := 0; b.Loop(); i++ {
		s += f(xs[i&1023])
	}
	sink = s
}

// The pairs compare each copy with package math's function on this
// machine (on amd64, math's Exp and Log are assembly).
func BenchmarkExp(b *testing.B)     { benchFunc(b, Exp, -50, 50) }
func BenchmarkMathExp(b *testing.B) { benchFunc(b, math.Exp, -50, 50) }
func BenchmarkLog(b *testing.B)     { benchFunc(b, Log, 1e-3, 1e3) }
func BenchmarkMathLog(b *testing.B) { benchFunc(b, math.Log, 1e-3, 1e3) }
func BenchmarkPow(b *testing.B) {
	benchFunc(b, func(x float64) float64 { return Pow(x, 0.37) }, 0.1, 10)
}
func BenchmarkMathPow(b *testing.B) {
	benchFunc(b, func(x float64) float64 { return math.Pow(x, 0.37) }, 0.1, 10)
}
func BenchmarkLog1p(b *testing.B)     { benchFunc(b, Log1p, -0.5, 10) }
func BenchmarkMathLog1p(b *testing.B) { benchFunc(b, math.Log1p, -0.5, 10) }
