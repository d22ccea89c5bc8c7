package helmholtz

import "math"

// critical finds the critical point of the equation itself: the
// temperature at which the smallest value of dp/drho along the isotherm is
// zero, and the density where that minimum lies. It is used by TestDerived,
// which stores the result; the equations' critical points differ from
// their reducing constants by amounts the papers' rounding allows.
func (f *Fluid) critical() (Tc, rhoC, pc float64) {
	var tp tauPart
	dmin := func(T float64) (float64, float64) {
		f.eos.newTauPart(f.eos.tRed/T, false, &tp)
		D := func(d float64) float64 { r := f.eos.residual(&tp, d); return 1 + float64(2*r.d) + r.dd }
		d := goldenMin(D, 0.5, 1.6)
		return D(d), d
	}
	lo, hi := float64(0.97*f.eos.tRed), float64(1.03*f.eos.tRed)
	for it := 0; it < 200 && hi-lo > float64(1e-13*hi); it++ {
		mid := float64(0.5 * (lo + hi))
		if v, _ := dmin(mid); v < 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	Tc = float64(0.5 * (lo + hi))
	_, d := dmin(Tc)
	rhoC = float64(d * f.eos.rhoRed)
	pc, _ = f.pressure(&tp, Tc, rhoC)
	return Tc, rhoC, math.Abs(pc)
}
