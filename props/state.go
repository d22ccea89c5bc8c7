// Package props gives calcs the properties of water, steam and the organic
// working fluids as quantities: it reads which two properties a call gives
// from their dimensions, calls the numerics in props/if97 or
// props/helmholtz in SI base units, and turns range errors into messages
// that name the input, its value and the limit.
package props

import (
	"fmt"

	"github.com/vouchcalc/vouch/units"
)

// State is one state of a working fluid with its properties as quantities.
type State struct {
	Fluid       string // "water", "isopentane", ...
	Formulation string // "IAPWS-IF97", "Lemmon & Span (2006)"
	Reference   string // reference state of h, s and u
	Phase       string // liquid, vapour, two-phase, supercritical
	Region      int    // IF97 region (water only), else 0
	values      map[string]units.Quantity
	missing     map[string]string // field → why it is not defined here
}

// stateFields are the fields of a state in the order listings show them.
var stateFields = []string{"p", "T", "h", "s", "u", "v", "rho", "cp", "cv", "w", "x", "mu", "k", "phase", "region"}

// Field returns a field of the state by its calc name.
func (s *State) Field(name string) (any, error) {
	switch name {
	case "phase":
		return s.Phase, nil
	case "region":
		return units.Num(float64(s.Region)), nil
	}
	if q, ok := s.values[name]; ok {
		return q, nil
	}
	if why, ok := s.missing[name]; ok {
		return nil, fmt.Errorf("%s is not defined here: %s", name, why)
	}
	return nil, fmt.Errorf("a state has no field %s; its fields are %s", name, joinFields(stateFields))
}

// FieldNames lists the fields of a state.
func (s *State) FieldNames() []string { return stateFields }

// Source names the formulation the state comes from.
func (s *State) Source() string { return s.Formulation }

// Quantity returns a quantity field, for renderers and tests.
func (s *State) Quantity(name string) (units.Quantity, bool) {
	q, ok := s.values[name]
	return q, ok
}

// Sat is the saturation line at one point: saturated liquid (f) and vapour
// (g) properties.
type Sat struct {
	Fluid       string
	Formulation string
	Reference   string
	values      map[string]units.Quantity
}

var satFields = []string{"p", "T", "hf", "hg", "hfg", "sf", "sg", "sfg", "vf", "vg"}

// Field returns a field of the saturation point by its calc name.
func (s *Sat) Field(name string) (any, error) {
	if q, ok := s.values[name]; ok {
		return q, nil
	}
	return nil, fmt.Errorf("a saturation point has no field %s; its fields are %s", name, joinFields(satFields))
}

// FieldNames lists the fields of a saturation point.
func (s *Sat) FieldNames() []string { return satFields }

// Source names the formulation the saturation point comes from.
func (s *Sat) Source() string { return s.Formulation }

// Quantity returns a quantity field.
func (s *Sat) Quantity(name string) (units.Quantity, bool) {
	q, ok := s.values[name]
	return q, ok
}

func joinFields(f []string) string {
	out := ""
	for i, n := range f {
		if i > 0 {
			out += " "
		}
		out += n
	}
	return out
}

// numState is a state in SI base units, as both numerics packages give it.
type numState struct {
	P, T, V, Rho, H, S, U, Cp, Cv, W, X float64
	Mu, K                               float64 // 0 when not available
	Phase                               string
	Region                              int
	TwoPhase                            bool
}

// quantities builds a State from SI numbers.
func (n numState) state(fluid, formulation, reference string) *State {
	q := func(v float64, d units.Dim) units.Quantity { return units.Quantity{V: v, D: d} }
	s := &State{Fluid: fluid, Formulation: formulation, Reference: reference, Phase: n.Phase, Region: n.Region,
		values: map[string]units.Quantity{
			"p": q(n.P, units.DimPressure), "T": {V: n.T, D: units.DimTemperature, T: units.Abs},
			"h": q(n.H, units.DimSpecificEnergy), "s": q(n.S, units.DimSpecificEntropy),
			"u": q(n.U, units.DimSpecificEnergy), "v": q(n.V, units.DimSpecificVolume),
			"rho": q(n.Rho, units.DimDensity), "x": units.Num(n.X),
		}, missing: map[string]string{}}
	if n.Phase == "supercritical" {
		// A quality of 1 would pass a check such as x >= 0.88 for a fluid that may be as dense
		// as a liquid.
		delete(s.values, "x")
		s.missing["x"] = "a supercritical fluid (above both the critical temperature and the critical pressure) has no vapour quality"
	}
	if n.TwoPhase && n.X > 0 && n.X < 1 {
		for _, f := range []string{"cp", "cv", "w", "mu", "k"} {
			s.missing[f] = "the state is a two-phase mixture"
		}
		return s
	}
	s.values["cp"] = q(n.Cp, units.DimSpecificEntropy)
	s.values["cv"] = q(n.Cv, units.DimSpecificEntropy)
	s.values["w"] = q(n.W, units.DimVelocity)
	setOptional(s, "mu", n.Mu, units.DimViscosity)
	setOptional(s, "k", n.K, units.DimConductivity)
	return s
}

func setOptional(s *State, name string, v float64, d units.Dim) {
	if v > 0 {
		s.values[name] = units.Quantity{V: v, D: d}
	} else {
		s.missing[name] = "the formulation gives no " + name + " at this state"
	}
}

// numSat is a saturation point in SI base units.
type numSat struct{ P, T, Hf, Hg, Sf, Sg, Vf, Vg float64 }

func (n numSat) sat(fluid, formulation, reference string) *Sat {
	q := func(v float64, d units.Dim) units.Quantity { return units.Quantity{V: v, D: d} }
	return &Sat{Fluid: fluid, Formulation: formulation, Reference: reference, values: map[string]units.Quantity{
		"p": q(n.P, units.DimPressure), "T": {V: n.T, D: units.DimTemperature, T: units.Abs},
		"hf": q(n.Hf, units.DimSpecificEnergy), "hg": q(n.Hg, units.DimSpecificEnergy), "hfg": q(n.Hg-n.Hf, units.DimSpecificEnergy),
		"sf": q(n.Sf, units.DimSpecificEntropy), "sg": q(n.Sg, units.DimSpecificEntropy), "sfg": q(n.Sg-n.Sf, units.DimSpecificEntropy),
		"vf": q(n.Vf, units.DimSpecificVolume), "vg": q(n.Vg, units.DimSpecificVolume),
	}}
}

// kind is what a property-function argument gives, read from its dimension.
type kind string

const (
	kP   kind = "p"
	kT   kind = "T"
	kH   kind = "h"
	kS   kind = "s"
	kV   kind = "v"
	kRho kind = "rho"
	kX   kind = "x"
)

// kindOf reads an argument's property from its dimension.
func kindOf(q units.Quantity) (kind, bool) {
	switch q.D {
	case units.DimPressure:
		return kP, true
	case units.DimTemperature:
		return kT, true
	case units.DimSpecificEnergy:
		return kH, true
	case units.DimSpecificEntropy:
		return kS, true
	case units.DimSpecificVolume:
		return kV, true
	case units.DimDensity:
		return kRho, true
	case units.None:
		return kX, true
	}
	return "", false
}

// order ranks kinds so a pair is read in one canonical order.
var order = map[kind]int{kP: 0, kT: 1, kH: 2, kS: 3, kV: 4, kRho: 4, kX: 5}

// Pairs lists the input pairs the state functions accept.
var Pairs = []string{"(p, T)", "(p, h)", "(p, s)", "(h, s)", "(p, x)", "(T, x)", "(p, v)", "(p, rho)", "(T, v)", "(T, rho)"}

// pair sorts two arguments into canonical order and names them.
func pair(fn string, a, b units.Quantity) (ka, kb kind, qa, qb units.Quantity, err error) {
	ka, ok1 := kindOf(a)
	kb, ok2 := kindOf(b)
	switch {
	case !ok1:
		return "", "", a, b, fmt.Errorf("%s: the first argument is %s, which is none of pressure, temperature, specific enthalpy, specific entropy, specific volume, density or quality", fn, a.D.Name())
	case !ok2:
		return "", "", a, b, fmt.Errorf("%s: the second argument is %s, which is none of pressure, temperature, specific enthalpy, specific entropy, specific volume, density or quality", fn, b.D.Name())
	}
	if order[kb] < order[ka] {
		ka, kb, a, b = kb, ka, b, a
	}
	if kb == kRho {
		kb, b = kV, units.Quantity{V: 1 / b.V, D: units.DimSpecificVolume}
	}
	return ka, kb, a, b, nil
}
