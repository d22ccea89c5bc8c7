package helmholtz

import "math"

// densityIn solves p(T, rho) = p for rho between lo and hi (kg/m3), where
// p(T, lo) < p < p(T, hi) and p rises with rho in between, starting from
// guess (0 for the ideal-gas value). tp must be made for T.
func (f *Fluid) densityIn(tp *tauPart, T, p, lo, hi, guess float64) (float64, bool) {
	if guess == 0 {
		guess = math.Min(p/(f.R*T), float64(0.5*(lo+hi)))
	}
	if !(guess > math.Min(lo, hi) && guess < math.Max(lo, hi)) {
		guess = float64(0.5 * (lo + hi))
	}
	fdf := f.densityFdf(tp, T, p)
	fx, dfx := fdf(guess)
	return rtsafeFrom(fdf, lo, hi, guess, fx, dfx, 1e-14)
}

// densityFrom is densityIn from a guess x within the bracket where
// p(T, x) - p = fx and dp/drho = dfx are already known.
func (f *Fluid) densityFrom(tp *tauPart, T, p, lo, hi, x, fx, dfx float64) (float64, bool) {
	return rtsafeFrom(f.densityFdf(tp, T, p), lo, hi, x, fx, dfx, 1e-14)
}

// densityFdf returns rho -> (p(T, rho) - p, dp/drho) for the tau factors
// in tp.
func (f *Fluid) densityFdf(tp *tauPart, T, p float64) func(float64) (float64, float64) {
	rr := f.eos.rhoRed
	RT := float64(f.R * T)
	return func(rho float64) (float64, float64) {
		r := f.eos.residual(tp, rho/rr)
		return float64(rho*RT*(1+r.d)) - p, float64(RT * (1 + float64(2*r.d) + r.dd))
	}
}

// pressure returns p(T, rho) for the tau factors in tp.
func (f *Fluid) pressure(tp *tauPart, T, rho float64) (p, dpdrho float64) {
	r := f.eos.residual(tp, rho/f.eos.rhoRed)
	RT := float64(f.R * T)
	return float64(rho * RT * (1 + r.d)), float64(RT * (1 + float64(2*r.d) + r.dd))
}

// vapourDensity solves for the vapour density at (T, p) with p below the
// saturation pressure, given an upper bound rhoHi on the vapour branch
// with p(rhoHi) > p. A bound that fails that test by round-off only (a
// saturated vapour density at a T within round-off of Tsat) is widened.
func (f *Fluid) vapourDensity(tp *tauPart, T, p, rhoHi float64) (float64, bool) {
	for _, e := range boundSteps {
		hi := float64(rhoHi * (1 + e))
		ph, dh := f.pressure(tp, T, hi)
		if !(dh > 0) {
			break
		}
		if ph >= p {
			return f.densityIn(tp, T, p, 0, hi, 0)
		}
	}
	return 0, false
}

// liquidDensity solves for the liquid density at (T, p) with p above the
// saturation pressure, given a lower bound rhoLo on the liquid branch with
// p(rhoLo) < p. A bound that fails that test by round-off only (the
// liquid pressure is a small difference of large terms far below Tc) is
// widened. A tangent step from the bound gives the upper bound, since p
// is convex there; if it is not, the bound is widened.
func (f *Fluid) liquidDensity(tp *tauPart, T, p, rhoLo float64) (float64, bool) {
	for _, e := range boundSteps {
		lo := float64(rhoLo * (1 - e))
		pl, dl := f.pressure(tp, T, lo)
		if !(dl > 0) {
			break
		}
		if pl < p {
			return f.liquidAbove(tp, T, p, lo, pl, dl)
		}
	}
	return 0, false
}

// boundSteps are the relative widenings liquidDensity and vapourDensity
// try on a saturated density that bounds their solve.
var boundSteps = [...]float64{0, 1e-12, 1e-10, 1e-8, 1e-6}

// liquidAbove solves on the liquid branch above lo, where p(lo) = pl < p
// and dp/drho = dl > 0. The tangent step is at least 1e-13 of lo: a
// smaller one may not move the density at all.
func (f *Fluid) liquidAbove(tp *tauPart, T, p, lo, pl, dl float64) (float64, bool) {
	step := math.Max((p-pl)/dl, float64(1e-13*lo))
	hi := lo + step
	for i := 0; ; i++ {
		ph, dh := f.pressure(tp, T, hi)
		if ph > p && dh > 0 {
			return f.densityFrom(tp, T, p, lo, hi, hi, ph-p, dh)
		}
		if i == 60 {
			return 0, false
		}
		hi += step
	}
}

// superDensity solves for the density at T at or above Tc, where p rises
// with rho everywhere; the bracket runs from zero to beyond RhoMax.
func (f *Fluid) superDensity(tp *tauPart, T, p float64) (float64, bool) {
	hi := float64(1.2 * f.RhoMax)
	if ph, dh := f.pressure(tp, T, hi); !(ph > p) || !(dh > 0) {
		return 0, false
	}
	guess := 0.0
	if p > f.Pc {
		guess = float64(f.RhoC * 1.5)
	}
	return f.densityIn(tp, T, p, 0, hi, guess)
}
