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
	byV
)

// StatePH returns the state at pressure p and specific enthalpy h.
func (f *Fluid) StatePH(p, h float64) (Props, error) { return f.stateIsobar("StatePH", p, h, byH) }

// StatePS returns the state at pressure p and specific entropy s.
func (f *Fluid) StatePS(p, s float64) (Props, error) { return f.stateIsobar("StatePS", p, s, byS) }

// stateIsobar finds the phase first: below Pc it compares the target with
// the saturated liquid and vapour (estimated from the ancillaries where the
// target is clearly off the dome, exactly otherwise) and returns a
// two-phase state by the lever rule; single-phase states are then solved
// along the isobar for T, where h, s and v rise with T.
func (f *Fluid) stateIsobar(op string, p, target float64, by int) (Props, error) {
	if err := f.checkP(p); err != nil {
		return Props{}, err
	}
	if err := f.checkTarget(by, target); err != nil {
		return Props{}, err
	}
	if p >= f.Pc || p < f.Pmin() { // no saturation state at this pressure
		return f.isobarNoDome(op, p, target, by)
	}
	d, est := f.sideFast(p, target, by)
	if est && d.side != 0 {
		sat := &d.qv
		if d.side < 0 {
			sat = &d.ql
		}
		if pr, ok := f.tryNewtonPY(p, target, by, sat); ok {
			return pr, nil
		}
		dT := float64(1e-3 * d.Ts)
		b := isobar{lo: math.Max(d.Ts-dT, f.Tmin), hi: f.Tmax}
		if d.side < 0 {
			b = isobar{lo: f.Tmin, hi: math.Min(d.Ts+dT, f.Tmax)}
		}
		if pr, err := f.solveIsobar(op, p, target, by, b); err == nil {
			return pr, nil
		}
	}
	var g satGuess
	if est {
		g = d.guess()
	}
	sp, err := f.satPFrom(op, p, g)
	if err != nil {
		return Props{}, err
	}
	yf, yg := pick(f.props(&sp.liq), by), pick(f.props(&sp.vap), by)
	switch {
	case target < yf:
		if pr, ok := f.satNewtonPY(p, target, by, &sp, true); ok {
			return pr, nil
		}
		return f.solveIsobar(op, p, target, by, isobar{lo: f.Tmin, hi: sp.T, yhi: yf - target, hiKnown: true, floor: sp.liq.rho})
	case target > yg:
		if pr, ok := f.satNewtonPY(p, target, by, &sp, false); ok {
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
// and otherwise by the bracketed solver over the whole range of T. Below
// the saturation pressure at Tmin the whole isobar is vapour, with a
// density below that of the saturated vapour at Tmin.
func (f *Fluid) isobarNoDome(op string, p, target float64, by int) (Props, error) {
	b := isobar{lo: f.Tmin, hi: f.Tmax}
	if p < f.Pc {
		if sp, err := f.satT(op, f.Tmin); err == nil {
			b.cap = sp.vap.rho // p is below sp.p, or within round-off of it
		}
		return f.solveIsobar(op, p, target, by, b)
	}
	if f.Tc <= f.Tmax {
		var tp tauPart
		f.eos.newTauPart(f.eos.tRed/f.Tc, true, &tp)
		if rho, ok := f.superDensity(&tp, f.Tc, p); ok {
			q := f.at(&tp, f.Tc, rho)
			if pr, ok := f.tryNewtonPY(p, target, by, &q); ok {
				return pr, nil
			}
		}
	}
	return f.solveIsobar(op, p, target, by, b)
}

func byName(by int) string {
	switch by {
	case byH:
		return "h"
	case byS:
		return "s"
	}
	return "v"
}

// checkTarget rejects a target that no state has: NaN or infinite, and
// for v one not above zero or below that of the highest valid density.
func (f *Fluid) checkTarget(by int, target float64) error {
	if err := checkFinite(byName(by), target); err != nil || by != byV {
		return err
	}
	return f.checkV(target)
}

// checkFinite rejects NaN and infinite inputs.
func checkFinite(in string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &RangeError{Input: in, Value: v, Limit: math.Copysign(math.MaxFloat64, v), Above: v > 0, Reason: reasonFinite}
	}
	return nil
}

func pick(pr Props, by int) float64 {
	switch by {
	case byH:
		return pr.H
	case byS:
		return pr.S
	}
	return pr.V
}

// dome is the saturation state at p estimated from the ancillaries, and
// the side of it (-1 liquid, +1 vapour, 0 too near to tell) on which a
// target lies.
type dome struct {
	Ts     float64
	ql, qv point
	side   int
}

// guess is the estimate as a start for the saturation solver, with the
// residual parts already evaluated at it.
func (d *dome) guess() satGuess {
	return satGuess{T: d.Ts, dL: d.ql.delta, dV: d.qv.delta, rL: d.ql.r, rV: d.qv.r}
}

// sideFast estimates the dome at p from the ancillaries and decides
// whether the target lies clearly on its liquid or vapour side: 2 % of the
// latent change beyond the estimated saturated value for h and s, 2 % of
// the estimated saturated value for v. It reports false where the
// ancillaries are not used (near and above the critical point, below
// Pmin); side 0 means the target is too near the dome to tell.
func (f *Fluid) sideFast(p, target float64, by int) (dome, bool) {
	if f.anc.Tc == 0 || p > f.anc.pFast || p < f.Pmin() {
		return dome{}, false
	}
	T := f.anc.tsatEstimate(p)
	a := f.anc.estimate(T)
	var tp tauPart
	f.eos.newTauPart(f.eos.tRed/T, true, &tp)
	d := dome{Ts: T, ql: f.at(&tp, T, a.rhoL), qv: f.at(&tp, T, a.rhoV)}
	yf, yg := pick(f.props(&d.ql), by), pick(f.props(&d.qv), by)
	mf, mg := float64(0.02*(yg-yf)), float64(0.02*(yg-yf))
	if by == byV {
		mf, mg = float64(0.02*yf), float64(0.02*yg)
	}
	switch {
	case target < yf-mf:
		d.side = -1
	case target > yg+mg:
		d.side = 1
	}
	return d, true
}

// Pmin is the saturation pressure at Tmin, the lowest pressure at which
// saturation states exist within the equation's range.
func (f *Fluid) Pmin() float64 { return f.anc.Pmin }
