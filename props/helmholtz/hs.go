package helmholtz

import "math"

// StateHS returns the state at specific enthalpy h and entropy s. It
// solves along the isentrope s for the pressure at which the enthalpy is h,
// using (dh/dp) at constant s = v, from the lowest saturation pressure of
// the equation (divided by 100) up to Pmax.
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
		p := math.Min(math.Exp(lnp), f.Pmax) // exp(ln Pmax) may round above Pmax
		last, err = f.StatePS(p, s)
		if err != nil {
			return hsSignal(err), 0
		}
		return last.H - h, p * last.V
	}
	lo, hi := math.Log(f.Pmin()/100), math.Log(f.Pmax)
	glo, _ := eval(lo)
	if glo > 0 && err == nil {
		return Props{}, &RangeError{Input: "h", Value: h, Limit: last.H, Reason: reasonHminS}
	}
	ghi, _ := eval(hi)
	if ghi < 0 && err == nil {
		return Props{}, &RangeError{Input: "h", Value: h, Limit: last.H, Above: true, Reason: reasonHmaxS}
	}
	if !(glo < 0 && ghi > 0) {
		return Props{}, &SolveError{Op: "StateHS", Reason: whyNoState}
	}
	lnp, ok := brent(func(x float64) float64 { g, _ := eval(x); return g }, lo, hi, 1e-15)
	if ok {
		if g, _ := eval(lnp); err == nil && math.Abs(g) <= 1e-9*math.Max(math.Abs(h), f.R*f.Tc) {
			return last, nil
		}
	}
	return Props{}, &SolveError{Op: "StateHS", Reason: whyNoState}
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
