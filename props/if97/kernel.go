package if97

import "math"

// This file holds the parts shared by the basic equations of IAPWS R7-97(2012): the weighted
// term sums that the generated coefficient code returns, and the one Gibbs-energy kernel used by
// regions 1, 2 (with the metastable-vapour Eq. (18)) and 5. The Helmholtz kernel of region 3 is
// in region3.go.

//go:generate go run ./gen/r7
//go:generate go run ../../internal/fpguard .

// Bits of the want mask of the generated sum functions (r1Sums, r2rSums, ...): each selects one
// field of termSums.
const (
	wantF   uint8 = 1 << iota // f  = Σ n t
	wantX                     // x  = Σ n I t
	wantY                     // y  = Σ n J t
	wantXX                    // xx = Σ n I(I-1) t
	wantYY                    // yy = Σ n J(J-1) t
	wantXY                    // xy = Σ n I J t
	wantYYY                   // yyy = Σ n J(J-1)(J-2) t, for the third τ-derivative

	wantAll = wantF | wantX | wantY | wantXX | wantYY | wantXY // all that a state needs
)

// termSums holds weighted sums over the terms t_i = x^I_i y^J_i of one coefficient table. With
// the sum F = Σ n_i t_i, the partial derivatives are ∂F/∂x = x/x_, ∂²F/∂x² = xx/x_², ∂F/∂y =
// y/y_, ∂²F/∂y² = yy/y_², ∂²F/∂x∂y = xy/(x_ y_), ∂³F/∂y³ = yyy/y_³, where x_ and y_ are the
// variable values. This keeps each term product to one evaluation for all derivatives.
type termSums struct {
	f, x, y, xx, yy, xy, yyy float64
}

// gibbs holds the dimensionless Gibbs free energy γ = g/(RT) of one region and its partial
// derivatives with respect to π = p/p* and τ = T*/T, as used in R7-97 Tables 3, 12 and 39.
type gibbs struct {
	pi, tau                  float64
	g, gp, gt, gpp, gtt, gpt float64
	gttt                     float64 // γτττ, with wantYYY only
}

// props turns γ and its derivatives into the properties of R7-97 Tables 3, 12 and 39 (the same
// relations hold for regions 1, 2, 5 and Eq. (18)).
func (d *gibbs) props(p, T float64, region int) Props {
	var st Props
	d.setProps(&st, p, T, region)
	return st
}

// setProps is props writing into *st (all fields but Phase and X), so that the state is built
// in place rather than copied on its way out.
func (d *gibbs) setProps(st *Props, p, T float64, region int) {
	d.setVHSU(st, p, T, region)
	RT := float64(R * T)
	a := d.gp - float64(d.tau*d.gpt)
	cp := float64(-R * d.tau * d.tau * d.gtt)
	st.Cp = cp
	st.Cv = cp + R*a*a/d.gpp
	st.W = safeSqrt(RT * d.gp * d.gp / (a*a/(d.tau*d.tau*d.gtt) - d.gpp))
}

// setVHSU sets P, T, Region, V, Rho, H, S and U of *st as setProps does; it needs only γ, γπ
// and γτ (wantF|wantX|wantY), which is all a two-phase mixture takes from its end points.
func (d *gibbs) setVHSU(st *Props, p, T float64, region int) {
	RT := float64(R * T)
	tgt := float64(d.tau * d.gt)
	pgp := float64(d.pi * d.gp)
	st.P, st.T, st.Region = p, T, region
	st.V = float64(RT / p * pgp)
	st.Rho = 1 / st.V
	st.H = float64(RT * tgt)
	st.U = float64(RT * (tgt - pgp))
	st.S = float64(R * (tgt - d.g))
}

// safeSqrt is math.Sqrt for x >= 0 and 0 otherwise, so that a property that is not defined
// by rounding never becomes NaN.
func safeSqrt(x float64) float64 {
	if x > 0 {
		return math.Sqrt(x)
	}
	return 0
}
