package qualify

import (
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/props/helmholtz"
)

// FluidLookup returns the equation of state of a fluid by name and
// equation key, as helmholtz.LookupEquation does.
type FluidLookup func(name, key string) (*helmholtz.Fluid, bool)

func defaultFluids(name, key string) (*helmholtz.Fluid, bool) {
	return helmholtz.LookupEquation(name, key)
}

// fluidRow is one row of helmholtz_check-values.csv (columns fluid, eos, T,
// rho, rho_unit, p_MPa, phase, property, value, unit, source, note).
type fluidRow struct {
	fluid, eos, rhoUnit, phase, prop, value, unit, source, note string
	T, rho, p                                                   float64
}

// fluidChecks computes every published value of the organic-fluid
// equations. Single-phase values at a given (T, rho) come straight from
// the equation's reduced Helmholtz energy (helmholtz.Fluid.Alpha, no range
// check: some published points lie just outside an equation's stated
// range); a (T, p) point's density comes from StatePT, and saturated
// states from SatT or SatP.
func fluidChecks(opt Options) ([]Check, error) {
	rows, err := readCSV("helmholtz_check-values.csv")
	if err != nil {
		return nil, err
	}
	var out []Check
	for i, rec := range rows {
		r, err := parseFluidRow(rec)
		if err != nil {
			return nil, fmt.Errorf("embedded helmholtz_check-values.csv row %d: %v", i+1, err)
		}
		f, ok := opt.Fluids(r.fluid, r.eos)
		if !ok {
			return nil, fmt.Errorf("embedded helmholtz_check-values.csv row %d: no equation %s %s", i+1, r.fluid, r.eos)
		}
		want, _ := strconv.ParseFloat(r.value, 64)
		tol, rule := r.tolerance()
		c := Check{Group: GroupFluids, ID: fmt.Sprintf("helmholtz_check-values.csv:%d", i+1), Source: r.source,
			What: r.describe(f), Expected: r.value, Unit: r.unit, ExpectedV: want,
			Tolerance: tol + float64(8*0x1p-52*math.Abs(want)), ToleranceS: rule, Note: r.note}
		if r.T > f.Tmax {
			c.Note = joinNote(c.Note, fmt.Sprintf("outside the equation's stated range (T above %g K): evaluated without the range check, which calcs keep", f.Tmax))
		}
		got, err := r.compute(f)
		out = append(out, judge(c, float64(got*fluidScale(f, r.unit)), err))
	}
	return out, nil
}

func parseFluidRow(rec []string) (fluidRow, error) {
	if len(rec) < 12 {
		return fluidRow{}, fmt.Errorf("%d columns, want 12", len(rec))
	}
	num := func(s string) (float64, error) {
		if s == "" {
			return math.NaN(), nil
		}
		return strconv.ParseFloat(s, 64)
	}
	r := fluidRow{fluid: rec[0], eos: rec[1], rhoUnit: rec[4], phase: rec[6], prop: rec[7], value: rec[8],
		unit: rec[9], source: rec[10], note: rec[11]}
	var err [4]error
	r.T, err[0] = num(rec[2])
	r.rho, err[1] = num(rec[3])
	r.p, err[2] = num(rec[5])
	_, err[3] = strconv.ParseFloat(rec[8], 64)
	for _, e := range err {
		if e != nil {
			return r, e
		}
	}
	return r, nil
}

func (r fluidRow) describe(f *helmholtz.Fluid) string {
	var in []string
	if !math.IsNaN(r.T) {
		in = append(in, fmt.Sprintf("T=%g K", r.T))
	}
	if !math.IsNaN(r.rho) {
		in = append(in, fmt.Sprintf("rho=%g %s", r.rho, r.rhoUnit))
	}
	if !math.IsNaN(r.p) {
		in = append(in, fmt.Sprintf("p=%g MPa", r.p))
	}
	return fmt.Sprintf("%s, %s (%s), %s: %s → %s", r.fluid, f.Equation, r.eos, r.phase, strings.Join(in, "; "), r.prop)
}

// tolerance is half a unit of the last printed digit, except the absolute
// tolerances the reference README (section 7.3) gives for the MM rows of
// the Thol thesis, as in props/helmholtz check_test.go.
func (r fluidRow) tolerance() (float64, string) {
	if r.eos == "thol-2016" && strings.Contains(r.note, "1.5e-5") {
		switch r.prop {
		case "cp", "s":
			return 2e-5, "±2e-5 J/(mol K) (reference README 7.3)"
		case "h", "a":
			return 1e-2, "±1e-2 J/mol (reference README 7.3)"
		}
	}
	if v, _ := strconv.ParseFloat(r.value, 64); v == 0 {
		return 1e-12, "±1e-12 (printed value 0)"
	}
	t, _ := halfLastDigit(r.value)
	return t, "±0.5 unit of the last printed digit"
}

var fluidRef = regexp.MustCompile(`T=([0-9.]+) K, rho=([0-9.]+) kg/m3`)

// compute returns the row's property in SI per kg.
func (r fluidRow) compute(f *helmholtz.Fluid) (float64, error) {
	switch r.phase {
	case "single":
		rho := r.rho
		if r.rhoUnit == "mol/dm3" {
			rho = float64(rho * (1000 * f.M))
		}
		if math.IsNaN(rho) {
			var err error
			if rho, err = densityTP(f, r.T, float64(r.p*1e6)); err != nil {
				return 0, err
			}
		}
		if r.prop == "dh" || r.prop == "ds" {
			m := fluidRef.FindStringSubmatch(r.note)
			if m == nil {
				return 0, fmt.Errorf("no reference state in the note")
			}
			T0, _ := strconv.ParseFloat(m[1], 64)
			rho0, _ := strconv.ParseFloat(m[2], 64)
			a, b := alphaProp(f, r.T, rho, r.prop[1:]), alphaProp(f, T0, rho0, r.prop[1:])
			return a - b, nil
		}
		return alphaProp(f, r.T, rho, r.prop), nil
	case "sat", "sat_liquid", "sat_vapor":
		var s helmholtz.Sat
		var err error
		if math.IsNaN(r.T) {
			s, err = f.SatP(float64(r.p * 1e6))
		} else {
			s, err = f.SatT(r.T)
		}
		if err != nil {
			return 0, err
		}
		switch {
		case r.phase == "sat" && r.prop == "T":
			return s.T, nil
		case r.phase == "sat":
			return s.P, nil
		case r.phase == "sat_liquid":
			return alphaProp(f, s.T, 1/s.Vf, r.prop), nil
		}
		return alphaProp(f, s.T, 1/s.Vg, r.prop), nil
	}
	return 0, fmt.Errorf("unknown phase %q", r.phase)
}

// alphaProp computes a property at (T, rho) in SI per kg from the reduced
// Helmholtz energy and its derivatives (the usual relations, e.g. Span,
// Multiparameter Equations of State, 2000, Table 3.3).
func alphaProp(f *helmholtz.Fluid, T, rho float64, prop string) float64 {
	tau, delta := f.Tred/T, rho/f.RhoRed
	var a helmholtz.Reduced
	if rho == 0 {
		// The ideal-gas limit: the residual part and its derivatives vanish.
		a = helmholtz.Reduced{A0t: f.Alpha(tau, 1).A0t, A0tt: f.Alpha(tau, 1).A0tt}
	} else {
		a = f.Alpha(tau, delta)
	}
	R := f.R
	dr := float64(delta * a.Ard)
	tt := float64(tau * tau * (a.A0tt + a.Artt))
	num := 1 + dr - float64(delta*tau*a.Ardt)
	den := 1 + float64(2*dr) + float64(delta*delta*a.Ardd)
	cv := float64(-R * tt)
	switch prop {
	case "p":
		return float64(rho * R * T * (1 + dr))
	case "h":
		return float64(R * T * (1 + float64(tau*(a.A0t+a.Art)) + dr))
	case "s":
		return float64(R * (float64(tau*(a.A0t+a.Art)) - a.A0 - a.Ar))
	case "a":
		return float64(R * T * (a.A0 + a.Ar))
	case "cv":
		return cv
	case "cp":
		return cv + R*num*num/den
	case "w":
		return math.Sqrt(math.Max(float64(R*T*(den-num*num/tt)), 0))
	case "rho":
		return rho
	case "cp0":
		return float64(R * (1 - float64(tau*tau*a.A0tt)))
	}
	return math.NaN()
}

// fluidScale converts an SI per-kg value to the row's printed unit.
func fluidScale(f *helmholtz.Fluid, unit string) float64 {
	switch unit {
	case "kPa":
		return 1e-3
	case "MPa":
		return 1e-6
	case "J/mol", "J/(mol K)":
		return f.M
	case "kJ/mol", "kJ/(mol K)":
		return f.M / 1000
	case "kJ/kg", "kJ/(kg K)":
		return 1e-3
	case "mol/dm3":
		return 1 / (1000 * f.M)
	}
	return 1
}

// densityTP returns the density at (T, p) from StatePT. Above the
// equation's highest temperature StatePT refuses the point; on such a
// supercritical isotherm p(ρ) rises monotonically, so the density is found
// here by bisection of p(T, ρ) between 0 and RhoMax, as the package's own
// test reaches these published points through its unchecked functions.
func densityTP(f *helmholtz.Fluid, T, p float64) (float64, error) {
	st, err := f.StatePT(p, T)
	if err == nil || !(T > f.Tmax && T > f.Tc) {
		return st.Rho, err
	}
	lo, hi := 0.0, f.RhoMax
	if alphaProp(f, T, hi, "p") < p {
		return 0, fmt.Errorf("%v; no density up to %g kg/m3 reaches %g Pa", err, hi, p)
	}
	for range 200 {
		mid := float64((lo + hi) / 2)
		if mid == lo || mid == hi {
			break
		}
		if alphaProp(f, T, mid, "p") < p {
			lo = mid
		} else {
			hi = mid
		}
	}
	return float64((lo + hi) / 2), nil
}
