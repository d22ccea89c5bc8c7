package helmholtz

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// Phase tells which phase a state is in.
type Phase int

// The phases. Supercritical means T >= Tc and p >= Pc; above Tc at lower
// pressure the state is Vapour, and below Tc at higher pressure, Liquid.
const (
	Liquid Phase = iota
	Vapour
	TwoPhase
	Supercritical
)

// String names the phase in lower case, as the trade writes it.
func (p Phase) String() string {
	switch p {
	case Liquid:
		return "liquid"
	case Vapour:
		return "vapour"
	case TwoPhase:
		return "two-phase"
	case Supercritical:
		return "supercritical"
	}
	return "unknown"
}

// Props is one thermodynamic state, per kilogram, in SI base units: P in Pa,
// T in K, V in m3/kg, Rho in kg/m3, H and U in J/kg, S, Cp and Cv in
// J/(kg K), W (speed of sound) in m/s. X is the vapour quality: 0 for
// liquid, 1 for vapour and supercritical states, between 0 and 1 in the
// two-phase region. In a two-phase state Cp, Cv and W are not defined and
// are 0. No field is ever NaN.
type Props struct {
	P, T, V, Rho, H, S, U, Cp, Cv, W, X float64
	Phase                               Phase
}

// Sat is one point of the saturation line: pressure and temperature, and
// enthalpy, entropy, specific volume and internal energy of the saturated
// liquid (suffix f) and the saturated vapour (suffix g), in SI units per kg.
type Sat struct {
	P, T, Hf, Hg, Sf, Sg, Vf, Vg, Uf, Ug float64
}

// point is the full set of reduced quantities at one (T, rho): what every
// property and every solver derivative is built from.
type point struct {
	T, rho, tau, delta float64
	i                  idealTau
	r                  resid
}

// at evaluates the equation at (T, rho) with the tau factors in tp, which
// must have been made for this T with the ideal part.
func (f *Fluid) at(tp *tauPart, T, rho float64) point {
	delta := rho / f.eos.rhoRed
	return point{T: T, rho: rho, tau: tp.tau, delta: delta, i: tp.ideal, r: f.eos.residual(tp, delta)}
}

// eval evaluates the equation at (T, rho) from scratch.
func (f *Fluid) eval(T, rho float64) point {
	tau := f.eos.tRed / T
	lt := fpmath.Log(tau)
	delta := rho / f.eos.rhoRed
	return point{T: T, rho: rho, tau: tau, delta: delta, i: f.eos.idealAt(tau, lt), r: f.eos.fused(tau, lt, delta)}
}

func (q *point) p(R float64) float64  { return float64(q.rho * R * q.T * (1 + q.r.d)) }
func (q *point) h(R float64) float64  { return float64(R * q.T * (1 + q.i.t + q.r.t + q.r.d)) }
func (q *point) u(R float64) float64  { return float64(R * q.T * (q.i.t + q.r.t)) }
func (q *point) cv(R float64) float64 { return float64(-R * (q.i.tt + q.r.tt)) }

// s is the entropy; alpha0 includes ln delta.
func (q *point) s(R float64) float64 {
	return float64(R * (q.i.t + q.r.t - q.i.a - fpmath.Log(q.delta) - q.r.a))
}

// g is the Gibbs energy.
func (q *point) g(R float64) float64 {
	return float64(R * q.T * (1 + q.i.a + fpmath.Log(q.delta) + q.r.a + q.r.d))
}

// dpdrho is (dp/drho) at constant T, divided by R T.
func (q *point) dpdrho() float64 { return 1 + float64(2*q.r.d) + q.r.dd }

// dpdT is (dp/dT) at constant rho, divided by rho R.
func (q *point) dpdT() float64 { return 1 + q.r.d - q.r.dt }

// dvdT is (dv/dT) at constant p.
func (q *point) dvdT() float64 { return q.dpdT() / (q.rho * q.T * q.dpdrho()) }

// props fills a single-phase Props; the phase is set by the caller.
func (f *Fluid) props(q *point) Props {
	R := f.R
	cv := q.cv(R)
	num, den := q.dpdT(), q.dpdrho()
	cp := cv + R*num*num/den
	w2 := float64(R * q.T * (den - num*num/(q.i.tt+q.r.tt)))
	return Props{
		P: q.p(R), T: q.T, V: 1 / q.rho, Rho: q.rho,
		H: q.h(R), S: q.s(R), U: q.u(R),
		Cp: cp, Cv: cv, W: math.Sqrt(math.Max(w2, 0)),
	}
}

// twoPhase mixes the saturated states by the lever rule.
func twoPhase(s Sat, x float64) Props {
	v := s.Vf + float64(x*(s.Vg-s.Vf))
	return Props{
		P: s.P, T: s.T, V: v, Rho: 1 / v,
		H: s.Hf + float64(x*(s.Hg-s.Hf)), S: s.Sf + float64(x*(s.Sg-s.Sf)), U: s.Uf + float64(x*(s.Ug-s.Uf)),
		X: x, Phase: TwoPhase,
	}
}
