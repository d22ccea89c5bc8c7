package helmholtz

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// newtonPY solves p(T, rho) = p and y(T, rho) = target (y = h or s) by
// Newton's method in (T, ln rho) from (T, rho). It is the fast path of the
// (p, h) and (p, s) solvers; its result must still pass stableAt.
func (f *Fluid) newtonPY(p, target float64, by int, T, rho float64) (point, bool) {
	R := f.R
	for it := 0; it < 40; it++ {
		if !(T > float64(0.5*f.Tmin) && T < float64(2*f.Tmax) && rho > 0 && rho < float64(2*f.RhoMax)) {
			return point{}, false
		}
		q := f.eval(T, rho)
		num, den := q.dpdT(), q.dpdrho()
		if !(den > 0) {
			return point{}, false
		}
		cv := q.cv(R)
		// Rows: p and y; columns: d/dT and d/d(ln rho).
		pT, pl := float64(rho*R*num), float64(rho*R*T*den)
		F1, F2, yT, yl := q.p(R)-p, q.h(R)-target, cv+float64(R*num), float64(R*T*(den-num))
		switch by {
		case byS:
			F2, yT, yl = q.s(R)-target, cv/T, float64(-R*num)
		case byV: // ln(rho v) = 0
			F2, yT, yl = fpmath.Log(float64(rho*target)), 0, 1
		}
		det := float64(pT*yl) - float64(pl*yT)
		if det == 0 {
			return point{}, false
		}
		dT := -(float64(F1*yl) - float64(pl*F2)) / det
		dl := -(float64(pT*F2) - float64(yT*F1)) / det
		if math.Abs(dT) <= float64(1e-12*T) && math.Abs(dl) <= 1e-12 {
			return f.eval(T+dT, float64(rho*fpmath.Exp(dl))), true // quadratic: now at round-off
		}
		s := math.Min(1, math.Min(0.1*T/math.Abs(dT), 0.5/math.Abs(dl)))
		T += float64(s * dT)
		rho = float64(rho * fpmath.Exp(float64(s*dl)))
	}
	return point{}, false
}

// stableAt reports whether a point found by newtonPY is the stable
// single-phase state at pressure p on the expected side of the dome
// (liquid: rho above RhoC): on a rising isotherm and, below Tc, clearly on
// that side of the ancillary saturation pressure at its T, with a density
// near that side's saturated density rather than deep inside the dome,
// where some equations have spurious rising branches. It returns false
// where it cannot tell, and the caller then takes the slow, bracketed path.
func (f *Fluid) stableAt(q *point, p float64, liquid bool) bool {
	if !(q.dpdrho() > 0) || q.T < f.Tmin || q.T > f.Tmax {
		return false
	}
	if q.T >= f.Tc {
		return true
	}
	if f.anc.Tc == 0 || q.T > float64(fastMax*f.Tc) {
		return false
	}
	a := f.anc.estimate(q.T)
	m := 1e-4 + float64(10*f.anc.PErr)
	if liquid {
		return p > float64(a.p*(1+m)) && q.rho > float64(0.95*a.rhoL)
	}
	return p < float64(a.p*(1-m)) && q.rho < float64(1.05*a.rhoV)
}

// isobarStart is a starting point for newtonPY on one side of the dome,
// one linear step in T away from the saturated state sat along the isobar.
func (f *Fluid) isobarStart(sat *point, target float64, by int) (T, rho float64) {
	pr := f.props(sat)
	dydT := pr.Cp
	switch by {
	case byS:
		dydT /= sat.T
	case byV:
		dydT = sat.dvdT()
	}
	T = sat.T + (target-pick(pr, by))/dydT
	T = math.Min(math.Max(T, f.Tmin), f.Tmax)
	switch {
	case by == byV:
		rho = 1 / target
	case sat.rho < f.RhoC:
		rho = sat.rho * sat.T / T // ideal-gas-like vapour
	case f.anc.Tc != 0 && T < f.Tc:
		rho = float64(f.anc.estimate(T).rhoL * 1.001) // compressed liquid
	default:
		rho = sat.rho
	}
	return T, rho
}

// tryNewtonPY runs the fast path from a saturated state (or, at or above
// Pc, from any state on the isobar) and returns the finished state if it
// converged to a stable state.
func (f *Fluid) tryNewtonPY(p, target float64, by int, sat *point) (Props, bool) {
	T0, rho0 := f.isobarStart(sat, target, by)
	q, ok := f.newtonPY(p, target, by, T0, rho0)
	liquid := sat.rho > f.RhoC
	if p >= f.Pc {
		liquid = q.T < f.Tc // compressed liquid below Tc
	}
	if !ok || !f.stableAt(&q, p, liquid) {
		return Props{}, false
	}
	pr := f.props(&q)
	pr.P = p
	f.setPhase(&pr, q.rho)
	return pr, true
}
