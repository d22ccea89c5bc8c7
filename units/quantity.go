package units

import (
	"fmt"
	"math"
	"strings"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// Temp tells how a temperature quantity may be combined.
type Temp uint8

const (
	// Rel is every quantity that is not a temperature, and a temperature
	// difference (from absolute minus absolute, or written in Cdeg).
	Rel Temp = iota
	// Abs is an absolute temperature (written in degC or degF, or computed
	// as absolute plus difference). Two absolutes cannot be added.
	Abs
	// Scale is a kelvin-scale temperature (written in K or degR, or a
	// product or quotient of temperatures): it serves as absolute or as
	// difference, as the arithmetic needs.
	Scale
)

// Press tells how a pressure quantity may be combined. Its rules are those
// of temperatures, with a gauge pressure in the place of an absolute
// temperature: a gauge pressure is a reading on a scale whose zero is the
// atmosphere, as degC is a reading on a scale whose zero is 273.15 K.
type Press uint8

const (
	// AnyP is every pressure written in an absolute unit (Pa, bar, bara,
	// psia) or computed from other quantities: it serves as absolute or as
	// difference, as the arithmetic needs (the Scale of pressures).
	AnyP Press = iota
	// GaugeP is a pressure written in a gauge unit (barg, psig, kPag), or
	// computed as gauge plus or minus a pressure that is not gauge. Its value
	// is absolute (the atmosphere added); two gauge pressures cannot be
	// added (the Abs of pressures).
	GaugeP
	// DiffP is a pressure difference from gauge minus gauge: it cannot be
	// shown in a gauge unit (the Rel of pressures).
	DiffP
)

// Quantity is a value in SI base units with its dimension. T is meaningful
// only when D is the temperature dimension, P only when D is the pressure
// dimension.
type Quantity struct {
	V float64
	D Dim
	T Temp
	P Press
}

// Num returns a dimensionless quantity.
func Num(v float64) Quantity { return Quantity{V: v} }

// Q returns a quantity from a value in a unit; ctx supplies the atmosphere
// for gauge units.
func (u Unit) Q(v float64, ctx Context) Quantity {
	q := Quantity{V: float64(v*u.Factor) + u.Offset, D: u.Dim}
	switch {
	case u.Kind == Gauge:
		q.V = float64(v*u.Factor) + ctx.Atmosphere
		q.P = GaugeP
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
	case u.Kind == Gauge && q.P == DiffP:
		return 0, fmt.Errorf("a pressure difference (gauge minus gauge) cannot be shown in %s, which adds the atmosphere; use %s", u, absoluteOf(u))
	case u.Kind == Gauge:
		v = (q.V - ctx.Atmosphere) / u.Factor
	case u.Kind == AbsTemp && q.T == Rel:
		return 0, fmt.Errorf("a temperature difference cannot be shown in %s; use K or %sdeg", u, strings.TrimPrefix(u.String(), "deg"))
	default:
		v = (q.V - u.Offset) / u.Factor
	}
	if math.IsInf(v, 0) && !math.IsInf(q.V, 0) {
		du := DefaultUnit(q)
		return 0, fmt.Errorf("%g %s is beyond the range of numbers in %s; choose a larger unit", (q.V-du.Offset)/du.Factor, du, u)
	}
	return v, nil
}

// absoluteOf names the absolute unit of a gauge unit: barg → bar.
func absoluteOf(u Unit) string {
	return strings.TrimSuffix(u.String(), "g")
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

// Add returns a + b under the temperature and pressure rules: two absolute
// temperatures or two gauge pressures cannot be added (the scale's zero would
// be counted twice); absolute + difference is absolute, gauge + difference is
// gauge.
func Add(a, b Quantity) (Quantity, error) {
	if a.D != b.D {
		return Quantity{}, &DimError{Op: "add", A: a, B: b.D}
	}
	r := Quantity{V: a.V + b.V, D: a.D}
	switch a.D {
	case DimTemperature:
		if a.T == Abs && b.T == Abs {
			return r, fmt.Errorf("cannot add two absolute temperatures; subtract them for a difference, or write the one that is a difference in K or Cdeg")
		}
		r.T = addTemp(a.T, b.T)
	case DimPressure:
		if a.P == GaugeP && b.P == GaugeP {
			return r, fmt.Errorf("cannot add two gauge pressures: each holds the atmosphere; subtract them for a difference, or write the one that is a difference in an absolute unit (bar, kPa, psi)")
		}
		r.P = pressOf(addTemp(tempOf(a.P), tempOf(b.P)))
	}
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

// tempOf and pressOf map the pressure kinds to their temperature
// counterparts, so that both follow one set of rules.
func tempOf(p Press) Temp {
	switch p {
	case GaugeP:
		return Abs
	case DiffP:
		return Rel
	}
	return Scale
}

func pressOf(t Temp) Press {
	switch t {
	case Abs:
		return GaugeP
	case Rel:
		return DiffP
	}
	return AnyP
}

// Sub returns a − b under the temperature and pressure rules: absolute minus
// absolute is a difference, and so is gauge minus gauge.
func Sub(a, b Quantity) (Quantity, error) {
	if a.D != b.D {
		return Quantity{}, &DimError{Op: "subtract", A: a, B: b.D}
	}
	r := Quantity{V: a.V - b.V, D: a.D}
	switch a.D {
	case DimTemperature:
		t, ok := subTemp(a.T, b.T)
		if !ok {
			return r, fmt.Errorf("cannot subtract an absolute temperature from a temperature difference")
		}
		r.T = t
	case DimPressure:
		t, ok := subTemp(tempOf(a.P), tempOf(b.P))
		if !ok {
			return r, fmt.Errorf("cannot subtract a gauge pressure from a pressure difference")
		}
		r.P = pressOf(t)
	}
	return r, nil
}

func subTemp(a, b Temp) (Temp, bool) {
	switch {
	case b == Abs && (a == Abs || a == Scale):
		return Rel, true
	case a == Abs:
		return Abs, true
	case b == Abs:
		return 0, false
	}
	return addTemp(a, b), true
}

// Mul returns a × b; temperatures enter with their kelvin value. A result
// holding a base unit beyond MaxPower is an error.
func Mul(a, b Quantity) (Quantity, error) {
	d, err := a.D.Mul(b.D)
	if err != nil {
		return Quantity{}, err
	}
	return scaled(Quantity{V: float64(a.V * b.V), D: d}, a, b), nil
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

// scaled sets the temperature or pressure kind of a product or quotient: a
// difference scaled by a number stays a difference; anything else is
// kelvin-scale (temperature) or absolute (pressure): products use the
// kelvin value and the absolute pressure.
func scaled(r, a, b Quantity) Quantity {
	if r.D != DimTemperature && r.D != DimPressure {
		return r
	}
	k := Scale
	switch {
	case a.D == r.D && b.D.IsNone():
		k = keepDiff(kindOf(a))
	case b.D == r.D && a.D.IsNone():
		k = keepDiff(kindOf(b))
	}
	return withKind(r, k)
}

// kindOf returns the kind of a temperature or pressure in the temperature
// terms Abs, Rel and Scale; Scale for every other quantity.
func kindOf(q Quantity) Temp {
	switch q.D {
	case DimTemperature:
		return q.T
	case DimPressure:
		return tempOf(q.P)
	}
	return Scale
}

// withKind sets the kind of a temperature or pressure from its temperature
// terms.
func withKind(q Quantity, k Temp) Quantity {
	switch q.D {
	case DimTemperature:
		q.T = k
	case DimPressure:
		q.P = pressOf(k)
	}
	return q
}

func keepDiff(t Temp) Temp {
	if t == Rel {
		return Rel
	}
	return Scale
}

// Neg returns −a. An absolute temperature or a gauge pressure has no
// negative: its value counts from the scale's zero (273.15 K, the
// atmosphere), so −(20 degC) is not −20 degC. Write the negative reading as a
// literal (-20 degC) or negate a difference.
func Neg(a Quantity) (Quantity, error) {
	if err := offsetOp(a, "negate"); err != nil {
		return Quantity{}, err
	}
	a.V = -a.V
	return a, nil
}

// AbsValue returns |a|. An absolute temperature or a gauge pressure is an
// error, as in Neg: the size of a reading on an offset scale depends on the
// scale.
func AbsValue(a Quantity) (Quantity, error) {
	if err := offsetOp(a, "take abs of"); err != nil {
		return Quantity{}, err
	}
	a.V = math.Abs(a.V)
	return a, nil
}

// offsetOp refuses an operation that would treat a reading on an offset
// scale (degC, degF, a gauge unit) as a plain magnitude.
func offsetOp(a Quantity, op string) error {
	switch kindOf(a) {
	case Abs:
		if a.D == DimPressure {
			return fmt.Errorf("cannot %s a gauge pressure: its value counts from vacuum, not from the atmosphere; %s a difference (p - 0 barg) instead", op, op)
		}
		return fmt.Errorf("cannot %s an absolute temperature: its value counts from 0 K, not from 0 degC; write a negative reading as a literal (-20 degC) or %s a difference", op, op)
	}
	return nil
}

// Pow returns a raised to a dimensionless power; a quantity with a dimension
// needs a whole-number power.
func Pow(a, b Quantity) (Quantity, error) {
	if !b.D.IsNone() {
		return Quantity{}, fmt.Errorf("an exponent must be dimensionless, not %s (%s)", b.D.Name(), DefaultUnit(b))
	}
	if a.D.IsNone() {
		return Num(fpmath.Pow(a.V, b.V)), nil
	}
	n := math.Round(b.V)
	if n != b.V || math.Abs(n) > 12 {
		return Quantity{}, fmt.Errorf("%s (%s) can only be raised to a whole power between -12 and 12, not %g", a.D.Name(), DefaultUnit(a), b.V)
	}
	d, err := a.D.Pow(int(n))
	if err != nil {
		return Quantity{}, err
	}
	return withKind(Quantity{V: fpmath.Pow(a.V, n), D: d}, Scale), nil
}

// Compare returns −1, 0 or +1 as a <, ==, > b. Comparing an absolute
// temperature with a temperature difference, or a gauge pressure with a
// difference of gauge pressures, is an error.
func Compare(a, b Quantity) (int, error) {
	if a.D != b.D {
		return 0, &DimError{Op: "compare", A: a, B: b.D}
	}
	if ka, kb := kindOf(a), kindOf(b); ka == Abs && kb == Rel || ka == Rel && kb == Abs {
		if a.D == DimPressure {
			return 0, fmt.Errorf("cannot compare a gauge pressure with a pressure difference (gauge minus gauge)")
		}
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
