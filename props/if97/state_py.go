package if97

import "math"

// This file holds the inverse state functions StatePH and StatePS. They share one flow: find
// the region from saturation and boundary values at the given pressure, start from the
// backward equation of that region (R7-97 Eqs. 11, 13, 22-27; SR3-03 for region 3), and solve
// the basic equation by Newton steps so that the state is consistent with StatePT to rounding.

// yKind selects the second input: specific enthalpy or specific entropy.
type yKind int

const (
	byH yKind = iota
	byS
)

func (k yKind) input() string {
	if k == byH {
		return "h"
	}
	return "s"
}

// StatePH returns the state at pressure p (Pa) and specific enthalpy h (J/kg): single-phase
// (regions 1, 2, 3, 5) or two-phase (region 4).
func StatePH(p, h float64) (Props, error) { return statePY(p, h, byH) }

// StatePS returns the state at pressure p (Pa) and specific entropy s (J/(kg·K)): single-phase
// (regions 1, 2, 3, 5) or two-phase (region 4).
func StatePS(p, s float64) (Props, error) { return statePY(p, s, byS) }

func statePY(p, y float64, k yKind) (Props, error) {
	if !(p > 0) {
		return Props{}, below("p", p, 0, "pressure must be positive")
	}
	if !(p <= PMax) {
		return Props{}, above("p", p, PMax, "the highest pressure of IAPWS-IF97")
	}
	if math.IsNaN(y) || math.IsInf(y, 0) {
		return Props{}, above(k.input(), y, 0, "not a finite number")
	}
	switch {
	case p < PSatMin:
		// Only vapour: region 2 from 273.15 K, then region 5.
		return vapourPY(p, y, k, math.NaN())
	case p <= PSat623:
		return subPY(p, y, k)
	}
	return superPY(p, y, k)
}

// liquidPY solves region 1 between 273.15 K and Tmax.
func liquidPY(p, y float64, k yKind, Tmax float64) (Props, error) {
	var T0 float64
	if k == byH {
		T0 = T1PH(p, y)
	} else {
		T0 = T1PS(p, y)
	}
	st, T, out := solveState(1, p, y, k, T0, TMin, Tmax)
	switch {
	case out < 0:
		return Props{}, below(k.input(), y, yAt(1, p, TMin, k), "below the value at the lowest temperature of IAPWS-IF97")
	case out > 0:
		return gibbsState(1, p, T), nil
	}
	return st, nil
}

// vapourPY solves region 2 from Tmin (NaN: 273.15 K) to 1073.15 K, then region 5 up to
// 2273.15 K.
func vapourPY(p, y float64, k yKind, Tmin float64) (Props, error) {
	lo := Tmin
	if math.IsNaN(lo) {
		lo = TMin
	}
	var T0 float64
	if k == byH {
		T0 = T2PH(p, y)
	} else {
		T0 = T2PS(p, y)
	}
	st, _, out := solveState(2, p, y, k, T0, lo, T25)
	if out < 0 {
		return Props{}, below(k.input(), y, yAt(2, p, lo, k), "below the lowest value at this pressure")
	}
	if out == 0 {
		return st, nil
	}
	// Region 5.
	if p > P5Max {
		return Props{}, above(k.input(), y, yAt(2, p, T25, k), "above the highest pressure of region 5, IAPWS-IF97 ends at the highest temperature of region 2")
	}
	T, out := solveT(5, p, y, k, T25+(TMax-T25)*0.3, T25, TMax)
	if out > 0 {
		return Props{}, above(k.input(), y, yAt(5, p, TMax, k), "above the value at the highest temperature of IAPWS-IF97")
	}
	return gibbsState(5, p, T), nil
}

// subPY handles PSatMin <= p <= ps(623.15 K): liquid, two-phase or vapour, decided by the
// saturated-liquid and saturated-vapour values at Ts(p). A y above every saturated-vapour value
// of its pressure cell (vapHi) is vapour without Ts(p); otherwise bounds of those values
// (satBands) decide without them unless y lies near one of them.
func subPY(p, y float64, k yKind) (Props, error) {
	if c := vapCell(p); c >= 0 && y > vapHi(c, k) {
		return vapourPY(p, y, k, vapTsLo[c])
	}
	Ts := tsatEq(p)
	b := satBandAt(Ts, k)
	switch {
	case y < b.fLo:
		return liquidPY(p, y, k, Ts)
	case y > b.gHi:
		return vapourPY(p, y, k, Ts)
	case y > b.fHi && y < b.gLo:
		return wetPY(p, Ts, y, k), nil
	}
	return nearSatPY(p, Ts, y, k)
}

// nearSatPY is subPY for y near the saturated-liquid or saturated-vapour value at Ts.
func nearSatPY(p, Ts, y float64, k yKind) (Props, error) {
	// Fast path: when the region 1 backward equation puts the state plausibly and well below Ts
	// (outside region 1 it extrapolates wildly), solve
	// region 1 directly; the bracket [273.15 K, Ts] rejects a wrong guess (out > 0).
	var T0 float64
	if k == byH {
		T0 = T1PH(p, y)
	} else {
		T0 = T1PS(p, y)
	}
	if T0 < Ts-3 && T0 > TMin-10 {
		if st, _, out := solveState(1, p, y, k, T0, TMin, Ts); out == 0 {
			return st, nil
		} else if out < 0 {
			return Props{}, below(k.input(), y, yAt(1, p, TMin, k), "below the value at the lowest temperature of IAPWS-IF97")
		}
	}
	if yf := yAt(1, p, Ts, k); y < yf {
		return liquidPY(p, y, k, Ts)
	}
	if yg := yAt(2, p, Ts, k); y > yg {
		return vapourPY(p, y, k, Ts)
	}
	l, g := satStates(p, Ts)
	return mixY(&l, &g, y, k), nil
}

// wetPY returns the two-phase state at p and Ts = ts(p) <= 623.15 K whose h or s is y, for y
// strictly between the saturated values (as satBands place it): the mixture takes only v, h, s
// and u from its end points, so these are evaluated with γ, γπ and γτ alone.
func wetPY(p, Ts, y float64, k yKind) Props {
	var l, g Props
	d := r1Gibbs(p, Ts, wantF|wantX|wantY)
	d.setVHSU(&l, p, Ts, 4)
	d = r2Gibbs(p, Ts, wantF|wantX|wantY)
	d.setVHSU(&g, p, Ts, 4)
	if m := mixY(&l, &g, y, k); m.X > 0 && m.X < 1 {
		return m
	}
	l, g = satStates(p, Ts) // an end point itself, which needs all its properties
	return mixY(&l, &g, y, k)
}

// satBand bounds the saturated-liquid value f and the saturated-vapour value g of h or s at
// (ts(p), ts(p)) for ts(p) in one cell of the 2 K grid of psLo and psHi:
// fLo < f < fHi and gLo < g < gHi.
type satBand struct{ fLo, fHi, gLo, gHi float64 }

// satBandsH and satBandsS hold the bands of h and s, from the saturated states at the grid
// temperatures, widened by 100 J/kg and 0.5 J/(kg·K): far more than the bulge of h” between
// two grid points (under 10 J/kg at its maximum near 508 K) and than rounding.
var satBandsH, satBandsS = satBands()

func satBands() (bh, bs [psN]satBand) {
	var hf, hg, sf, sg [psN + 1]float64
	for k := range psN + 1 {
		T := TMin + float64(float64(k)*psStep)
		p := psatEq(T)
		hf[k], hg[k] = hG(1, p, T), hG(2, p, T)
		sf[k], sg[k] = sG(1, p, T), sG(2, p, T)
	}
	band := func(f, g *[psN + 1]float64, k int, m float64) satBand {
		return satBand{min(f[k], f[k+1]) - m, max(f[k], f[k+1]) + m, min(g[k], g[k+1]) - m, max(g[k], g[k+1]) + m}
	}
	for k := range psN {
		bh[k] = band(&hf, &hg, k, 100)
		bs[k] = band(&sf, &sg, k, 0.5)
	}
	return bh, bs
}

// satBandAt returns the band of h or s for the saturation temperature Ts.
func satBandAt(Ts float64, k yKind) *satBand {
	c := min(max(int(float64((Ts-TMin)*(1/psStep))), 0), psN-1)
	if k == byH {
		return &satBandsH[c]
	}
	return &satBandsS[c]
}

// Upper bounds of the saturated-vapour h” and s” by pressure cell, for subPY. A cell is the
// set of pressures whose float64 bits agree above the 48th: one sixteenth of an octave. The
// bound is the largest of 17 points across the cell (Eq. 31 for Ts, region 2 at (p, Ts)),
// widened by 100 J/kg and 0.5 J/(kg·K): far more than h” or s” varies between two of those
// points and than rounding. TestVapourBounds holds them against a finer sampling.
const vapShift = 48

var (
	vapBase                 = int(math.Float64bits(PSatMin) >> vapShift)
	vapHiH, vapHiS, vapTsLo = vapBounds()
	vapCells                = len(vapHiH)
)

// vapBounds computes, for each cell, the bounds of h” and s” and the saturation temperature at
// the cell's lowest pressure: a lower bound of Ts(p) in the cell (Ts rises with p), which keeps
// the region-2 search of vapourPY off the liquid side.
func vapBounds() (bh, bs, tlo []float64) {
	last := int(math.Float64bits(PSat623) >> vapShift)
	for c := vapBase; c <= last; c++ {
		lo := math.Max(math.Float64frombits(uint64(c)<<vapShift), PSatMin)
		hi := math.Min(math.Float64frombits(uint64(c+1)<<vapShift), PSat623)
		mh, ms := math.Inf(-1), math.Inf(-1)
		for i := 0; i <= 16; i++ {
			p := lo + float64((hi-lo)*float64(i)/16)
			Ts := tsatEq(p)
			mh, ms = math.Max(mh, hG(2, p, Ts)), math.Max(ms, sG(2, p, Ts))
		}
		bh, bs, tlo = append(bh, mh+100), append(bs, ms+0.5), append(tlo, tsatEq(lo))
	}
	return bh, bs, tlo
}

// vapCell returns the cell of p, or -1 outside PSatMin..ps(623.15 K).
func vapCell(p float64) int {
	c := int(math.Float64bits(p)>>vapShift) - vapBase
	if c < 0 || c >= vapCells || !(p >= PSatMin && p <= PSat623) {
		return -1
	}
	return c
}

// vapHi returns the bound of h” or s” of cell c.
func vapHi(c int, k yKind) float64 {
	if k == byH {
		return vapHiH[c]
	}
	return vapHiS[c]
}

// mixY returns the two-phase state whose h or s is y.
func mixY(l, g *Props, y float64, k yKind) Props {
	var x float64
	if k == byH {
		x = (y - l.H) / (g.H - l.H)
	} else {
		x = (y - l.S) / (g.S - l.S)
	}
	return mix(l, g, min(1, max(0, x))) // as math.Min and math.Max, also for NaN and ±0
}

// Bounds, for ps(623.15 K) <= p <= 100 MPa, of h and s of region 1 on the 623.15 K isotherm
// (y1, falling with p: 1553.92..1670.86 kJ/kg, 3.39778..3.77829 kJ/(kg·K)) and of region 2 on
// the B23 line (y2: 2563.59..2812.95 kJ/kg, 5.04809..5.26058 kJ/(kg·K)), rounded outward;
// TestSuperBounds holds them. superPY evaluates y1(p) and y2(p) only for y between the bounds.
var (
	y1Lo = [2]float64{byH: 1553.92e3, byS: 3397.78}
	y1Hi = [2]float64{byH: 1670.86e3, byS: 3778.29}
	y2Lo = [2]float64{byH: 2563.59e3, byS: 5048.09}
	y2Hi = [2]float64{byH: 2812.95e3, byS: 5260.59}
)

// superPY handles p > ps(623.15 K): region 1 up to 623.15 K, region 3 up to the B23 line,
// region 2 and 5 above it; below 22.064 MPa region 3 holds a part of the two-phase region.
func superPY(p, y float64, k yKind) (Props, error) {
	if y <= y1Lo[k] || y <= y1Hi[k] && y <= yAt(1, p, T13, k) {
		return liquidPY(p, y, k, T13)
	}
	TB := TB23(p)
	if y >= y2Hi[k] || y >= y2Lo[k] && y >= yAt(2, p, TB, k) {
		return vapourPY(p, y, k, TB)
	}
	if p < Pc {
		lo, hi, ps := hf623, hg623, 0.0
		if k == byS {
			lo, hi = sf623, sg623
		}
		if y >= lo && y <= hi {
			if k == byH {
				ps = P3SatH(y)
			} else {
				ps = P3SatS(y)
			}
		}
		if p <= float64(ps*1.01) {
			Ts := tsatEq(p)
			l, g := satStates(p, Ts)
			yf, yg := l.H, g.H
			if k == byS {
				yf, yg = l.S, g.S
			}
			if y >= yf && y <= yg {
				return mixY(&l, &g, y, k), nil
			}
		}
	}
	return finish(region3PY(p, y, k)), nil
}

// region3PY solves region 3 at (p, y) by Newton steps in (ρ, T) on R7-97 Eq. (28), starting
// from the backward equations of IAPWS SR3-03(2014). The steps need neither φ itself (for h)
// nor the full state; they stop as rho3Newton does, when the steps shrink quadratically and the
// next would be below 1e-14 (from the SR3-03 start, two steps; p(ρ, T) fixes ρ only to about
// 1e-13 in region 3 anyway), and the state is evaluated once at the end.
func region3PY(p, y float64, k yKind) Props {
	var T, rho float64
	want := wantX | wantY | wantXX | wantYY | wantXY
	if k == byH {
		T, rho = T3PH(p, y), 1/V3PH(p, y)
	} else {
		T, rho = T3PS(p, y), 1/V3PS(p, y)
		want |= wantF
	}
	prev := 0.0
	for it := 0; it < 60; it++ {
		a := r3Helm(rho, T, want)
		dr, dT, ok := region3Step(&a, p, y, k)
		if !ok {
			break
		}
		// Damp steps that would leave the neighbourhood of the start.
		sc := 1.0
		if l := float64(0.05 * rho); math.Abs(dr) > l {
			sc = l / math.Abs(dr)
		}
		if float64(math.Abs(dT)*sc) > 5 {
			sc = 5 / math.Abs(dT)
		}
		rho += float64(sc * dr)
		T += float64(sc * dT)
		r := float64(sc * max(math.Abs(dr)/rho, math.Abs(dT)/T))
		if r <= 1e-13 || it > 0 && r <= 1e-7 && float64(r*r*r) <= float64(1e-14*prev*prev) {
			break
		}
		prev = r
	}
	a := r3Helm(rho, T, wantAll)
	var st Props
	a.setProps(&st)
	st.P = p
	return st
}

// region3Step returns the Newton step (dρ, dT) for p(ρ, T) = p and h or s (ρ, T) = y from the
// derivatives in a; ok is false for a singular system.
func region3Step(a *helm, p, y float64, k yKind) (dr, dT float64, ok bool) {
	f1 := a.p() - p
	var f2, y1, y2 float64
	if k == byH {
		f2, y1, y2 = a.h()-y, a.dhdrho(), a.dhdT()
	} else {
		f2, y1, y2 = a.s()-y, a.dsdrho(), a.dsdT()
	}
	p1, p2 := a.dpdrho(), a.dpdT()
	det := float64(p1*y2) - float64(p2*y1)
	if det == 0 {
		return 0, 0, false
	}
	return -(float64(f1*y2) - float64(p2*f2)) / det, -(float64(p1*f2) - float64(f1*y1)) / det, true
}
