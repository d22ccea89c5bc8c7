package helmholtz

// isobar is a temperature bracket on an isobar, with the values of
// y - target at its ends where they are known (the saturated states).
// Where the exact saturation state at p bounds the bracket, the side is
// known too: cap > 0 is the saturated vapour density, above which no
// vapour on this isobar lies (T >= Tsat), and floor > 0 the saturated
// liquid density, below which no liquid on it lies (T <= Tsat).
type isobar struct {
	lo, hi, ylo, yhi float64
	loKnown, hiKnown bool
	cap, floor       float64
}

// solveIsobar solves y(T, p) = target for T in the bracket, with
// dy/dT = cp (for h), cp/T (for s) or v alpha (for v).
func (f *Fluid) solveIsobar(op string, p, target float64, by int, b isobar) (Props, error) {
	var last Props
	var q point
	var err error
	eval := func(T float64) (float64, float64) {
		last, q, err = f.isobarPoint(op, p, T, &b)
		switch by {
		case byH:
			return last.H - target, last.Cp
		case byS:
			return last.S - target, last.Cp / T
		}
		return last.V - target, q.dvdT()
	}
	if !b.loKnown {
		if b.ylo, _ = eval(b.lo); err != nil {
			return Props{}, err
		}
	}
	if b.ylo > 0 {
		return Props{}, f.isobarRange(by, target, b.ylo, false)
	}
	if !b.hiKnown {
		if b.yhi, _ = eval(b.hi); err != nil {
			return Props{}, err
		}
	}
	if b.yhi < 0 {
		return Props{}, f.isobarRange(by, target, b.yhi, true)
	}
	guess := b.lo + (b.hi-b.lo)*(-b.ylo)/(b.yhi-b.ylo)
	T, ok := rtsafe(eval, b.lo, b.hi, guess, 1e-14)
	if ok && err == nil && last.T != T {
		eval(T)
	}
	if !ok || err != nil {
		return Props{}, &SolveError{Op: op, Reason: f.critWhy(T, p)}
	}
	return last, nil
}

// isobarRange reports a target beyond the enthalpy or entropy at the
// temperature limits of the equation on this isobar.
func (f *Fluid) isobarRange(by int, target, dy float64, above bool) error {
	r := isobarReasons[by][0]
	if above {
		r = isobarReasons[by][1]
	}
	return &RangeError{Input: byName(by), Value: target, Limit: target + dy, Above: above, Reason: r}
}

// isobarReasons are the lower and upper limits' reasons per target.
var isobarReasons = [...][2]string{
	byH: {reasonHmin, reasonHmax},
	byS: {reasonSmin, reasonSmax},
	byV: {reasonVminP, reasonVmaxP},
}

// isobarPoint is the single-phase state at (p, T) within the bracket b,
// and the point it was built from.
func (f *Fluid) isobarPoint(op string, p, T float64, b *isobar) (Props, point, error) {
	var tp tauPart
	f.eos.newTauPart(f.eos.tRed/T, true, &tp)
	rho, ok := f.sideDensity(&tp, T, p, b)
	if !ok {
		var err error
		if rho, _, err = f.densityAt(op, &tp, T, p); err != nil {
			return Props{}, point{}, err
		}
	}
	q := f.at(&tp, T, rho)
	pr := f.props(&q)
	pr.P = p
	f.setPhase(&pr, rho)
	return pr, q, nil
}

// sideDensity solves for the density at (T, p) on the side of the dome
// that the bracket fixes, bounded by the saturated density at p. It
// reports false where the side is not known or the bound does not hold,
// and the caller then decides the phase at T itself. On the liquid side
// the ancillaries decide first where they can, since far below Tsat the
// saturated liquid density at p may lie inside the dome at T.
func (f *Fluid) sideDensity(tp *tauPart, T, p float64, b *isobar) (float64, bool) {
	switch {
	case b.cap > 0:
		return f.vapourDensity(tp, T, p, b.cap)
	case b.floor > 0:
		if rho, liquid, ok := f.densityFast(tp, T, p); ok && liquid {
			return rho, true
		}
		return f.liquidDensity(tp, T, p, b.floor)
	}
	return 0, false
}

// stableSide reports whether a point found by newtonPY is the stable
// state at p on the given side of the exact saturation state sp at p:
// liquid at or below Tsat with a density at or above the saturated
// liquid's, or vapour at or above Tsat with a density at or below the
// saturated vapour's, on a rising isotherm within the equation's range.
func (f *Fluid) stableSide(q *point, sp *satPoint, liquid bool) bool {
	if !(q.dpdrho() > 0) || q.T < f.Tmin || q.T > f.Tmax {
		return false
	}
	if !liquid {
		return q.T >= sp.T && q.rho <= sp.vap.rho
	}
	if q.T > sp.T || q.rho < sp.liq.rho {
		return false
	}
	// Far below Tsat some equations have rising branches inside the dome.
	return f.anc.Tc == 0 || q.T > float64(fastMax*f.Tc) || q.rho > float64(0.95*f.anc.estimate(q.T).rhoL)
}

// satNewtonPY runs the fast path from one saturated state of the exact
// saturation state sp at p and returns the state if it converged on that
// side of the dome.
func (f *Fluid) satNewtonPY(p, target float64, by int, sp *satPoint, liquid bool) (Props, bool) {
	sat := &sp.vap
	if liquid {
		sat = &sp.liq
	}
	T0, rho0 := f.isobarStart(sat, target, by)
	q, ok := f.newtonPY(p, target, by, T0, rho0)
	if !ok || !f.stableSide(&q, sp, liquid) {
		return Props{}, false
	}
	pr := f.props(&q)
	pr.P = p
	f.setPhase(&pr, q.rho)
	return pr, true
}
