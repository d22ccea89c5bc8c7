package if97

import "github.com/vouchcalc/vouch/internal/fpmath"

// This file evaluates the Gibbs-energy basic equations of IAPWS R7-97(2012): region 1
// (Eq. 7, Table 2), region 2 (Eqs. 15-17, Tables 10 and 11), the metastable-vapour region
// (Eqs. 18-19, Table 10 footnote a and Table 16) and region 5 (Eqs. 32-34, Tables 37 and 38).
// The coefficient sums come from the generated region*_gen.go files; the properties come from
// the shared kernel gibbs.props.

// Reducing quantities p* and T* of the Gibbs-energy equations.
const (
	r1PStar = 16.53e6 // Pa, R7-97 Eq. (7)
	r1TStar = 1386.0  // K, R7-97 Eq. (7)
	r2PStar = 1e6     // Pa, R7-97 Eq. (15) and Eq. (18)
	r2TStar = 540.0   // K, R7-97 Eq. (15) and Eq. (18)
	r5PStar = 1e6     // Pa, R7-97 Eq. (32)
	r5TStar = 1000.0  // K, R7-97 Eq. (32)
)

// r1Gibbs returns γ of region 1, R7-97 Eq. (7), and those derivatives that want selects
// (the others are zero). The derivatives follow R7-97 Table 4.
func r1Gibbs(p, T float64, want uint8) gibbs {
	pi, tau := p/r1PStar, r1TStar/T
	x, y := 7.1-pi, tau-1.222
	var s termSums
	r1Sums(x, y, want, &s)
	ix, iy := 1/x, 1/y
	return gibbs{pi: pi, tau: tau, g: s.f, gp: float64(-s.x * ix), gt: float64(s.y * iy),
		gpp: float64(s.xx * ix * ix), gtt: float64(s.yy * iy * iy), gpt: float64(-s.xy * ix * iy), gttt: float64(s.yyy * iy * iy * iy)}
}

// idealGibbs adds the ideal-gas part γ° = ln π + Σ n°_i τ^J°_i (R7-97 Eqs. 16, 33; Tables 13,
// 40) to the residual sums r of Eqs. (17), (19) or (34), where r was evaluated at x = π and
// y = τ - shift. lnPi is ln π (lnPiFor), used with wantF only.
func idealGibbs(pi, lnPi, tau, y float64, o, r *termSums, want uint8) gibbs {
	ip, it, iy := 1/pi, 1/tau, 1/y
	d := gibbs{pi: pi, tau: tau}
	if want&wantF != 0 {
		d.g = lnPi + o.f + r.f
	}
	d.gp = ip + float64(r.x*ip)
	d.gpp = float64((r.xx - 1) * ip * ip)
	d.gt = float64(o.y*it) + float64(r.y*iy)
	d.gtt = float64(o.yy*it*it) + float64(r.yy*iy*iy)
	d.gpt = float64(r.xy * ip * iy)
	if want&wantYYY != 0 {
		d.gttt = float64(o.yyy*it*it*it) + float64(r.yyy*iy*iy*iy)
	}
	return d
}

// r2Gibbs returns γ = γ° + γr of region 2, R7-97 Eq. (15), with the derivatives of Tables 13
// and 14 that want selects.
func r2Gibbs(p, T float64, want uint8) gibbs {
	pi, tau := p/r2PStar, r2TStar/T
	lnPi := lnPiFor(pi, want)
	y := tau - 0.5
	var o, r termSums
	r2oSums(tau, want&^(wantX|wantXX|wantXY), &o)
	r2rSums(pi, y, want, &r)
	return idealGibbs(pi, lnPi, tau, y, &o, &r, want)
}

// lnPiFor returns ln π when want asks for γ, else 0. The callers take it before the sums, so
// that the logarithm, which depends on p alone, runs alongside them.
func lnPiFor(pi float64, want uint8) float64 {
	if want&wantF != 0 {
		return fpmath.Log(pi)
	}
	return 0
}

// r2mGibbs returns γ of the metastable-vapour region, R7-97 Eq. (18): Eq. (16) with the
// n°1, n°2 of Table 10 footnote a, plus Eq. (19) with Table 16.
func r2mGibbs(p, T float64, want uint8) gibbs {
	pi, tau := p/r2PStar, r2TStar/T
	lnPi := lnPiFor(pi, want)
	y := tau - 0.5
	var o, r termSums
	r2moSums(tau, want&^(wantX|wantXX|wantXY), &o)
	r2mrSums(pi, y, want, &r)
	return idealGibbs(pi, lnPi, tau, y, &o, &r, want)
}

// r5Gibbs returns γ of region 5, R7-97 Eq. (32), with the derivatives of Tables 40 and 41.
func r5Gibbs(p, T float64, want uint8) gibbs {
	pi, tau := p/r5PStar, r5TStar/T
	lnPi := lnPiFor(pi, want)
	var o, r termSums
	r5oSums(tau, want&^(wantX|wantXX|wantXY), &o)
	r5rSums(pi, tau, want, &r)
	return idealGibbs(pi, lnPi, tau, tau, &o, &r, want)
}

// gibbsAt evaluates the equation of the given region (1, 2 or 5).
func gibbsAt(region int, p, T float64, want uint8) gibbs {
	switch region {
	case 1:
		return r1Gibbs(p, T, want)
	case 5:
		return r5Gibbs(p, T, want)
	}
	return r2Gibbs(p, T, want)
}

// Single properties of the Gibbs-energy regions, computing only the derivatives they need.

// hG returns h = RT τ γτ of region 1, 2 or 5 at (p, T).
func hG(region int, p, T float64) float64 {
	d := gibbsAt(region, p, T, wantY)
	return float64(R * T * d.tau * d.gt)
}

// sG returns s = R(τγτ - γ) of region 1, 2 or 5 at (p, T).
func sG(region int, p, T float64) float64 {
	d := gibbsAt(region, p, T, wantF|wantY)
	return float64(R * (float64(d.tau*d.gt) - d.g))
}

// vG returns v = (RT/p) π γπ of region 1, 2 or 5 at (p, T).
func vG(region int, p, T float64) float64 {
	d := gibbsAt(region, p, T, wantX)
	return float64(R * T / p * d.pi * d.gp)
}

// h1 returns the specific enthalpy of region 1, R7-97 Table 3, at (p, T) without range checks.
func h1(p, T float64) float64 {
	y := r1TStar/T - 1.222
	var s termSums
	r1SumsY(7.1-p/r1PStar, y, &s)
	return R * r1TStar * s.y / y
}

// h2 returns the specific enthalpy of region 2, R7-97 Table 12, at (p, T) without range checks.
func h2(p, T float64) float64 {
	tau := r2TStar / T
	y := tau - 0.5
	var o, r termSums
	r2oSums(tau, wantY, &o)
	r2rSumsY(p/r2PStar, y, &r)
	return float64(R * r2TStar * (o.y/tau + r.y/y))
}
