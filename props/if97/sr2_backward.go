package if97

// Backward equations p(h,s) for regions 1 and 2 of IAPWS-IF97, from IAPWS SR2-01(2014),
// "Revised Supplementary Release on Backward Equations for Pressure as a Function of Enthalpy
// and Entropy p(h,s) for Regions 1 and 2 of the IAPWS Industrial Formulation 1997".
//
// The equations work in kJ/kg, kJ/(kg·K) and MPa; the functions take and return SI base units
// (J/kg, J/(kg·K), Pa) and convert inside.

// srS2bc is the entropy that separates subregions 2b and 2c for p(h,s),
// 5.85 kJ/(kg·K), in J/(kg·K) (IAPWS SR2-01(2014), Section 6.1).
const srS2bc = 5.85e3

// P1HS returns the pressure p in Pa of region 1 from the specific enthalpy h in J/kg and the
// specific entropy s in J/(kg·K), by the backward equation p1(h,s) of IAPWS SR2-01(2014),
// Eq. (1), with the coefficients of Table 2 (p* = 100 MPa, h* = 3400 kJ/kg,
// s* = 7.6 kJ/(kg·K)).
//
// Domain: region 1 of IAPWS-IF97 (273.15 K ≤ T ≤ 623.15 K, ps(T) ≤ p ≤ 100 MPa) as described
// by h and s. The result is not a property of the basic equation: it is consistent with it to
// 0.6 % below 2.5 MPa and 15 kPa above (SR2-01 Table 4); refine it with the basic equation where
// more is needed.
func P1HS(h, s float64) float64 {
	eta := h / 3400e3
	sigma := s / 7.6e3
	return float64(srSumP1HS(eta+0.05, sigma+0.05) * 100e6)
}

// H2abS returns the specific enthalpy h in J/kg on the boundary between subregions 2a and 2b
// for p(h,s) at the specific entropy s in J/(kg·K): the equation h2ab(s) of IAPWS SR2-01(2014),
// Eq. (2), with the coefficients of Table 5 (h* = 1 kJ/kg, s* = 1 kJ/(kg·K)).
//
// Domain: the entropies at which the line h2ab(s), which follows the 4 MPa isobar, lies in
// region 2 (between the saturated-vapour line and 1073.15 K); P2HS uses it only for
// s ≥ 5.85 kJ/(kg·K).
func H2abS(s float64) float64 {
	return float64(srSumH2abS(s/1e3) * 1e3)
}

// P2HS returns the pressure p in Pa of region 2 from the specific enthalpy h in J/kg and the
// specific entropy s in J/(kg·K), by the backward equations of IAPWS SR2-01(2014): p2a(h,s),
// Eq. (3), Table 6, where s ≥ 5.85 kJ/(kg·K) and h ≤ h2ab(s); p2b(h,s), Eq. (4), Table 7, where
// s ≥ 5.85 kJ/(kg·K) and h > h2ab(s); p2c(h,s), Eq. (5), Table 8, where s < 5.85 kJ/(kg·K).
//
// Domain: region 2 of IAPWS-IF97 (273.15 K ≤ T ≤ 1073.15 K, from the saturation line or the
// 2-3 boundary up to 100 MPa; not the metastable-vapour region) as described by h and s. The result agrees with the basic equation
// to 0.0035 % in 2a and 2b and 0.0088 % in 2c (SR2-01 Table 10).
func P2HS(h, s float64) float64 {
	switch {
	case s < srS2bc:
		// Subregion 2c: p* = 100 MPa, h* = 3500 kJ/kg, s* = 5.9 kJ/(kg·K).
		return float64(srPow4(srSumP2cHS(h/3500e3-0.7, s/5.9e3-1.1)) * 100e6)
	case h <= H2abS(s):
		// Subregion 2a: p* = 4 MPa, h* = 4200 kJ/kg, s* = 12 kJ/(kg·K).
		return float64(srPow4(srSumP2aHS(h/4200e3-0.5, s/12e3-1.2)) * 4e6)
	default:
		// Subregion 2b: p* = 100 MPa, h* = 4100 kJ/kg, s* = 7.9 kJ/(kg·K).
		return float64(srPow4(srSumP2bHS(h/4100e3-0.6, s/7.9e3-1.01)) * 100e6)
	}
}

// srPow4 returns x⁴, the outer power of the "[Σ …]^4" equations.
func srPow4(x float64) float64 {
	x = float64(x * x)
	return float64(x * x)
}
