package helmholtz

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// pvGrid returns (p, T) pairs for the StatePV round trips: the grid of
// TestRoundTrip, states just off the saturation line on both sides,
// compressed liquid above Pc and supercritical states near the critical
// point.
func pvGrid(f *Fluid) [][2]float64 {
	out := stateGrid(f)
	for _, T := range satGrid(f, 8)[1:8] {
		sat, err := f.SatT(T)
		if err != nil {
			continue
		}
		for _, e := range []float64{1e-3, 1e-6, 1e-9} {
			out = append(out, [2]float64{sat.P * (1 + e), T}, [2]float64{sat.P * (1 - e), T})
		}
	}
	for _, rp := range []float64{1.001, 1.01, 1.1, 2} {
		for _, rT := range []float64{0.9, 0.99, 0.999, 1.0001, 1.001, 1.01, 1.1} {
			if p, T := rp*f.Pc, rT*f.Tc; p <= f.Pmax && T <= f.Tmax {
				out = append(out, [2]float64{p, T})
			}
		}
	}
	return out
}

// TestStatePVRoundTrip computes states from (p, T) and returns each
// through (p, v): T to 1e-9, the same phase, v to 1e-12.
func TestStatePVRoundTrip(t *testing.T) {
	for _, f := range allFluids {
		for _, c := range pvGrid(f) {
			p, T := c[0], c[1]
			st, err := f.StatePT(p, T)
			if err != nil {
				t.Errorf("%s/%s StatePT(%.12g, %.12g): %v", f.Name, f.Key, p, T, err)
				continue
			}
			got, err := f.StatePV(p, st.V)
			switch {
			case err != nil:
				t.Errorf("%s/%s StatePV(%.12g, %.12g) (T %.12g): %v", f.Name, f.Key, p, st.V, T, err)
			case relErr(got.T, T) > 1e-9 || got.Phase != st.Phase || got.P != p || relErr(got.V, st.V) > 1e-12:
				t.Errorf("%s/%s StatePV(%.12g, %.12g): got T %.12g %v v %.15g, want T %.12g %v", f.Name, f.Key, p, st.V, got.T, got.Phase, got.V, T, st.Phase)
			}
		}
	}
}

// TestStatePVTwoPhase builds states of known quality from (T, x) and
// recovers them from (p, v), and checks that v just beyond vf and vg is
// single-phase.
func TestStatePVTwoPhase(t *testing.T) {
	for _, f := range allFluids {
		for _, T := range satGrid(f, 8)[1:8] {
			for _, x := range []float64{0, 1e-9, 0.01, 0.5, 0.99, 1 - 1e-9, 1} {
				st, err := f.StateTX(T, x)
				if err != nil {
					t.Errorf("%s/%s StateTX(%g, %g): %v", f.Name, f.Key, T, x, err)
					continue
				}
				got, err := f.StatePV(st.P, st.V)
				// At x = 0 and 1 the saturated liquid or vapour may come
				// back as such or as two-phase with x 0 or 1.
				edge := (x == 0 || x == 1) && got.Phase == st.Phase
				if err != nil || (got.Phase != TwoPhase && !edge) || math.Abs(got.X-x) > 1e-9 || relErr(got.T, T) > 1e-9 {
					t.Errorf("%s/%s StatePV at (T %g, x %g): got T %.12g x %.12g %v (%v)", f.Name, f.Key, T, x, got.T, got.X, got.Phase, err)
				}
			}
			sat, err := f.SatT(T)
			if err != nil {
				continue
			}
			for _, c := range []struct {
				v    float64
				want Phase
			}{{sat.Vf * (1 - 1e-9), Liquid}, {sat.Vg * (1 + 1e-9), Vapour}} {
				got, err := f.StatePV(sat.P, c.v)
				if err != nil || got.Phase != c.want || relErr(got.T, T) > 1e-8 {
					t.Errorf("%s/%s StatePV(%g, %.15g): got T %.12g %v, want T %.12g %v (%v)", f.Name, f.Key, sat.P, c.v, got.T, got.Phase, T, c.want, err)
				}
			}
		}
	}
}

// TestStatePVRange checks that a v no state has at p is a *RangeError
// naming v and the limit.
func TestStatePVRange(t *testing.T) {
	f := mustLookup(t, "R-245fa")
	cold, err := f.StatePT(f.Pc, f.Tmin)
	if err != nil {
		t.Fatal(err)
	}
	hot, err := f.StatePT(1e5, f.Tmax)
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name  string
		p, v  float64
		input string
		limit float64
		above bool
	}{
		{"v zero", 1e5, 0, "v", 0, false},
		{"v negative", 1e5, -1, "v", 0, false},
		{"v NaN", 1e5, math.NaN(), "v", 0, false},
		{"v infinite", 1e5, math.Inf(1), "v", math.MaxFloat64, true},
		{"v below the highest density", 1e5, 0.99 / f.RhoMax, "v", 1 / f.RhoMax, false},
		{"v below the liquid at Tmin", f.Pc, cold.V * 0.999, "v", cold.V, false},
		{"v above the vapour at Tmax", 1e5, hot.V * 1.001, "v", hot.V, true},
		{"p zero", 0, 0.1, "p", 0, false},
		{"p above Pmax", 2 * f.Pmax, 1e-3, "p", f.Pmax, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := f.StatePV(c.p, c.v)
			var re *RangeError
			if !errors.As(err, &re) {
				t.Fatalf("got %v, want a *RangeError", err)
			}
			if re.Input != c.input || re.Above != c.above || (!math.IsNaN(c.v) && relErr(re.Limit, c.limit) > 1e-9) {
				t.Errorf("got %+v, want input %s limit %g above %v", re, c.input, c.limit, c.above)
			}
			if strings.ContainsAny(re.Error(), "0123456789") {
				t.Errorf("message %q holds numbers", re.Error())
			}
		})
	}
}

// TestStatePVNeverNaN feeds a spread of inputs, many outside the ranges:
// each call returns an error or a state with no NaN or Inf.
func TestStatePVNeverNaN(t *testing.T) {
	ps := []float64{math.NaN(), math.Inf(1), -1, 0, 1e-300, 1, 100, 1e5, 3e6, 1e7, 1e9}
	vs := []float64{math.NaN(), math.Inf(1), math.Inf(-1), -1, 0, 1e-300, 1e-4, 1e-3, 2e-3, 1e-2, 0.1, 1, 1e3, 1e9}
	for _, f := range []*Fluid{mustLookup(t, "isopentane"), mustLookup(t, "MM"), mustLookup(t, "R-1233zd(E)")} {
		for _, p := range ps {
			for _, v := range vs {
				pr, err := f.StatePV(p, v)
				if err == nil && !finite(pr) {
					t.Errorf("%s StatePV(%g, %g) = %+v", f.Name, p, v, pr)
				}
			}
		}
	}
}

func BenchmarkStatePVVapour(b *testing.B)   { benchPV(b, 1e6, 400) }
func BenchmarkStatePVLiquid(b *testing.B)   { benchPV(b, 2e6, 320) }
func BenchmarkStatePVTwoPhase(b *testing.B) { benchPV(b, 1e6, 0) }

// benchPV times StatePV at the state StatePT gives at (p, T), or at the
// two-phase state of quality 0.5 at p when T is 0.
func benchPV(b *testing.B, p, T float64) {
	f := benchFluid(b)
	var st Props
	var err error
	if T == 0 {
		st, err = f.StatePX(p, 0.5)
	} else {
		st, err = f.StatePT(p, T)
	}
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := f.StatePV(p, st.V); err != nil {
			b.Fatal(err)
		}
	}
}
