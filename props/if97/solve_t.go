package if97

import "math"

// This file solves y(p, T) = y for T at given p in region 1, 2 or 5, where y is the specific
// enthalpy or entropy: solveT by safeguarded Newton steps, and solveState, which most often
// needs only two evaluations of the basic equation: one for a step of Halley's method from the
// backward equation's T, one for the state, corrected by the Newton step that the state's own
// residual gives.

// ySlope returns h and cp = dh/dT, or s and cp/T = ds/dT, at (p, T) in region 1, 2 or 5.
func ySlope(region int, p, T float64, k yKind) (y, dy float64) {
	want := wantY | wantYY
	if k == byS {
		want |= wantF
	}
	d := gibbsAt(region, p, T, want)
	cp := float64(-R * d.tau * d.tau * d.gtt)
	if k == byH {
		return float64(R * T * d.tau * d.gt), cp
	}
	return float64(R * (float64(d.tau*d.gt) - d.g)), cp / T
}

// yCurve returns h and its first two T-derivatives cp and dcp/dT, or s, cp/T and
// (dcp/dT - cp/T)/T, at (p, T) in region 1, 2 or 5; y and dy are those of ySlope, bit for bit.
// With τ = T*/T, dcp/dT = R τ² (2 γττ + τ γτττ) / T.
func yCurve(region int, p, T float64, k yKind) (y, dy, d2y float64) {
	d := curveGibbs(region, p, T, k)
	cp := float64(-R * d.tau * d.tau * d.gtt)
	dcp := R * d.tau * d.tau * (float64(2*d.gtt) + float64(d.tau*d.gttt)) / T
	if k == byH {
		return float64(R * T * d.tau * d.gt), cp, dcp
	}
	return float64(R * (float64(d.tau*d.gt) - d.g)), cp / T, (dcp - cp/T) / T
}

// curveGibbs returns γτ, γττ and γτττ (and γ for s) of region 1, 2 or 5, as gibbsAt with
// wantY|wantYY|wantYYY (|wantF) gives them, by the generated variants that compute only those
// sums in regions 1 and 2.
func curveGibbs(region int, p, T float64, k yKind) gibbs {
	want := wantY | wantYY | wantYYY
	if k == byS {
		want |= wantF
	}
	var s termSums
	switch region {
	case 1:
		pi, tau := p/r1PStar, r1TStar/T
		y := tau - 1.222
		if k == byH {
			r1SumsCurveH(7.1-pi, y, &s)
		} else {
			r1SumsCurveS(7.1-pi, y, &s)
		}
		iy := 1 / y
		return gibbs{pi: pi, tau: tau, g: s.f, gt: float64(s.y * iy), gtt: float64(s.yy * iy * iy), gttt: float64(s.yyy * iy * iy * iy)}
	case 2:
		pi, tau := p/r2PStar, r2TStar/T
		lnPi := lnPiFor(pi, want)
		y := tau - 0.5
		var o termSums
		r2oSums(tau, want, &o)
		if k == byH {
			r2rSumsCurveH(pi, y, &s)
		} else {
			r2rSumsCurveS(pi, y, &s)
		}
		return idealGibbs(pi, lnPi, tau, y, &o, &s, want)
	}
	return gibbsAt(region, p, T, want)
}

// halleyT takes one step of Halley's method for y(p, T) = y from T0 (a backward equation):
// T1 = T0 - 2 e y' / (2 y'² - e y”) with e = y(T0) - y, whose error is of the order of δ³ for
// the step δ = T1 - T0. It reports ok when the step is sound: y' > 0, a positive denominator,
// T1 inside (lo, hi) and δ below 1e-3 T0 (a backward equation is far better than that in its
// own region). c is dln(cp)/dT at T0, for solveState.
func halleyT(region int, p, y float64, k yKind, T0, lo, hi float64) (T1, c float64, ok bool) {
	if !(T0 > lo && T0 < hi) {
		return T0, 0, false
	}
	f, f1, f2 := yCurve(region, p, T0, k)
	e := f - y
	den := float64(2*f1*f1) - float64(e*f2)
	if !(f1 > 0 && den > 0) {
		return T0, 0, false
	}
	T1 = T0 - 2*e*f1/den
	c = f2 / f1 // dln(cp)/dT for h; for s, y' = cp/T and y”/y' = dln(cp)/dT - 1/T
	if k == byS {
		c += 1 / T0
	}
	return T1, c, T1 > lo && T1 < hi && math.Abs(T1-T0) <= float64(1e-3*T0)
}

// yAt returns h or s at (p, T) in region 1, 2 or 5.
func yAt(region int, p, T float64, k yKind) float64 {
	if k == byH {
		return hG(region, p, T)
	}
	return sG(region, p, T)
}

// solveT finds T in [lo, hi] with y(p, T) = y in region 1, 2 or 5 (y rises with T), starting at
// T. It returns out = -1 if y is below y(p, lo), +1 if above y(p, hi), else 0.
func solveT(region int, p, y float64, k yKind, T, lo, hi float64) (float64, int) {
	a, b := lo, hi
	aOK, bOK := false, false
	if !(T > lo) {
		T = lo
	} else if !(T < hi) {
		T = hi
	}
	for it := 0; it < 100; it++ {
		f, df := ySlope(region, p, T, k)
		e := f - y
		if e == 0 || (T <= lo || T >= hi) && math.Abs(e) <= float64(1e-12*math.Abs(y)) {
			return T, 0
		}
		if e < 0 {
			if T >= hi {
				return hi, +1
			}
			a, aOK = T, true
		} else {
			if T <= lo {
				return lo, -1
			}
			b, bOK = T, true
		}
		next := T - e/df
		if next == T && df > 0 {
			return T, 0 // the step is below the rounding of T: converged
		}
		if !(df > 0) || !(next > a && next < b) {
			switch {
			case e < 0 && !bOK:
				next = b
			case e > 0 && !aOK:
				next = a
			default:
				next = float64((a + b) / 2)
			}
		}
		// Newton converges quadratically here: after a step below 1e-7 T the error left is
		// far below 1e-13 T, so the next evaluation can be skipped.
		if math.Abs(next-T) <= float64(1e-7*T) && next > a && next < b && df > 0 {
			return next, 0
		}
		T = next
	}
	return T, 0
}

// solveState returns the state of region 1, 2 or 5 at p whose h or s is y, with T in [lo, hi]
// and T0 the start from a backward equation, and T and out as solveT gives them (st is set
// only for out = 0).
//
// First it tries two evaluations: a Halley step from T0 (halleyT) to T1, and the complete state
// at T1. That state's residual gives the Newton step δ = (y - y(T1))/y'(T1), after which T is
// converged (Halley leaves |δ| near 1e-14 T, Newton then K δ² far below rounding). T, h, s, v,
// ρ and u are moved to T1 + δ along their T-derivatives (exact to rounding at this δ); cp, cv
// and w keep their values at T1, which differ by about δ dln(cp)/dT. The step is taken when
// both |δ|/T and that difference are below 1e-13; otherwise solveT iterates from T0 as before.
func solveState(region int, p, y float64, k yKind, T0, lo, hi float64) (st Props, T float64, out int) {
	if T1, c, ok := halleyT(region, p, y, k, T0, lo, hi); ok {
		d := gibbsAt(region, p, T1, wantAll)
		d.setProps(&st, p, T1, region)
		cp := st.Cp
		e, dy := st.H-y, cp
		if k == byS {
			e, dy = st.S-y, cp/T1
		}
		delta := -e / dy
		if T2 := T1 + delta; float64(math.Abs(delta)*(1/T1+math.Abs(c))) <= 1e-13 && T2 > lo && T2 < hi {
			dvdT := float64(R / p * d.pi * (d.gp - float64(d.tau*d.gpt))) // (∂v/∂T)_p
			st.T = T2
			st.H += float64(cp * delta)
			st.S += float64(cp / T1 * delta)
			st.V += float64(dvdT * delta)
			st.Rho = 1 / st.V
			st.U += float64((cp - float64(p*dvdT)) * delta)
			setPhase(&st)
			return st, T2, 0
		}
	}
	T, out = solveT(region, p, y, k, T0, lo, hi)
	if out == 0 {
		st = gibbsState(region, p, T)
	}
	return st, T, out
}
