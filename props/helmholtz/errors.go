package helmholtz

// RangeError reports an input outside the range of validity of an
// equation of state, or outside the range where the asked-for state
// exists (a quality above 1, a saturation temperature above the critical
// point). Its message holds no numbers, so that this package need not
// format them: callers format Value and Limit in the units they show.
type RangeError struct {
	Input  string  // the input's symbol: "T", "p", "rho", "v", "h", "s", "x"
	Value  float64 // the value given, SI
	Limit  float64 // the limit it crosses, SI
	Above  bool    // whether Value is above Limit (else below)
	Reason string  // what the limit is, e.g. "highest temperature of the equation"
}

// Error reads, e.g., "T is above the highest temperature of the equation".
func (e *RangeError) Error() string {
	side := "below"
	if e.Above {
		side = "above"
	}
	return e.Input + " is " + side + " the " + e.Reason
}

// SolveError reports a state that the solvers could not settle: they give
// up rather than return a state of the wrong phase or an unconverged one.
type SolveError struct {
	Op     string // the function, e.g. "SatT", "StatePH"
	Reason string // why, e.g. "too close to the critical point"
}

// Error reads, e.g., "SatT: no solution: too close to the critical point".
func (e *SolveError) Error() string { return e.Op + ": no solution: " + e.Reason }

// NoState reports that no state of the equation has the inputs (rather
// than that the solver failed to find one).
func (e *SolveError) NoState() bool { return e.Reason == whyNoState }

// OnSaturation reports that (p, T) lies on the saturation line, where they
// do not fix the state.
func (e *SolveError) OnSaturation() bool { return e.Reason == whyOnSat }

// Reasons used in RangeError.
const (
	reasonTmin   = "lowest temperature of the equation"
	reasonTmax   = "highest temperature of the equation"
	reasonPmax   = "highest pressure of the equation"
	reasonPmin   = "lowest pressure (zero)"
	reasonRhoMx  = "highest density of the equation"
	reasonRho0   = "lowest density (zero)"
	reasonTc     = "critical temperature, where saturation ends"
	reasonPc     = "critical pressure, where saturation ends"
	reasonPsatL  = "saturation pressure at the lowest temperature of the equation"
	reasonX0     = "quality range 0 to 1"
	reasonX1     = "quality range 0 to 1"
	reasonHmin   = "lowest enthalpy at this pressure within the equation's range"
	reasonHmax   = "highest enthalpy at this pressure within the equation's range"
	reasonSmin   = "lowest entropy at this pressure within the equation's range"
	reasonSmax   = "highest entropy at this pressure within the equation's range"
	reasonFinite = "range of finite numbers"
	reasonHminS  = "lowest enthalpy at this entropy within the equation's range"
	reasonHmaxS  = "highest enthalpy at this entropy within the equation's range"
	reasonV0     = "lowest specific volume (zero)"
	reasonVmin   = "lowest specific volume of the equation, at its highest density"
	reasonVminP  = "lowest specific volume at this pressure within the equation's range"
	reasonVmaxP  = "highest specific volume at this pressure within the equation's range"
)

// Reasons used in SolveError.
const (
	whyCritical = "too close to the critical point"
	whyNoConv   = "the iteration did not converge"
	whyOnSat    = "the state lies on the saturation line; give the quality instead"
	whyNoState  = "no state of the equation has these properties"
)
