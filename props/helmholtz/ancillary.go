package helmholtz

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// Ancillary equations: smooth fits of the saturation line of each
// equation, used only as starting values for the saturation solver and to
// find the phase quickly where a state is far from the saturation line.
// Their coefficients are fitted to the equation itself by the test
// TestDerived (run it with -update to refit) and stored in derived_gen.go.
// With theta = 1 - T/Tc:
//
//	ln(p/Pc)     = (Tc/T) sum_i P_i  theta^(kP_i/6)
//	rho'/RhoC    = 1 +    sum_i L_i  theta^(kL_i/6)
//	ln(rho''/RhoC) = (Tc/T) sum_i V_i theta^(kV_i/6)
//
// where Tc, Pc and RhoC are the critical point of the equation.
const nAnc = 8

// fastMax is the highest T/Tc at which the phase is decided from the
// ancillaries alone when a state is far enough from saturation.
const fastMax = 0.98

// Exponents of theta, in sixths.
var (
	ancKP = [nAnc]int{6, 9, 12, 15, 21, 30, 36, 48}
	ancKL = [nAnc]int{2, 3, 4, 6, 9, 15, 24, 36}
	ancKV = [nAnc]int{2, 3, 4, 6, 9, 15, 24, 36}
)

// ancillary holds the fitted coefficients and the critical point of the
// equation (found by TestDerived as the point where dp/drho and
// d2p/drho2 vanish).
type ancillary struct {
	Tc, Pc, RhoC float64
	RhoMax       float64 // liquid density at (Tmin, Pmax)
	Pmin         float64 // saturation pressure at Tmin
	P, L, V      [nAnc]float64
	// PErr, LErr, VErr are the largest relative deviations of the fits from
	// the equation up to fastMax*Tc, where the solvers use them to decide
	// the phase; they widen their margins by them.
	PErr, LErr, VErr float64
	// pFast is the estimated saturation pressure at fastMax*Tc, set by
	// init: above it the ancillaries do not decide the phase.
	pFast float64
}

// ancSat is one estimated saturation point.
type ancSat struct{ p, rhoL, rhoV float64 }

// sixths returns theta^(k/6) for k = 0..48: the first six powers by
// products, then each from the one six before it, in six short chains
// rather than one of 48 dependent products.
func sixths(theta float64, pw *[49]float64) {
	s := fpmath.Cbrt(math.Sqrt(theta))
	pw[0] = 1
	for k := 1; k <= 6; k++ {
		pw[k] = float64(pw[k-1] * s)
	}
	for k := 7; k < len(pw); k++ {
		pw[k] = float64(pw[k-6] * pw[6])
	}
}

// estimate evaluates the ancillaries at T < Tc.
func (a *ancillary) estimate(T float64) ancSat {
	var pw [49]float64
	sixths(1-T/a.Tc, &pw)
	var sp, sl, sv float64
	for i := 0; i < nAnc; i++ {
		sp += float64(a.P[i] * pw[ancKP[i]])
		sl += float64(a.L[i] * pw[ancKL[i]])
		sv += float64(a.V[i] * pw[ancKV[i]])
	}
	r := a.Tc / T
	return ancSat{p: float64(a.Pc * fpmath.Exp(float64(r*sp))), rhoL: float64(a.RhoC * (1 + sl)), rhoV: float64(a.RhoC * fpmath.Exp(float64(r*sv)))}
}

// tsatEstimate inverts the vapour-pressure ancillary by Newton's method in
// T; p must lie below Pc.
func (a *ancillary) tsatEstimate(p float64) float64 {
	y := fpmath.Log(p / a.Pc)
	T := a.Tc / (1 + y/a.P[0]) // first term only: ln(p/Pc) = P0 (Tc/T - 1)
	for it := 0; it < 50; it++ {
		theta := 1 - T/a.Tc
		var pw [49]float64
		sixths(theta, &pw)
		var S, dS float64 // sum and its derivative in theta
		for i := 0; i < nAnc; i++ {
			k := float64(ancKP[i]) / 6
			S += float64(a.P[i] * pw[ancKP[i]])
			dS += float64(a.P[i] * k * pw[ancKP[i]-6]) // k >= 1: theta^(k-1)
		}
		r := a.Tc / T
		g := float64(-r/T*S) - dS/T // d/dT of r S
		dT := (float64(r*S) - y) / g
		dT = math.Max(math.Min(dT, float64(0.5*T)), float64(-0.5*(a.Tc-T)))
		T -= dT
		// Convergence is quadratic: after a step below 1e-7 the error is
		// far below that of the fit itself (about 1e-5 in T).
		if math.Abs(dT) < float64(1e-7*T) {
			break
		}
	}
	return T
}
