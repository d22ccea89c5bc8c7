package props

import (
	"errors"
	"fmt"
	"strings"

	"github.com/vouchcalc/vouch/props/helmholtz"
	"github.com/vouchcalc/vouch/units"
)

// nameFolder drops the characters a fluid name may be written with or without.
var nameFolder = strings.NewReplacer("-", "", " ", "", "_", "")

// normalName folds a fluid name for lookup: lower case, no hyphens or spaces.
func normalName(s string) string {
	return nameFolder.Replace(strings.ToLower(s))
}

// isWater reports whether a fluid name means water (IAPWS-IF97).
func isWater(name string) bool {
	n := normalName(name)
	return n == "water" || n == "steam" || n == "h2o" || n == "r718"
}

// lookupFluid finds an organic fluid or says which name was meant.
func lookupFluid(name string) (*helmholtz.Fluid, error) {
	f, ok := helmholtz.Lookup(name)
	if ok {
		return f, nil
	}
	msg := fmt.Sprintf("unknown fluid %q", name)
	if near := helmholtz.Nearest(name); near != "" {
		msg += fmt.Sprintf("; did you mean %q?", near)
	}
	return nil, errors.New(msg + "; `vouch functions` lists the fluids")
}

// Fluid returns the state of a working fluid from two properties read from
// their dimensions: water by IAPWS-IF97, the organic fluids by their
// Helmholtz-energy equations of state.
func Fluid(name string, a, b units.Quantity) (*State, error) {
	if isWater(name) {
		return Water(a, b)
	}
	f, err := lookupFluid(name)
	if err != nil {
		return nil, err
	}
	ka, kb, qa, qb, err := pair(func() string { return fmt.Sprintf("fluid(%q, A, B)", f.Name) }, a, b)
	if err != nil {
		return nil, err
	}
	// The call as messages show it, built only for a message.
	callText := func() string { return fmt.Sprintf("fluid(%q, %s, %s)", f.Name, ka, kb) }
	if err := positive(callText, ka, qa, kb, qb); err != nil {
		return nil, err
	}
	var p helmholtz.Props
	switch [2]kind{ka, kb} {
	case [2]kind{kP, kT}:
		p, err = f.StatePT(qa.V, qb.V)
	case [2]kind{kP, kH}:
		p, err = f.StatePH(qa.V, qb.V)
	case [2]kind{kP, kS}:
		p, err = f.StatePS(qa.V, qb.V)
	case [2]kind{kH, kS}:
		p, err = f.StateHS(qa.V, qb.V)
	case [2]kind{kP, kX}:
		p, err = f.StatePX(qa.V, qb.V)
	case [2]kind{kT, kX}:
		p, err = f.StateTX(qa.V, qb.V)
	case [2]kind{kT, kV}:
		p, err = f.StateTRho(qa.V, 1/qb.V)
	case [2]kind{kP, kV}:
		p, err = f.StatePV(qa.V, qb.V)
	default:
		return nil, fmt.Errorf("%s is not a pair the fluid functions can solve; use one of (p, T), (p, h), (p, s), (h, s), (p, x), (T, x), (T, v), (T, rho), (p, v), (p, rho)", callText())
	}
	if err != nil {
		if noStateErr(err) {
			return nil, noStateMessage(callText(), f.Equation+" for "+f.Name, ka, qa, kb, qb)
		}
		if onSatErr(err) {
			return nil, onSatMessage(callText(), fmt.Sprintf("fluid(%q, ", f.Name), qa, qb)
		}
		return nil, fluidError(callText(), f, err)
	}
	return fluidState(f, p), nil
}

// FluidSat returns the saturation line of a working fluid at a pressure or
// a temperature.
func FluidSat(name string, x units.Quantity) (*Sat, error) {
	if isWater(name) {
		return WaterSat(x)
	}
	f, err := lookupFluid(name)
	if err != nil {
		return nil, err
	}
	var s helmholtz.Sat
	var call string
	switch x.D {
	case units.DimPressure:
		call = fmt.Sprintf("fluid_sat(%q, p)", f.Name)
		s, err = f.SatP(x.V)
	case units.DimTemperature:
		call = fmt.Sprintf("fluid_sat(%q, T)", f.Name)
		s, err = f.SatT(x.V)
	default:
		return nil, fmt.Errorf("fluid_sat needs a pressure or a temperature, not %s", x.D.Name())
	}
	if err != nil {
		return nil, fluidError(call, f, err)
	}
	return numSat{P: s.P, T: s.T, Hf: s.Hf, Hg: s.Hg, Sf: s.Sf, Sg: s.Sg, Vf: s.Vf, Vg: s.Vg}.sat(f.Name, f.Equation+" for "+f.Name, f.Reference), nil
}

// fluidError turns a numerics error into a message with values and limits.
func fluidError(call string, f *helmholtz.Fluid, err error) error {
	var re *helmholtz.RangeError
	if errors.As(err, &re) {
		return fmt.Errorf("%s: %s", call, limitText(re.Input, re.Value, re.Limit, re.Above, re.Reason, f.Equation+" for "+f.Name))
	}
	return fmt.Errorf("%s: %v", call, err)
}

func fluidState(f *helmholtz.Fluid, p helmholtz.Props) *State {
	n := numState{P: p.P, T: p.T, V: p.V, Rho: p.Rho, H: p.H, S: p.S, U: p.U, Cp: p.Cp, Cv: p.Cv, W: p.W, X: p.X,
		Tc: f.Tc, RhoC: f.RhoC, Phase: p.Phase.String(), TwoPhase: p.Phase == helmholtz.TwoPhase}
	return n.state(f.Name, formulationOf(f), f.Reference)
}

// formulations holds "EQUATION for NAME" of every organic fluid, built
// once, so a state does not build the text again.
var formulations = func() map[*helmholtz.Fluid]string {
	m := map[*helmholtz.Fluid]string{}
	for _, n := range helmholtz.Names() {
		if f, ok := helmholtz.Lookup(n); ok {
			m[f] = f.Equation + " for " + f.Name
		}
	}
	return m
}()

// formulationOf names the equation of state of an organic fluid.
func formulationOf(f *helmholtz.Fluid) string {
	if s, ok := formulations[f]; ok {
		return s
	}
	return f.Equation + " for " + f.Name
}

// FluidInfo describes a working fluid for listings.
type FluidInfo struct {
	Name, Aliases, Equation, Range, Reference string
}

// Fluids lists water and the organic fluids with their equations.
func Fluids() []FluidInfo {
	out := []FluidInfo{{Name: "water", Aliases: "steam", Equation: IF97, Range: "273.15–1073.15 K at p ≤ 100 MPa; to 2273.15 K at p ≤ 50 MPa", Reference: IF97Reference}}
	for _, n := range helmholtz.Names() {
		f, _ := helmholtz.Lookup(n)
		out = append(out, FluidInfo{Name: f.Name, Aliases: strings.Join(f.Aliases, ", "), Equation: f.Equation,
			Range: fmt.Sprintf("%.2f–%.2f K, p ≤ %g MPa", f.Tmin, f.Tmax, f.Pmax/1e6), Reference: f.Reference})
	}
	return out
}

// fluidSatFunc, fluidSatAtP and fluidStateTS serve diagrams of the organic
// fluids.
func fluidSatFunc(fluid string) (func(T float64) (numSat, error), float64, float64, error) {
	f, err := lookupFluid(fluid)
	if err != nil {
		return nil, 0, 0, err
	}
	return func(T float64) (numSat, error) {
		s, err := f.SatT(T)
		return numSat{P: s.P, T: s.T, Hf: s.Hf, Hg: s.Hg, Sf: s.Sf, Sg: s.Sg, Vf: s.Vf, Vg: s.Vg}, err
	}, f.Tmin, f.Tc, nil
}

func fluidSatAtP(fluid string, p float64) (float64, float64, bool) {
	f, err := lookupFluid(fluid)
	if err != nil {
		return 0, 0, false
	}
	s, err := f.SatP(p)
	return s.Hf, s.Hg, err == nil
}

func fluidStateTS(fluid string, p, h float64) (float64, float64, error) {
	f, err := lookupFluid(fluid)
	if err != nil {
		return 0, 0, err
	}
	st, err := f.StatePH(p, h)
	if err != nil {
		return 0, 0, fluidError("fluid(p, h)", f, err)
	}
	return st.T, st.S, nil
}

// Describe gives the full citation and reference state of a formulation
// named by a state's Source, for the package's appendix.
func Describe(source string) string {
	if source == IF97 {
		return IF97 + " (" + IF97Version + "); " + IF97Reference
	}
	if i := strings.LastIndex(source, " for "); i >= 0 {
		if f, ok := helmholtz.Lookup(source[i+5:]); ok {
			return source + ": " + f.Citation + "; reference state " + f.Reference
		}
	}
	return source
}

// Crit is a fluid's critical point and the range of its formulation.
type Crit struct {
	Fluid, Formulation string
	num                [len(critFields)]float64 // T, p, rho, Tmin, Tmax, pmax in SI
}

var critFields = [...]string{"T", "p", "rho", "Tmin", "Tmax", "pmax"}

var critDims = [len(critFields)]units.Dim{units.DimTemperature, units.DimPressure, units.DimDensity,
	units.DimTemperature, units.DimTemperature, units.DimPressure}

// Field returns a field of the critical point by its calc name.
func (c *Crit) Field(name string) (any, error) {
	for i, n := range critFields {
		if n == name {
			q := units.Quantity{V: c.num[i], D: critDims[i]}
			if q.D == units.DimTemperature {
				q.T = units.Abs
			}
			return q, nil
		}
	}
	return nil, fmt.Errorf("fluid_crit has no field %s; its fields are %s", name, joinFields(critFields[:]))
}

// FieldNames lists the fields of a critical point.
func (c *Crit) FieldNames() []string { return critFields[:] }

// Source names the formulation.
func (c *Crit) Source() string { return c.Formulation }

// FluidCrit returns a fluid's critical point (T, p, rho) and its
// formulation's range (Tmin, Tmax, pmax), so a calc can check a reduced
// pressure or a margin once for every fluid.
func FluidCrit(name string) (*Crit, error) {
	if isWater(name) {
		// IAPWS R7-97(2012) Eqs. (2)-(4): Tc = 647.096 K, pc = 22.064 MPa, rhoc = 322 kg/m3;
		// the range of Section 2 (to 1073.15 K at 100 MPa).
		return &Crit{Fluid: "water", Formulation: IF97, num: [len(critFields)]float64{647.096, 22.064e6, 322, 273.15, 1073.15, 100e6}}, nil
	}
	f, err := lookupFluid(name)
	if err != nil {
		return nil, err
	}
	return &Crit{Fluid: f.Name, Formulation: formulationOf(f), num: [len(critFields)]float64{f.Tc, f.Pc, f.RhoC, f.Tmin, f.Tmax, f.Pmax}}, nil
}
