package if97

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// This file holds StateTV and StatePV: the state from temperature or pressure and specific
// volume, found by Newton steps on the basic equations of IAPWS R7-97(2012) (in region 3,
// Eq. (28) is explicit in density, so StateTV needs no iteration there).

// rising solves f(x) = y for a function that rises on [lo, hi], from the start x, by Newton
// steps kept inside a bracket (bisection when a step leaves it). out is -1 when y < f(lo) and
// +1 when y > f(hi).
func rising(f func(x float64) (v, dv float64), y, x, lo, hi float64) (float64, int) {
	a, b := lo, hi
	aOK, bOK := false, false
	if !(x > lo) {
		x = lo
	} else if !(x < hi) {
		x = hi
	}
	for it := 0; it < 200; it++ {
		v, dv := f(x)
		e := v - y
		if e == 0 || (x <= lo || x >= hi) && math.Abs(e) <= float64(1e-12*(math.Abs(y)+1)) {
			return x, 0
		}
		if e < 0 {
			if x >= hi {
				return hi, +1
			}
			a, aOK = x, true
		} else {
			if x <= lo {
				return lo, -1
			}
			b, bOK = x, true
		}
		next := x - e/dv
		if !(dv > 0) || !(next > a && next < b) {
			switch {
			case e < 0 && !bOK:
				next = b
			case e > 0 && !aOK:
				next = a
			default:
				next = float64((a + b) / 2)
			}
		}
		if math.Abs(next-x) <= float64(1e-14*math.Abs(x)) {
			return next, 0
		}
		x = next
	}
	return x, 0
}

func checkV(v float64) error {
	if !(v > 0) {
		return below("v", v, 0, "specific volume must be positive")
	}
	if math.IsInf(v, 1) {
		return above("v", v, math.MaxFloat64, "not a finite number")
	}
	return nil
}

// pOfTV solves v(p, T) = v for p in [lo, hi] in region 1, 2 or 5: with q = -ln p, ln v rises
// with q.
func pOfTV(region int, T, v, lo, hi, p0 float64) (float64, int) {
	f := func(q float64) (float64, float64) {
		p := fpmath.Exp(-q)
		d := gibbsAt(region, p, T, wantX|wantXX)
		// v = RT γπ / p*, so d ln v / d ln p = π γππ / γπ.
		return fpmath.Log(d.gp), -d.pi * d.gpp / d.gp
	}
	var ps float64
	switch region {
	case 1:
		ps = r1PStar
	case 2:
		ps = r2PStar
	default:
		ps = r5PStar
	}
	target := fpmath.Log(v * ps / (R * T))
	q, out := rising(f, target, -fpmath.Log(p0), -fpmath.Log(hi), -fpmath.Log(lo))
	return fpmath.Exp(-q), -out
}

// StateTV returns the state at temperature T (K) and specific volume v (m³/kg), single-phase or
// two-phase.
func StateTV(T, v float64) (Props, error) {
	if err := checkPT(1, T); err != nil {
		return Props{}, err
	}
	if err := checkV(v); err != nil {
		return Props{}, err
	}
	switch {
	case T > T25:
		return gibbsTV(5, T, v, 0, P5Max)
	case T <= T13:
		ps := psatEq(T)
		vf, vg := vG(1, ps, T), vG(2, ps, T)
		switch {
		case v >= vg:
			return gibbsTV(2, T, v, 0, ps)
		case v <= vf:
			return gibbsTV(1, T, v, ps, PMax)
		}
		l, g := satStates(ps, T)
		return mix(&l, &g, (v-vf)/(vg-vf)), nil
	case T <= TB23Max:
		pB := PB23(T)
		if v >= vG(2, pB, T) {
			return gibbsTV(2, T, v, 0, pB)
		}
		return region3TV(T, v)
	}
	return gibbsTV(2, T, v, 0, PMax)
}

// gibbsTV solves region 1, 2 or 5 at (T, v) with p in [lo, hi] (lo = 0: no lower bound).
func gibbsTV(region int, T, v, lo, hi float64) (Props, error) {
	p0 := R * T / v // ideal gas
	if region == 1 {
		p0 = float64((lo + hi) / 2)
	}
	lo0 := lo
	if lo0 == 0 {
		lo0 = float64(1e-12 * hi)
	}
	p0 = math.Min(hi, math.Max(lo0, p0))
	p, out := pOfTV(region, T, v, lo0, hi, p0)
	if out > 0 {
		return Props{}, below("v", v, vG(region, hi, T), "below the value at the highest pressure of IAPWS-IF97")
	}
	if out < 0 && lo == 0 {
		return Props{}, above("v", v, vG(region, lo0, T), "the pressure would be below the range handled")
	}
	return gibbsState(region, p, T), nil
}

// region3TV evaluates region 3 at (T, ρ = 1/v), or the two-phase state below Tc.
func region3TV(T, v float64) (Props, error) {
	rho := 1 / v
	if T < Tc {
		ps := psatEq(T)
		rf, rg := sat3Densities(ps, T)
		if rho >= rg && rho <= rf {
			l, g := satStates(ps, T)
			return mix(&l, &g, (v-l.V)/(g.V-l.V)), nil
		}
	}
	// Above the density at 100 MPa Eq. (28) leaves its range (and soon gives a negative
	// pressure), so the density is tested, not the pressure it gives.
	rhoMax := rho3(PMax, T)
	a := r3Helm(rho, T, wantAll)
	st := a.props()
	if rho > float64(rhoMax*(1+1e-12)) || !(st.P > 0 && st.P <= PMax*(1+1e-9)) {
		return Props{}, below("v", v, 1/rhoMax, "below the value at the highest pressure of IAPWS-IF97")
	}
	return finish(st), nil
}

// StatePV returns the state at pressure p (Pa) and specific volume v (m³/kg), single-phase or
// two-phase. Near the density maximum of liquid water (about 277 K at low pressure) two liquid
// temperatures can have the same v; StatePV then returns a RangeError rather than choose.
func StatePV(p, v float64) (Props, error) {
	if err := checkPT(p, TMin); err != nil {
		return Props{}, err
	}
	if err := checkV(v); err != nil {
		return Props{}, err
	}
	switch {
	case p < PSatMin:
		return vapourPV(p, v, TMin)
	case p <= PSat623:
		Ts := tsatEq(p)
		vf, vg := vG(1, p, Ts), vG(2, p, Ts)
		switch {
		case v > vg:
			return vapourPV(p, v, Ts)
		case v < vf:
			return liquidPV(p, v, Ts)
		}
		l, g := satStates(p, Ts)
		return mix(&l, &g, (v-vf)/(vg-vf)), nil
	}
	if v <= vG(1, p, T13) {
		return liquidPV(p, v, T13)
	}
	TB := TB23(p)
	if v >= vG(2, p, TB) {
		return vapourPV(p, v, TB)
	}
	return region3PV(p, v)
}

// vOfT returns v and dv/dT at (p, T) in region 1, 2 or 5.
func vOfT(region int, p, T float64) (float64, float64) {
	d := gibbsAt(region, p, T, wantX|wantXY)
	ps := r2PStar
	if region == 1 {
		ps = r1PStar
	}
	// v = RT γπ / p*; dv/dT = R(γπ - τγπτ)/p*.
	return R * T * d.gp / ps, R * (d.gp - float64(d.tau*d.gpt)) / ps
}

func vapourPV(p, v, Tmin float64) (Props, error) {
	f := func(T float64) (float64, float64) { return vOfT(2, p, T) }
	T, out := rising(f, v, math.Min(T25, math.Max(Tmin, p*v/R)), Tmin, T25)
	if out < 0 {
		return Props{}, below("v", v, vG(2, p, Tmin), "below the lowest value at this pressure")
	}
	if out == 0 {
		return gibbsState(2, p, T), nil
	}
	if p > P5Max {
		return Props{}, above("v", v, vG(2, p, T25), "above the highest pressure of region 5, IAPWS-IF97 ends at the highest temperature of region 2")
	}
	f5 := func(T float64) (float64, float64) { return vOfT(5, p, T) }
	T, out = rising(f5, v, math.Min(TMax, math.Max(T25, p*v/R)), T25, TMax)
	if out > 0 {
		return Props{}, above("v", v, vG(5, p, TMax), "above the value at the highest temperature of IAPWS-IF97")
	}
	return gibbsState(5, p, T), nil
}

// liquidPV solves region 1 between 273.15 K and Tmax, where v(T) falls to a minimum (the
// density maximum) and then rises.
func liquidPV(p, v, Tmax float64) (Props, error) {
	f := func(T float64) (float64, float64) { return vOfT(1, p, T) }
	lo := TMin
	if _, dv := f(TMin); dv < 0 {
		// Find the density maximum, where dv/dT = 0.
		g := func(T float64) (float64, float64) {
			const e = 1e-3
			_, d1 := f(T)
			_, d2 := f(T + e)
			return d1, (d2 - d1) / e
		}
		Tm, _ := rising(g, 0, 277, TMin, Tmax)
		vm, _ := f(Tm)
		v0, _ := f(TMin)
		if v < vm {
			return Props{}, below("v", v, vm, "below the specific volume at the density maximum of liquid water at this pressure")
		}
		if v <= v0 {
			return Props{}, below("v", v, v0, "two liquid states at this pressure have this specific volume (density maximum); give the temperature instead")
		}
		lo = Tm
	}
	T, out := rising(f, v, float64((lo+Tmax)/2), lo, Tmax)
	if out < 0 {
		return Props{}, below("v", v, vG(1, p, lo), "below the lowest value at this pressure")
	}
	return gibbsState(1, p, T), nil
}

// region3PV solves region 3 at (p, ρ = 1/v) for T, or returns the two-phase state.
func region3PV(p, v float64) (Props, error) {
	rho := 1 / v
	lo, hi := T13, TB23(p)
	if p < Pc {
		Ts := tsatEq(p)
		rf, rg := sat3Densities(p, Ts)
		switch {
		case rho > rf:
			hi = Ts
		case rho < rg:
			lo = Ts
		default:
			l, g := satStates(p, Ts)
			return mix(&l, &g, (v-l.V)/(g.V-l.V)), nil
		}
	}
	f := func(T float64) (float64, float64) {
		a := r3Helm(rho, T, wantX|wantXY)
		return a.p(), a.dpdT()
	}
	T, _ := rising(f, p, float64((lo+hi)/2), lo, hi)
	st := r3Helm(rho, T, wantAll)
	out := st.props()
	out.P = p
	return finish(out), nil
}
