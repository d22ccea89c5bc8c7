package if97

// Backward equations T(p,h), v(p,h), T(p,s), v(p,s) for region 3 of IAPWS-IF97 and the
// boundary equations p3sat(h), p3sat(s), from IAPWS SR3-03(2014), "Revised Supplementary Release
// on Backward Equations for the Functions T(p,h), v(p,h) and T(p,s), v(p,s) for Region 3 of the
// IAPWS Industrial Formulation 1997".
//
// The equations work in kJ/kg, kJ/(kg·K) and MPa; the functions take and return SI base units
// (J/kg, J/(kg·K), Pa, K, m³/kg) and convert inside.
//
// Domain of the region 3 equations: the single-phase states of region 3 of IAPWS-IF97
// (T ≥ 623.15 K, p ≥ p_B23(T), p ≤ 100 MPa). They are not equations for wet steam: below pc the
// caller must first decide with P3SatH or P3SatS whether the state is in the two-phase region.

// srSc is the critical entropy s_c = 4.41202148223476 kJ/(kg·K) in J/(kg·K), the boundary
// between subregions 3a and 3b for the (p,s) and (h,s) backward equations
// (IAPWS SR3-03(2014), Section 3.2; used again by IAPWS SR4-04(2014)).
const srSc = 4.41202148223476e3

// H3abP returns the specific enthalpy h in J/kg on the boundary between subregions 3a and 3b
// for T(p,h) and v(p,h) at the pressure p in Pa: the equation h3ab(p) of IAPWS SR3-03(2014),
// Eq. (1), with the coefficients of Table 2 (h* = 1 kJ/kg, p* = 1 MPa).
//
// Domain: pc = 22.064 MPa ≤ p ≤ 100 MPa (it starts at the critical point). Below pc the
// boundary between 3a and 3b is the saturation line.
func H3abP(p float64) float64 {
	return float64(srSumH3abP(p/1e6) * 1e3)
}

// T3PH returns the temperature T in K of region 3 from the pressure p in Pa and the specific
// enthalpy h in J/kg, by IAPWS SR3-03(2014) Eq. (2), Table 3 (subregion 3a, h ≤ h3ab(p);
// T* = 760 K, p* = 100 MPa, h* = 2300 kJ/kg) or Eq. (3), Table 4 (subregion 3b, h > h3ab(p);
// T* = 860 K, p* = 100 MPa, h* = 2800 kJ/kg).
//
// Domain: region 3 (see the file comment). Consistency with the basic equation: 25 mK (SR3-03 Table 9).
func T3PH(p, h float64) float64 {
	pi := p / 100e6
	if h <= H3abP(p) {
		return float64(srSumT3aPH(pi+0.240, h/2300e3-0.615) * 760)
	}
	return float64(srSumT3bPH(pi+0.298, h/2800e3-0.720) * 860)
}

// V3PH returns the specific volume v in m³/kg of region 3 from the pressure p in Pa and the
// specific enthalpy h in J/kg, by IAPWS SR3-03(2014) Eq. (4), Table 6 (subregion 3a,
// h ≤ h3ab(p); v* = 0.0028 m³/kg, p* = 100 MPa, h* = 2100 kJ/kg) or Eq. (5), Table 7
// (subregion 3b; v* = 0.0088 m³/kg, p* = 100 MPa, h* = 2800 kJ/kg).
//
// Domain: as T3PH. Consistency with the basic equation: 0.01 % (SR3-03 Table 9).
func V3PH(p, h float64) float64 {
	pi := p / 100e6
	if h <= H3abP(p) {
		return float64(srSumV3aPH(pi+0.128, h/2100e3-0.727) * 0.0028)
	}
	return float64(srSumV3bPH(pi+0.0661, h/2800e3-0.720) * 0.0088)
}

// T3PS returns the temperature T in K of region 3 from the pressure p in Pa and the specific
// entropy s in J/(kg·K), by IAPWS SR3-03(2014) Eq. (6), Table 10 (subregion 3a, s ≤ s_c;
// T* = 760 K, p* = 100 MPa, s* = 4.4 kJ/(kg·K)) or Eq. (7), Table 11 (subregion 3b, s > s_c;
// T* = 860 K, p* = 100 MPa, s* = 5.3 kJ/(kg·K)), with s_c = 4.41202148223476 kJ/(kg·K).
//
// Domain: region 3 (see the file comment). Consistency with the basic equation: 25 mK
// (SR3-03 Table 16).
func T3PS(p, s float64) float64 {
	pi := p / 100e6
	if s <= srSc {
		return float64(srSumT3aPS(pi+0.240, s/4.4e3-0.703) * 760)
	}
	return float64(srSumT3bPS(pi+0.760, s/5.3e3-0.818) * 860)
}

// V3PS returns the specific volume v in m³/kg of region 3 from the pressure p in Pa and the
// specific entropy s in J/(kg·K), by IAPWS SR3-03(2014) Eq. (8), Table 13 (subregion 3a,
// s ≤ s_c; v* = 0.0028 m³/kg, p* = 100 MPa, s* = 4.4 kJ/(kg·K)) or Eq. (9), Table 14
// (subregion 3b; v* = 0.0088 m³/kg, p* = 100 MPa, s* = 5.3 kJ/(kg·K)).
//
// Domain: as T3PS. Consistency with the basic equation: 0.01 % (SR3-03 Table 16).
func V3PS(p, s float64) float64 {
	pi := p / 100e6
	if s <= srSc {
		return float64(srSumV3aPS(pi+0.187, s/4.4e3-0.755) * 0.0028)
	}
	return float64(srSumV3bPS(pi+0.298, s/5.3e3-0.816) * 0.0088)
}

// P3SatH returns the saturation pressure p in Pa of region 3 from the specific enthalpy h in
// J/kg of saturated liquid or vapour: the boundary equation p3sat(h) of IAPWS SR3-03(2014),
// Eq. (10), Table 17 (p* = 22 MPa, h* = 2600 kJ/kg).
//
// Domain: h'(623.15 K) = 1670.858218 kJ/kg ≤ h ≤ h″(623.15 K) = 2563.592004 kJ/kg
// (SR3-03 Section 4.3). It tells whether a (p,h) point lies in the two-phase region; it is not
// the saturation pressure of the basic equations (they differ by up to 0.00043 %).
func P3SatH(h float64) float64 {
	eta := h / 2600e3
	return float64(srSumP3SatH(eta-1.02, eta-0.608) * 22e6)
}

// P3SatS returns the saturation pressure p in Pa of region 3 from the specific entropy s in
// J/(kg·K) of saturated liquid or vapour: the boundary equation p3sat(s) of IAPWS SR3-03(2014),
// Eq. (11), Table 19 (p* = 22 MPa, s* = 5.2 kJ/(kg·K)).
//
// Domain: s'(623.15 K) = 3.778281340 kJ/(kg·K) ≤ s ≤ s″(623.15 K) = 5.210887825 kJ/(kg·K)
// (SR3-03 Section 4.3); as P3SatH, a region test, not the basic saturation pressure.
func P3SatS(s float64) float64 {
	sigma := s / 5.2e3
	return float64(srSumP3SatS(sigma-1.03, sigma-0.699) * 22e6)
}
