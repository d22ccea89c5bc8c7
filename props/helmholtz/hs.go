package helmholtz

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// StateHS returns the state at specific enthalpy h and entropy s. It
// solves along the isentrope s for the pressure at which the enthalpy is h,
// by Newton's method in ln p with (dh/d ln p) at constant s = p v, kept
// within the bracket from the lowest saturation pressure of the equation
// (divided by 100) to Pmax.
func (f *Fluid) StateHS(h, s float64) (Props, error) {
	if err := checkFinite("h", h); err != nil {
		return Props{}, err
	}
	if err := checkFinite("s", s); err != nil {
		return Props{}, err
	}
	var last Props
	var err error
	eval := func(lnp float64) (float64, float64) {
		p := math.Min(fpmath.Exp(lnp), f.Pmax) // exp(ln Pmax) may round above Pmax
		last, err = f.StatePS(p, s)
		if err != nil {
			return hsSignal(err), 0
		}
		return last.H - h, float64(p * last.V)
	}
	lo, hi := fpmath.Log(f.Pmin()/100), fpmath.Log(f.Pmax)
	lnp, _ := rtsafe(eval, lo, hi, fpmath.Log(f.Pc/10), 1e-15)
	g, _ := eval(lnp)
	scale := math.Max(math.Abs(h), float64(f.R*f.Tc))
	if err == nil && math.Abs(g) <= float64(1e-10*scale) {
		return last, nil
	}
	// The search ended at an edge: of the pressure bracket, or of the
	// equation's temperature range along the isentrope (where StatePS
	// reports s out of range). Then h is out of reach for this s; the
	// nearest valid state gives the limit.
	if err != nil {
		re, ok := err.(*RangeError)
		if !ok || re.Input != "s" {
			return Props{}, &SolveError{Op: "StateHS", Reason: whyNoState}
		}
		step := 1e-8
		if re.Above {
			step = -step
		}
		if g, _ = eval(lnp + step); err != nil {
			return Props{}, &SolveError{Op: "StateHS", Reason: whyNoState}
		}
	} else if lnp-lo > 1e-6 && hi-lnp > 1e-6 {
		step := 1e-8
		if g > 0 {
			step = -step
		}
		saved := last
		if eval(lnp + step); err == nil {
			return Props{}, &SolveError{Op: "StateHS", Reason: whyNoConv}
		}
		last = saved
	}
	above := g < 0
	r := reasonHminS
	if above {
		r = reasonHmaxS
	}
	return Props{}, &RangeError{Input: "h", Value: h, Limit: last.H, Above: above, Reason: r}
}

// hsSignal maps a (p, s) state outside the equation's range to the sign
// of h(p, s) - h that the pressure search needs. Entropy falls with
// pressure along an isotherm, so an s above the isobar's range (T would
// exceed Tmax) means the pressure is too high, and one below it (T would
// fall below Tmin) means the pressure is too low.
func hsSignal(err error) float64 {
	re, ok := err.(*RangeError)
	if !ok || re.Input != "s" {
		return math.NaN()
	}
	if re.Above {
		return 1
	}
	return -1
}
