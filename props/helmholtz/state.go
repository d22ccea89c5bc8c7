package helmholtz

import "math"

// StateTRho returns the state at temperature T and density rho. Below the
// critical temperature a density between those of the saturated vapour
// and liquid gives a two-phase state.
func (f *Fluid) StateTRho(T, rho float64) (Props, error) {
	if err := f.checkT(T); err != nil {
		return Props{}, err
	}
	if !(rho > 0) {
		return Props{}, &RangeError{Input: "rho", Value: rho, Limit: 0, Reason: reasonRho0}
	}
	if rho > f.RhoMax {
		return Props{}, &RangeError{Input: "rho", Value: rho, Limit: f.RhoMax, Above: true, Reason: reasonRhoMx}
	}
	var tp tauPart
	f.eos.newTauPart(f.eos.tRed/T, true, &tp)
	if T < f.Tc && !f.clearOfDome(T, rho) {
		sp, err := f.satT("StateTRho", T)
		if err != nil {
			return Props{}, err
		}
		if rho < sp.liq.rho && rho > sp.vap.rho {
			x := (1/rho - 1/sp.liq.rho) / (1/sp.vap.rho - 1/sp.liq.rho)
			return twoPhase(f.sat(&sp), x), nil
		}
	}
	q := f.at(&tp, T, rho)
	pr := f.props(&q)
	if pr.P > f.Pmax {
		return Props{}, &RangeError{Input: "p", Value: pr.P, Limit: f.Pmax, Above: true, Reason: reasonPmax}
	}
	f.setPhase(&pr, rho)
	return pr, nil
}

// clearOfDome reports whether the ancillaries put rho well outside the
// saturated densities at T, so that no saturation solve is needed.
func (f *Fluid) clearOfDome(T, rho float64) bool {
	if f.anc.Tc == 0 || T > float64(fastMax*f.Tc) {
		return false
	}
	a := f.anc.estimate(T)
	m := 1e-3 + float64(10*math.Max(f.anc.LErr, f.anc.VErr))
	return rho > float64(a.rhoL*(1+m)) || rho < float64(a.rhoV*(1-m))
}

// setPhase labels a single-phase state.
func (f *Fluid) setPhase(pr *Props, rho float64) {
	switch {
	case pr.T >= f.Tc && pr.P >= f.Pc:
		pr.Phase, pr.X = Supercritical, 1
	case pr.T >= f.Tc:
		pr.Phase, pr.X = Vapour, 1
	case rho >= f.RhoC:
		pr.Phase, pr.X = Liquid, 0
	default:
		pr.Phase, pr.X = Vapour, 1
	}
}

// checkT accepts Tmin <= T <= Tmax.
func (f *Fluid) checkT(T float64) error {
	switch {
	case !(T >= f.Tmin):
		return &RangeError{Input: "T", Value: T, Limit: f.Tmin, Reason: reasonTmin}
	case T > f.Tmax:
		return &RangeError{Input: "T", Value: T, Limit: f.Tmax, Above: true, Reason: reasonTmax}
	}
	return nil
}

// checkP accepts 0 < p <= Pmax.
func (f *Fluid) checkP(p float64) error {
	switch {
	case !(p > 0):
		return &RangeError{Input: "p", Value: p, Limit: 0, Reason: reasonPmin}
	case p > f.Pmax:
		return &RangeError{Input: "p", Value: p, Limit: f.Pmax, Above: true, Reason: reasonPmax}
	}
	return nil
}

// StatePT returns the single-phase state at pressure p and temperature T.
// A (p, T) on the saturation line is an error: the quality is needed there.
func (f *Fluid) StatePT(p, T float64) (Props, error) {
	if err := f.checkT(T); err != nil {
		return Props{}, err
	}
	if err := f.checkP(p); err != nil {
		return Props{}, err
	}
	var tp tauPart
	f.eos.newTauPart(f.eos.tRed/T, true, &tp)
	rho, _, err := f.densityAt("StatePT", &tp, T, p)
	if err != nil {
		return Props{}, err
	}
	q := f.at(&tp, T, rho)
	pr := f.props(&q)
	pr.P = p
	f.setPhase(&pr, rho)
	return pr, nil
}

// densityTP finds the density at (T, p) on the stable branch, without
// range checks; the bool reports a liquid-side root below Tc.
func (f *Fluid) densityTP(op string, T, p float64) (float64, bool, error) {
	var tp tauPart
	f.eos.newTauPart(f.eos.tRed/T, false, &tp)
	return f.densityAt(op, &tp, T, p)
}

// densityAt is densityTP with the tau factors for T already made.
func (f *Fluid) densityAt(op string, tp *tauPart, T, p float64) (float64, bool, error) {
	if T >= f.Tc {
		if rho, ok := f.superDensity(tp, T, p); ok {
			return rho, rho > f.RhoC, nil
		}
		return 0, false, &SolveError{Op: op, Reason: f.critWhy(T, p)}
	}
	if rho, liquid, ok := f.densityFast(tp, T, p); ok {
		return rho, liquid, nil
	}
	sp, err := f.satT(op, T)
	if err != nil {
		return 0, false, err
	}
	rho, ok, liquid := 0.0, false, p > sp.p
	switch {
	case math.Abs(p-sp.p) <= float64(1e-12*p):
		return 0, false, &SolveError{Op: op, Reason: whyOnSat}
	case liquid:
		rho, ok = f.liquidDensity(tp, T, p, sp.liq.rho)
	default:
		rho, ok = f.vapourDensity(tp, T, p, sp.vap.rho)
	}
	if !ok {
		return 0, false, &SolveError{Op: op, Reason: f.critWhy(T, p)}
	}
	return rho, liquid, nil
}

func (f *Fluid) critWhy(T, p float64) string {
	if math.Abs(T/f.Tc-1) < 1e-3 && math.Abs(p/f.Pc-1) < 1e-2 {
		return whyCritical
	}
	return whyNoConv
}

// densityFast decides the phase from the ancillaries where p is clearly
// off the saturation pressure, and solves within brackets it checks.
func (f *Fluid) densityFast(tp *tauPart, T, p float64) (float64, bool, bool) {
	if f.anc.Tc == 0 || T > float64(fastMax*f.Tc) {
		return 0, false, false
	}
	a := f.anc.estimate(T)
	mp := 1e-4 + float64(10*f.anc.PErr)
	switch {
	case p < float64(a.p*(1-mp)):
		hi := float64(a.rhoV * (1 + 1e-3 + float64(10*f.anc.VErr)))
		if ph, dh := f.pressure(tp, T, hi); ph > p && dh > 0 {
			rho, ok := f.densityIn(tp, T, p, 0, hi, 0)
			return rho, false, ok
		}
	case p > float64(a.p*(1+mp)):
		lo := float64(a.rhoL * (1 - 1e-3 - float64(10*f.anc.LErr)))
		rho, ok := f.liquidDensity(tp, T, p, lo)
		return rho, true, ok
	}
	return 0, false, false
}
