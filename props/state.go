// Package props gives calcs the properties of water, steam and the organic
// working fluids as quantities: it reads which two properties a call gives
// from their dimensions, calls the numerics in props/if97 or
// props/helmholtz in SI base units, and turns range errors into messages
// that name the input, its value and the limit.
package props

import (
	"fmt"
	"math"
	"strings"

	"github.com/vouchcalc/vouch/props/if97"
	"github.com/vouchcalc/vouch/units"
)

// The fields of a state, in the order listings show them; a State keeps
// them by these indices.
const (
	fP = iota
	fT
	fH
	fS
	fU
	fV
	fRho
	fCp
	fCv
	fW
	fX
	fMu
	fK
	fPhase
	fRegion
)

// stateFields are the fields of a state in the order listings show them.
var stateFields = []string{"p", "T", "h", "s", "u", "v", "rho", "cp", "cv", "w", "x", "mu", "k", "phase", "region"}

// stateDims are the dimensions of the quantity fields, by index.
var stateDims = [fK + 1]units.Dim{units.DimPressure, units.DimTemperature, units.DimSpecificEnergy,
	units.DimSpecificEntropy, units.DimSpecificEnergy, units.DimSpecificVolume, units.DimDensity,
	units.DimSpecificEntropy, units.DimSpecificEntropy, units.DimVelocity, units.None,
	units.DimViscosity, units.DimConductivity}

// mustBePositive marks the fields that are finite and above zero wherever
// they are defined.
var mustBePositive = [fK + 1]bool{fP: true, fT: true, fV: true, fRho: true, fCp: true, fCv: true, fW: true, fMu: true, fK: true}

// CritRatio is the largest cp/cv a state may have for cp (and the thermal
// conductivity, which contains it) to be given. Both diverge at the
// critical point; cp/cv reaches 1e6 within about 0.2 mK of the critical
// temperature on the critical isochore of water, closer than the critical
// constants are known (647.096 K is given to 1 mK), so such a state is the
// critical point and cp there is no number.
const CritRatio = 1e6

// StateFieldIndex returns the index of a state field by its calc name, or
// -1; FieldAt reads a field by this index.
func StateFieldIndex(name string) int {
	switch name {
	case "p":
		return fP
	case "T":
		return fT
	case "h":
		return fH
	case "s":
		return fS
	case "u":
		return fU
	case "v":
		return fV
	case "rho":
		return fRho
	case "cp":
		return fCp
	case "cv":
		return fCv
	case "w":
		return fW
	case "x":
		return fX
	case "mu":
		return fMu
	case "k":
		return fK
	case "phase":
		return fPhase
	case "region":
		return fRegion
	}
	return -1
}

// State is one state of a working fluid. It keeps the numbers in SI base
// units in a fixed array; the transport properties of water are computed
// from the state when mu or k is read, never before.
type State struct {
	Fluid       string // "water", "isopentane", ...
	Formulation string // "IAPWS-IF97", "Lemmon & Span (2006)"
	Reference   string // reference state of h, s and u
	Phase       string // liquid, vapour, two-phase, supercritical
	Region      int    // IF97 region (water only), else 0
	num         [fX + 1]float64
	water       if97.Props // water: the state mu and k are computed from
	isWater     bool
	tc, rhoc    float64 // critical temperature and density of the formulation
	mixture     bool    // two-phase with 0 < x < 1
	supercrit   bool
}

// Field returns a field of the state by its calc name.
func (s *State) Field(name string) (any, error) {
	i := StateFieldIndex(name)
	if i < 0 {
		return nil, fmt.Errorf("a state has no field %s; its fields are %s", name, joinFields(stateFields))
	}
	return s.FieldAt(i)
}

// FieldAt returns the field of index i (from StateFieldIndex): a quantity,
// or the phase as text.
func (s *State) FieldAt(i int) (any, error) {
	switch {
	case i < 0 || i > fRegion:
		return nil, fmt.Errorf("a state has no field number %d; its fields are %s", i, joinFields(stateFields))
	case i == fPhase:
		return s.Phase, nil
	case i == fRegion:
		return units.Num(float64(s.Region)), nil
	}
	q, err := s.quantity(i)
	if err != nil {
		return nil, err
	}
	return q, nil
}

// FieldNames lists the fields of a state.
func (s *State) FieldNames() []string { return stateFields }

// Source names the formulation the state comes from.
func (s *State) Source() string { return s.Formulation }

// Quantity returns a quantity field, for renderers and tests; false when
// the field is not a quantity or not defined at this state.
func (s *State) Quantity(name string) (units.Quantity, bool) {
	i := StateFieldIndex(name)
	if i < 0 || i > fK {
		return units.Quantity{}, false
	}
	q, err := s.quantity(i)
	return q, err == nil
}

// quantity returns quantity field i (fP..fK) or says why it is not defined.
func (s *State) quantity(i int) (units.Quantity, error) {
	if i < 0 || i > fK {
		return units.Quantity{}, fmt.Errorf("field number %d of a state is not a quantity", i)
	}
	name := stateFields[i]
	var v float64
	switch {
	case i == fX && s.supercrit:
		// A quality of 1 would pass a check such as x >= 0.88 for a fluid that may be
		// as dense as a liquid.
		return units.Quantity{}, s.undefined(name, "a supercritical fluid (above both the critical temperature and the critical pressure) has no vapour quality")
	case i >= fCp && i != fX && s.mixture:
		return units.Quantity{}, s.undefined(name, "the state is a two-phase mixture")
	case i == fMu || i == fK:
		var err error
		if v, err = s.transport(i); err != nil {
			return units.Quantity{}, err
		}
	default:
		v = s.num[i]
	}
	if err := s.defined(i, v); err != nil {
		return units.Quantity{}, err
	}
	q := units.Quantity{V: v, D: stateDims[i]}
	if i == fT {
		q.T = units.Abs
	}
	return q, nil
}

// transport computes mu or k from the known state.
func (s *State) transport(i int) (float64, error) {
	name := stateFields[i]
	if !s.isWater {
		return 0, s.undefined(name, "vouch has no transport-property correlation for "+s.Fluid)
	}
	var v float64
	var err error
	if i == fMu {
		v, err = if97.ViscosityOf(&s.water)
	} else {
		v, err = if97.ConductivityOf(&s.water)
	}
	if err != nil {
		return 0, s.undefined(name, rangeMessage("the transport equations", "IAPWS R12-08 and R15-11", err).Error())
	}
	return v, nil
}

// defined applies the rules every state keeps: no field is NaN or
// infinite; p, T, v, rho, cp, cv, w, mu and k are above zero; cp is not
// given at the critical point (cp/cv above CritRatio, see there), nor k,
// whose critical enhancement contains cp.
func (s *State) defined(i int, v float64) error {
	if why := s.why(i, v); why != "" {
		return s.undefined(stateFields[i], why)
	}
	if i == fK {
		if why := s.why(fCp, s.num[fCp]); why != "" {
			return s.undefined("k", "its critical enhancement (IAPWS R15-11) contains cp, and "+why)
		}
	}
	return nil
}

// stateSI are the SI units of the quantity fields, for messages.
var stateSI = [fK + 1]string{"Pa", "K", "J/kg", "J/(kg*K)", "J/kg", "m^3/kg", "kg/m^3", "J/(kg*K)", "J/(kg*K)", "m/s", "", "Pa*s", "W/(m*K)"}

// why says why field i with value v is not defined, or returns "".
func (s *State) why(i int, v float64) string {
	name := stateFields[i]
	bad := math.IsNaN(v) || math.IsInf(v, 0) || mustBePositive[i] && !(v > 0)
	if !bad && !(i == fCp && !(v <= float64(CritRatio*s.num[fCv]))) {
		return ""
	}
	given := strings.TrimSpace(fmt.Sprintf("%s gives %s = %s %s", s.Formulation, name, showNum(v), stateSI[i]))
	if s.nearCritical() {
		return fmt.Sprintf("the state is the critical point of %s (T = %s, rho = %s) to within the precision of its constants, where cp diverges; %s",
			s.Fluid, showValue("T", s.tc), showValue("rho", s.rhoc), given)
	}
	if !bad {
		return fmt.Sprintf("%s, %s times cv (above %s): the state is too close to the critical point for cp to be a number", given, showNum(v/s.num[fCv]), showNum(CritRatio))
	}
	return given + ", and " + name + " must be finite and above zero: the formulation does not define it at this state"
}

// nearCritical reports whether the state lies within 0.1 % in T and 25 % in
// density of the critical point (for messages only).
func (s *State) nearCritical() bool {
	return math.Abs(s.num[fT]/s.tc-1) < 1e-3 && math.Abs(s.num[fRho]/s.rhoc-1) < 0.25
}

// undefined says that a field is not defined at this state, naming the
// state.
func (s *State) undefined(name, why string) error {
	return fmt.Errorf("%s is not defined here: %s (the state: %s at p = %s, T = %s, rho = %s)",
		name, why, s.Fluid, showValue("p", s.num[fP]), showValue("T", s.num[fT]), showValue("rho", s.num[fRho]))
}

// Sat is the saturation line at one point: saturated liquid (f) and vapour
// (g) properties.
type Sat struct {
	Fluid       string
	Formulation string
	Reference   string
	num         [len(satFields)]float64
}

var satFields = [...]string{"p", "T", "hf", "hg", "hfg", "sf", "sg", "sfg", "vf", "vg"}

var satDims = [len(satFields)]units.Dim{units.DimPressure, units.DimTemperature,
	units.DimSpecificEnergy, units.DimSpecificEnergy, units.DimSpecificEnergy,
	units.DimSpecificEntropy, units.DimSpecificEntropy, units.DimSpecificEntropy,
	units.DimSpecificVolume, units.DimSpecificVolume}

// Field returns a field of the saturation point by its calc name.
func (s *Sat) Field(name string) (any, error) {
	if q, ok := s.Quantity(name); ok {
		return q, nil
	}
	return nil, fmt.Errorf("a saturation point has no field %s; its fields are %s", name, joinFields(satFields[:]))
}

// FieldNames lists the fields of a saturation point.
func (s *Sat) FieldNames() []string { return satFields[:] }

// Source names the formulation the saturation point comes from.
func (s *Sat) Source() string { return s.Formulation }

// Quantity returns a quantity field.
func (s *Sat) Quantity(name string) (units.Quantity, bool) {
	for i, n := range satFields {
		if n == name {
			q := units.Quantity{V: s.num[i], D: satDims[i]}
			if i == 1 {
				q.T = units.Abs
			}
			return q, true
		}
	}
	return units.Quantity{}, false
}

func joinFields(f []string) string {
	return strings.Join(f, " ")
}

// numState is a state in SI base units, as both numerics packages give it.
type numState struct {
	P, T, V, Rho, H, S, U, Cp, Cv, W, X float64
	Tc, RhoC                            float64 // critical point of the formulation
	Phase                               string
	Region                              int
	TwoPhase                            bool
}

// state builds a State from SI numbers.
func (n *numState) state(fluid, formulation, reference string) *State {
	s := &State{Fluid: fluid, Formulation: formulation, Reference: reference, Phase: n.Phase, Region: n.Region,
		num: [fX + 1]float64{n.P, n.T, n.H, n.S, n.U, n.V, n.Rho, n.Cp, n.Cv, n.W, n.X},
		tc:  n.Tc, rhoc: n.RhoC,
		mixture:   n.TwoPhase && n.X > 0 && n.X < 1,
		supercrit: n.Phase == "supercritical"}
	return s
}

// numSat is a saturation point in SI base units.
type numSat struct{ P, T, Hf, Hg, Sf, Sg, Vf, Vg float64 }

func (n numSat) sat(fluid, formulation, reference string) *Sat {
	return &Sat{Fluid: fluid, Formulation: formulation, Reference: reference,
		num: [len(satFields)]float64{n.P, n.T, n.Hf, n.Hg, n.Hg - n.Hf, n.Sf, n.Sg, n.Sg - n.Sf, n.Vf, n.Vg}}
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

// rank orders kinds so a pair is read in one canonical order.
func rank(k kind) int {
	switch k {
	case kP:
		return 0
	case kT:
		return 1
	case kH:
		return 2
	case kS:
		return 3
	case kV, kRho:
		return 4
	}
	return 5
}

// Pairs lists the input pairs the state functions accept.
var Pairs = []string{"(p, T)", "(p, h)", "(p, s)", "(h, s)", "(p, x)", "(T, x)", "(p, v)", "(p, rho)", "(T, v)", "(T, rho)"}

// pair sorts two arguments into canonical order and names them; fn names
// the call in an error (a function, so the text is built only then).
func pair(fn func() string, a, b units.Quantity) (ka, kb kind, qa, qb units.Quantity, err error) {
	ka, ok1 := kindOf(a)
	kb, ok2 := kindOf(b)
	switch {
	case !ok1:
		return "", "", a, b, fmt.Errorf("%s: the first argument is %s, which is none of pressure, temperature, specific enthalpy, specific entropy, specific volume, density or quality", fn(), a.D.Name())
	case !ok2:
		return "", "", a, b, fmt.Errorf("%s: the second argument is %s, which is none of pressure, temperature, specific enthalpy, specific entropy, specific volume, density or quality", fn(), b.D.Name())
	}
	if rank(kb) < rank(ka) {
		ka, kb, a, b = kb, ka, b, a
	}
	if kb == kRho {
		kb, b = kV, units.Quantity{V: 1 / b.V, D: units.DimSpecificVolume}
	}
	return ka, kb, a, b, nil
}
