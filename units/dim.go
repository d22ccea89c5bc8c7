// Package units holds physical dimensions, the unit table, the parsing and
// formatting of unit expressions, and quantities with their arithmetic.
//
// A dimension is a vector of exponents over the seven SI base dimensions; a
// unit is a factor to SI base units, an optional offset (absolute
// temperatures) or gauge reference (gauge pressures) and a dimension; a
// quantity is a value in SI base units with its dimension and, for
// temperatures, whether it is absolute or a difference.
//
// The package imports nothing of this project.
package units

import "fmt"

import "strings"

// Base dimension indices into a Dim.
const (
	Length = iota
	Mass
	Time
	Current
	Temperature
	Amount
	Luminosity
)

// baseSymbols are the SI base units in Dim order.
var baseSymbols = [7]string{"m", "kg", "s", "A", "K", "mol", "cd"}

// Dim is a dimension: the exponents of the seven SI base dimensions in the
// order m, kg, s, A, K, mol, cd. It is comparable.
type Dim [7]int8

// None is the dimension of a pure number.
var None Dim

// Common dimensions used by the engine and the property functions.
var (
	DimLength           = Dim{1, 0, 0, 0, 0, 0, 0}
	DimMass             = Dim{0, 1, 0, 0, 0, 0, 0}
	DimTime             = Dim{0, 0, 1, 0, 0, 0, 0}
	DimTemperature      = Dim{0, 0, 0, 0, 1, 0, 0}
	DimPressure         = Dim{-1, 1, -2, 0, 0, 0, 0}
	DimEnergy           = Dim{2, 1, -2, 0, 0, 0, 0}
	DimPower            = Dim{2, 1, -3, 0, 0, 0, 0}
	DimForce            = Dim{1, 1, -2, 0, 0, 0, 0}
	DimSpecificEnergy   = Dim{2, 0, -2, 0, 0, 0, 0}
	DimSpecificEntropy  = Dim{2, 0, -2, 0, -1, 0, 0}
	DimSpecificVolume   = Dim{3, -1, 0, 0, 0, 0, 0}
	DimDensity          = Dim{-3, 1, 0, 0, 0, 0, 0}
	DimMassFlow         = Dim{0, 1, -1, 0, 0, 0, 0}
	DimVolumeFlow       = Dim{3, 0, -1, 0, 0, 0, 0}
	DimVelocity         = Dim{1, 0, -1, 0, 0, 0, 0}
	DimViscosity        = Dim{-1, 1, -1, 0, 0, 0, 0}
	DimConductivity     = Dim{1, 1, -3, 0, -1, 0, 0}
	DimSurfaceTension   = Dim{0, 1, -2, 0, 0, 0, 0}
	DimHeatTransferCoef = Dim{0, 1, -3, 0, -1, 0, 0}
	DimArea             = Dim{2, 0, 0, 0, 0, 0, 0}
	DimVolume           = Dim{3, 0, 0, 0, 0, 0, 0}
)

// dimNames gives a readable name for the dimensions an engineer meets.
var dimNames = map[Dim]string{
	None:                    "dimensionless",
	DimLength:               "length",
	DimMass:                 "mass",
	DimTime:                 "time",
	DimTemperature:          "temperature",
	DimPressure:             "pressure",
	DimEnergy:               "energy",
	DimPower:                "power",
	DimForce:                "force",
	DimSpecificEnergy:       "specific enthalpy",
	DimSpecificEntropy:      "specific entropy",
	DimSpecificVolume:       "specific volume",
	DimDensity:              "density",
	DimMassFlow:             "mass flow",
	DimVolumeFlow:           "volume flow",
	DimVelocity:             "velocity",
	DimViscosity:            "dynamic viscosity",
	DimConductivity:         "thermal conductivity",
	DimSurfaceTension:       "surface tension",
	DimHeatTransferCoef:     "heat transfer coefficient",
	DimArea:                 "area",
	DimVolume:               "volume",
	{0, 0, -1, 0, 0, 0, 0}:  "frequency",
	{0, 0, 1, 1, 0, 0, 0}:   "electric charge",
	{0, 0, 0, 1, 0, 0, 0}:   "electric current",
	{0, 0, 0, 0, 0, 1, 0}:   "amount of substance",
	{2, 1, -3, -1, 0, 0, 0}: "voltage",
}

// MaxPower is the largest power of one base unit that a dimension may hold,
// the same as a unit's written power, so that every dimension's text parses
// back; a product, quotient or power beyond it is an error, never a wrapped
// exponent.
const MaxPower = 12

// Mul returns the dimension of a product, or an error beyond MaxPower.
func (d Dim) Mul(e Dim) (Dim, error) {
	var w [7]int
	for i := range d {
		w[i] = int(d[i]) + int(e[i])
	}
	return fromWide(w)
}

// Div returns the dimension of a quotient, or an error beyond MaxPower.
func (d Dim) Div(e Dim) (Dim, error) {
	var w [7]int
	for i := range d {
		w[i] = int(d[i]) - int(e[i])
	}
	return fromWide(w)
}

// Pow returns the dimension raised to an integer power, or an error beyond
// MaxPower.
func (d Dim) Pow(n int) (Dim, error) {
	if n > MaxPower || n < -MaxPower {
		if d.IsNone() {
			return d, nil
		}
		for i, e := range d {
			if e != 0 {
				return Dim{}, powerError(i, int(e)*n)
			}
		}
	}
	var w [7]int
	for i := range d {
		w[i] = int(d[i]) * n
	}
	return fromWide(w)
}

// powerError says which base unit a result would hold beyond MaxPower.
func powerError(i, e int) error {
	return fmt.Errorf("the result would hold %s^%d; the power of a base unit is at most %d", baseSymbols[i], e, MaxPower)
}

func fromWide(w [7]int) (Dim, error) {
	var d Dim
	for i, e := range w {
		if e > MaxPower || e < -MaxPower {
			return Dim{}, powerError(i, e)
		}
		d[i] = int8(e)
	}
	return d, nil
}

// IsNone reports whether d is dimensionless.
func (d Dim) IsNone() bool { return d == None }

// Name returns a readable name of the dimension, such as "pressure", or its
// SI base-unit text when it has no common name.
func (d Dim) Name() string {
	if n, ok := dimNames[d]; ok {
		return n
	}
	return d.String()
}

// String returns the canonical SI base-unit text of the dimension, such as
// "m^2/s^2" or "kg/(m*s^2)"; it parses back to the same dimension. A pure
// number is "1".
func (d Dim) String() string {
	var num, den []string
	for i, e := range d {
		switch {
		case e > 0:
			num = append(num, powText(baseSymbols[i], int(e)))
		case e < 0:
			den = append(den, powText(baseSymbols[i], int(-e)))
		}
	}
	return joinFraction(num, den)
}

// joinFraction writes numerator and denominator factors as canonical unit text.
func joinFraction(num, den []string) string { return JoinFraction(num, den, "*") }

// JoinFraction writes unit factors as a fraction: the numerator factors
// joined by sep, then "/" and the denominator, parenthesised when it has
// several factors: kJ/(kg*K). An empty numerator is "1".
func JoinFraction(num, den []string, sep string) string {
	n := strings.Join(num, sep)
	if n == "" {
		n = "1"
	}
	switch len(den) {
	case 0:
		return n
	case 1:
		return n + "/" + den[0]
	}
	return n + "/(" + strings.Join(den, sep) + ")"
}

// powText writes sym^n, or sym for n == 1.
func powText(sym string, n int) string {
	if n == 1 {
		return sym
	}
	return sym + "^" + itoa(n)
}

// itoa formats a small integer without importing strconv in hot code.
func itoa(n int) string {
	if n < 0 {
		return "-" + itoa(-n)
	}
	if n < 10 {
		return string(rune('0' + n))
	}
	return itoa(n/10) + string(rune('0'+n%10))
}
