package fpmath

import (
	"crypto/sha256"
	"encoding/binary"
	"fmt"
	"math"
	"runtime"
	"testing"
)

// funcs are the copies, each with math's function and a domain to sample.
var funcs = []struct {
	name   string
	f, ref func(float64) float64
	lo, hi float64
}{
	{"Exp", Exp, math.Exp, -745, 709},
	{"Exp2", Exp2, math.Exp2, -1074, 1024},
	{"Expm1", Expm1, math.Expm1, -40, 709},
	{"Log", Log, math.Log, 1e-300, 1e300},
	{"Log2", Log2, math.Log2, 1e-300, 1e300},
	{"Log10", Log10, math.Log10, 1e-300, 1e300},
	{"Log1p", Log1p, math.Log1p, -0.999999, 1e300},
	{"Cbrt", Cbrt, math.Cbrt, -1e300, 1e300},
	{"Sin", Sin, math.Sin, -1e6, 1e6},
	{"Cos", Cos, math.Cos, -1e6, 1e6},
	{"Tan", Tan, math.Tan, -1e6, 1e6},
	{"Asin", Asin, math.Asin, -1, 1},
	{"Acos", Acos, math.Acos, -1, 1},
	{"Atan", Atan, math.Atan, -1e10, 1e10},
	{"Pow(x, 1.37)", func(x float64) float64 { return Pow(x, 1.37) }, func(x float64) float64 { return math.Pow(x, 1.37) }, 1e-200, 1e200},
	{"Pow(1.0001, y)", func(y float64) float64 { return Pow(1.0001, y) }, func(y float64) float64 { return math.Pow(1.0001, y) }, -7e6, 7e6},
	{"Hypot(x, 3)", func(x float64) float64 { return Hypot(x, 3) }, func(x float64) float64 { return math.Hypot(x, 3) }, -1e3, 1e3},
}

// samples returns n points spread over [lo, hi]: evenly for a narrow
// domain, logarithmically for a wide one.
func samples(lo, hi float64, n int) []float64 {
	xs := make([]float64, 0, n)
	for i := range n {
		// Rounded explicitly and with this package's Pow, so that the
		// samples are the same bits on every architecture.
		u := float64(i) / float64(n-1)
		x := lo + float64((hi-lo)*u)
		if lo > 0 && hi/lo > 1e6 {
			x = float64(lo * Pow(hi/lo, u))
		}
		xs = append(xs, x)
	}
	return xs
}

// ulps is the distance between a and b in units in the last place.
func ulps(a, b float64) uint64 {
	ia, ib := int64(math.Float64bits(a)), int64(math.Float64bits(b))
	if ia < 0 {
		ia = math.MinInt64 - ia
	}
	if ib < 0 {
		ib = math.MinInt64 - ib
	}
	if ia > ib {
		return uint64(ia - ib)
	}
	return uint64(ib - ia)
}

// TestCloseToMath: each copy is within 4 ulps of package math, whatever
// the architecture's math does: amd64's assembly Exp is itself up to 2 ulps
// from the true value (Exp(-181.91499999999996) gives ...472e-80, the
// rounded true value is ...474e-80 and this copy gives ...475e-80), and it
// overflows to +Inf above about 709.49, below the true limit 709.78.
//
// It runs on amd64 only: on arm64, package math's pure-Go functions are
// compiled with fused multiply-add, which moves Asin and Acos near ±1 (where
// 1 - x*x cancels) by up to about 20 ulps; these copies then give what
// amd64's math gives.
func TestCloseToMath(t *testing.T) {
	if runtime.GOARCH != "amd64" {
		t.Skip("package math is compiled with fused multiply-add on " + runtime.GOARCH)
	}
	for _, c := range funcs {
		for _, x := range samples(c.lo, c.hi, 20001) {
			got, want := c.f(x), c.ref(x)
			if math.IsNaN(got) != math.IsNaN(want) || !math.IsNaN(got) && ulps(got, want) > 4 {
				t.Errorf("%s(%v) = %v, math gives %v", c.name, x, got, want)
				break
			}
		}
	}
}

// TestSpecialCases: the special cases of package math's doc comments.
func TestSpecialCases(t *testing.T) {
	inf, nan := math.Inf(1), math.NaN()
	for _, c := range funcs {
		for _, x := range []float64{inf, -inf, nan, 0, math.Copysign(0, -1), 1, -1} {
			got, want := c.f(x), c.ref(x)
			if math.Float64bits(got) != math.Float64bits(want) && !(math.IsNaN(got) && math.IsNaN(want)) {
				t.Errorf("%s(%v) = %v, math gives %v", c.name, x, got, want)
			}
		}
	}
}

// digests are SHA-256 prefixes of the bits of each copy over its 20001
// samples, computed on amd64; the same on every architecture is the point
// of the package (CI runs this test on arm64 under qemu-user).
var digests = map[string]string{
	"Exp":            "00869c9179a64002",
	"Exp2":           "493977628f7f3ae5",
	"Expm1":          "0ad91f9179505e67",
	"Log":            "5f1be037156583a1",
	"Log2":           "ae47b51422d487ec",
	"Log10":          "b79549f7bc4d5b8a",
	"Log1p":          "0a1724f81e9a50ec",
	"Cbrt":           "c39de54ae7e53b5f",
	"Sin":            "d923b98b3ddd68b4",
	"Cos":            "3cf363d08147e503",
	"Tan":            "5d224ec155eb17cf",
	"Asin":           "f04de3416c6f1658",
	"Acos":           "6aa249788ff46437",
	"Atan":           "b756de3cbe285331",
	"Pow(x, 1.37)":   "afe7737fb7f2f418",
	"Pow(1.0001, y)": "015c4155306f4d01",
	"Hypot(x, 3)":    "90df191e7a3258bd",
}

func TestSameBits(t *testing.T) {
	for _, c := range funcs {
		h := sha256.New()
		for _, x := range samples(c.lo, c.hi, 20001) {
			binary.Write(h, binary.LittleEndian, math.Float64bits(c.f(x)))
		}
		got := fmt.Sprintf("%x", h.Sum(nil)[:8])
		if got != digests[c.name] {
			t.Errorf("%q: %q, // digest of the samples' bits; want %q", c.name, got, digests[c.name])
		}
	}
}

// TestLdexpShortcut: expmulti's product by 2**k gives Ldexp's bits over the
// k where it is used, for y across [0.5, 2] (the range of its y).
func TestLdexpShortcut(t *testing.T) {
	for k := -1020; k <= 1021; k++ {
		for _, y := range []float64{0.5, 0.70710678118654757, 1, math.Nextafter(1, 2), 1.4142135623730951, math.Nextafter(2, 0)} {
			want := math.Ldexp(y, k)
			if got := float64(y * math.Float64frombits(uint64(k+1023)<<52)); got != want {
				t.Fatalf("y=%v k=%d: %v, Ldexp gives %v", y, k, got, want)
			}
		}
	}
}
