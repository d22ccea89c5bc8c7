package helmholtz

import "math"

// densityIn solves p(T, rho) = p for rho between lo and hi (kg/m3), where
// p(T, lo) < p < p(T, hi) and p rises with rho in between, starting from
// guess (0 for the ideal-gas value). tp must be made for T.
func (f *Fluid) densityIn(tp *tauPart, T, p, lo, hi, guess float64) (float64, bool) {
	rr := f.eos.rhoRed
	RT := f.R * T
	fdf := func(rho float64) (float64, float64) {
		r := f.eos.residual(tp, rho/rr)
		return rho*RT*(1+r.d) - p, RT * (1 + 2*r.d + r.dd)
	}
	if guess == 0 {
		guess = math.Min(p/RT, 0.5*(lo+hi))
	}
	return rtsafe(fdf, lo, hi, guess, 1e-14)
}

// pressure returns p(T, rho) for the tau factors in tp.
func (f *Fluid) pressure(tp *tauPart, T, rho float64) (p, dpdrho float64) {
	r := f.eos.residual(tp, rho/f.eos.rhoRed)
	RT := f.R * T
	return rho * RT * (1 + r.d), RT * (1 + 2*r.d + r.dd)
}

// vapourDensity solves for the vapour density at (T, p) with p below the
// saturation pressure, given an upper bound rhoHi on the vapour branch
// with p(rhoHi) > p.
func (f *Fluid) vapourDensity(tp *tauPart, T, p, rhoHi float64) (float64, bool) {
	return f.densityIn(tp, T, p, 0, rhoHi, 0)
}

// liquidDensity solves for the liquid density at (T, p) with p above the
// saturation pressure, given a lower bound rhoLo on the liquid branch with
// p(rhoLo) < p. A tangent step from rhoLo gives the upper bound, since p is
// convex there; if it is not, the bound is widened.
func (f *Fluid) liquidDensity(tp *tauPart, T, p, rhoLo float64) (float64, bool) {
	pl, dl := f.pressure(tp, T, rhoLo)
	if !(dl > 0) || pl >= p {
		return 0, false
	}
	hi := rhoLo + (p-pl)/dl
	for i := 0; ; i++ {
		ph, dh := f.pressure(tp, T, hi)
		if ph > p && dh > 0 {
			break
		}
		if i == 60 {
			return 0, false
		}
		hi += (p - pl) / dl
	}
	return f.densityIn(tp, T, p, rhoLo, hi, hi)
}

// superDensity solves for the density at T at or above Tc, where p rises
// with rho everywhere; the bracket runs from zero to beyond RhoMax.
func (f *Fluid) superDensity(tp *tauPart, T, p float64) (float64, bool) {
	hi := 1.2 * f.RhoMax
	if ph, dh := f.pressure(tp, T, hi); !(ph > p) || !(dh > 0) {
		return 0, false
	}
	guess := 0.0
	if p > f.Pc {
		guess = f.RhoC * 1.5
	}
	return f.densityIn(tp, T, p, 0, hi, guess)
}
