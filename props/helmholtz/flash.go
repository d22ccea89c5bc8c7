package helmholtz

import "math"

// StateTX returns the saturated state at temperature T and quality x
// (0 saturated liquid, 1 saturated vapour). At x = 0 and x = 1 the state
// is the saturated liquid or vapour with all its properties.
func (f *Fluid) StateTX(T, x float64) (Props, error) {
	if err := checkX(x); err != nil {
		return Props{}, err
	}
	sp, err := f.satT("StateTX", T)
	if err != nil {
		return Props{}, err
	}
	return f.satState(&sp, x), nil
}

// StatePX returns the saturated state at pressure p and quality x.
func (f *Fluid) StatePX(p, x float64) (Props, error) {
	if err := checkX(x); err != nil {
		return Props{}, err
	}
	sp, err := f.satP("StatePX", p)
	if err != nil {
		return Props{}, err
	}
	pr := f.satState(&sp, x)
	pr.P = p
	return pr, nil
}

func checkX(x float64) error {
	switch {
	case !(x >= 0):
		return &RangeError{Input: "x", Value: x, Limit: 0, Reason: reasonX0}
	case x > 1:
		return &RangeError{Input: "x", Value: x, Limit: 1, Above: true, Reason: reasonX1}
	}
	return nil
}

// satState is the state of quality x on a saturation point.
func (f *Fluid) satState(sp *satPoint, x float64) Props {
	switch x {
	case 0:
		pr := f.props(&sp.liq)
		pr.P, pr.Phase, pr.X = sp.p, Liquid, 0
		return pr
	case 1:
		pr := f.props(&sp.vap)
		pr.P, pr.Phase, pr.X = sp.p, Vapour, 1
		return pr
	}
	return twoPhase(f.sat(sp), x)
}

// Which property an isobar solve matches.
const (
	byH = iota
	byS
)

// StatePH returns the state at pressure p and specific enthalpy h.
func (f *Fluid) StatePH(p, h float64) (Props, error) { return f.stateIsobar("StatePH", p, h, byH) }

// StatePS returns the state at pressure p and specific entropy s.
func (f *Fluid) StatePS(p, s float64) (Props, error) { return f.stateIsobar("StatePS", p, s, byS) }

// stateIsobar finds the phase first: below Pc it compares the target with
// the saturated liquid and vapour (estimated from the ancillaries where the
// target is clearly off the dome, exactly otherwise) and returns a
// two-phase state by the lever rule; single-phase states are then solved
// along the isobar for T, where h and s rise with T.
func (f *Fluid) stateIsobar(op string, p, target float64, by int) (Props, error) {
	if err := f.checkP(p); err != nil {
		return Props{}, err
	}
	if err := checkFinite(byName(by), target); err != nil {
		return Props{}, err
	}
	if p >= f.Pc || p < f.Pmin() { // no saturation state at this pressure
		return f.isobarNoDome(op, p, target, by)
	}
	if d, ok := f.sideFast(p, target, by); ok {
		sat := &d.qv
		if d.side < 0 {
			sat = &d.ql
		}
		if pr, ok := f.tryNewtonPY(p, target, by, sat); ok {
			return pr, nil
		}
		dT := 1e-3 * d.Ts
		b := isobar{lo: math.Max(d.Ts-dT, f.Tmin), hi: f.Tmax}
		if d.side < 0 {
			b = isobar{lo: f.Tmin, hi: math.Min(d.Ts+dT, f.Tmax)}
		}
		if pr, err := f.solveIsobar(op, p, target, by, b); err == nil {
			return pr, nil
		}
	}
	sp, err := f.satP(op, p)
	if err != nil {
		return Props{}, err
	}
	yf, yg := pick(f.props(&sp.liq), by), pick(f.props(&sp.vap), by)
	switch {
	case target < yf:
		if pr, ok := f.tryNewtonPY(p, target, by, &sp.liq); ok {
			return pr, nil
		}
		return f.solveIsobar(op, p, target, by, isobar{lo: f.Tmin, hi: sp.T, yhi: yf - target, hiKnown: true})
	case target > yg:
		if pr, ok := f.tryNewtonPY(p, target, by, &sp.vap); ok {
			return pr, nil
		}
		return f.solveIsobar(op, p, target, by, isobar{lo: sp.T, hi: f.Tmax, ylo: yg - target, loKnown: true, cap: sp.vap.rho})
	}
	pr := twoPhase(f.sat(&sp), (target-yf)/(yg-yf))
	pr.P = p
	return pr, nil
}

// isobarNoDome solves an isobar that crosses no saturation state: at or
// above Pc by Newton's method from the state at Tc where that converges,
// and otherwise by the bracketed solver over the whole range of T.
func (f *Fluid) isobarNoDome(op string, p, target float64, by int) (Props, error) {
	if p >= f.Pc && f.Tc <= f.Tmax {
		var tp tauPart
		f.eos.newTauPart(f.eos.tRed/f.Tc, true, &tp)
		if rho, ok := f.superDensity(&tp, f.Tc, p); ok {
			q := f.at(&tp, f.Tc, rho)
			if pr, ok := f.tryNewtonPY(p, target, by, &q); ok {
				return pr, nil
			}
		}
	}
	return f.solveIsobar(op, p, target, by, isobar{lo: f.Tmin, hi: f.Tmax})
}

// isobar is a temperature bracket on an isobar, with the values of
// y - target at its ends where they are known (the saturated states), and
// for the vapour side the saturated vapour density, above which no vapour
// on this isobar lies.
type isobar struct {
	lo, hi, ylo, yhi float64
	loKnown, hiKnown bool
	cap              float64
}

func byName(by int) string {
	if by == byH {
		return "h"
	}
	return "s"
}

// checkFinite rejects NaN and infinite inputs.
func checkFinite(in string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &RangeError{Input: in, Value: v, Limit: math.Copysign(math.MaxFloat64, v), Above: v > 0, Reason: reasonFinite}
	}
	return nil
}

func pick(pr Props, by int) float64 {
	if by == byH {
		return pr.H
	}
	return pr.S
}

// dome is the saturation state at p estimated from the ancillaries, and
// the side of it (-1 liquid, +1 vapour) on which a target lies.
type dome struct {
	Ts     float64
	ql, qv point
	side   int
}

// sideFast decides from the ancillaries whether the target lies clearly on
// the liquid or the vapour side of the dome at p (2 % of the latent
// change beyond the estimated saturated value).
func (f *Fluid) sideFast(p, target float64, by int) (dome, bool) {
	if f.anc.Tc == 0 || p > f.anc.estimate(fastMax*f.Tc).p || p < f.Pmin() {
		return dome{}, false
	}
	T := f.anc.tsatEstimate(p)
	a := f.anc.estimate(T)
	var tp tauPart
	f.eos.newTauPart(f.eos.tRed/T, true, &tp)
	d := dome{Ts: T, ql: f.at(&tp, T, a.rhoL), qv: f.at(&tp, T, a.rhoV)}
	yf, yg := pick(f.props(&d.ql), by), pick(f.props(&d.qv), by)
	m := 0.02 * (yg - yf)
	switch {
	case target < yf-m:
		d.side = -1
	case target > yg+m:
		d.side = 1
	default:
		return dome{}, false
	}
	return d, true
}

// Pmin is the saturation pressure at Tmin, the lowest pressure at which
// saturation states exist within the equation's range.
func (f *Fluid) Pmin() float64 { return f.anc.Pmin }

// solveIsobar solves y(T, p) = target for T in the bracket, with
// dy/dT = cp (for h) or cp/T (for s).
func (f *Fluid) solveIsobar(op string, p, target float64, by int, b isobar) (Props, error) {
	var last Props
	var err error
	eval := func(T float64) (float64, float64) {
		last, err = f.isobarPoint(op, p, T, b.cap)
		if by == byH {
			return last.H - target, last.Cp
		}
		return last.S - target, last.Cp / T
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
	in, r := "h", reasonHmin
	if by == byS {
		in, r = "s", reasonSmin
	}
	if above {
		r = reasonHmax
		if by == byS {
			r = reasonSmax
		}
	}
	return &RangeError{Input: in, Value: target, Limit: target + dy, Above: above, Reason: r}
}

// isobarPoint is the single-phase state at (p, T). With cap > 0 the state
// is known to be vapour with a density below cap.
func (f *Fluid) isobarPoint(op string, p, T, cap float64) (Props, error) {
	var tp tauPart
	f.eos.newTauPart(f.eos.tRed/T, true, &tp)
	rho, ok := 0.0, false
	if cap > 0 {
		if ph, dh := f.pressure(&tp, T, cap); ph >= p && dh > 0 {
			rho, ok = f.vapourDensity(&tp, T, p, cap)
		}
	}
	if !ok {
		var err error
		if rho, _, err = f.densityAt(op, &tp, T, p); err != nil {
			return Props{}, err
		}
	}
	q := f.at(&tp, T, rho)
	pr := f.props(&q)
	pr.P = p
	f.setPhase(&pr, rho)
	return pr, nil
}
