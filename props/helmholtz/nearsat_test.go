package helmholtz

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// nearSatOffsets are the relative offsets from a saturated value that the
// near-saturation sweeps try, on both sides, and zero.
var nearSatOffsets = []float64{0, 1e-15, 1e-14, 1e-13, 1e-12, 1e-11, 1e-10, 1e-9, 1e-8, 1e-7, 1e-6}

// nearSatPressures returns pressures from just above the lowest saturation
// pressure of the equation to 0.995 Pc.
func nearSatPressures(f *Fluid) []float64 {
	ps := []float64{1.01 * f.Pmin()}
	for _, r := range []float64{1e-3, 1e-2, 0.1, 0.5, 0.9, 0.98, 0.995} {
		if p := r * f.Pc; p > 1.01*f.Pmin() {
			ps = append(ps, p)
		}
	}
	return ps
}

// offset moves y by the relative offset e (of |y|, or of scale where y is
// near zero, as h and s are near a reference state).
func offset(y, e, scale float64) float64 { return y + e*math.Max(math.Abs(y), scale) }

// TestNearSaturationReported is the case first reported: liquid isopentane
// within 1e-12 of the saturated liquid at 308.15 K.
func TestNearSaturationReported(t *testing.T) {
	f := mustLookup(t, "isopentane")
	s, err := f.SatT(308.15)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range []float64{-1e-12, 1e-12} {
		if st, err := f.StatePH(s.P, s.Hf*(1+e)); err != nil || (e < 0) != (st.Phase == Liquid) {
			t.Errorf("StatePH(p, hf (1%+g)) = %v, %v", e, st.Phase, err)
		}
		if st, err := f.StatePS(s.P, s.Sf*(1+e)); err != nil || (e < 0) != (st.Phase == Liquid) {
			t.Errorf("StatePS(p, sf (1%+g)) = %v, %v", e, st.Phase, err)
		}
		if st, err := f.StateHS(s.Hf*(1+e), s.Sf); err != nil || math.Abs(st.H/(s.Hf*(1+e))-1) > 1e-9 {
			t.Errorf("StateHS(hf (1%+g), sf) = %v, %v", e, st.Phase, err)
		}
	}
}

// TestNearSaturationIsobars sweeps h, s and v across hf, hg, sf, sg, vf
// and vg by relative offsets from 1e-15 to 1e-6 at several pressures for
// every default equation. Each StatePH, StatePS and StatePV call must give
// liquid below the saturated liquid, two-phase between, vapour above, with
// the target met to 1e-9 and T from the slope of the isobar at saturation
// to 1e-9; StatePT at the T found must give back the target where it is
// off the saturation line.
func TestNearSaturationIsobars(t *testing.T) {
	for _, f := range allFluids {
		if !f.IsDefault {
			continue
		}
		for _, p := range nearSatPressures(f) {
			sp, err := f.satP("test", p)
			if err != nil {
				t.Errorf("%s SatP(%g): %v", f.Name, p, err)
				continue
			}
			for _, by := range []int{byH, byS, byV} {
				for _, side := range []*point{&sp.liq, &sp.vap} {
					y := pick(f.props(side), by)
					for _, e := range nearSatOffsets {
						for _, sign := range []float64{-1, 1} {
							checkNearSat(t, f, p, by, offset(y, sign*e, yScale(f, by)), &sp)
						}
					}
				}
			}
		}
	}
}

// yScale is the size below which offsets of h and s are taken absolute
// (they pass through zero at the reference state); v is positive.
func yScale(f *Fluid, by int) float64 {
	switch by {
	case byH:
		return f.R * f.Tc
	case byS:
		return f.R
	}
	return 0
}

// checkNearSat checks one StatePH, StatePS or StatePV call near the dome
// at p, given the saturation state at p.
func checkNearSat(t *testing.T, f *Fluid, p float64, by int, target float64, sp *satPoint) {
	t.Helper()
	op, fn := [...]string{"StatePH", "StatePS", "StatePV"}[by], [...]func(float64, float64) (Props, error){f.StatePH, f.StatePS, f.StatePV}[by]
	st, err := fn(p, target)
	where := func() string { return fmt.Sprintf("%s %s(%.17g, %.17g)", f.Name, op, p, target) }
	if err != nil {
		t.Errorf("%s: %v", where(), err)
		return
	}
	liq, vap, Ts := f.props(&sp.liq), f.props(&sp.vap), sp.T
	yf, yg := pick(liq, by), pick(vap, by)
	tol := 1e-9 * math.Max(math.Abs(target), yScale(f, by))
	if math.Abs(pick(st, by)-target) > tol || st.P != p {
		t.Errorf("%s: got p %.15g, y %.15g", where(), st.P, pick(st, by))
	}
	var want Phase
	switch {
	case target < yf:
		want = Liquid
	case target > yg:
		want = Vapour
	default:
		want = TwoPhase
	}
	if st.Phase != want {
		t.Errorf("%s: phase %v, want %v (yf %.17g, yg %.17g)", where(), st.Phase, want, yf, yg)
		return
	}
	if want == TwoPhase {
		if st.T != Ts || st.X < 0 || st.X > 1 || math.Abs(yf+st.X*(yg-yf)-target) > tol {
			t.Errorf("%s: two-phase T %.15g x %.15g; Tsat %.15g", where(), st.T, st.X, Ts)
		}
		return
	}
	sat, q := liq, &sp.liq
	if want == Vapour {
		sat, q = vap, &sp.vap
	}
	dydT := [...]float64{sat.Cp, sat.Cp / Ts, q.dvdT()}[by]
	if Tlin := Ts + (target-pick(sat, by))/dydT; math.Abs(st.T-Tlin) > 1e-9*Ts {
		t.Errorf("%s: T %.15g, want %.15g from the slope at saturation", where(), st.T, Tlin)
	}
	back, err := f.StatePT(p, st.T)
	var se *SolveError
	switch {
	case errors.As(err, &se) && se.Reason == whyOnSat:
	case err != nil:
		t.Errorf("%s: StatePT(%g, %.17g): %v", where(), p, st.T, err)
	case back.Phase != want || math.Abs(pick(back, by)-target) > tol:
		t.Errorf("%s: StatePT at T %.15g gives y %.15g %v", where(), st.T, pick(back, by), back.Phase)
	}
}

// TestNearSaturationHS sweeps StateHS across the saturated liquid and
// vapour at several pressures for every default equation, moving h, then
// s, by relative offsets from 1e-15 to 1e-6: each call must return a state
// with the given h and s (to 1e-9), or a *RangeError.
func TestNearSaturationHS(t *testing.T) {
	for _, f := range allFluids {
		if !f.IsDefault {
			continue
		}
		for _, p := range nearSatPressures(f) {
			sat, err := f.SatP(p)
			if err != nil {
				t.Errorf("%s SatP(%g): %v", f.Name, p, err)
				continue
			}
			for _, hs := range [][2]float64{{sat.Hf, sat.Sf}, {sat.Hg, sat.Sg}} {
				for _, e := range nearSatOffsets {
					for _, sign := range []float64{-1, 1} {
						h := offset(hs[0], sign*e, f.R*f.Tc)
						s := offset(hs[1], sign*e, f.R)
						checkHS(t, f, h, hs[1])
						checkHS(t, f, hs[0], s)
					}
				}
			}
		}
	}
}

func checkHS(t *testing.T, f *Fluid, h, s float64) {
	t.Helper()
	st, err := f.StateHS(h, s)
	var re *RangeError
	switch {
	case errors.As(err, &re):
	case err != nil:
		t.Errorf("%s StateHS(%.17g, %.17g): %v", f.Name, h, s, err)
	case math.Abs(st.H-h) > 1e-9*math.Max(math.Abs(h), f.R*f.Tc) || math.Abs(st.S-s) > 1e-9*math.Max(math.Abs(s), f.R):
		t.Errorf("%s StateHS(%.17g, %.17g) = h %.17g, s %.17g", f.Name, h, s, st.H, st.S)
	}
}
