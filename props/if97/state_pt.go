package if97

import "math"

// This file finds the IF97 region of a (p, T) state (IAPWS R7-97(2012) Section 2, Figure 1)
// and evaluates single-phase states and single properties from (p, T).

// checkPT reports whether (p, T) lies in the range of validity of IAPWS-IF97 (R7-97
// Section 2): 273.15 K <= T <= 1073.15 K with 0 < p <= 100 MPa, and 1073.15 K < T <= 2273.15 K
// with 0 < p <= 50 MPa. The test for a valid point is small enough to inline; rangePT says
// what is wrong with an invalid one.
func checkPT(p, T float64) error {
	if T >= TMin && T <= T25 && p > 0 && p <= PMax {
		return nil
	}
	return rangePT(p, T)
}

// rangePT returns the RangeError of a (p, T) outside IAPWS-IF97 (nil for a valid one).
func rangePT(p, T float64) error {
	if !(T >= TMin) {
		return below("T", T, TMin, "the lowest temperature of IAPWS-IF97")
	}
	if !(T <= TMax) {
		return above("T", T, TMax, "the highest temperature of IAPWS-IF97")
	}
	if !(p > 0) {
		return below("p", p, 0, "pressure must be positive")
	}
	if T > T25 {
		if !(p <= P5Max) {
			return above("p", p, P5Max, "the highest pressure of region 5 of IAPWS-IF97")
		}
	} else if !(p <= PMax) {
		return above("p", p, PMax, "the highest pressure of IAPWS-IF97")
	}
	return nil
}

// regionPT returns the region (1, 2, 3 or 5) of a valid (p, T). On the saturation line
// (p = ps(T), T <= 623.15 K) it returns 1, the saturated liquid.
func regionPT(p, T float64) int {
	switch {
	case T <= T13:
		if aboveSat(p, T) {
			return 1
		}
		return 2
	case T > T25:
		return 5
	case T <= TB23Max && p > PB23(T):
		return 3
	}
	return 2
}

// Bounds of ps(T) for aboveSat: psGrid[k] = ps(TMin + k·psStep) by R7-97 Eq. (30), up to
// 623.15 K. As ps(T) rises with T, psGrid[k] < ps(T) < psGrid[k+1] between two grid
// temperatures; psLo and psHi widen these bounds by 1e-12 against rounding.
const (
	psStep = 2.0 // K
	psN    = 175 // grid intervals: psN·psStep = T13 - TMin
)

var psLo, psHi = psBounds()

func psBounds() (lo, hi [psN]float64) {
	for k := range psN {
		lo[k] = float64(psatEq(TMin+float64(float64(k)*psStep)) * (1 - 1e-12))
		hi[k] = float64(psatEq(TMin+float64(float64(k+1)*psStep)) * (1 + 1e-12))
	}
	return lo, hi
}

// aboveSat reports p >= ps(T) for TMin <= T <= T13, by R7-97 Eq. (30); the grid bounds decide
// all but the points within a grid step of the saturation line.
func aboveSat(p, T float64) bool {
	k := psCell(T)
	if p >= psHi[k] {
		return true
	}
	return p >= psLo[k] && p >= psatEq(T)
}

// psCell returns the cell of the ps(T) grid that holds T, TMin <= T <= T13.
func psCell(T float64) uint {
	return min(uint(float64((T-TMin)*(1/psStep))), psN-1)
}

// onSatLine reports whether p lies within 1e-12 of ps(T) (R7-97 Eq. 30), for T < Tc. Below
// 623.15 K the grid bounds of aboveSat decide without Eq. (30) for all but a narrow band.
func onSatLine(p, T float64) bool {
	if T <= T13 {
		k := psCell(T)
		if p > float64(psHi[k]*(1+1e-12)) || p < float64(psLo[k]*(1-1e-12)) {
			return false
		}
	}
	return math.Abs(p-psatEq(T)) <= float64(1e-12*p)
}

// phaseOf classifies a single-phase state; ps is used only for T < Tc.
func phaseOf(p, T float64) Phase {
	switch {
	case T < Tc:
		if T <= T13 || p > Pc || p > psatEq(T) {
			// Region 1 is liquid by construction; in region 3 compare with ps(T).
			return Liquid
		}
		return Vapour
	case p > Pc && T > Tc:
		return Supercritical
	}
	return Vapour
}

// finish sets the phase and quality of a single-phase state.
func finish(st Props) Props {
	setPhase(&st)
	return st
}

// setPhase sets the phase and quality of the single-phase state *st.
func setPhase(st *Props) {
	switch st.Region {
	case 1:
		st.Phase = Liquid
	case 2, 5:
		st.Phase = Vapour
		if st.P > Pc && st.T > Tc {
			st.Phase = Supercritical
		}
	default:
		st.Phase = phaseOf(st.P, st.T)
	}
	st.X = 0
	if st.Phase != Liquid {
		st.X = 1
	}
}

// StatePT returns the single-phase state at pressure p (Pa) and temperature T (K); the region
// (1, 2, 3 or 5) is found from (p, T) as in R7-97 Figure 1. On the saturation line (to 1e-12
// in p) p and T do not fix the state, and it returns a *SaturationError.
func StatePT(p, T float64) (Props, error) {
	if err := checkPT(p, T); err != nil {
		return Props{}, err
	}
	if T < Tc && onSatLine(p, T) {
		return Props{}, &SaturationError{}
	}
	var st Props
	statePT(&st, regionPT(p, T), p, T)
	setPhase(&st)
	return st, nil
}

// statePT evaluates the basic equation of the given region at (p, T) into *st.
func statePT(st *Props, region int, p, T float64) {
	if region == 3 {
		a := r3Helm(rho3(p, T), T, wantAll)
		a.setProps(st)
		st.P = p // exact, not the rounded p(ρ, T)
		return
	}
	d := gibbsAt(region, p, T, wantAll)
	d.setProps(st, p, T, region)
}

// HPT returns the specific enthalpy (J/kg) at (p, T), computing only what h needs.
func HPT(p, T float64) (float64, error) {
	if err := checkPT(p, T); err != nil {
		return 0, err
	}
	switch r := regionPT(p, T); r {
	case 1:
		return h1(p, T), nil
	case 2:
		return h2(p, T), nil
	case 3:
		a := r3Helm(rho3(p, T), T, wantX|wantY)
		return a.h(), nil
	default:
		return hG(r, p, T), nil
	}
}

// SPT returns the specific entropy (J/(kg·K)) at (p, T), computing only what s needs.
func SPT(p, T float64) (float64, error) {
	if err := checkPT(p, T); err != nil {
		return 0, err
	}
	if r := regionPT(p, T); r != 3 {
		return sG(r, p, T), nil
	}
	a := r3Helm(rho3(p, T), T, wantF|wantY)
	return a.s(), nil
}

// VPT returns the specific volume (m³/kg) at (p, T), computing only what v needs.
func VPT(p, T float64) (float64, error) {
	if err := checkPT(p, T); err != nil {
		return 0, err
	}
	if r := regionPT(p, T); r != 3 {
		return vG(r, p, T), nil
	}
	return 1 / rho3(p, T), nil
}
