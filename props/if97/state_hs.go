package if97

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// This file holds StateHS: the state from specific enthalpy and specific entropy. The region is
// placed with the boundary equations of IAPWS SR4-04(2014) (saturation lines h'(s), h''(s),
// B13 and B23 in (h,s)); the start comes from p(h,s) of SR2-01(2014) or SR4-04(2014) and the
// backward T(p,h); then 2-D Newton steps solve the basic equations of R7-97(2012).

// Entropies of the saturated liquid and vapour at 273.15 K: the ends of the saturation line in s.
var (
	sf273 = sG(1, PSatMin, TMin)
	sg273 = sG(2, PSatMin, TMin)
	sc3   = 4.41202148223476e3 // critical entropy, J/(kg·K), IAPWS SR3-03(2014) Section 3.2
)

// domeH returns the approximate enthalpy of the saturation line at entropy s (SR4-04 Eqs. 3-6),
// for sf273 <= s <= sg273.
func domeH(s float64) float64 {
	switch {
	case s <= sf623:
		return H1SatLiqS(s)
	case s <= sc3:
		return H3aSatLiqS(s)
	case s <= 5.85e3:
		return H2c3bSatVapS(s)
	}
	return H2abSatVapS(s)
}

// StateHS returns the state at specific enthalpy h (J/kg) and specific entropy s (J/(kg·K)),
// single-phase or two-phase. A pair outside IAPWS-IF97 is reported as a RangeError on the
// pressure or the temperature it would need.
func StateHS(h, s float64) (Props, error) {
	if math.IsNaN(h) || math.IsInf(h, 0) {
		return Props{}, above("h", h, 0, "not a finite number")
	}
	if math.IsNaN(s) || math.IsInf(s, 0) {
		return Props{}, above("s", s, 0, "not a finite number")
	}
	if s >= sf273 && s <= sg273 {
		const margin = 20e3 // J/kg, far above the error of the boundary equations
		if hd := domeH(s); h < hd+margin {
			if st, ok := twoPhaseHS(h, s); ok {
				return st, nil
			}
			if h < hd-margin {
				return Props{}, below("T", TMin, TMin, "the state (h, s) lies in the two-phase region below the lowest temperature of IAPWS-IF97")
			}
		}
	}
	region, p, T := startHS(h, s)
	switch region {
	case 3:
		st, ok := region3HS(h, s, p, T)
		if ok {
			return finish(st), nil
		}
	default:
		var ok bool
		p0 := p
		p, T, ok = gibbsHS(region, h, s, p, T)
		if region == 2 && (!ok || T > T25) {
			p, T, ok = gibbsHS(5, h, s, p0, math.Max(T, 1500))
			region = 5
		}
		if ok {
			p = snapLimit(p, T)
			if err := checkPT(p, T); err != nil {
				return Props{}, err
			}
			if region == 1 && p < float64(psatEq(math.Min(T, Tc))*(1-1e-9)) {
				return Props{}, below("p", p, psatEq(T), "the state (h, s) would be a liquid below its saturation pressure")
			}
			if inRegion(region, p, T) {
				return gibbsState(region, p, T), nil
			}
			// The equation of one region met (h, s) outside that region, where it does not
			// hold: solve again with the equation of the region the point lies in.
			if r := regionPT(p, T); r == 3 {
				if st, ok := region3HS(h, s, p, T); ok {
					return finish(st), nil
				}
			} else if p2, T2, ok := gibbsHS(r, h, s, p, T); ok && checkPT(p2, T2) == nil && inRegion(r, p2, T2) {
				return gibbsState(r, p2, T2), nil
			}
		}
	}
	if p > PMax {
		return Props{}, above("p", p, PMax, "no state of IAPWS-IF97 has this (h, s)")
	}
	return Props{}, &NoStateError{Pair: "(h, s)"}
}

// inRegion reports whether a valid (p, T) lies in region 1, 2 or 5 of R7-97 Figure 1, or on
// its boundary to within rounding (1e-9 relative in p).
func inRegion(region int, p, T float64) bool {
	const tol = 1e-9
	switch region {
	case 1:
		return T <= T13 && p >= float64(psatEq(T)*(1-tol))
	case 2:
		switch {
		case T <= T13:
			return p <= float64(psatEq(T)*(1+tol))
		case T <= TB23Max:
			return p <= float64(PB23(T)*(1+tol)) && T <= T25
		}
		return T <= T25
	}
	return T >= T25
}

// startHS places (h, s) in region 1, 2 or 3 and returns a start (p, T).
func startHS(h, s float64) (region int, p, T float64) {
	switch {
	case s <= sf623:
		if s < 3.397782955e3 || h <= HB13S(s) {
			p = P1HS(h, s)
			return 1, p, T1PH(clampP(p), h)
		}
	case s >= 5.260578707e3 || h >= 2.812942061e6:
		p = P2HS(h, s)
		return 2, p, T2PH(clampP(p), h)
	case s >= 5.048096828e3 && h >= 2.563592004e6:
		p = P2HS(h, s)
		if p <= PB23(TB23HS(h, s)) {
			return 2, p, T2PH(clampP(p), h)
		}
	}
	p = P3HS(h, s)
	pc := clampP(p)
	return 3, p, T3PH(pc, h)
}

func clampP(p float64) float64 {
	if !(p > 1e-3) {
		return 1e-3
	}
	return math.Min(p, PMax)
}

// gibbsHS solves h(p, T) = h, s(p, T) = s in region 1, 2 or 5 by Newton steps in (ln p, T).
func gibbsHS(region int, h, s, p, T float64) (float64, float64, bool) {
	p, T = clampP(p), math.Min(TMax, math.Max(250, T))
	if region == 5 && T < T25 {
		T = T25
	}
	ps := r2PStar
	if region == 1 {
		ps = r1PStar
	}
	for it := 0; it < 100; it++ {
		d := gibbsAt(region, p, T, wantAll)
		hh := float64(R * T * d.tau * d.gt)
		ss := float64(R * (float64(d.tau*d.gt) - d.g))
		cp := float64(-R * d.tau * d.tau * d.gtt)
		v := R * T * d.gp / ps
		dvdT := R * (d.gp - float64(d.tau*d.gpt)) / ps
		hq, sq := float64(p*(v-float64(T*dvdT))), float64(-p*dvdT) // derivatives with respect to q = ln p
		hT, sT := cp, cp/T
		f1, f2 := hh-h, ss-s
		det := float64(hq*sT) - float64(hT*sq)
		if !(det != 0) || math.IsNaN(det) {
			return p, T, false
		}
		dq := -(float64(f1*sT) - float64(hT*f2)) / det
		dT := -(float64(hq*f2) - float64(f1*sq)) / det
		sc := 1.0
		if math.Abs(dq) > 0.5 {
			sc = 0.5 / math.Abs(dq)
		}
		if float64(math.Abs(dT)*sc) > 50 {
			sc = 50 / math.Abs(dT)
		}
		p = float64(p * fpmath.Exp(float64(sc*dq)))
		T += float64(sc * dT)
		if region == 1 && p > 1.1*PMax {
			p = 1.1 * PMax // keep 7.1 - π of Eq. (7) positive
		}
		// In compressed liquid at low pressure p hardly moves h and s, so the residuals are
		// the better test there.
		small := math.Abs(f1) <= float64(1e-13*math.Max(math.Abs(h), 1e4)) && math.Abs(f2) <= float64(1e-13*math.Max(math.Abs(s), 1e2))
		if small || math.Abs(dq) <= 1e-13 && math.Abs(dT) <= float64(1e-13*T) {
			return p, T, true
		}
	}
	return p, T, false
}

// region3HS solves region 3 at (h, s) by Newton steps in (ρ, T) on R7-97 Eq. (28).
func region3HS(h, s, p, T float64) (Props, bool) {
	pc := clampP(p)
	rho := 1 / V3PH(pc, h)
	for it := 0; it < 100; it++ {
		a := r3Helm(rho, T, wantAll)
		f1, f2 := a.h()-h, a.s()-s
		h1, h2 := a.dhdrho(), a.dhdT()
		s1, s2 := a.dsdrho(), a.dsdT()
		det := float64(h1*s2) - float64(h2*s1)
		if !(det != 0) {
			break
		}
		dr := -(float64(f1*s2) - float64(h2*f2)) / det
		dT := -(float64(h1*f2) - float64(f1*s1)) / det
		sc := 1.0
		if l := float64(0.05 * rho); math.Abs(dr) > l {
			sc = l / math.Abs(dr)
		}
		if float64(math.Abs(dT)*sc) > 5 {
			sc = 5 / math.Abs(dT)
		}
		rho += float64(sc * dr)
		T += float64(sc * dT)
		if math.Abs(dr) <= float64(1e-13*rho) && math.Abs(dT) <= float64(1e-13*T) {
			st := r3Helm(rho, T, wantAll)
			out := st.props()
			ok := out.P <= PMax && T >= T13 && out.P >= float64(PB23(math.Min(T, TB23Max))*(1-1e-9))
			return out, ok
		}
	}
	return Props{}, false
}

// twoPhaseHS finds the two-phase state with enthalpy h and entropy s, if there is one: the
// saturation temperature T with h and s on one isobar (in the two-phase
// region dh = T ds), by the Illinois variant of regula falsi on [273.15 K, Tc].
func twoPhaseHS(h, s float64) (Props, bool) {
	g := func(T float64) float64 {
		p := Pc
		if T < Tc {
			p = psatEq(T)
		}
		l, v := satStates(p, T)
		if T >= Tc {
			return l.H + float64(T*(s-l.S)) - h
		}
		return l.H + (s-l.S)*(v.H-l.H)/(v.S-l.S) - h
	}
	// On [273.15 K, Tend], where Tend is the saturation temperature whose s' (liquid side) or
	// s'' (vapour side) equals s, the quality lies in 0..1 and g rises; beyond Tend g can turn
	// negative again.
	Tend, ok := satTempOfS(s)
	if !ok {
		return Props{}, false
	}
	a, fa := TMin, g(TMin)
	b, fb := Tend, g(Tend)
	if fa > 0 && fa <= float64(1e-9*math.Abs(h)) {
		fa = 0
	}
	if fa > 0 || fb < 0 {
		return Props{}, false
	}
	side := 0
	T := a
	for it := 0; it < 200 && b-a > float64(1e-12*b); it++ {
		T = (float64(a*fb) - float64(b*fa)) / (fb - fa)
		f := g(T)
		if f == 0 {
			break
		}
		if float64(f*fb) > 0 {
			b, fb = T, f
			if side == -1 {
				fa = float64(fa / 2)
			}
			side = -1
		} else {
			a, fa = T, f
			if side == +1 {
				fb = float64(fb / 2)
			}
			side = +1
		}
	}
	p := Pc
	if T < Tc {
		p = psatEq(T)
	}
	l, gv := satStates(p, T)
	x := (s - l.S) / (gv.S - l.S)
	if T >= Tc {
		x = 0
		if h > l.H {
			x = 1
		}
	}
	if !(x >= -1e-6 && x <= 1+1e-6) {
		return Props{}, false
	}
	return mix(&l, &gv, math.Min(1, math.Max(0, x))), true
}

// satTempOfS returns the saturation temperature at which the saturated liquid (s <= sc) or the
// saturated vapour (s > sc) has entropy s.
func satTempOfS(s float64) (float64, bool) {
	liquid := s <= sc3
	sat := func(T float64) float64 {
		p := Pc
		if T < Tc {
			p = psatEq(T)
		}
		l, g := satStates(p, T)
		if liquid {
			return l.S
		}
		return -g.S
	}
	f := func(T float64) (float64, float64) {
		const d = 1e-4
		T0 := math.Min(T, Tc-d)
		a := sat(T0)
		return sat(T), (sat(T0+d) - a) / d
	}
	y := s
	if !liquid {
		y = -s
	}
	T, out := rising(f, y, (TMin+Tc)/2, TMin, Tc)
	return T, out == 0
}

// snapLimit moves a pressure that passes the upper limit of IAPWS-IF97 at T by rounding only
// (relative 1e-9) onto the limit.
func snapLimit(p, T float64) float64 {
	lim := PMax
	if T > T25 {
		lim = P5Max
	}
	if p > lim && p <= float64(lim*(1+1e-9)) {
		return lim
	}
	return p
}
