package if97

import "math"

// This file holds the Helmholtz-energy kernel of region 3, IAPWS R7-97(2012) Eq. (28) with
// Table 30 and the relations of Tables 31 and 32, and the density of region 3 at given (p, T).

// helm holds the reduced derivatives of φ(δ, τ) = f/(RT) of R7-97 Eq. (28), each multiplied by
// its own variables: f = φ, d = δφδ, t = τφτ, dd = δ²φδδ, tt = τ²φττ, dt = δτφδτ.
type helm struct {
	rho, T              float64
	f, d, t, dd, tt, dt float64
}

// r3Helm evaluates R7-97 Eq. (28) at (ρ, T) with the derivatives that want selects
// (R7-97 Table 32).
func r3Helm(rho, T float64, want uint8) helm {
	delta, tau := rho/Rhoc, Tc/T
	var s termSums
	r3Sums(delta, tau, want, &s)
	a := helm{rho: rho, T: T, d: r3LnN + s.x, t: s.y, dd: s.xx - r3LnN, tt: s.yy, dt: s.xy}
	if want&wantF != 0 {
		a.f = r3LnN*math.Log(delta) + s.f
	}
	return a
}

// p returns the pressure p = ρRT δφδ (R7-97 Table 31).
func (a *helm) p() float64 { return a.rho * R * a.T * a.d }

// h returns the specific enthalpy h = RT(τφτ + δφδ) (R7-97 Table 31).
func (a *helm) h() float64 { return R * a.T * (a.t + a.d) }

// s returns the specific entropy s = R(τφτ - φ) (R7-97 Table 31); needs wantF.
func (a *helm) s() float64 { return R * (a.t - a.f) }

// dpdrho returns (∂p/∂ρ)_T = RT(2δφδ + δ²φδδ).
func (a *helm) dpdrho() float64 { return R * a.T * (2*a.d + a.dd) }

// dpdT returns (∂p/∂T)_ρ = ρR(δφδ - δτφδτ).
func (a *helm) dpdT() float64 { return a.rho * R * (a.d - a.dt) }

// dhdrho returns (∂h/∂ρ)_T = (RT/ρ)(δτφδτ + δφδ + δ²φδδ).
func (a *helm) dhdrho() float64 { return R * a.T / a.rho * (a.dt + a.d + a.dd) }

// dhdT returns (∂h/∂T)_ρ = R(δφδ - τ²φττ - δτφδτ).
func (a *helm) dhdT() float64 { return R * (a.d - a.tt - a.dt) }

// dsdrho returns (∂s/∂ρ)_T = (R/ρ)(δτφδτ - δφδ).
func (a *helm) dsdrho() float64 { return R / a.rho * (a.dt - a.d) }

// dsdT returns (∂s/∂T)_ρ = cv/T = -R τ²φττ / T.
func (a *helm) dsdT() float64 { return -R * a.tt / a.T }

// props returns the state of R7-97 Table 31; a must hold all derivatives.
func (a *helm) props() Props {
	RT := R * a.T
	b := a.d - a.dt
	st := Props{P: a.p(), T: a.T, Rho: a.rho, V: 1 / a.rho, Region: 3}
	st.H = a.h()
	st.U = RT * a.t
	st.S = a.s()
	st.Cv = -R * a.tt
	c := 2*a.d + a.dd
	if c > 0 {
		st.Cp = R * (-a.tt + b*b/c)
	}
	st.W = safeSqrt(RT * (c - b*b/a.tt))
	return st
}

// rho3 returns the density of region 3 at (p, T): the backward equation v3(p, T) of IAPWS
// SR5-05(2016) as start, then Newton steps on R7-97 Eq. (28) until p is met to rounding.
func rho3(p, T float64) float64 {
	rho := 1 / V3PT(p, T)
	return rho3Newton(p, T, rho)
}

// rho3Newton polishes a region-3 density at (p, T) from the start rho with Newton steps on
// p(ρ, T) = p, each step limited to 2 % of ρ so that it cannot jump across the critical
// inflection.
func rho3Newton(p, T, rho float64) float64 {
	for it := 0; it < 50; it++ {
		a := r3Helm(rho, T, wantX|wantXX)
		dp := a.dpdrho()
		if dp <= 0 {
			break
		}
		step := (p - a.p()) / dp
		if lim := 0.02 * rho; math.Abs(step) > lim {
			step = math.Copysign(lim, step)
		}
		rho += step
		if math.Abs(step) <= 1e-14*rho {
			break
		}
	}
	return rho
}
