package helmholtz

// StatePV returns the state at pressure p and specific volume v. Below
// the critical pressure (and above the saturation pressure at Tmin) the
// phase is found first from the saturated liquid and vapour at p: a v
// from vf to vg is two-phase, with quality x = (v - vf)/(vg - vf) by the
// lever rule. Otherwise the state is the single-phase one at the T where
// v(p, T) = v, found along the isobar, where v rises with T, by Newton's
// method with a bracketed fallback. A v that no state of the equation at
// this p has is a *RangeError naming the limit.
func (f *Fluid) StatePV(p, v float64) (Props, error) {
	return f.stateIsobar("StatePV", p, v, byV)
}

// checkV accepts v >= 1/RhoMax, to round-off: the state at (Pmax, Tmin)
// has the density RhoMax and should come back from its own v.
func (f *Fluid) checkV(v float64) error {
	switch {
	case !(v > 0):
		return &RangeError{Input: "v", Value: v, Limit: 0, Reason: reasonV0}
	case v < (1-1e-12)/f.RhoMax:
		return &RangeError{Input: "v", Value: v, Limit: 1 / f.RhoMax, Reason: reasonVmin}
	}
	return nil
}
