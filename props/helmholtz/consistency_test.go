package helmholtz

import (
	"math"
	"testing"
)

// satGrid returns n temperatures from Tmin to just below Tc, denser near Tc.
func satGrid(f *Fluid, n int) []float64 {
	var Ts []float64
	for k := 0; k < n; k++ {
		u := float64(k) / float64(n)
		Ts = append(Ts, f.Tc-(f.Tc-f.Tmin)*math.Pow(1-u, 2))
	}
	return append(Ts, f.Tc*(1-1e-6))
}

// TestSaturationEquilibrium checks, over a grid per equation, that the
// saturated liquid and vapour have equal pressure and equal Gibbs energy
// to 1e-10 relative (or the round-off of the liquid pressure, far below
// Tc), and that SatP inverts SatT to 1e-9.
func TestSaturationEquilibrium(t *testing.T) {
	for _, f := range allFluids {
		for _, T := range satGrid(f, 40) {
			sp, err := f.satT("test", T)
			if err != nil {
				t.Errorf("%s/%s: SatT(%.10g): %v", f.Name, f.Key, T, err)
				continue
			}
			pl, pv := sp.liq.p(f.R), sp.vap.p(f.R)
			roundoff := 1e-15 * sp.liq.rho * f.R * T * (1 + math.Abs(sp.liq.r.d)) * 100
			if math.Abs(pl-pv) > 1e-10*pv+roundoff {
				t.Errorf("%s/%s T=%.10g: p' = %.15g, p'' = %.15g", f.Name, f.Key, T, pl, pv)
			}
			gl, gv := sp.liq.g(f.R), sp.vap.g(f.R)
			if math.Abs(gl-gv) > 1e-10*f.R*T {
				t.Errorf("%s/%s T=%.10g: g' - g'' = %.3g J/kg", f.Name, f.Key, T, gl-gv)
			}
			if !(sp.liq.rho > sp.vap.rho) {
				t.Errorf("%s/%s T=%.10g: rho' = %g <= rho'' = %g", f.Name, f.Key, T, sp.liq.rho, sp.vap.rho)
			}
			if sp.p < f.Pmin()*(1-1e-9) || T < f.Tmin*(1+1e-9) {
				continue
			}
			s2, err := f.SatP(sp.p)
			if err != nil {
				t.Errorf("%s/%s: SatP(%.10g): %v", f.Name, f.Key, sp.p, err)
			} else if math.Abs(s2.T/T-1) > 1e-9 {
				t.Errorf("%s/%s: SatP(SatT(%.12g).P).T = %.12g", f.Name, f.Key, T, s2.T)
			}
		}
	}
}

// stateGrid returns (p, T) pairs across each equation's range, off the
// saturation line: compressed liquid, superheated vapour, supercritical.
func stateGrid(f *Fluid) [][2]float64 {
	var out [][2]float64
	for i := 0; i <= 8; i++ {
		T := f.Tmin + (f.Tmax-f.Tmin)*(0.02+0.96*float64(i)/8)
		for _, lp := range []float64{-3, -2, -1, -0.5, -0.1, 0.1, 0.5, 1, 1.5} {
			p := f.Pc * math.Pow(10, lp)
			if p > f.Pmax || p < f.Pmin() {
				continue
			}
			if T < f.Tc {
				ps := f.anc.estimate(T).p
				if math.Abs(p/ps-1) < 0.02 {
					continue
				}
			}
			out = append(out, [2]float64{p, T})
		}
	}
	return out
}

func relErr(a, b float64) float64 { return math.Abs(a-b) / math.Max(math.Abs(b), 1e-300) }

// TestRoundTrip computes states from (p, T) over a grid per equation,
// checks cp, cv, w > 0, and returns each through every input pair: (T, rho),
// (p, h), (p, s) and (h, s) must give back T and p to 1e-9.
func TestRoundTrip(t *testing.T) {
	for _, f := range allFluids {
		for _, c := range stateGrid(f) {
			p, T := c[0], c[1]
			st, err := f.StatePT(p, T)
			if err != nil {
				t.Errorf("%s/%s: StatePT(%g, %g): %v", f.Name, f.Key, p, T, err)
				continue
			}
			if !(st.Cp > 0 && st.Cv > 0 && st.W > 0) {
				t.Errorf("%s/%s (%g, %g): cp %g cv %g w %g", f.Name, f.Key, p, T, st.Cp, st.Cv, st.W)
			}
			checkBack(t, f, "StateTRho", st, func() (Props, error) { return f.StateTRho(T, st.Rho) })
			checkBack(t, f, "StatePH", st, func() (Props, error) { return f.StatePH(p, st.H) })
			checkBack(t, f, "StatePS", st, func() (Props, error) { return f.StatePS(p, st.S) })
			checkBack(t, f, "StateHS", st, func() (Props, error) { return f.StateHS(st.H, st.S) })
		}
	}
}

func checkBack(t *testing.T, f *Fluid, op string, want Props, fn func() (Props, error)) {
	t.Helper()
	got, err := fn()
	if err != nil {
		t.Errorf("%s/%s %s at (p %g, T %g): %v", f.Name, f.Key, op, want.P, want.T, err)
		return
	}
	if relErr(got.T, want.T) > 1e-9 || relErr(got.P, want.P) > 1e-9 || got.Phase != want.Phase {
		t.Errorf("%s/%s %s: got (p %.12g, T %.12g, %v), want (p %.12g, T %.12g, %v)",
			f.Name, f.Key, op, got.P, got.T, got.Phase, want.P, want.T, want.Phase)
	}
}

// TestTwoPhaseRoundTrip builds states of known quality from (T, x) and
// (p, x) and recovers them from (p, h), (p, s), (h, s) and (T, rho).
func TestTwoPhaseRoundTrip(t *testing.T) {
	for _, f := range allFluids {
		for _, T := range satGrid(f, 8)[1:8] {
			for _, x := range []float64{0.01, 0.3, 0.9} {
				st, err := f.StateTX(T, x)
				if err != nil {
					t.Errorf("%s/%s StateTX(%g, %g): %v", f.Name, f.Key, T, x, err)
					continue
				}
				back := []struct {
					op string
					fn func() (Props, error)
				}{
					{"StatePX", func() (Props, error) { return f.StatePX(st.P, x) }},
					{"StatePH", func() (Props, error) { return f.StatePH(st.P, st.H) }},
					{"StatePS", func() (Props, error) { return f.StatePS(st.P, st.S) }},
					{"StateHS", func() (Props, error) { return f.StateHS(st.H, st.S) }},
					{"StateTRho", func() (Props, error) { return f.StateTRho(T, st.Rho) }},
				}
				for _, b := range back {
					got, err := b.fn()
					if err != nil {
						t.Errorf("%s/%s %s (T %g, x %g): %v", f.Name, f.Key, b.op, T, x, err)
						continue
					}
					if got.Phase != TwoPhase || math.Abs(got.X-x) > 1e-9 || relErr(got.T, T) > 1e-9 {
						t.Errorf("%s/%s %s: got (T %.12g, x %.12g, %v), want (T %.12g, x %g)", f.Name, f.Key, b.op, got.T, got.X, got.Phase, T, x)
					}
				}
			}
		}
	}
}

// TestNearCriticalIsobars sweeps (p, h) and (p, s) just below and above
// the critical pressure: each call converges to a state that StatePT
// (single phase) or the lever rule (two-phase) confirms, or says it cannot.
func TestNearCriticalIsobars(t *testing.T) {
	for _, f := range allFluids {
		for _, r := range []float64{0.95, 0.99, 0.999, 0.99999, 1.00001, 1.01} {
			p := f.Pc * r
			lo, err1 := f.StatePT(p, f.Tc*0.97)
			hi, err2 := f.StatePT(p, math.Min(f.Tc*1.03, f.Tmax))
			if err1 != nil || err2 != nil {
				t.Errorf("%s/%s: %v %v", f.Name, f.Key, err1, err2)
				continue
			}
			for k := 0; k <= 20; k++ {
				h := lo.H + (hi.H-lo.H)*float64(k)/20
				st, err := f.StatePH(p, h)
				if err != nil {
					var se *SolveError
					if !errorsAs(err, &se) {
						t.Errorf("%s/%s StatePH(%g, %g): %v", f.Name, f.Key, p, h, err)
					}
					continue
				}
				if st.Phase == TwoPhase {
					sat, err := f.SatP(p)
					if err != nil || st.X <= 0 || st.X >= 1 || math.Abs(sat.Hf+st.X*(sat.Hg-sat.Hf)-h) > 1e-9*math.Abs(h)+1e-6 {
						t.Errorf("%s/%s StatePH(%g, %g): two-phase x = %g does not check (%v)", f.Name, f.Key, p, h, st.X, err)
					}
					continue
				}
				back, err := f.StatePT(p, st.T)
				if err != nil || math.Abs(back.H-h) > 1e-8*math.Max(math.Abs(h), f.R*f.Tc) || back.Phase != st.Phase {
					t.Errorf("%s/%s StatePH(%g, %g) = T %.10g %v; StatePT gives h %.10g %v (%v)", f.Name, f.Key, p, h, st.T, st.Phase, back.H, back.Phase, err)
				}
			}
		}
	}
}

func errorsAs(err error, se **SolveError) bool {
	e, ok := err.(*SolveError)
	if ok {
		*se = e
	}
	return ok
}
