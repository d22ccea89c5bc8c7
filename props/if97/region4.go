package if97

import "math"

// This file holds the saturation-pressure and saturation-temperature equations of region 4,
// IAPWS R7-97(2012) Eqs. (30) and (31) with Table 34, and the boundary equations B23
// (Eqs. 5, 6 with Table 1) and B2bc (Eqs. 20, 21 with Table 19).

// PSatMin is the saturation pressure at 273.15 K from R7-97 Eq. (30), the lowest pressure of
// the saturation line of IF97 (R7-97 Section 8.2: 611.213 Pa).
var PSatMin = psatEq(TMin)

// PSat623 is the saturation pressure at 623.15 K (R7-97 Eq. 30), where region 3 starts on the
// saturation line (16.529 MPa).
var PSat623 = psatEq(T13)

// psatEq is R7-97 Eq. (30) in SI units, without range checks.
func psatEq(T float64) float64 {
	th := T + satN[9]/(T-satN[10])
	A := float64((th+satN[1])*th) + satN[2]
	B := float64((float64(satN[3]*th)+satN[4])*th) + satN[5]
	C := float64((float64(satN[6]*th)+satN[7])*th) + satN[8]
	x := 2 * C / (-B + math.Sqrt(float64(B*B)-float64(4*A*C)))
	x = float64(x * x)
	return float64(x * x * 1e6)
}

// tsatEq is R7-97 Eq. (31) in SI units, without range checks.
func tsatEq(p float64) float64 {
	beta := math.Sqrt(math.Sqrt(float64(p * 1e-6)))
	E := float64((beta+satN[3])*beta) + satN[6]
	F := float64((float64(satN[1]*beta)+satN[4])*beta) + satN[7]
	G := float64((float64(satN[2]*beta)+satN[5])*beta) + satN[8]
	D := 2 * G / (-F - math.Sqrt(float64(F*F)-float64(4*E*G)))
	nd := satN[10] + D
	return float64((nd - math.Sqrt(float64(nd*nd)-float64(4*(satN[9]+float64(satN[10]*D))))) / 2)
}

// Psat returns the saturation pressure in Pa at temperature T in K, R7-97 Eq. (30), for
// 273.15 K <= T <= 647.096 K.
func Psat(T float64) (float64, error) {
	if err := checkSatT(T); err != nil {
		return 0, err
	}
	return psatEq(T), nil
}

// Tsat returns the saturation temperature in K at pressure p in Pa, R7-97 Eq. (31), for
// PSatMin (611.213 Pa) <= p <= 22.064 MPa.
func Tsat(p float64) (float64, error) {
	if err := checkSatP(p); err != nil {
		return 0, err
	}
	if p == Pc {
		return Tc, nil
	}
	return tsatEq(p), nil
}

func checkSatT(T float64) error {
	if !(T >= TMin) {
		return below("T", T, TMin, "the saturation line starts at the lowest temperature of IAPWS-IF97")
	}
	if !(T <= Tc) {
		return above("T", T, Tc, "the saturation line ends at the critical temperature")
	}
	return nil
}

func checkSatP(p float64) error {
	if !(p >= PSatMin) {
		return below("p", p, PSatMin, "the saturation line starts at the saturation pressure at the lowest temperature of IAPWS-IF97")
	}
	if !(p <= Pc) {
		return above("p", p, Pc, "the saturation line ends at the critical pressure")
	}
	return nil
}

// PB23 returns the pressure in Pa of the boundary between regions 2 and 3 at temperature T in K,
// R7-97 Eq. (5), meant for 623.15 K <= T <= 863.15 K; no range check.
func PB23(T float64) float64 {
	return float64((b23N[1] + float64((b23N[2]+float64(b23N[3]*T))*T)) * 1e6)
}

// TB23 returns the temperature in K of the boundary between regions 2 and 3 at pressure p in
// Pa, R7-97 Eq. (6), meant for 16.5292 MPa <= p <= 100 MPa; no range check.
func TB23(p float64) float64 {
	return b23N[4] + math.Sqrt(math.Max(0, (float64(p*1e-6)-b23N[5])/b23N[3]))
}

// PB2bc returns the pressure in Pa on the boundary between subregions 2b and 2c at specific
// enthalpy h in J/kg, R7-97 Eq. (20); no range check.
func PB2bc(h float64) float64 {
	eta := float64(h * 1e-3)
	return float64((b2bcN[1] + float64((b2bcN[2]+float64(b2bcN[3]*eta))*eta)) * 1e6)
}

// HB2bc returns the specific enthalpy in J/kg on the boundary between subregions 2b and 2c at
// pressure p in Pa, R7-97 Eq. (21); no range check.
func HB2bc(p float64) float64 {
	return float64((b2bcN[4] + math.Sqrt(math.Max(0, (float64(p*1e-6)-b2bcN[5])/b2bcN[3]))) * 1e3)
}
