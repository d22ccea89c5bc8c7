package if97

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// Backward equations v(p,T) for region 3 of IAPWS-IF97, from IAPWS SR5-05(2016), "Revised
// Supplementary Release on Backward Equations for Specific Volume as a Function of Pressure and
// Temperature v(p,T) for Region 3 of the IAPWS Industrial Formulation 1997 for the
// Thermodynamic Properties of Water and Steam".
//
// Region 3 is split into the subregions 3a to 3t (Table 2), bounded by the isobars of Table 2,
// the saturation line and the lines T3xy(p) of Table 1 and Eq. (3). Very close to the critical
// point, between T3qu(p) and T3rx(p) for ps(643.15 K) < p ≤ 22.5 MPa, the auxiliary subregions
// 3u to 3z of Table 10 take over.

// srSubregion is the v(p,T) equation of one subregion: IAPWS SR5-05(2016) Eq. (4),
//
//	ω = v/v* = [ Σ n_i ((π − a)^c)^I_i ((θ − b)^d)^J_i ]^e,  π = p/p*, θ = T/T*,
//
// or, for 3n (marked e = 0), Eq. (5), ω = exp[ Σ n_i (π − a)^I_i (θ − b)^J_i ].
type srSubregion struct {
	vStar   float64 // m³/kg
	pStar   float64 // MPa
	tStar   float64 // K
	a, b    float64
	c, d, e float64 // c is 1 or 0.5, d is 1 or 0.25, e is 1, 4, or 0 for Eq. (5)
	tab     srTable
	sum     func(x, y float64) float64 // tab.sum as straight-line code (sr5_sums_*.go)
}

// v returns v in m³/kg at p in MPa and T in K.
func (r *srSubregion) v(pMPa, t float64) float64 {
	x := pMPa/r.pStar - r.a
	if r.c != 1 { // c = 0.5
		x = math.Sqrt(x)
	}
	y := t/r.tStar - r.b
	if r.d != 1 { // d = 0.25
		y = math.Sqrt(math.Sqrt(y))
	}
	w := r.sum(x, y)
	switch r.e {
	case 0:
		w = fpmath.Exp(w)
	case 4:
		w = srPow4(w)
	}
	return float64(w * r.vStar)
}

// Pressures that bound the rows of the subregion selection, in MPa
// (IAPWS SR5-05(2016) Table 2 and Table 10 with their footnotes).
const (
	srPSat64315 = 2.104336732e1       // ps(643.15 K), SR5-05 Section 5.1
	srP3cd      = 1.900881189173929e1 // where Ts(p) = T3cd(p), SR5-05 Table 2 footnote
	srPSatV264  = 2.193161551e1       // ps at v' = 0.00264 m³/kg, SR5-05 Table 10 footnote
	srPSatV385  = 2.190096265e1       // ps at v″ = 0.00385 m³/kg, SR5-05 Table 10 footnote
	srPc        = 22.064              // critical pressure, IAPWS R7-97(2012) Eq. (3)
)

// srT3ab .. srT3wx are the subregion boundaries T3xy(p) of IAPWS SR5-05(2016): Table 1 with
// Eq. (1), θ = Σ n_i π^I_i, or Eq. (2), θ = Σ n_i (ln π)^I_i (3ab, 3op), and Table 9 for the
// auxiliary boundaries 3uv (Eq. (1)) and 3wx (Eq. (2)). p is in MPa (p* = 1 MPa), T in K.
func srT3ab(p float64) float64 { return srSumT3ab(fpmath.Log(p)) }
func srT3cd(p float64) float64 { return srSumT3cd(p) }
func srT3gh(p float64) float64 { return srSumT3gh(p) }
func srT3ij(p float64) float64 { return srSumT3ij(p) }
func srT3jk(p float64) float64 { return srSumT3jk(p) }
func srT3mn(p float64) float64 { return srSumT3mn(p) }
func srT3op(p float64) float64 { return srSumT3op(fpmath.Log(p)) }
func srT3qu(p float64) float64 { return srSumT3qu(p) }
func srT3rx(p float64) float64 { return srSumT3rx(p) }
func srT3uv(p float64) float64 { return srSumT3uv(p) }
func srT3wx(p float64) float64 { return srSumT3wx(fpmath.Log(p)) }

// srT3ef is the boundary T3ef(p) of IAPWS SR5-05(2016) Eq. (3), the tangent of the saturation
// curve at the critical point: θ = 3.727888004 (π − 22.064) + 647.096, p in MPa, T in K.
func srT3ef(p float64) float64 { return float64(3.727888004*(p-22.064)) + 647.096 }

// srTs returns the saturation temperature in K at p in MPa by the saturation-temperature
// equation of IAPWS R7-97(2012), Eq. (31), with the coefficients of Table 34. SR5-05 Tables 2
// and 10 use it to split liquid-like from vapour-like subregions below pc.
func srTs(p float64) float64 {
	n := srTabSat.terms
	beta := math.Sqrt(math.Sqrt(p))
	b2 := float64(beta * beta)
	e := b2 + float64(n[2].n*beta) + n[5].n
	f := float64(n[0].n*b2) + float64(n[3].n*beta) + n[6].n
	g := float64(n[1].n*b2) + float64(n[4].n*beta) + n[7].n
	d := 2 * g / (-f - math.Sqrt(float64(f*f)-float64(4*e*g)))
	nd := n[9].n + d
	return float64((nd - math.Sqrt(float64(nd*nd)-float64(4*(n[8].n+float64(n[9].n*d))))) / 2)
}

// Region3Subregion returns the subregion, 'a' to 't', or the auxiliary subregion near the
// critical point, 'u' to 'z', of region 3 that the pressure p in Pa and temperature T in K fall
// in, as IAPWS SR5-05(2016) Table 2 (subregions 3a–3t) and Table 10 (auxiliary subregions
// 3u–3z) assign them.
//
// Domain: region 3 of IAPWS-IF97 (623.15 K ≤ T ≤ T_B23(p), p_B23(T) ≤ p ≤ 100 MPa), excluding
// the saturation line itself. Outside it the result has no meaning (p above 100 MPa is treated
// as in the 40–100 MPa row, p below ps(623.15 K) as in the lowest row).
func Region3Subregion(p, T float64) byte {
	p /= 1e6 // MPa from here on
	switch {
	case p > 40: // 40 MPa < p ≤ 100 MPa
		if T <= srT3ab(p) {
			return 'a'
		}
		return 'b'
	case p > 25: // 25 MPa < p ≤ 40 MPa
		switch {
		case T <= srT3cd(p):
			return 'c'
		case T <= srT3ab(p):
			return 'd'
		case T <= srT3ef(p):
			return 'e'
		}
		return 'f'
	case p > 23.5: // 23.5 MPa < p ≤ 25 MPa
		switch {
		case T <= srT3cd(p):
			return 'c'
		case T <= srT3gh(p):
			return 'g'
		case T <= srT3ef(p):
			return 'h'
		case T <= srT3ij(p):
			return 'i'
		case T <= srT3jk(p):
			return 'j'
		}
		return 'k'
	case p > 23: // 23 MPa < p ≤ 23.5 MPa
		switch {
		case T <= srT3cd(p):
			return 'c'
		case T <= srT3gh(p):
			return 'l'
		case T <= srT3ef(p):
			return 'h'
		case T <= srT3ij(p):
			return 'i'
		case T <= srT3jk(p):
			return 'j'
		}
		return 'k'
	case p > 22.5: // 22.5 MPa < p ≤ 23 MPa
		switch {
		case T <= srT3cd(p):
			return 'c'
		case T <= srT3gh(p):
			return 'l'
		case T <= srT3mn(p):
			return 'm'
		case T <= srT3ef(p):
			return 'n'
		case T <= srT3op(p):
			return 'o'
		case T <= srT3ij(p):
			return 'p'
		case T <= srT3jk(p):
			return 'j'
		}
		return 'k'
	case p > srPSat64315: // ps(643.15 K) < p ≤ 22.5 MPa
		switch {
		case T <= srT3cd(p):
			return 'c'
		case T <= srT3qu(p):
			return 'q'
		case T <= srT3rx(p):
			return srAuxSubregion(p, T)
		case T <= srT3jk(p):
			return 'r'
		}
		return 'k'
	case p > 20.5: // 20.5 MPa < p ≤ ps(643.15 K)
		switch {
		case T <= srT3cd(p):
			return 'c'
		case T <= srTs(p):
			return 's'
		case T <= srT3jk(p):
			return 'r'
		}
		return 'k'
	case p > srP3cd: // p3cd < p ≤ 20.5 MPa
		switch {
		case T <= srT3cd(p):
			return 'c'
		case T <= srTs(p):
			return 's'
		}
		return 't'
	default: // ps(623.15 K) < p ≤ p3cd
		if T <= srTs(p) {
			return 'c'
		}
		return 't'
	}
}

// srAuxSubregion picks the auxiliary subregion 3u to 3z for ps(643.15 K) < p ≤ 22.5 MPa
// (p in MPa) and T3qu(p) < T ≤ T3rx(p), as IAPWS SR5-05(2016) Table 10 assigns it.
func srAuxSubregion(p, T float64) byte {
	switch {
	case p > 22.11: // 22.11 MPa < p ≤ 22.5 MPa
		switch {
		case T <= srT3uv(p):
			return 'u'
		case T <= srT3ef(p):
			return 'v'
		case T <= srT3wx(p):
			return 'w'
		}
		return 'x'
	case p > srPc: // 22.064 MPa < p ≤ 22.11 MPa
		switch {
		case T <= srT3uv(p):
			return 'u'
		case T <= srT3ef(p):
			return 'y'
		case T <= srT3wx(p):
			return 'z'
		}
		return 'x'
	}
	// ps(643.15 K) < p ≤ 22.064 MPa: liquid-like below Ts(p), vapour-like above.
	if T <= srTs(p) {
		if p > srPSatV264 && T > srT3uv(p) { // ps(v' = 0.00264) < p ≤ 22.064 MPa
			return 'y'
		}
		return 'u'
	}
	if p > srPSatV385 && T <= srT3wx(p) { // ps(v″ = 0.00385) < p ≤ 22.064 MPa
		return 'z'
	}
	return 'x'
}

// V3PT returns the specific volume v in m³/kg of region 3 from the pressure p in Pa and the
// temperature T in K, by the backward equation of the subregion that Region3Subregion picks:
// IAPWS SR5-05(2016) Eq. (4) (Eq. (5) for 3n) with the parameters of Table 4 and the
// coefficients of Tables A1.1 to A1.20 for 3a–3t, and the auxiliary equations with Table 12
// and Tables A2.1 to A2.6 for 3u–3z.
//
// Domain: as Region3Subregion. The 3a–3t equations agree with the basic equation to 0.001 % in
// v (SR5-05 Table 6). The auxiliary equations are less accurate (up to about 0.1 % in 3u–3x and
// 1.8 % in 3y and 3z, SR5-05 Table 14): there the result is a start value for iteration with the
// basic equation, not a property value.
func V3PT(p, T float64) float64 {
	return srV3PT[Region3Subregion(p, T)-'a'].v(p/1e6, T)
}
