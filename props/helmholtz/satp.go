package helmholtz

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// satGuess is a start for satPNewton: T and the reduced densities, and,
// where T is not 0, the residual parts at them.
type satGuess struct {
	T, dL, dV float64
	rL, rV    resid
}

// satPNewton solves for the saturation state at pressure p by Newton's
// method in (T, delta', delta”) on p' = p, p” = p and g' = g”, from g or,
// if g.T is 0, from the ancillary estimates. The result is polished at
// its temperature by satNewton and accepted if its pressure is p to 1e-11.
func (f *Fluid) satPNewton(p float64, g satGuess) (satPoint, bool) {
	rr := f.eos.rhoRed
	T, dL, dV, rL, rV := g.T, g.dL, g.dV, g.rL, g.rV
	if T == 0 {
		T = f.anc.tsatEstimate(p)
		a := f.anc.estimate(T)
		dL, dV = a.rhoL/rr, a.rhoV/rr
	}
	var tp tauPart
	for it := 0; it < 30; it++ {
		if !(T > float64(f.Tmin*0.99) && T < f.Tc && dL > dV && dV > 0) {
			return satPoint{}, false
		}
		if it > 0 || g.T == 0 {
			f.eos.newTauPart(f.eos.tRed/T, false, &tp)
			rL, rV = f.eos.residual(&tp, dL), f.eos.residual(&tp, dV)
		}
		RT := float64(f.R * T)
		pL, pV := float64(dL*rr*RT*(1+rL.d)), float64(dV*rr*RT*(1+rV.d))
		var J [3][4]float64 // augmented rows: dF/dT, dF/d dL, dF/d dV | -F
		J[0] = [4]float64{dL * rr * f.R * (1 + rL.d - rL.dt) / p, rr * RT * (1 + float64(2*rL.d) + rL.dd) / p, 0, 1 - pL/p}
		J[1] = [4]float64{dV * rr * f.R * (1 + rV.d - rV.dt) / p, 0, rr * RT * (1 + float64(2*rV.d) + rV.dd) / p, 1 - pV/p}
		J[2] = [4]float64{-(rL.t + rL.dt - rV.t - rV.dt) / T, (1 + float64(2*rL.d) + rL.dd) / dL, -(1 + float64(2*rV.d) + rV.dd) / dV,
			-(fpmath.Log(dL/dV) + rL.a + rL.d - rV.a - rV.d)}
		x, ok := solve3(&J)
		if !ok {
			return satPoint{}, false
		}
		s := math.Min(1, math.Min(0.05*T/math.Abs(x[0]), math.Min(0.5*dL/math.Abs(x[1]), 0.5*dV/math.Abs(x[2]))))
		T, dL, dV = T+float64(s*x[0]), dL+float64(s*x[1]), dV+float64(s*x[2])
		// Convergence is quadratic: after full steps this small the error
		// is near 1e-14, and satNewton finishes at this T.
		if s == 1 && math.Abs(x[0]) <= float64(1e-8*T) && math.Abs(x[1]) <= float64(1e-7*dL) && math.Abs(x[2]) <= float64(1e-7*dV) {
			f.eos.newTauPart(f.eos.tRed/T, true, &tp)
			sp, ok := f.satNewton(&tp, T, float64(dL*rr), float64(dV*rr))
			return sp, ok && math.Abs(sp.p/p-1) <= 1e-11
		}
	}
	return satPoint{}, false
}

// solve3 solves a 3x3 system given as an augmented matrix by Gaussian
// elimination with partial pivoting.
func solve3(m *[3][4]float64) ([3]float64, bool) {
	for c := 0; c < 3; c++ {
		piv := c
		for r := c + 1; r < 3; r++ {
			if math.Abs(m[r][c]) > math.Abs(m[piv][c]) {
				piv = r
			}
		}
		if m[piv][c] == 0 || math.IsNaN(m[piv][c]) {
			return [3]float64{}, false
		}
		m[c], m[piv] = m[piv], m[c]
		for r := c + 1; r < 3; r++ {
			k := m[r][c] / m[c][c]
			for j := c; j < 4; j++ {
				m[r][j] -= float64(k * m[c][j])
			}
		}
	}
	var x [3]float64
	for r := 2; r >= 0; r-- {
		s := m[r][3]
		for j := r + 1; j < 3; j++ {
			s -= float64(m[r][j] * x[j])
		}
		x[r] = s / m[r][r]
	}
	return x, true
}
