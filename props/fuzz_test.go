package props

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/vouchcalc/vouch/props/helmholtz"
	"github.com/vouchcalc/vouch/units"
)

// fuzzPairs are the input pairs the fuzz tests call, with the unit each
// side's number is in (SI base units).
var fuzzPairs = []struct{ a, b, ua, ub string }{
	{"p", "T", "Pa", "K"}, {"p", "h", "Pa", "J/kg"}, {"p", "s", "Pa", "J/(kg*K)"},
	{"h", "s", "J/kg", "J/(kg*K)"}, {"p", "x", "Pa", ""}, {"T", "x", "K", ""},
	{"p", "v", "Pa", "m^3/kg"}, {"T", "v", "K", "m^3/kg"},
}

// fuzzFluids are the fluids FuzzFluid picks from: IF97 water and every
// default equation of state.
var fuzzFluids = append([]string{"water"}, helmholtz.Names()...)

// fuzzSpan maps any number onto the span of one kind of input where the
// fluids have states: p from 1 kPa to 100 MPa and v from 1e-4 to 1e3 m³/kg
// on a log scale, T from 250 K to 1200 K, h from -300 to 4500 kJ/kg, s from
// -1 to 12 kJ/(kg·K), x from 0 to 1.
func fuzzSpan(kind string, v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		v = 0
	}
	f := math.Abs(v) - math.Floor(math.Abs(v)) // in [0, 1)
	lin := func(lo, hi float64) float64 { return lo + f*(hi-lo) }
	switch kind {
	case "p":
		return math.Pow(10, lin(3, 8))
	case "v":
		return math.Pow(10, lin(-4, 3))
	case "T":
		return lin(250, 1200)
	case "h":
		return lin(-300e3, 4500e3)
	case "s":
		return lin(-1e3, 12e3)
	}
	return f
}

func fuzzQ(v float64, unit string) units.Quantity {
	if unit == "" {
		return units.Num(v)
	}
	return q(v, unit)
}

// checkState holds what every state a call returns must satisfy: every
// quantity finite, p, T, v and rho positive, x in [0, 1] when two-phase,
// and the two given properties given back (1e-9 relative, or 1e-9 of the
// property's scale where it crosses zero).
func checkState(t *testing.T, call string, st *State, a, b string, va, vb float64) {
	t.Helper()
	for _, n := range stateFields {
		if qv, ok := st.Quantity(n); ok && (math.IsNaN(qv.V) || math.IsInf(qv.V, 0)) {
			t.Fatalf("%s: %s = %v", call, n, qv.V)
		}
	}
	for _, n := range []string{"p", "T", "v", "rho"} {
		if qv, _ := st.Quantity(n); !(qv.V > 0) {
			t.Fatalf("%s: %s = %v, not positive", call, n, qv.V)
		}
	}
	// A field that must be positive is positive wherever it is given (the
	// class of cp = 0 and cp < 0 at the critical point).
	for _, n := range []string{"cp", "cv", "w", "mu", "k"} {
		if qv, ok := st.Quantity(n); ok && !(qv.V > 0) {
			t.Fatalf("%s: %s = %v, not positive", call, n, qv.V)
		}
	}
	if st.Phase == "two-phase" {
		if x, _ := st.Quantity("x"); !(x.V >= 0 && x.V <= 1) {
			t.Fatalf("%s: two-phase with x = %v", call, x.V)
		}
	}
	scale := map[string]float64{"p": 0, "T": 0, "v": 0, "h": 1e3, "s": 1, "x": 1}
	for _, c := range []struct {
		n string
		v float64
	}{{a, va}, {b, vb}} {
		got, ok := st.Quantity(c.n)
		if !ok {
			if c.n == "x" && st.Phase != "two-phase" {
				continue // a quality at the very end of the line may give a saturated single phase
			}
			t.Fatalf("%s: no %s", call, c.n)
		}
		if c.n == "x" && st.Phase != "two-phase" {
			continue
		}
		if d := math.Abs(got.V - c.v); d > 1e-9*(math.Abs(c.v)+scale[c.n]) {
			t.Fatalf("%s: %s = %.17g back, %.17g given (rel %.2g)", call, c.n, got.V, c.v, d/math.Abs(c.v))
		}
	}
}

// FuzzFluid calls fluid(NAME, A, B) — water through IAPWS-IF97, the
// organic fluids through their equations of state — with every input pair
// and checks that it either refuses with an error or returns a state that
// holds checkState: never a panic, a NaN or a state that does not match
// its inputs.
func FuzzFluid(f *testing.F) {
	// Seeds: a point of each pair in each phase region (values common
	// practice for steam and ORC cycles, not from a source).
	for fl := range fuzzFluids {
		for k := range fuzzPairs {
			for _, ab := range [][2]float64{{1e6, 450}, {1e5, 400e3}, {3e6, 1.5e3}, {500e3, 1.8e3}, {2e5, 0.5}, {350, 0.9}, {1e6, 0.01}, {22e6, 700}} {
				f.Add(uint8(fl), uint8(k), ab[0], ab[1])
				f.Add(uint8(fl), uint8(k+128), ab[0]/7e5, ab[1]/3e3)
			}
		}
	}
	f.Fuzz(func(t *testing.T, fl, k uint8, va, vb float64) {
		name := fuzzFluids[int(fl)%len(fuzzFluids)]
		pr := fuzzPairs[int(k)%len(fuzzPairs)]
		if k >= 128 {
			// Map the numbers into the span where states lie, so that most calls
			// return a state to check rather than a range error.
			va, vb = fuzzSpan(pr.a, va), fuzzSpan(pr.b, vb)
		}
		call := fmt.Sprintf("fluid(%q, %s = %.17g, %s = %.17g)", name, pr.a, va, pr.b, vb)
		st, err := Fluid(name, fuzzQ(va, pr.ua), fuzzQ(vb, pr.ub))
		if err != nil {
			if err.Error() == "" {
				t.Fatalf("%s: an empty error", call)
			}
			return
		}
		checkState(t, call, st, pr.a, pr.b, va, vb)
	})
}

// TestRandomStates runs the checks of FuzzFluid on 80,000 seeded random
// points spread over every fluid of fuzzFluids, every pair and the spans of
// fuzzSpan, so that plain go test covers them too.
func TestRandomStates(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 11))
	n := 80000
	if testing.Short() {
		n = 4000
	}
	ok := map[string]int{}
	for range n {
		name := fuzzFluids[r.IntN(len(fuzzFluids))]
		pr := fuzzPairs[r.IntN(len(fuzzPairs))]
		va, vb := fuzzSpan(pr.a, r.Float64()), fuzzSpan(pr.b, r.Float64())
		call := fmt.Sprintf("fluid(%q, %s = %.17g, %s = %.17g)", name, pr.a, va, pr.b, vb)
		st, err := Fluid(name, fuzzQ(va, pr.ua), fuzzQ(vb, pr.ub))
		if err != nil {
			continue
		}
		checkState(t, call, st, pr.a, pr.b, va, vb)
		ok[name+" "+pr.a+","+pr.b]++
	}
	total := 0
	for _, name := range fuzzFluids {
		for _, pr := range fuzzPairs {
			c := ok[name+" "+pr.a+","+pr.b]
			total += c
			t.Logf("%-10s (%s, %s): %d states", name, pr.a, pr.b, c)
		}
	}
	if total < n*3/10 {
		t.Errorf("only %d of %d calls gave a state to check; the generator has drifted", total, n)
	}
}

// TestRandomSaturation: the saturation line at random pressures and
// temperatures is an error or finite, with the given property given back
// (1e-9 relative), liquid below vapour in h, s and v up to the critical
// point, and hfg = hg - hf, sfg = sg - sf.
func TestRandomSaturation(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 5))
	got := map[string]int{}
	for range 20000 {
		name := fuzzFluids[r.IntN(len(fuzzFluids))]
		kind, unit := "p", "Pa"
		if r.IntN(2) == 0 {
			kind, unit = "T", "K"
		}
		v := fuzzSpan(kind, r.Float64())
		sat, err := FluidSat(name, q(v, unit))
		if err != nil {
			continue
		}
		call := fmt.Sprintf("fluid_sat(%q, %s = %.17g)", name, kind, v)
		f := map[string]float64{}
		for _, n := range satFields {
			qv, ok := sat.Quantity(n)
			if !ok || math.IsNaN(qv.V) || math.IsInf(qv.V, 0) {
				t.Fatalf("%s: %s = %v", call, n, qv.V)
			}
			f[n] = qv.V
		}
		if math.Abs(f[kind]-v) > 1e-9*v {
			t.Fatalf("%s: %s = %.17g back", call, kind, f[kind])
		}
		if !(f["hf"] <= f["hg"] && f["sf"] <= f["sg"] && f["vf"] <= f["vg"] && f["p"] > 0) {
			t.Fatalf("%s: liquid and vapour out of order: %v", call, f)
		}
		if math.Abs(f["hfg"]-(f["hg"]-f["hf"])) > 1e-9*math.Abs(f["hg"]) || math.Abs(f["sfg"]-(f["sg"]-f["sf"])) > 1e-9*math.Abs(f["sg"]) {
			t.Fatalf("%s: hfg or sfg is not the difference: %v", call, f)
		}
		got[name]++
	}
	for _, name := range fuzzFluids {
		if got[name] < 300 {
			t.Errorf("%s: only %d saturation points checked; the generator has drifted", name, got[name])
		}
	}
	t.Logf("saturation points checked: %v", got)
}
