package if97

import "github.com/vouchcalc/vouch/internal/fpmath"

// Backward equations p(h,s) for region 3, equations of the region boundaries as functions of h
// and s, and Tsat(h,s) for region 4 of IAPWS-IF97, from IAPWS SR4-04(2014), "Revised
// Supplementary Release on Backward Equations p(h,s) for Region 3, Equations as a Function of h
// and s for the Region Boundaries, and an Equation Tsat(h,s) for Region 4 of the IAPWS Industrial
// Formulation 1997".
//
// The equations work in kJ/kg, kJ/(kg·K) and MPa; the functions take and return SI base units
// (J/kg, J/(kg·K), Pa, K) and convert inside.

// P3HS returns the pressure p in Pa of region 3 from the specific enthalpy h in J/kg and the
// specific entropy s in J/(kg·K), by IAPWS SR4-04(2014) Eq. (1), Table 3 (subregion 3a,
// s ≤ s_c = 4.41202148223476 kJ/(kg·K); p* = 99 MPa, h* = 2300 kJ/kg, s* = 4.4 kJ/(kg·K)) or
// Eq. (2), Table 4 (subregion 3b, s > s_c; p* = 16.6 MPa, h* = 2800 kJ/kg, s* = 5.3 kJ/(kg·K);
// the sum gives p*/p).
//
// Domain: the single-phase states of region 3 of IAPWS-IF97 (T ≥ 623.15 K, p ≥ p_B23(T),
// p ≤ 100 MPa) as described by h and s. Consistency with the basic equation: 0.01 %
// (SR4-04 Table 6).
func P3HS(h, s float64) float64 {
	if s <= srSc {
		return float64(srSumP3aHS(h/2300e3-1.01, s/4.4e3-0.750) * 99e6)
	}
	return 16.6e6 / srSumP3bHS(h/2800e3-0.681, s/5.3e3-0.792)
}

// H1SatLiqS returns the specific enthalpy h in J/kg of saturated liquid at the specific entropy
// s in J/(kg·K), on the side of region 1: the boundary equation h'1(s) of IAPWS SR4-04(2014),
// Eq. (3), Table 9 (h* = 1700 kJ/kg, s* = 3.8 kJ/(kg·K)).
//
// Domain: s'(273.15 K) = -1.545495919e-4 kJ/(kg·K) ≤ s ≤ s'(623.15 K) = 3.778281340 kJ/(kg·K).
// It places an (h,s) point with respect to the saturated-liquid line; it is not the saturation
// enthalpy of the basic equations.
func H1SatLiqS(s float64) float64 {
	sigma := s / 3.8e3
	return float64(srSumH1SatLiqS(sigma-1.09, sigma+0.366e-4) * 1700e3)
}

// H3aSatLiqS returns the specific enthalpy h in J/kg of saturated liquid at the specific entropy
// s in J/(kg·K), on the side of subregion 3a: the boundary equation h'3a(s) of IAPWS
// SR4-04(2014), Eq. (4), Table 10 (h* = 1700 kJ/kg, s* = 3.8 kJ/(kg·K)).
//
// Domain: s'(623.15 K) = 3.778281340 kJ/(kg·K) ≤ s ≤ s_c = 4.41202148223476 kJ/(kg·K).
func H3aSatLiqS(s float64) float64 {
	sigma := s / 3.8e3
	return float64(srSumH3aSatLiqS(sigma-1.09, sigma+0.366e-4) * 1700e3)
}

// H2abSatVapS returns the specific enthalpy h in J/kg of saturated vapour at the specific
// entropy s in J/(kg·K), on the side of subregions 2a and 2b: the boundary equation h″2ab(s) of
// IAPWS SR4-04(2014), Eq. (5), Table 16 (h* = 2800 kJ/kg, s1* = 5.21 kJ/(kg·K),
// s2* = 9.2 kJ/(kg·K); exp form).
//
// Domain: 5.85 kJ/(kg·K) ≤ s ≤ s″(273.15 K) = 9.155759395 kJ/(kg·K).
func H2abSatVapS(s float64) float64 {
	return float64(fpmath.Exp(srSumH2abSatVapS(5.21e3/s-0.513, s/9.2e3-0.524)) * 2800e3)
}

// H2c3bSatVapS returns the specific enthalpy h in J/kg of saturated vapour at the specific
// entropy s in J/(kg·K), on the side of subregions 2c and 3b: the boundary equation h″2c3b(s)
// of IAPWS SR4-04(2014), Eq. (6), Table 17 (h* = 2800 kJ/kg, s* = 5.9 kJ/(kg·K); fourth power).
//
// Domain: s_c = 4.41202148223476 kJ/(kg·K) ≤ s ≤ 5.85 kJ/(kg·K).
func H2c3bSatVapS(s float64) float64 {
	sigma := s / 5.9e3
	return float64(srPow4(srSumH2c3bSatVapS(sigma-1.02, sigma-0.726)) * 2800e3)
}

// HB13S returns the specific enthalpy h in J/kg on the boundary between regions 1 and 3 (the
// 623.15 K isotherm) at the specific entropy s in J/(kg·K): the boundary equation hB13(s) of
// IAPWS SR4-04(2014), Eq. (7), Table 23 (h* = 1700 kJ/kg, s* = 3.8 kJ/(kg·K)).
//
// Domain: s(100 MPa, 623.15 K) = 3.397782955 kJ/(kg·K) ≤ s ≤ s'(623.15 K) = 3.778281340 kJ/(kg·K).
func HB13S(s float64) float64 {
	sigma := s / 3.8e3
	return float64(srSumHB13S(sigma-0.884, sigma-0.864) * 1700e3)
}

// TB23HS returns the temperature T in K on the boundary between regions 2 and 3 at the specific
// enthalpy h in J/kg and specific entropy s in J/(kg·K): the boundary equation TB23(h,s) of
// IAPWS SR4-04(2014), Eq. (8), Table 25 (T* = 900 K, h* = 3000 kJ/kg, s* = 5.3 kJ/(kg·K)).
// Together with the B23 equation p(T) of IAPWS-IF97 it tells on which side of the boundary an
// (h,s) point lies.
//
// Domain: 5.048096828 kJ/(kg·K) ≤ s ≤ 5.260578707 kJ/(kg·K) and
// h″(623.15 K) = 2563.592004 kJ/kg ≤ h ≤ h(100 MPa, 863.15 K) = 2812.942061 kJ/kg.
func TB23HS(h, s float64) float64 {
	return float64(srSumTB23HS(h/3000e3-0.727, s/5.3e3-0.864) * 900)
}

// TSatHS returns the saturation temperature T in K of a two-phase state given by its specific
// enthalpy h in J/kg and specific entropy s in J/(kg·K): the backward equation Tsat(h,s) of
// IAPWS SR4-04(2014), Eq. (9), Table 28 (T* = 550 K, h* = 2800 kJ/kg, s* = 9.2 kJ/(kg·K)).
//
// Domain: the two-phase region 4 with s ≥ s″(623.15 K) = 5.210887825 kJ/(kg·K)
// (273.15 K ≤ T ≤ 623.15 K). Permissible deviation from Ts(p) of the basic equations: 10 mK
// for s ≥ 5.85 kJ/(kg·K) and 25 mK below (SR4-04 Table 27).
// For wet steam at higher T, or lower s, use the pressure from P3HS or the basic saturation
// equations instead.
func TSatHS(h, s float64) float64 {
	return float64(srSumTSatHS(h/2800e3-0.119, s/9.2e3-1.07) * 550)
}
