package if97

import "math"

// This file holds the backward equations T(p,h) and T(p,s) of IAPWS R7-97(2012) for region 1
// (Eqs. 11, 13; Tables 6, 8) and region 2 (Eqs. 22-27; Tables 20-22, 25-27, with the subregion
// boundaries p = 4 MPa, B2bc of Eqs. 20-21 and s = 5.85 kJ/(kg·K)). They are pure equations:
// no range checks, valid only inside the region they belong to. The state functions use them as
// starting values and then solve the basic equations.

// T1PH returns T in K at p in Pa and h in J/kg for region 1, R7-97 Eq. (11), Table 6.
func T1PH(p, h float64) float64 {
	return t1ph(float64(p*1e-6), h/2500e3+1)
}

// T1PS returns T in K at p in Pa and s in J/(kg·K) for region 1, R7-97 Eq. (13), Table 8.
func T1PS(p, s float64) float64 {
	return t1ps(float64(p*1e-6), float64(s*1e-3)+2)
}

// T2PH returns T in K at p in Pa and h in J/kg for region 2: subregion 2a (p <= 4 MPa,
// Eq. 22, Table 20), 2b (h >= h2bc(p), Eq. 23, Table 21) or 2c (Eq. 24, Table 22).
func T2PH(p, h float64) float64 {
	pi, eta := float64(p*1e-6), h/2000e3
	switch {
	case p <= 4e6:
		return t2aph(pi, eta-2.1)
	case h >= HB2bc(p):
		return t2bph(pi-2, eta-2.6)
	}
	return t2cph(pi+25, eta-1.8)
}

// T2PS returns T in K at p in Pa and s in J/(kg·K) for region 2: subregion 2a (p <= 4 MPa,
// Eq. 25, Table 25), 2b (s >= 5.85 kJ/(kg·K), Eq. 26, Table 26) or 2c (Eq. 27, Table 27).
func T2PS(p, s float64) float64 {
	pi := float64(p * 1e-6)
	switch {
	case p <= 4e6:
		return t2aps(math.Sqrt(math.Sqrt(pi)), s/2000-2)
	case s >= 5.85e3:
		return t2bps(pi, 10-s/785.3)
	}
	return t2cps(pi, 2-s/2925.1)
}
