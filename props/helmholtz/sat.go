package helmholtz

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// satTol is the convergence target of the saturation solver: equal
// pressure and equal Gibbs energy on both phases to 1e-10 relative (it
// iterates to well below that).
const satTol = 1e-12

// satPoint is a converged saturation state at one temperature.
type satPoint struct {
	T, p     float64
	liq, vap point
}

// SatT returns the saturation state at temperature T, from the triple
// point (or the equation's lowest temperature) up to the critical point.
func (f *Fluid) SatT(T float64) (Sat, error) {
	sp, err := f.satT("SatT", T)
	if err != nil {
		return Sat{}, err
	}
	return f.sat(&sp), nil
}

// SatP returns the saturation state at pressure p, from the saturation
// pressure at the equation's lowest temperature up to the critical
// pressure.
func (f *Fluid) SatP(p float64) (Sat, error) {
	sp, err := f.satP("SatP", p)
	if err != nil {
		return Sat{}, err
	}
	return f.sat(&sp), nil
}

func (f *Fluid) sat(sp *satPoint) Sat {
	R := f.R
	return Sat{
		P: sp.p, T: sp.T,
		Hf: sp.liq.h(R), Hg: sp.vap.h(R), Sf: sp.liq.s(R), Sg: sp.vap.s(R),
		Vf: 1 / sp.liq.rho, Vg: 1 / sp.vap.rho, Uf: sp.liq.u(R), Ug: sp.vap.u(R),
	}
}

// satT checks T and solves: Newton from the ancillary estimate first, and
// the bracketing method when that fails.
func (f *Fluid) satT(op string, T float64) (satPoint, error) {
	if err := f.checkSatT(T); err != nil {
		return satPoint{}, err
	}
	var tp tauPart
	f.eos.newTauPart(f.eos.tRed/T, true, &tp)
	if f.anc.Tc != 0 {
		a := f.anc.estimate(T)
		if sp, ok := f.satNewton(&tp, T, a.rhoL, a.rhoV); ok {
			return sp, nil
		}
	}
	if sp, ok := f.satBracket(&tp, T); ok {
		return sp, nil
	}
	return satPoint{}, &SolveError{Op: op, Reason: f.satWhy(T)}
}

func (f *Fluid) satWhy(T float64) string {
	if T > float64(0.999*f.Tc) {
		return whyCritical
	}
	return whyNoConv
}

// checkSatT accepts Tmin <= T < Tc.
func (f *Fluid) checkSatT(T float64) error {
	switch {
	case !(T >= f.Tmin): // also catches NaN
		return &RangeError{Input: "T", Value: T, Limit: f.Tmin, Reason: reasonTmin}
	case T >= f.Tc && f.Tc != 0:
		return &RangeError{Input: "T", Value: T, Limit: f.Tc, Above: true, Reason: reasonTc}
	}
	return nil
}

// satNewton solves p' = p” and g' = g” for the two densities by Newton's
// method in reduced form, from the given starting densities. It reports
// failure if the iteration does not converge or ends on a trivial or
// unstable solution.
func (f *Fluid) satNewton(tp *tauPart, T, rhoL, rhoV float64) (satPoint, bool) {
	dL, dV := rhoL/f.eos.rhoRed, rhoV/f.eos.rhoRed
	for it := 0; it < 40; it++ {
		rL, rV := f.eos.residual(tp, dL), f.eos.residual(tp, dV)
		pL, pV := float64(dL*(1+rL.d)), float64(dV*(1+rV.d))
		f1 := pL - pV
		f2 := fpmath.Log(dL/dV) + rL.a + rL.d - rV.a - rV.d
		DL, DV := 1+float64(2*rL.d)+rL.dd, 1+float64(2*rV.d)+rV.dd
		if DL <= 0 || DV <= 0 || !(dL > dV) {
			return satPoint{}, false
		}
		det := float64(DL * DV * (1/dL - 1/dV))
		// J = [[DL, -DV], [DL/dL, -DV/dV]]; solve J (xL, xV) = -(f1, f2).
		xL := (float64(-f1*(-DV/dV)) + float64(f2*(-DV))) / det
		xV := (float64(DL*(-f2)) - float64(DL/dL*(-f1))) / det
		// Far below Tc the liquid pressure is a small difference of large
		// terms: its round-off, not satTol, bounds f1, and the iteration
		// has converged when its steps are at round-off.
		if math.Abs(f1) <= float64(satTol*pV) && math.Abs(f2) <= satTol {
			return f.satAt(tp, T, dL, dV, rL, rV), true
		}
		if math.Abs(xL) <= float64(1e-12*dL) && math.Abs(xV) <= float64(1e-12*dV) {
			// One more step reaches round-off: convergence is quadratic.
			return f.satDone(tp, T, dL+xL, dV+xV), true
		}
		dL = clampStep(dL, xL)
		dV = clampStep(dV, xV)
	}
	return satPoint{}, false
}

// clampStep applies a Newton step to a density, keeping it positive and
// within a factor of two.
func clampStep(x, dx float64) float64 {
	return math.Min(math.Max(x+dx, float64(0.5*x)), float64(2*x))
}

func (f *Fluid) satDone(tp *tauPart, T, dL, dV float64) satPoint {
	liq := f.at(tp, T, float64(dL*f.eos.rhoRed))
	vap := f.at(tp, T, float64(dV*f.eos.rhoRed))
	return satPoint{T: T, p: vap.p(f.R), liq: liq, vap: vap}
}

// satAt is satDone with the residual parts at dL and dV already known.
func (f *Fluid) satAt(tp *tauPart, T, dL, dV float64, rL, rV resid) satPoint {
	rr := f.eos.rhoRed
	liq := point{T: T, rho: float64(dL * rr), tau: tp.tau, delta: dL, i: tp.ideal, r: rL}
	vap := point{T: T, rho: float64(dV * rr), tau: tp.tau, delta: dV, i: tp.ideal, r: rV}
	return satPoint{T: T, p: vap.p(f.R), liq: liq, vap: vap}
}

// satBracket is the slow, robust method: find the spinodals, bisect on the
// pressure at which the Gibbs energies of the two stable branches are
// equal, then polish with satNewton.
func (f *Fluid) satBracket(tp *tauPart, T float64) (satPoint, bool) {
	sV, sL, dHi, ok := f.spinodals(tp, T)
	if !ok {
		return satPoint{}, false
	}
	RT := float64(f.R * T)
	pOf := func(d float64) float64 { return float64(d * f.eos.rhoRed * RT * (1 + f.eos.residual(tp, d).d)) }
	pHi := pOf(sV)
	pLo := math.Max(pOf(sL), 0)
	dg := func(lnp float64) float64 {
		p := fpmath.Exp(lnp)
		dV, okV := f.densityIn(tp, T, p, 0, float64(sV*f.eos.rhoRed), 0)
		dL, okL := f.densityIn(tp, T, p, float64(sL*f.eos.rhoRed), float64(dHi*f.eos.rhoRed), float64(dHi*f.eos.rhoRed))
		if !okV || !okL {
			return math.NaN()
		}
		dV, dL = dV/f.eos.rhoRed, dL/f.eos.rhoRed
		rV, rL := f.eos.residual(tp, dV), f.eos.residual(tp, dL)
		return fpmath.Log(dL/dV) + rL.a + rL.d - rV.a - rV.d
	}
	hi := fpmath.Log(pHi) - 1e-12
	lo := fpmath.Log(math.Max(pLo, float64(pHi*1e-3)))
	for i := 0; i < 20 && pLo <= 0 && dg(lo) < 0; i++ {
		lo -= fpmath.Log(1e3)
	}
	if pLo > 0 && fpmath.Log(pLo) > lo {
		lo = fpmath.Log(pLo) + 1e-12
	}
	lnp, ok := brent(dg, lo, hi, 1e-15)
	if !ok {
		return satPoint{}, false
	}
	p := fpmath.Exp(lnp)
	dV, _ := f.densityIn(tp, T, p, 0, float64(sV*f.eos.rhoRed), 0)
	dL, _ := f.densityIn(tp, T, p, float64(sL*f.eos.rhoRed), float64(dHi*f.eos.rhoRed), float64(dHi*f.eos.rhoRed))
	return f.satNewton(tp, T, dL, dV)
}

// spinodals returns the reduced densities of the vapour spinodal sV and
// the liquid spinodal sL at T, and a reduced density dHi on the stable
// liquid branch whose pressure exceeds that of the vapour spinodal.
func (f *Fluid) spinodals(tp *tauPart, T float64) (sV, sL, dHi float64, ok bool) {
	D := func(d float64) float64 { r := f.eos.residual(tp, d); return 1 + float64(2*r.d) + r.dd }
	dm, ok := f.unstableDensity(tp, T, D)
	if !ok {
		return 0, 0, 0, false
	}
	// Vapour spinodal: the first zero of D coming up from zero density.
	a := math.Min(1e-12, float64(dm/2))
	b := a
	for b < dm {
		b = math.Min(float64(b*1.05), dm)
		if D(b) <= 0 {
			break
		}
		a = b
	}
	sV, _ = brent(D, a, b, 1e-14)
	// Liquid spinodal: the first zero of D coming down from dense liquid.
	RT := float64(f.R * T)
	pV := float64(sV * f.eos.rhoRed * RT * (1 + f.eos.residual(tp, sV).d))
	dHi = 0
	for _, top := range []float64{6, 5, 4, 3} {
		r := f.eos.residual(tp, top)
		if top > dm && 1+float64(2*r.d)+r.dd > 0 && float64(top*f.eos.rhoRed*RT*(1+r.d)) > pV {
			dHi = top
			break
		}
	}
	if dHi == 0 {
		return 0, 0, 0, false
	}
	a, b = dHi, dHi
	for b > dm {
		b = math.Max(float64(b*0.995), dm)
		if D(b) <= 0 {
			break
		}
		a = b
	}
	sL, _ = brent(D, b, a, 1e-14)
	return sV, sL, dHi, sV < sL
}

// unstableDensity finds a reduced density where dp/drho < 0 at T: by a scan
// away from the critical point and by minimising dp/drho near it.
func (f *Fluid) unstableDensity(tp *tauPart, T float64, D func(float64) float64) (float64, bool) {
	if T < float64(0.9*f.eos.tRed) {
		for d := 1e-6; d < 5; d = float64(d * 1.02) {
			if D(d) < 0 {
				return d, true
			}
		}
	}
	dm := goldenMin(D, 0.3, 2.5)
	return dm, D(dm) < 0
}

// goldenMin returns the minimiser of a unimodal f on [a, b].
func goldenMin(f func(float64) float64, a, b float64) float64 {
	const g = 0.6180339887498949
	c, d := b-float64(g*(b-a)), a+float64(g*(b-a))
	fc, fd := f(c), f(d)
	for it := 0; it < 100 && b-a > float64(1e-12*(a+b)); it++ {
		if fc < fd {
			b, d, fd = d, c, fc
			c = b - float64(g*(b-a))
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + float64(g*(b-a))
			fd = f(d)
		}
	}
	return float64(0.5 * (a + b))
}

// satP finds the saturation temperature at p by Newton's method on the
// Clausius-Clapeyron slope, starting from the ancillary inverse, with a
// bracketing fallback on T.
func (f *Fluid) satP(op string, p float64) (satPoint, error) {
	return f.satPFrom(op, p, satGuess{})
}

// satPFrom is satP from a given start for Newton's method (T = 0: from the
// ancillaries).
func (f *Fluid) satPFrom(op string, p float64, g satGuess) (satPoint, error) {
	if err := f.checkSatP(p); err != nil {
		return satPoint{}, err
	}
	if sp, ok := f.satPNewton(p, g); ok {
		return sp, nil
	}
	T := f.anc.tsatEstimate(p)
	var best satPoint // the closest in p, for where round-off stalls the steps
	for it := 0; it < 30; it++ {
		T = math.Min(math.Max(T, f.Tmin), float64(f.Tc*(1-1e-12)))
		sp, err := f.satT(op, T)
		if err != nil {
			break
		}
		if best.p == 0 || math.Abs(sp.p-p) < math.Abs(best.p-p) {
			best = sp
		}
		// dp/dT = (s'' - s') / (v'' - v') (Clausius-Clapeyron)
		dpdT := (sp.vap.s(f.R) - sp.liq.s(f.R)) / (1/sp.vap.rho - 1/sp.liq.rho)
		dT := (sp.p - p) / dpdT
		if math.Abs(sp.p-p) <= float64(1e-13*p) || math.Abs(dT) <= float64(1e-14*T) {
			return sp, nil
		}
		T -= dT
	}
	if best.p != 0 && math.Abs(best.p-p) <= float64(1e-11*p) {
		return best, nil
	}
	return f.satPBracket(op, p)
}

// satPBracket bisects on T for the saturation pressure p.
func (f *Fluid) satPBracket(op string, p float64) (satPoint, error) {
	g := func(T float64) float64 {
		sp, err := f.satT(op, T)
		if err != nil {
			return math.NaN()
		}
		return fpmath.Log(sp.p / p)
	}
	T, ok := brent(g, f.Tmin, float64(f.Tc*(1-1e-9)), 1e-14)
	if ok {
		if sp, err := f.satT(op, T); err == nil && math.Abs(sp.p-p) <= float64(1e-9*p) {
			return sp, nil
		}
	}
	why := whyNoConv
	if p > float64(0.99*f.Pc) {
		why = whyCritical
	}
	return satPoint{}, &SolveError{Op: op, Reason: why}
}

// checkSatP accepts pressures between the saturation pressure at Tmin and
// the critical pressure.
func (f *Fluid) checkSatP(p float64) error {
	switch {
	case !(p > 0):
		return &RangeError{Input: "p", Value: p, Limit: 0, Reason: reasonPmin}
	case p >= f.Pc:
		return &RangeError{Input: "p", Value: p, Limit: f.Pc, Above: true, Reason: reasonPc}
	case p < f.pTriple():
		return &RangeError{Input: "p", Value: p, Limit: f.pTriple(), Reason: reasonPsatL}
	}
	return nil
}

// pTriple is the saturation pressure at Tmin (stored by TestDerived).
func (f *Fluid) pTriple() float64 { return f.anc.Pmin }
