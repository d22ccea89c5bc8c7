package if97

import (
	"math"
	"testing"
)

// Tests of the shortcuts taken for speed: each one must give what the plain computation gives.

// region3Grid returns (p, T) points of region 3, denser near the critical point.
func region3Grid() [][2]float64 {
	var pts [][2]float64
	for p := PSat623 + 1e3; p <= PMax; p *= 1.0113 {
		for T := T13 + 0.01; T < TB23(p); T += 1.37 {
			pts = append(pts, [2]float64{p, T})
		}
	}
	for p := 21.5e6; p < 23e6; p += 0.0173e6 {
		for T := 645.0; T < 649; T += 0.0191 {
			if p > PB23(T) {
				pts = append(pts, [2]float64{p, T})
			}
		}
	}
	return pts
}

// TestRho3Converged checks that the density rho3 returns is a fixed point of a full Newton step
// on R7-97 Eq. (28), to 1e-12 (RT/(∂p/∂ρ)_T)-fold larger near the critical point, where
// (∂p/∂ρ)_T vanishes and the rounding of p(ρ, T) fixes ρ only that far; the many-step solution
// this replaced needs the same allowance.
func TestRho3Converged(t *testing.T) {
	worst := 0.0
	for _, pt := range region3Grid() {
		p, T := pt[0], pt[1]
		rho := rho3(p, T)
		a := r3Helm(rho, T, wantX|wantXX)
		step := math.Abs((p-a.p())/a.dpdrho()) / rho
		tol := 1e-12 * (1 + R*T/a.dpdrho())
		if !(step <= tol) {
			t.Errorf("rho3(%g, %g) = %.17g: a further Newton step changes it by %.3g", p, T, rho, step)
		}
		worst = math.Max(worst, step/tol)
	}
	t.Logf("largest further step: %.3g of the tolerance", worst)
}

// TestAboveSat checks the grid bounds of aboveSat against R7-97 Eq. (30) itself, at the grid
// temperatures and between them, on the saturation line and one rounding step off it.
func TestAboveSat(t *testing.T) {
	for k := 0; k <= 20*psN; k++ {
		T := math.Min(TMin+float64(k)*psStep/20, T13)
		ps := psatEq(T)
		for _, p := range []float64{ps, math.Nextafter(ps, 0), math.Nextafter(ps, 1e9), ps * 0.9, ps * 1.1, ps * 0.999, ps * 1.001, 1, PMax} {
			if got, want := aboveSat(p, T), p >= ps; got != want {
				t.Errorf("aboveSat(%v, %v) = %v, want %v", p, T, got, want)
			}
		}
	}
}

// TestSuperBounds checks the bounds y1Lo..y2Hi of superPY on a fine grid of pressures from
// ps(623.15 K) to 100 MPa.
func TestSuperBounds(t *testing.T) {
	for i := 0; i <= 100000; i++ {
		p := PSat623 + (PMax-PSat623)*float64(i)/100000
		for _, k := range []yKind{byH, byS} {
			y1, y2 := yAt(1, p, T13, k), yAt(2, p, TB23(p), k)
			if !(y1 > y1Lo[k] && y1 < y1Hi[k] && y2 > y2Lo[k] && y2 < y2Hi[k]) {
				t.Fatalf("p = %g: %s1 = %v, %s2 = %v outside [%v, %v], [%v, %v]", p, k.input(), y1, k.input(), y2, y1Lo[k], y1Hi[k], y2Lo[k], y2Hi[k])
			}
		}
	}
}

// TestSatBands checks the bands of subPY against the saturated values at (p, ts(p)) for
// pressures from PSatMin to ps(623.15 K), log-spaced, and at the pressures of the grid.
func TestSatBands(t *testing.T) {
	var ps []float64
	for i := 0; i <= 200000; i++ {
		ps = append(ps, PSatMin*math.Pow(PSat623/PSatMin, float64(i)/200000))
	}
	for k := range psN + 1 {
		p := psatEq(TMin + float64(k)*psStep)
		ps = append(ps, p, math.Nextafter(p, 0), math.Nextafter(p, PMax))
	}
	for _, p := range ps {
		if p < PSatMin || p > PSat623 {
			continue
		}
		Ts := tsatEq(p)
		for _, k := range []yKind{byH, byS} {
			b := satBandAt(Ts, k)
			f, g := yAt(1, p, Ts, k), yAt(2, p, Ts, k)
			if !(f > b.fLo && f < b.fHi && g > b.gLo && g < b.gHi) {
				t.Fatalf("p = %g, Ts = %g: %s' = %v, %s\" = %v outside %+v", p, Ts, k.input(), f, k.input(), g, *b)
			}
		}
	}
}

// TestWetPY checks the two-phase states of wetPY, built from γ, γπ and γτ of the end points,
// against those from the complete saturated states: the same, bit for bit.
func TestWetPY(t *testing.T) {
	for i := 0; i <= 2000; i++ {
		p := PSatMin * math.Pow(PSat623/PSatMin, float64(i)/2000)
		Ts := tsatEq(p)
		l, g := satStates(p, Ts)
		for _, x := range []float64{1e-9, 0.01, 0.37, 0.999} {
			for _, k := range []yKind{byH, byS} {
				y := l.H + x*(g.H-l.H)
				if k == byS {
					y = l.S + x*(g.S-l.S)
				}
				if got, want := wetPY(p, Ts, y, k), mixY(&l, &g, y, k); got != want {
					t.Fatalf("p = %g, %s = %v: got %+v, want %+v", p, k.input(), y, got, want)
				}
			}
		}
	}
}

// TestSolveStateConsistent checks the states of StatePH and StatePS in regions 1 and 2, most of
// which come from solveState's two evaluations and its final correction, against StatePT at
// their own temperature: T reproduces the input to 1e-13 and the other properties agree to
// 1e-13 (cp, cv and w, which keep their values at the Halley point, to 1e-12; h and u near zero
// to 1e-8 J/kg, s to 1e-10 J/(kg·K), as one rounding of T moves them that far). The two points
// named first once ended on a bisection midpoint of solveT.
func TestSolveStateConsistent(t *testing.T) {
	pts := [][2]float64{{86639.56000543357, 366.5908527456879}, {21751612.450519316, 279.68628606508827}}
	for _, p := range []float64{700, 5e3, 0.1e6, 1e6, 3e6, 10e6, 16e6, 20e6, 40e6, 99e6} {
		for T := 274.0; T < T25; T *= 1.007 {
			pts = append(pts, [2]float64{p, T})
		}
	}
	rel := func(a, b, floor float64) float64 { return math.Abs(a-b) / math.Max(math.Abs(b), floor) }
	for _, pt := range pts {
		want, err := StatePT(pt[0], pt[1])
		if err != nil || want.Region == 3 || nearBoundary(pt[0], pt[1]) {
			continue
		}
		for _, k := range []yKind{byH, byS} {
			y := want.H
			if k == byS {
				y = want.S
			}
			got, err := statePY(pt[0], y, k)
			if err != nil || got.Region != want.Region {
				t.Errorf("%s(%g, %v): region %d, %v; want region %d", k.input(), pt[0], y, got.Region, err, want.Region)
				continue
			}
			at, _ := StatePT(got.P, got.T)
			if d := rel(got.T, pt[1], 1); d > 1e-13 {
				t.Errorf("%s(%g, %v): T = %.17g, want %.17g", k.input(), pt[0], y, got.T, pt[1])
			}
			for _, c := range []struct {
				name      string
				a, b, fl  float64
				tolerance float64
			}{{"h", got.H, at.H, 1e5, 1e-13}, {"s", got.S, at.S, 1e3, 1e-13}, {"v", got.V, at.V, 0, 1e-13},
				{"u", got.U, at.U, 1e5, 1e-13}, {"cp", got.Cp, at.Cp, 0, 1e-12}, {"cv", got.Cv, at.Cv, 0, 1e-12}, {"w", got.W, at.W, 0, 1e-12}} {
				if d := rel(c.a, c.b, c.fl); d > c.tolerance {
					t.Errorf("%s(%g, %v): %s = %.17g, StatePT at its T gives %.17g (%.2g)", k.input(), pt[0], y, c.name, c.a, c.b, d)
				}
			}
		}
	}
}

// TestRegion3PYConverged checks that the (ρ, T) that region3PY returns is a fixed point of a
// full Newton step, with the allowance of TestRho3Converged.
func TestRegion3PYConverged(t *testing.T) {
	for _, pt := range region3Grid() {
		p, T := pt[0], pt[1]
		want := r3Helm(rho3(p, T), T, wantAll)
		for _, k := range []yKind{byH, byS} {
			y := want.h()
			if k == byS {
				y = want.s()
			}
			st := region3PY(p, y, k)
			a := r3Helm(st.Rho, st.T, wantAll)
			dr, dT, ok := region3Step(&a, p, y, k)
			tol := 1e-12 * (1 + R*T/a.dpdrho())
			if !ok || !(math.Abs(dr)/st.Rho <= tol && math.Abs(dT)/st.T <= tol) {
				t.Errorf("region3PY(%g, %v, %s): a further Newton step moves ρ by %.3g, T by %.3g", p, y, k.input(), dr/st.Rho, dT/st.T)
			}
		}
	}
}

// TestVapourBounds checks the cell bounds of h” and s” that let subPY skip Eq. (31): at 40,000
// log-spaced pressures and at both ends of every cell the saturated vapour lies below the bound
// of its cell, and a vapour state sent through the shortcut is bit for bit the one found with
// Ts(p) as the lower bound.
func TestVapourBounds(t *testing.T) {
	check := func(p float64) {
		Ts, c := tsatEq(p), vapCell(p)
		if c < 0 {
			t.Fatalf("p=%g has no cell", p)
		}
		if h := hG(2, p, Ts); !(h < vapHi(c, byH)) {
			t.Errorf("p=%g: h''=%g above the bound %g", p, h, vapHi(c, byH))
		}
		if s := sG(2, p, Ts); !(s < vapHi(c, byS)) {
			t.Errorf("p=%g: s''=%g above the bound %g", p, s, vapHi(c, byS))
		}
		if !(vapTsLo[c] <= Ts) {
			t.Errorf("p=%g: the cell's lowest Ts %g is above Ts %g", p, vapTsLo[c], Ts)
		}
	}
	r := math.Pow(PSat623/PSatMin, 1.0/40000)
	for p := PSatMin; p <= PSat623; p *= r {
		check(p)
	}
	for c := 0; c < vapCells; c++ {
		lo := math.Float64frombits(uint64(c+vapBase) << vapShift)
		hi := math.Nextafter(math.Float64frombits(uint64(c+vapBase+1)<<vapShift), 0)
		for _, p := range []float64{lo, hi} {
			if p >= PSatMin && p <= PSat623 {
				check(p)
			}
		}
	}
	if vapCell(PSatMin*0.99) != -1 || vapCell(PSat623*1.01) != -1 || vapCell(PSatMin) != 0 {
		t.Error("the cells do not span PSatMin..ps(623.15 K)")
	}
	n := 0
	for p := 1e3; p < PSat623; p *= 1.37 {
		Ts := tsatEq(p)
		for _, k := range []yKind{byH, byS} {
			y := vapHi(vapCell(p), k) * 1.0001
			a, errA := subPY(p, y, k)
			b, errB := vapourPY(p, y, k, Ts)
			if errA != nil || errB != nil || a != b {
				t.Errorf("p=%g y=%g: %+v %v vs %+v %v", p, y, a, errA, b, errB)
			}
			n++
		}
	}
	t.Logf("%d cells; %d shortcut states compared", vapCells, n)
}
