package if97

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// This file holds the transport properties in their industrial forms: the viscosity of IAPWS
// R12-08 (Eqs. 10-12 with μ2 = 1), the thermal conductivity of IAPWS R15-11 (Eqs. 10-16, with
// the density derivatives from IAPWS-IF97 and ζ at the reference temperature from Eq. (26) and
// Table 6), and the surface tension of IAPWS R1-76(2014) Eq. (1).

// Reducing constants of R12-08 and R15-11 (R12-08 Eqs. 4-8, R15-11 Eqs. 4-9).
const (
	trTStar   = 647.096   // K
	trRhoStar = 322.0     // kg/m³
	trPStar   = 22.064e6  // Pa
	trMuStar  = 1e-6      // Pa·s
	trLamStar = 1e-3      // W/(m·K)
	trR95     = 461.51805 // J/(kg·K), specific gas constant of IAPWS-95 used by R15-11 Eq. (19)
	trTMax    = 1173.15   // K, upper temperature of R12-08 and R15-11
	trRhoMax  = 1260.0    // kg/m³, above the densities of the R12-08/R15-11 range (≈1252 kg/m³ at 1000 MPa, 273.16 K)
)

// R12-08 Table 1: coefficients H_i of μ0, Eq. (11).
var muH0 = [4]float64{1.67752, 2.20462, 0.6366564, -0.241605}

// R12-08 Table 2: coefficients H_ij of μ1, Eq. (12); muH1[i][j] multiplies (1/T̄ - 1)^i (ρ̄ - 1)^j.
var muH1 = [6][7]float64{
	{5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0},
	{8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0},
	{-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0},
	{-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3},
	{0, 0, -2.57040e-1, 0, 0, 8.72102e-3, 0},
	{0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4},
}

// R15-11 Table 1: coefficients L_k of λ0, Eq. (16).
var lamL0 = [5]float64{2.443221e-3, 1.323095e-2, 6.770357e-3, -3.454586e-3, 4.096266e-4}

// R15-11 Table 2: coefficients L_ij of λ1, Eq. (17); lamL1[i][j] multiplies (1/T̄ - 1)^i (ρ̄ - 1)^j.
var lamL1 = [5][6]float64{
	{1.60397357, -0.646013523, 0.111443906, 0.102997357, -0.0504123634, 0.00609859258},
	{2.33771842, -2.78843778, 1.53616167, -0.463045512, 0.0832827019, -0.00719201245},
	{2.19650529, -4.54580785, 3.55777244, -1.40944978, 0.275418278, -0.0205938816},
	{-1.21051378, 1.60812989, -0.621178141, 0.0716373224, 0, 0},
	{-2.7203370, 4.57586331, -3.18369245, 1.1168348, -0.19268305, 0.012913842},
}

// R15-11 Table 6: coefficients A_ij of Eq. (26), 1/ζ(T̄R, ρ̄) = Σ_j A_ij ρ̄^j, for the density
// ranges ρ̄ <= 0.310559006, <= 0.776397516, <= 1.242236025, <= 1.863354037 and above.
var lamA = [5][6]float64{
	{6.53786807199516, -5.61149954923348, 3.39624167361325, -2.27492629730878, 10.2631854662709, 1.97815050331519},
	{6.52717759281799, -6.30816983387575, 8.08379285492595, -9.82240510197603, 12.1358413791395, -5.54349664571295},
	{5.35500529896124, -3.96415689925446, 8.91990208918795, -12.0338729505790, 9.19494865194302, -2.16866274479712},
	{1.55225959906681, 0.464621290821181, 8.93237374861479, -11.0321960061126, 6.16780999933360, -0.965458722086812},
	{1.11999926419994, 0.595748562571649, 9.88952565078920, -10.3255051147040, 4.66861294457414, -0.503243546373828},
}

var lamABounds = [4]float64{0.310559006, 0.776397516, 1.242236025, 1.863354037}

func checkTransport(rho, T float64) error {
	if !(T >= TMin) {
		return below("T", T, TMin, "the lowest temperature of the transport equations")
	}
	if !(T <= trTMax) {
		return above("T", T, trTMax, "the highest temperature of the transport equations")
	}
	if !(rho >= 0) {
		return below("rho", rho, 0, "density must not be negative")
	}
	if !(rho <= trRhoMax) {
		return above("rho", rho, trRhoMax, "above the densities covered by the transport equations")
	}
	return nil
}

// Viscosity returns the dynamic viscosity in Pa·s at density rho (kg/m³) and temperature T (K),
// IAPWS R12-08 Eq. (10) in its industrial form, μ2 = 1 (no critical enhancement), for
// 273.15 K <= T <= 1173.15 K.
func Viscosity(rho, T float64) (float64, error) {
	if err := checkTransport(rho, T); err != nil {
		return 0, err
	}
	return float64(muBar(rho/trRhoStar, T/trTStar) * trMuStar), nil
}

// muBar returns μ̄0 μ̄1 of R12-08 Eqs. (11), (12).
func muBar(rb, tb float64) float64 {
	it := 1 / tb
	den := muH0[0] + float64(it*(muH0[1]+float64(it*(muH0[2]+float64(it*muH0[3])))))
	mu0 := 100 * math.Sqrt(tb) / den
	a, r := it-1, rb-1
	s, ai := 0.0, 1.0
	for i := 0; i < 6; i++ {
		row := &muH1[i]
		inner := 0.0
		for j := 6; j >= 0; j-- {
			inner = float64(inner*r) + row[j]
		}
		s += float64(ai * inner)
		ai = float64(ai * a)
	}
	return float64(mu0 * fpmath.Exp(float64(rb*s)))
}

// lamBackground returns λ̄0 λ̄1 of R15-11 Eqs. (16), (17).
func lamBackground(rb, tb float64) float64 {
	it := 1 / tb
	den := lamL0[0] + float64(it*(lamL0[1]+float64(it*(lamL0[2]+float64(it*(lamL0[3]+float64(it*lamL0[4])))))))
	l0 := math.Sqrt(tb) / den
	a, r := it-1, rb-1
	s, ai := 0.0, 1.0
	for i := 0; i < 5; i++ {
		row := &lamL1[i]
		inner := 0.0
		for j := 5; j >= 0; j-- {
			inner = float64(inner*r) + row[j]
		}
		s += float64(ai * inner)
		ai = float64(ai * a)
	}
	return float64(l0 * fpmath.Exp(float64(rb*s)))
}

// zetaRef returns ζ(T̄R, ρ̄) of R15-11 Eq. (26) with Table 6.
func zetaRef(rb float64) float64 {
	k := 0
	for k < 4 && rb > lamABounds[k] {
		k++
	}
	row := &lamA[k]
	s := 0.0
	for j := 5; j >= 0; j-- {
		s = float64(s*rb) + row[j]
	}
	return 1 / s
}

// lamCritical returns λ̄2 of R15-11 Eqs. (18)-(25) from IF97 values: cp and cv in J/(kg·K),
// drdp = (∂ρ/∂p)_T in kg/(m³·Pa) and the viscosity μ̄.
func lamCritical(rb, tb, cp, cv, drdp, mub float64) float64 {
	const (
		lambda = 177.8514
		qD     = 1 / 0.40e-9 // 1/m
		xi0    = 0.13e-9     // m
		gamma0 = 0.06
		nu     = 0.630
		gam    = 1.239
		tR     = 1.5
	)
	cpb := cp / trR95
	if cpb < 0 || cpb > 1e13 {
		cpb = 1e13
	}
	kappa := cp / cv
	if kappa < 0 || kappa > 1e13 {
		kappa = 1e13
	}
	zeta := drdp * trPStar / trRhoStar
	dchi := float64(rb * (zeta - zetaRef(rb)*tR/tb))
	if !(dchi > 0) {
		return 0
	}
	xi := float64(xi0 * fpmath.Pow(dchi/gamma0, nu/gam))
	y := float64(qD * xi)
	if y < 1.2e-7 {
		return 0
	}
	ik := 1 / kappa
	z := float64(2 / (math.Pi * y) * ((float64((1-ik)*fpmath.Atan(y)) + float64(ik*y)) - (1 - fpmath.Exp(-1/(1/y+y*y/(3*rb*rb))))))
	return float64(lambda * rb * cpb * tb / mub * z)
}

// Conductivity returns the thermal conductivity in W/(m·K) at density rho (kg/m³) and
// temperature T (K), IAPWS R15-11 Eq. (10) in its industrial form: λ2 from Eqs. (18)-(25) with
// cp, cv and (∂ρ/∂p)_T from IAPWS-IF97, ζ at T̄R = 1.5 from Eq. (26), and μ̄ from R12-08 with
// μ2 = 1. The state (rho, T) must be a single-phase state of IAPWS-IF97 with T <= 1173.15 K;
// rho = 0 gives the dilute-gas limit λ0. It finds the state from (T, 1/rho); a caller that
// has the state already uses ConductivityOf, which does not solve for it again.
func Conductivity(rho, T float64) (float64, error) {
	if err := checkTransport(rho, T); err != nil {
		return 0, err
	}
	if rho == 0 {
		return float64(lamBackground(0, T/trTStar) * trLamStar), nil
	}
	st, err := StateTV(T, 1/rho)
	if err != nil {
		if re, ok := err.(*RangeError); ok && re.Input == "v" {
			return 0, &RangeError{Input: "rho", Value: rho, Limit: 1 / re.Limit, Above: !re.Above, Reason: re.Reason}
		}
		return 0, err
	}
	if st.Region == 4 {
		return 0, twoPhaseRho(rho, st)
	}
	return conductivityOf(&st), nil
}

// ConductivityOf returns the thermal conductivity in W/(m·K) of a state that a state function
// of this package returned, by the same equations as Conductivity, from the state's own
// density, temperature, pressure, cp and cv and the (∂ρ/∂p)_T of the basic equation the state
// lies on; it never solves for the state again. A saturated liquid or vapour (X = 0 or 1) is
// taken on its own side of the saturation line. A two-phase mixture (0 < X < 1) has no
// conductivity and gives a *RangeError on x; a state beyond the transport equations' range
// (T above 1173.15 K) gives a *RangeError on T.
func ConductivityOf(st *Props) (float64, error) {
	if err := checkTransportState(st); err != nil {
		return 0, err
	}
	return conductivityOf(st), nil
}

// ViscosityOf returns the dynamic viscosity in Pa·s of a state that a state function of this
// package returned: Viscosity at its density and temperature, with the same errors as
// ConductivityOf for a two-phase mixture or a state beyond the range.
func ViscosityOf(st *Props) (float64, error) {
	if err := checkTransportState(st); err != nil {
		return 0, err
	}
	return float64(muBar(st.Rho/trRhoStar, st.T/trTStar) * trMuStar), nil
}

// checkTransportState refuses a two-phase mixture and a state outside the transport range.
func checkTransportState(st *Props) error {
	if st.Region == 4 && st.X != 0 && st.X != 1 {
		return above("x", st.X, 0, "a two-phase mixture has no single-phase transport properties")
	}
	return checkTransport(st.Rho, st.T)
}

// conductivityOf is R15-11 Eq. (10) at a single-phase or saturated state within range.
func conductivityOf(st *Props) float64 {
	rho, T := st.Rho, st.T
	rb, tb := rho/trRhoStar, T/trTStar
	l := lamBackground(rb, tb) + lamCritical(rb, tb, st.Cp, st.Cv, drhodp(st), muBar(rb, tb))
	return float64(l * trLamStar)
}

// drhodp returns (∂ρ/∂p)_T in kg/(m³·Pa) from the basic equation the state lies on: region 3
// at (ρ, T), else the Gibbs equation of its region at (p, T). A saturated state (region 4)
// lies on region 1 (liquid) or 2 (vapour) up to 623.15 K and on region 3 above.
func drhodp(st *Props) float64 {
	region := st.Region
	if region == 4 {
		switch {
		case st.T > T13:
			region = 3
		case st.X == 0:
			region = 1
		default:
			region = 2
		}
	}
	if region == 3 {
		a := r3Helm(st.Rho, st.T, wantX|wantXX)
		return 1 / a.dpdrho()
	}
	d := gibbsAt(region, st.P, st.T, wantX|wantXX)
	ps := r2PStar
	if region == 1 {
		ps = r1PStar
	}
	dvdp := R * st.T * d.gpp / (ps * ps)
	return float64(-st.Rho * st.Rho * dvdp)
}

// twoPhaseRho reports a density inside the two-phase region, naming the nearer saturated
// density as the limit.
func twoPhaseRho(rho float64, st Props) error {
	l, g := satStates(st.P, st.T)
	if rho-g.Rho < l.Rho-rho {
		return above("rho", rho, g.Rho, "inside the two-phase region, where the conductivity of a single phase is not defined")
	}
	return below("rho", rho, l.Rho, "inside the two-phase region, where the conductivity of a single phase is not defined")
}

// SurfaceTension returns the surface tension of water against its vapour in N/m at
// temperature T (K), IAPWS R1-76(2014) Eq. (1), from 273.15 K to the critical temperature.
// (R1-76 states validity from the triple point, 273.16 K, and notes that the equation stays
// reasonable in the supercooled liquid; 273.15 K is the lower limit of IAPWS-IF97.)
func SurfaceTension(T float64) (float64, error) {
	if !(T >= TMin) {
		return 0, below("T", T, TMin, "the lowest temperature of the surface tension equation")
	}
	if !(T <= Tc) {
		return 0, above("T", T, Tc, "there is no surface tension above the critical temperature")
	}
	tau := 1 - T/Tc
	return float64(235.8e-3 * fpmath.Pow(tau, 1.256) * (1 - float64(0.625*tau))), nil
}
