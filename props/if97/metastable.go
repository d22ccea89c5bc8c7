package if97

// MetastableVapourPT returns the state of metastable (supercooled) vapour at pressure p (Pa)
// and temperature T (K) from IAPWS R7-97(2012) Eq. (18) (Eq. 16 with the n°1, n°2 of Table 10
// footnote a, and Eq. 19 with Table 16). R7-97 Section 6.2 gives its range: from the saturated-
// vapour line to the 5 % equilibrium-moisture line (from the equilibrium h' and h” at p), for
// pressures from the triple-point pressure to 10 MPa. The state has Region 2, Phase Vapour and
// X = 1 (it is a single vapour phase, not an equilibrium mixture).
func MetastableVapourPT(p, T float64) (Props, error) {
	if !(p >= Pt) {
		return Props{}, below("p", p, Pt, "the metastable-vapour equation starts at the triple-point pressure")
	}
	if !(p <= 10e6) {
		return Props{}, above("p", p, 10e6, "the highest pressure of the metastable-vapour equation")
	}
	Ts := tsatEq(p)
	if !(T <= Ts) {
		return Props{}, above("T", T, Ts, "above the saturation temperature the vapour is not metastable")
	}
	if !(T >= TMin) {
		return Props{}, below("T", T, TMin, "the lowest temperature of IAPWS-IF97")
	}
	d := r2mGibbs(p, T, wantAll)
	st := d.props(p, T, 2)
	hf, hg := h1(p, Ts), h2(p, Ts)
	if hmin := hf + float64(0.95*(hg-hf)); st.H < hmin {
		return Props{}, below("T", T, metaTMin(p, hmin, Ts), "below the equilibrium-moisture limit of the metastable-vapour equation")
	}
	st.Phase, st.X = Vapour, 1
	return st, nil
}

// metaTMin returns the temperature at which Eq. (18) gives h = hmin at p, by bisection below
// Ts (h rises with T); used only to report the limit.
func metaTMin(p, hmin, Ts float64) float64 {
	lo, hi := TMin, Ts
	for i := 0; i < 60; i++ {
		m := float64((lo + hi) / 2)
		d := r2mGibbs(p, m, wantY)
		if float64(R*m*d.tau*d.gt) < hmin {
			lo = m
		} else {
			hi = m
		}
	}
	return hi
}
