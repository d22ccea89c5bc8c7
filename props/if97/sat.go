package if97

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// This file computes saturated states (region 4 of IAPWS R7-97(2012)): below 623.15 K the
// saturated liquid from region 1 and the saturated vapour from region 2 at (ps(T), T); above,
// the liquid and vapour roots of p3(ρ, T) = ps(T) of region 3. It also builds two-phase states
// from the quality.

// Saturation end points at 623.15 K (R7-97 Eq. 30 with regions 1 and 2): they bound the part of
// the saturation line that lies in region 3 (IAPWS SR3-03(2014) Section 4.3 quotes
// h' = 1670.858218 kJ/kg, h” = 2563.592004 kJ/kg, s' = 3.778281340 kJ/(kg·K),
// s” = 5.210887825 kJ/(kg·K)).
var (
	hf623 = h1(PSat623, T13)
	hg623 = h2(PSat623, T13)
	sf623 = sG(1, PSat623, T13)
	sg623 = sG(2, PSat623, T13)
)

// satStates returns the saturated liquid and vapour at temperature T (273.15 K <= T <= Tc) and
// saturation pressure p.
func satStates(p, T float64) (liq, vap Props) {
	if T <= T13 {
		liq = gibbsProps(1, p, T)
		vap = gibbsProps(2, p, T)
	} else {
		rf, rg := sat3Densities(p, T)
		a := r3Helm(rf, T, wantAll)
		liq = a.props()
		b := r3Helm(rg, T, wantAll)
		vap = b.props()
		liq.P, vap.P = p, p
	}
	liq.Phase, liq.X, liq.Region = TwoPhase, 0, 4
	vap.Phase, vap.X, vap.Region = TwoPhase, 1, 4
	return liq, vap
}

// gibbsProps returns the state of region 1, 2 or 5 at (p, T) without its phase.
func gibbsProps(region int, p, T float64) Props {
	d := gibbsAt(region, p, T, wantAll)
	return d.props(p, T, region)
}

// gibbsState returns the single-phase state of region 1, 2 or 5 at (p, T), phase included:
// finish(gibbsProps(region, p, T)), built in place.
func gibbsState(region int, p, T float64) Props {
	var st Props
	d := gibbsAt(region, p, T, wantAll)
	d.setProps(&st, p, T, region)
	setPhase(&st)
	return st
}

// sat3Densities returns the saturated-liquid and saturated-vapour densities of region 3 at
// (ps, T), 623.15 K < T <= Tc: the roots of p3(ρ, T) = ps of R7-97 Eq. (28) on the liquid and the
// vapour branch. The starting values come from the auxiliary equations for the saturated
// densities of IAPWS SR1-86(1992) Eqs. (2.3) and (2.4), used only as starting values.
func sat3Densities(ps, T float64) (rf, rg float64) {
	if T >= Tc {
		return Rhoc, Rhoc
	}
	th := 1 - T/Tc
	t1 := fpmath.Cbrt(th) // ϑ^(1/3)
	t2 := float64(t1 * t1)
	t5 := float64(t2 * t2 * t1)
	t16 := float64(t5 * t5 * t5 * t1)
	t43 := float64(t16 * t16 * t5 * t5 * t1)
	t110 := float64(t43 * t43 * t16 * t5 * t2 * t1)
	rf = float64(Rhoc * (1 + float64(1.99274064*t1) + float64(1.09965342*t2) - float64(0.510839303*t5) - float64(1.75493479*t16) - float64(45.5170352*t43) - float64(6.74694450e5*t110)))
	u := math.Sqrt(t1) // ϑ^(1/6)
	u2 := float64(u * u)
	u4 := float64(u2 * u2)
	u8 := float64(u4 * u4)
	u18 := float64(u8 * u8 * u2)
	u37 := float64(u18 * u18 * u)
	u71 := float64(u37 * u18 * u8 * u8)
	rg = float64(Rhoc * fpmath.Exp(float64(-2.03150240*u2)-float64(2.68302940*u4)-float64(5.38626492*u8)-float64(17.2991605*u18)-float64(44.7586581*u37)-float64(63.9201063*u71)))
	rf = satRoot(ps, T, rf, true)
	rg = satRoot(ps, T, rg, false)
	return rf, rg
}

// satRoot solves p3(ρ, T) = ps on one branch by Newton steps that stay on that branch: on the
// liquid branch p(ρ) rises and is convex, on the vapour branch it rises and is concave, so the
// steps approach the root from above (liquid) or below (vapour) once on the branch.
func satRoot(ps, T, rho float64, liquid bool) float64 {
	for it := 0; it < 100; it++ {
		a := r3Helm(rho, T, wantX|wantXX)
		dp := a.dpdrho()
		if dp <= 0 {
			// Inside the spinodal: move outward, away from the critical density.
			if liquid {
				rho += float64(0.1 * (rho - Rhoc + 1))
			} else {
				rho -= float64(0.1 * (Rhoc - rho + 1))
			}
			continue
		}
		step := (ps - a.p()) / dp
		if lim := float64(0.05 * rho); math.Abs(step) > lim {
			step = math.Copysign(lim, step)
		}
		if liquid && rho+step < Rhoc || !liquid && rho+step > Rhoc {
			step = float64(step / 2)
		}
		rho += step
		if math.Abs(step) <= float64(1e-14*rho) {
			break
		}
	}
	return rho
}

// SatT returns the saturated liquid and vapour at temperature T (K), 273.15 K <= T <= Tc, with
// the pressure from R7-97 Eq. (30).
func SatT(T float64) (Sat, error) {
	if err := checkSatT(T); err != nil {
		return Sat{}, err
	}
	p := Pc
	if T < Tc {
		p = psatEq(T)
	}
	return satOf(satStates(p, T)), nil
}

// SatP returns the saturated liquid and vapour at pressure p (Pa), PSatMin <= p <= Pc, with the
// temperature from R7-97 Eq. (31).
func SatP(p float64) (Sat, error) {
	T, err := Tsat(p)
	if err != nil {
		return Sat{}, err
	}
	return satOf(satStates(p, T)), nil
}

func satOf(l, g Props) Sat {
	return Sat{P: l.P, T: l.T, Hf: l.H, Hg: g.H, Sf: l.S, Sg: g.S, Vf: l.V, Vg: g.V, Uf: l.U, Ug: g.U}
}

// mix returns the two-phase state of quality x between saturated liquid l and vapour g.
func mix(l, g *Props, x float64) Props {
	switch x {
	case 0:
		return *l
	case 1:
		return *g
	}
	m := Props{P: l.P, T: l.T, X: x, Region: 4, Phase: TwoPhase}
	m.V = l.V + float64(x*(g.V-l.V))
	m.Rho = 1 / m.V
	m.H = l.H + float64(x*(g.H-l.H))
	m.S = l.S + float64(x*(g.S-l.S))
	m.U = l.U + float64(x*(g.U-l.U))
	return m
}

func checkX(x float64) error {
	if !(x >= 0) {
		return below("x", x, 0, "the vapour quality lies between saturated liquid and saturated vapour")
	}
	if !(x <= 1) {
		return above("x", x, 1, "the vapour quality lies between saturated liquid and saturated vapour")
	}
	return nil
}

// StatePX returns the two-phase state at saturation pressure p (Pa) and vapour quality x (0..1).
func StatePX(p, x float64) (Props, error) {
	T, err := Tsat(p)
	if err != nil {
		return Props{}, err
	}
	if err := checkX(x); err != nil {
		return Props{}, err
	}
	l, g := satStates(p, T)
	return mix(&l, &g, x), nil
}

// StateTX returns the two-phase state at saturation temperature T (K) and vapour quality x
// (0..1).
func StateTX(T, x float64) (Props, error) {
	if err := checkSatT(T); err != nil {
		return Props{}, err
	}
	if err := checkX(x); err != nil {
		return Props{}, err
	}
	p := Pc
	if T < Tc {
		p = psatEq(T)
	}
	l, g := satStates(p, T)
	return mix(&l, &g, x), nil
}
