package if97

import (
	"math"
	"testing"
)

// Tests of the shortcuts taken for speed: each one must give what the plain computation gives.

// region3Grid returns (p, T) points of region 3, denser near the critical point.
func region3Grid() [][2]float64 {
	var pts [][2]float64
	for p := PSat623 + 1e3; p <= PMax; p *= 1.0113 {
		for T := T13 + 0.01; T < TB23(p); T += 1.37 {
			pts = append(pts, [2]float64{p, T})
		}
	}
	for p := 21.5e6; p < 23e6; p += 0.0173e6 {
		for T := 645.0; T < 649; T += 0.0191 {
			if p > PB23(T) {
				pts = append(pts, [2]float64{p, T})
			}
		}
	}
	return pts
}

// TestRho3Converged checks that the density rho3 returns is a fixed point of a full Newton step
// on R7-97 Eq. (28), to 1e-12 (RT/(∂p/∂ρ)_T)-fold larger near the critical point, where
// (∂p/∂ρ)_T vanishes and the rounding of p(ρ, T) fixes ρ only that far; the many-step solution
// this replaced needs the same allowance.
func TestRho3Converged(t *testing.T) {
	worst := 0.0
	for _, pt := range region3Grid() {
		p, T := pt[0], pt[1]
		rho := rho3(p, T)
		a := r3Helm(rho, T, wantX|wantXX)
		step := math.Abs((p-a.p())/a.dpdrho()) / rho
		tol := 1e-12 * (1 + R*T/a.dpdrho())
		if !(step <= tol) {
			t.Errorf("rho3(%g, %g) = %.17g: a further Newton step changes it by %.3g", p, T, rho, step)
		}
		worst = math.Max(worst, step/tol)
	}
	t.Logf("largest further step: %.3g of the tolerance", worst)
}

// TestAboveSat checks the grid bounds of aboveSat against R7-97 Eq. (30) itself, at the grid
// temperatures and between them, on the saturation line and one rounding step off it.
func TestAboveSat(t *testing.T) {
	for k := 0; k <= 20*psN; k++ {
		T := math.Min(TMin+float64(k)*psStep/20, T13)
		ps := psatEq(T)
		for _, p := range []float64{ps, math.Nextafter(ps, 0), math.Nextafter(ps, 1e9), ps * 0.9, ps * 1.1, ps * 0.999, ps * 1.001, 1, PMax} {
			if got, want := aboveSat(p, T), p >= ps; got != want {
				t.Errorf("aboveSat(%v, %v) = %v, want %v", p, T, got, want)
			}
		}
	}
}
