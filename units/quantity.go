package units

import (
	"fmt"
	"math"
)

// Temp tells how a temperature quantity may be combined.
type Temp uint8

const (
	// Rel is every quantity that is not a temperature, and a temperature
	// difference (from absolute minus absolute, or written in delta_degC).
	Rel Temp = iota
	// Abs is an absolute temperature (written in degC or degF, or computed
	// as absolute plus difference). Two absolutes cannot be added.
	Abs
	// Scale is a kelvin-scale temperature (written in K or degR, or a
	// product or quotient of temperatures): it serves as absolute or as
	// difference, as the arithmetic needs.
	Scale
)

// Quantity is a value in SI base units with its dimension. T is meaningful
// only when D is the temperature dimension.
type Quantity struct {
	V float64
	D Dim
	T Temp
}

// Num returns a dimensionless quantity.
func Num(v float64) Quantity { return Quantity{V: v} }

// Q returns a quantity from a value in a unit; ctx supplies the atmosphere
// for gauge units.
func (u Unit) Q(v float64, ctx Context) Quantity {
	q := Quantity{V: v*u.Factor + u.Offset, D: u.Dim}
	switch {
	case u.Kind == Gauge:
		q.V = v*u.Factor + ctx.Atmosphere
	case u.Kind == AbsTemp:
		q.T = Abs
	case u.Kelvin:
		q.T = Scale
	case u.Dim == DimTemperature:
		q.T = Rel
	}
	return q
}

// Context holds what converting some units needs: the atmosphere for gauge
// pressures, in Pa.
type Context struct {
	Atmosphere float64
}

// StandardAtmosphere is the default atmosphere for gauge pressures, 101 325 Pa.
var StandardAtmosphere = Context{Atmosphere: atmSI}

// In returns the value of q expressed in unit u. It checks the dimension and
// refuses to show a temperature difference on an absolute scale.
func (q Quantity) In(u Unit, ctx Context) (float64, error) {
	if q.D != u.Dim {
		return 0, &DimError{Op: "show", A: q, B: u.Dim, BUnit: u.String()}
	}
	var v float64
	switch {
	case u.Kind == Gauge:
		v = (q.V - ctx.Atmosphere) / u.Factor
	case u.Kind == AbsTemp && q.T == Rel:
		return 0, fmt.Errorf("a temperature difference cannot be shown in %s; use K or delta_%s", u, u)
	default:
		v = (q.V - u.Offset) / u.Factor
	}
	if math.IsInf(v, 0) && !math.IsInf(q.V, 0) {
		du := DefaultUnit(q)
		return 0, fmt.Errorf("%g %s is beyond the range of numbers in %s; choose a larger unit", (q.V-du.Offset)/du.Factor, du, u)
	}
	return v, nil
}

// DimError is a dimension mismatch between two operands.
type DimError struct {
	Op    string // "add", "subtract", "compare", "show"
	A     Quantity
	B     Dim
	BUnit string // the unit asked for, for "show"
}

// Error names both dimensions and their units.
func (e *DimError) Error() string {
	a := fmt.Sprintf("%s (%s)", e.A.D.Name(), DefaultUnit(e.A).String())
	switch e.Op {
	case "show":
		return fmt.Sprintf("cannot show %s in %s, which is %s", a, e.BUnit, e.B.Name())
	case "compare":
		return fmt.Sprintf("cannot compare %s with %s (%s)", a, e.B.Name(), DefaultUnit(Quantity{D: e.B}).String())
	}
	return fmt.Sprintf("cannot %s %s and %s (%s)", e.Op, a, e.B.Name(), DefaultUnit(Quantity{D: e.B}).String())
}

// Add returns a + b under the temperature rules.
func Add(a, b Quantity) (Quantity, error) {
	if a.D != b.D {
		return Quantity{}, &DimError{Op: "add", A: a, B: b.D}
	}
	r := Quantity{V: a.V + b.V, D: a.D}
	if a.D != DimTemperature {
		return r, nil
	}
	if a.T == Abs && b.T == Abs {
		return r, fmt.Errorf("cannot add two absolute temperatures; subtract them for a difference, or write the one that is a difference in K or delta_degC")
	}
	r.T = addTemp(a.T, b.T)
	return r, nil
}

func addTemp(a, b Temp) Temp {
	switch {
	case a == Abs || b == Abs:
		return Abs
	case a == Rel || b == Rel:
		return Rel
	}
	return Scale
}

// Sub returns a − b under the temperature rules: absolute minus absolute is
// a difference.
func Sub(a, b Quantity) (Quantity, error) {
	if a.D != b.D {
		return Quantity{}, &DimError{Op: "subtract", A: a, B: b.D}
	}
	r := Quantity{V: a.V - b.V, D: a.D}
	if a.D != DimTemperature {
		return r, nil
	}
	switch {
	case b.T == Abs && (a.T == Abs || a.T == Scale):
		r.T = Rel
	case a.T == Abs:
		r.T = Abs
	case b.T == Abs:
		return r, fmt.Errorf("cannot subtract an absolute temperature from a temperature difference")
	default:
		r.T = addTemp(a.T, b.T)
	}
	return r, nil
}

// Mul returns a × b; temperatures enter with their kelvin value. A result
// holding a base unit beyond MaxPower is an error.
func Mul(a, b Quantity) (Quantity, error) {
	d, err := a.D.Mul(b.D)
	if err != nil {
		return Quantity{}, err
	}
	return scaled(Quantity{V: a.V * b.V, D: d}, a, b), nil
}

// Div returns a ÷ b; the caller checks for a zero divisor. A result holding
// a base unit beyond MaxPower is an error.
func Div(a, b Quantity) (Quantity, error) {
	d, err := a.D.Div(b.D)
	if err != nil {
		return Quantity{}, err
	}
	return scaled(Quantity{V: a.V / b.V, D: d}, a, b), nil
}

// scaled sets the temperature kind of a product or quotient: a difference
// scaled by a number stays a difference; anything else is kelvin-scale.
func scaled(r, a, b Quantity) Quantity {
	if r.D != DimTemperature {
		return r
	}
	switch {
	case a.D == DimTemperature && b.D.IsNone():
		r.T = keepDiff(a.T)
	case b.D == DimTemperature && a.D.IsNone():
		r.T = keepDiff(b.T)
	default:
		r.T = Scale
	}
	return r
}

func keepDiff(t Temp) Temp {
	if t == Rel {
		return Rel
	}
	return Scale
}

// Neg returns −a.
func Neg(a Quantity) Quantity {
	a.V = -a.V
	if a.D == DimTemperature {
		a.T = keepDiff(a.T)
	}
	return a
}

// Pow returns a raised to a dimensionless power; a quantity with a dimension
// needs a whole-number power.
func Pow(a, b Quantity) (Quantity, error) {
	if !b.D.IsNone() {
		return Quantity{}, fmt.Errorf("an exponent must be dimensionless, not %s (%s)", b.D.Name(), DefaultUnit(b))
	}
	if a.D.IsNone() {
		return Num(math.Pow(a.V, b.V)), nil
	}
	n := math.Round(b.V)
	if n != b.V || math.Abs(n) > 12 {
		return Quantity{}, fmt.Errorf("%s (%s) can only be raised to a whole power between -12 and 12, not %g", a.D.Name(), DefaultUnit(a), b.V)
	}
	d, err := a.D.Pow(int(n))
	if err != nil {
		return Quantity{}, err
	}
	r := Quantity{V: math.Pow(a.V, n), D: d}
	if r.D == DimTemperature {
		r.T = Scale
	}
	return r, nil
}

// Compare returns −1, 0 or +1 as a <, ==, > b. Comparing an absolute
// temperature with a difference is an error.
func Compare(a, b Quantity) (int, error) {
	if a.D != b.D {
		return 0, &DimError{Op: "compare", A: a, B: b.D}
	}
	if a.D == DimTemperature && (a.T == Abs && b.T == Rel || a.T == Rel && b.T == Abs) {
		return 0, fmt.Errorf("cannot compare an absolute temperature with a temperature difference")
	}
	switch {
	case a.V < b.V:
		return -1, nil
	case a.V > b.V:
		return 1, nil
	}
	return 0, nil
}
