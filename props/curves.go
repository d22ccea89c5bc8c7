package props

import (
	"math"

	"github.com/vouchcalc/vouch/props/if97"
)

// CurvePoint is a point of a diagram curve in SI base units.
type CurvePoint struct{ T, S, H float64 }

// Dome returns the saturation dome of a fluid as one curve: the saturated
// liquid line from tLow (or the lowest temperature of the formulation, if
// higher) up to the critical point, then the saturated vapour line back
// down, n points on each side.
func Dome(fluid string, n int, tLow float64) ([]CurvePoint, error) {
	sat, tmin, tc, err := satFunc(fluid)
	if err != nil {
		return nil, err
	}
	if tLow > tmin && tLow < tc {
		tmin = tLow
	}
	liq := make([]CurvePoint, 0, n)
	vap := make([]CurvePoint, 0, n)
	for i := 0; i < n; i++ {
		// Points crowd toward the critical point, where the dome turns.
		f := float64(i) / float64(n-1)
		T := tmin + float64((tc-tmin)*(1-float64((1-f)*(1-f))))
		if i == n-1 {
			T = tc - float64(1e-6*(tc-tmin))
		}
		s, err := sat(T)
		if err != nil {
			return nil, err
		}
		liq = append(liq, CurvePoint{T: T, S: s.Sf, H: s.Hf})
		vap = append(vap, CurvePoint{T: T, S: s.Sg, H: s.Hg})
	}
	for i := len(vap) - 1; i >= 0; i-- {
		liq = append(liq, vap[i])
	}
	return liq, nil
}

// satFunc returns a fluid's saturation function and its temperature range.
func satFunc(fluid string) (func(T float64) (numSat, error), float64, float64, error) {
	if normalName(fluid) == "water" {
		return func(T float64) (numSat, error) {
			s, err := if97.SatT(T)
			return numSat{P: s.P, T: s.T, Hf: s.Hf, Hg: s.Hg, Sf: s.Sf, Sg: s.Sg, Vf: s.Vf, Vg: s.Vg}, err
		}, 273.16, 647.096, nil
	}
	return fluidSatFunc(fluid)
}

// Isobar returns n states along the constant-pressure line p between the
// enthalpies h1 and h2, through the dome where it crosses it; the
// saturation corners are included exactly.
func Isobar(fluid string, p, h1, h2 float64, n int) ([]CurvePoint, error) {
	hs := make([]float64, 0, n+2)
	for i := 0; i < n-1; i++ {
		hs = append(hs, h1+(h2-h1)*float64(i)/float64(n-1))
	}
	hs = append(hs, h2) // the end state exactly, not a rounding of it
	hs = addCorners(fluid, p, h1, h2, hs)
	out := make([]CurvePoint, 0, len(hs))
	for _, h := range hs {
		T, s, err := stateTS(fluid, p, h)
		if err != nil {
			return nil, err
		}
		out = append(out, CurvePoint{T: T, S: s, H: h})
	}
	return out, nil
}

// addCorners inserts the saturated liquid and vapour enthalpies at p into a
// sorted run of enthalpies when they lie inside it.
func addCorners(fluid string, p, h1, h2 float64, hs []float64) []float64 {
	hf, hg, ok := satAtP(fluid, p)
	if !ok {
		return hs
	}
	lo, hi := math.Min(h1, h2), math.Max(h1, h2)
	for _, c := range []float64{hf, hg} {
		if c <= lo || c >= hi {
			continue
		}
		i := 0
		for i < len(hs) && float64((hs[i]-c)*(h2-h1)) < 0 {
			i++
		}
		hs = append(hs[:i], append([]float64{c}, hs[i:]...)...)
	}
	return hs
}

func satAtP(fluid string, p float64) (hf, hg float64, ok bool) {
	if normalName(fluid) == "water" {
		s, err := if97.SatP(p)
		return s.Hf, s.Hg, err == nil
	}
	return fluidSatAtP(fluid, p)
}

// stateTS returns T and s at (p, h).
func stateTS(fluid string, p, h float64) (float64, float64, error) {
	if normalName(fluid) == "water" {
		st, err := if97.StatePH(p, h)
		if err != nil {
			return 0, 0, rangeMessage("water(p, h)", IF97, err)
		}
		return st.T, st.S, nil
	}
	return fluidStateTS(fluid, p, h)
}

// HeatPath returns n states of a heat exchange from (p1, h1) to (p2, h2)
// in which the pressure changes evenly with the enthalpy; with p1 == p2 it
// is the isobar, saturation corners included.
func HeatPath(fluid string, p1, p2, h1, h2 float64, n int) ([]CurvePoint, error) {
	if p1 == p2 {
		return Isobar(fluid, p1, h1, h2, n)
	}
	out := make([]CurvePoint, 0, n)
	for i := 0; i < n; i++ {
		f := float64(i) / float64(n-1)
		p, h := p1+float64((p2-p1)*f), h1+float64((h2-h1)*f)
		if i == n-1 {
			p, h = p2, h2
		}
		T, s, err := stateTS(fluid, p, h)
		if err != nil {
			return nil, err
		}
		out = append(out, CurvePoint{T: T, S: s, H: h})
	}
	return out, nil
}
