package if97

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

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
	lnDelta := 0.0
	if want&wantF != 0 {
		lnDelta = fpmath.Log(delta) // first, so that it runs alongside the sums
	}
	var s termSums
	r3Sums(delta, tau, want, &s)
	a := helm{rho: rho, T: T, d: r3LnN + s.x, t: s.y, dd: s.xx - r3LnN, tt: s.yy, dt: s.xy}
	if want&wantF != 0 {
		a.f = float64(r3LnN*lnDelta) + s.f
	}
	return a
}

// p returns the pressure p = ρRT δφδ (R7-97 Table 31).
func (a *helm) p() float64 { return float64(a.rho * R * a.T * a.d) }

// h returns the specific enthalpy h = RT(τφτ + δφδ) (R7-97 Table 31).
func (a *helm) h() float64 { return float64(R * a.T * (a.t + a.d)) }

// s returns the specific entropy s = R(τφτ - φ) (R7-97 Table 31); needs wantF.
func (a *helm) s() float64 { return float64(R * (a.t - a.f)) }

// dpdrho returns (∂p/∂ρ)_T = RT(2δφδ + δ²φδδ).
func (a *helm) dpdrho() float64 { return float64(R * a.T * (float64(2*a.d) + a.dd)) }

// dpdT returns (∂p/∂T)_ρ = ρR(δφδ - δτφδτ).
func (a *helm) dpdT() float64 { return float64(a.rho * R * (a.d - a.dt)) }

// dhdrho returns (∂h/∂ρ)_T = (RT/ρ)(δτφδτ + δφδ + δ²φδδ).
func (a *helm) dhdrho() float64 { return float64(R * a.T / a.rho * (a.dt + a.d + a.dd)) }

// dhdT returns (∂h/∂T)_ρ = R(δφδ - τ²φττ - δτφδτ).
func (a *helm) dhdT() float64 { return float64(R * (a.d - a.tt - a.dt)) }

// dsdrho returns (∂s/∂ρ)_T = (R/ρ)(δτφδτ - δφδ).
func (a *helm) dsdrho() float64 { return float64(R / a.rho * (a.dt - a.d)) }

// dsdT returns (∂s/∂T)_ρ = cv/T = -R τ²φττ / T.
func (a *helm) dsdT() float64 { return -R * a.tt / a.T }

// props returns the state of R7-97 Table 31; a must hold all derivatives.
func (a *helm) props() Props {
	var st Props
	a.setProps(&st)
	return st
}

// setProps is props writing into *st (all fields but Phase and X).
func (a *helm) setProps(st *Props) {
	RT := float64(R * a.T)
	b := a.d - a.dt
	st.P, st.T, st.Rho, st.V, st.Region = a.p(), a.T, a.rho, 1/a.rho, 3
	st.H = a.h()
	st.U = float64(RT * a.t)
	st.S = a.s()
	st.Cv = float64(-R * a.tt)
	c := float64(2*a.d) + a.dd
	st.Cp = 0 // not defined where (∂p/∂ρ)_T <= 0
	if c > 0 {
		st.Cp = float64(R * (-a.tt + b*b/c))
	}
	st.W = safeSqrt(float64(RT * (c - b*b/a.tt)))
}

// rho3 returns the density of region 3 at (p, T): the backward equation v3(p, T) of IAPWS
// SR5-05(2016) as start, then Newton steps on R7-97 Eq. (28) until p is met to rounding.
func rho3(p, T float64) float64 {
	return rho3Newton(p, T, 1/V3PT(p, T))
}

// rho3Newton polishes a region-3 density at (p, T) from the start rho with Newton steps on
// p(ρ, T) = p, each step limited to 2 % of ρ so that it cannot jump across the critical
// inflection. At fixed T, δφδ and δ²φδδ are polynomials in δ alone (r3XCoeffs), so a step costs
// two short polynomials instead of the whole Eq. (28).
//
// It stops after a step below 1e-14 ρ, or after a step s_k (k >= 1) below 1e-8 ρ whose
// successor, by Newton's quadratic convergence s_k+1 ≈ K s_k² with K ≈ s_k/s_k-1², would be
// below 1e-15 ρ. From the SR5-05 start (within 0.001 % outside the auxiliary subregions) that is
// two steps; the densities agree with those of ever more steps to rounding (about 1e-15, and
// never worse than the 1e-13 to which p(ρ, T) itself fixes ρ in compressed states).
func rho3Newton(p, T, rho float64) float64 {
	var c [12]float64
	r3XCoeffs(Tc/T, &c)
	RT := float64(R * T)
	prev := 0.0
	for it := 0; it < 50; it++ {
		x, xx := r3XPoly(&c, rho/Rhoc)
		d := r3LnN + x
		dp := float64(RT * (float64(2*d) + xx - r3LnN)) // (∂p/∂ρ)_T
		if dp <= 0 {
			break
		}
		step := (p - float64(rho*RT*d)) / dp
		if lim := float64(0.02 * rho); math.Abs(step) > lim {
			step = math.Copysign(lim, step)
		}
		rho += step
		a := math.Abs(step)
		if a <= float64(1e-14*rho) || it > 0 && a <= float64(1e-8*rho) && float64(a*a*a) <= float64(1e-15*rho*prev*prev) {
			break
		}
		prev = a
	}
	return rho
}

// r3XPoly returns Σ c[I] x^I and Σ (I-1) c[I] x^I for the coefficients of r3XCoeffs: the sums
// x and xx of r3Sums at δ = x.
func r3XPoly(c *[12]float64, x float64) (s, ss float64) {
	x2 := float64(x * x)
	x3 := float64(x2 * x)
	x4 := float64(x2 * x2)
	x5 := float64(x4 * x)
	x8 := float64(x4 * x4)
	t1, t2, t3, t4 := float64(c[1]*x), float64(c[2]*x2), float64(c[3]*x3), float64(c[4]*x4)
	t5, t6, t7, t8 := float64(c[5]*x5), float64(c[6]*x3*x3), float64(c[7]*x4*x3), float64(c[8]*x8)
	t9, t10, t11 := float64(c[9]*x8*x), float64(c[10]*x5*x5), float64(c[11]*x8*x3)
	s = ((t1 + t2) + (t3 + t4)) + ((t5 + t6) + (t7 + t8)) + (t9 + t10 + t11)
	ss = (t2 + float64(2*t3) + float64(3*t4) + float64(4*t5)) + (float64(5*t6) + float64(6*t7) + float64(7*t8)) + (float64(8*t9) + float64(9*t10) + float64(10*t11))
	return s, ss
}
