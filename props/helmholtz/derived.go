package helmholtz

import "math"

// init fills each term's precomputed factors and attaches to each
// equation the data derived from it by TestDerived (derived_gen.go): its
// critical point, its highest valid density and its ancillary fits.
func init() {
	for _, f := range allFluids {
		f.eos.expAt = nil
		for i := range f.eos.terms {
			k := &f.eos.terms[i]
			if i < f.eos.nPol && k.t >= 1 && k.t <= 4 && k.t == math.Trunc(k.t) {
				k.ti = int(k.t)
			} else {
				f.eos.expAt = append(f.eos.expAt, i)
			}
			k.fd, k.fl = float64(k.d), float64(k.l)
			k.t2, k.d2, k.l2 = float64(k.t*(k.t-1)), float64(k.fd*(k.fd-1)), float64(k.fl*(k.fl-1))
			k.td, k.eta2, k.beta2 = float64(k.t*k.fd), float64(2*k.eta), float64(2*k.beta)
		}
		a, ok := derivedTable[f.Name+"/"+f.Key]
		if !ok {
			continue
		}
		a.pFast = a.estimate(float64(fastMax * a.Tc)).p
		f.anc = a
		f.Tc, f.Pc, f.RhoC, f.RhoMax = a.Tc, a.Pc, a.RhoC, a.RhoMax
	}
}
