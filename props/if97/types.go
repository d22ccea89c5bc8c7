// Package if97 computes the thermodynamic properties of water and steam with the IAPWS
// Industrial Formulation 1997 (IAPWS R7-97(2012), "IAPWS-IF97"), its supplementary backward
// equations (IAPWS SR2-01, SR3-03, SR4-04, SR5-05), and the transport properties of IAPWS
// R12-08 (viscosity), R15-11 (thermal conductivity) and R1-76(2014) (surface tension), in the
// forms those releases give for industrial use.
//
// All values are float64 in SI base units: Pa, K, J/kg, J/(kg·K), m³/kg, kg/m³, m/s, Pa·s,
// W/(m·K), N/m. The package imports only math. It never returns NaN and never panics: an input
// outside the range of validity of the formulation is reported as a *RangeError, never
// extrapolated.
//
// Results are for engineering calculations; as with any property formulation, designs that can
// hurt someone rest on the applicable codes and on review by a licensed engineer.
package if97

// Constants of IAPWS R7-97(2012).
const (
	R       = 461.526  // specific gas constant of IF97, J/(kg·K), R7-97 Eq. (1)
	Tc      = 647.096  // critical temperature, K, R7-97 Eq. (2)
	Pc      = 22.064e6 // critical pressure, Pa, R7-97 Eq. (3)
	Rhoc    = 322.0    // critical density, kg/m³, R7-97 Eq. (4)
	Tt      = 273.16   // triple-point temperature, K, R7-97 Eq. (9)
	Pt      = 611.657  // triple-point pressure, Pa, R7-97 Eq. (9)
	TMin    = 273.15   // lowest temperature of IF97, K, R7-97 Section 2
	TMax    = 2273.15  // highest temperature of IF97 (region 5), K, R7-97 Section 2
	PMax    = 100e6    // highest pressure for T <= 1073.15 K, Pa, R7-97 Section 2
	P5Max   = 50e6     // highest pressure for T > 1073.15 K (region 5), Pa, R7-97 Section 2
	T13     = 623.15   // isotherm between regions 1 and 3, K, R7-97 Section 2
	T25     = 1073.15  // isotherm between regions 2 and 5, K, R7-97 Section 2
	TB23Max = 863.15   // temperature of the B23 line at 100 MPa, K, R7-97 Section 4
)

// Phase tells which kind of state a Props describes.
type Phase int

// The phases. The boundaries follow common engineering use: liquid below the critical
// temperature and above the saturation pressure; vapour at or below the saturation pressure, or
// at or above the critical temperature and at or below the critical pressure; supercritical
// above both critical values; two-phase for a saturated mixture (including its end points).
const (
	// Liquid is a compressed (subcooled) liquid: T < Tc and p above the saturation pressure. X is 0.
	Liquid Phase = iota + 1
	// Vapour is a superheated vapour, or a gas at T >= Tc and p <= Pc. X is 1.
	Vapour
	// TwoPhase is a saturated liquid-vapour mixture in equilibrium; X is the vapour quality,
	// 0 for saturated liquid and 1 for saturated vapour.
	TwoPhase
	// Supercritical is a fluid with T > Tc and p > Pc. X is 1.
	Supercritical
)

// String returns the phase name in lowercase.
func (ph Phase) String() string {
	switch ph {
	case Liquid:
		return "liquid"
	case Vapour:
		return "vapour"
	case TwoPhase:
		return "two-phase"
	case Supercritical:
		return "supercritical"
	}
	return "unknown"
}

// Props is a single state in SI base units.
//
// X is the vapour quality: 0 for liquid, 1 for vapour and supercritical fluid, and between 0
// and 1 in the two-phase region. In the two-phase region (Phase TwoPhase, Region 4) Cp, Cv and
// W are not defined and are 0, except at X = 0 and X = 1, where they are those of the saturated
// liquid and the saturated vapour.
type Props struct {
	P   float64 // pressure, Pa
	T   float64 // temperature, K
	V   float64 // specific volume, m³/kg
	Rho float64 // density, kg/m³
	H   float64 // specific enthalpy, J/kg
	S   float64 // specific entropy, J/(kg·K)
	U   float64 // specific internal energy, J/kg
	Cp  float64 // specific isobaric heat capacity, J/(kg·K)
	Cv  float64 // specific isochoric heat capacity, J/(kg·K)
	W   float64 // speed of sound, m/s
	X   float64 // vapour quality, 0..1

	Region int   // IF97 region: 1, 2, 3, 4 (two-phase) or 5
	Phase  Phase // kind of state
}

// Sat holds the saturated liquid (f) and saturated vapour (g) at one point of the saturation
// line, in SI base units.
type Sat struct {
	P, T   float64 // saturation pressure (Pa) and temperature (K)
	Hf, Hg float64 // specific enthalpy, J/kg
	Sf, Sg float64 // specific entropy, J/(kg·K)
	Vf, Vg float64 // specific volume, m³/kg
	Uf, Ug float64 // specific internal energy, J/kg
}

// RangeError reports an input outside the range of validity of the formulation. Input names the
// input ("p", "T", "h", "s", "x", "v" or "rho"), Value is the value given and Limit the limit
// it passes, in SI base units; Above tells whether Value is above Limit (else below). Reason
// says which rule applies.
type RangeError struct {
	Input  string
	Value  float64
	Limit  float64
	Above  bool
	Reason string
}

// Error returns a text without numbers (the package formats no numbers); callers that want the
// value and the limit format e.Value and e.Limit with units.
func (e *RangeError) Error() string {
	side := "below the lower"
	if e.Above {
		side = "above the upper"
	}
	msg := "if97: " + e.Input + " is " + side + " limit"
	if e.Reason != "" {
		msg += ": " + e.Reason
	}
	return msg
}

// NoStateError reports a pair of properties that no state of IAPWS-IF97 has, although each lies
// within the formulation's range on its own (for example an entropy far above any the
// formulation reaches at that enthalpy). Pair names the inputs, as "(h, s)".
type NoStateError struct {
	Pair string
}

// Error returns "if97: no state of IAPWS-IF97 has this (h, s)".
func (e *NoStateError) Error() string { return "if97: no state of IAPWS-IF97 has this " + e.Pair }

// NoState reports that the error says no state has the inputs.
func (e *NoStateError) NoState() bool { return true }

// SaturationError reports a (p, T) on the saturation line, to within rounding (1e-12 in p):
// there p and T do not fix the state, which may be liquid, vapour or any mixture of the two.
type SaturationError struct{}

// Error returns the reason and the remedy.
func (e *SaturationError) Error() string {
	return "if97: (p, T) lies on the saturation line; give the quality instead"
}

// OnSaturation reports that the error says (p, T) lies on the saturation line.
func (e *SaturationError) OnSaturation() bool { return true }

// below and above build RangeErrors.
func below(input string, value, limit float64, reason string) error {
	return &RangeError{Input: input, Value: value, Limit: limit, Reason: reason}
}

func above(input string, value, limit float64, reason string) error {
	return &RangeError{Input: input, Value: value, Limit: limit, Above: true, Reason: reason}
}
