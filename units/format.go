package units

import (
	"math"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// displayChoices lists, per dimension, the units a value is shown in when the
// calc names none: the one that puts the number between 1 and 1000 is used.
var displayChoices = map[Dim][]string{
	DimPressure:         {"Pa", "kPa", "MPa", "GPa"},
	DimEnergy:           {"J", "kJ", "MJ", "GJ"},
	DimPower:            {"W", "kW", "MW", "GW"},
	DimForce:            {"N", "kN", "MN"},
	DimSpecificEnergy:   {"kJ/kg"},
	DimSpecificEntropy:  {"kJ/(kg*K)"},
	DimSpecificVolume:   {"m^3/kg"},
	DimDensity:          {"kg/m^3"},
	DimMassFlow:         {"kg/s"},
	DimVolumeFlow:       {"m^3/s"},
	DimTemperature:      {"K"},
	DimViscosity:        {"Pa*s"},
	DimConductivity:     {"W/(m*K)"},
	DimHeatTransferCoef: {"W/(m^2*K)"},
	DimLength:           {"m"},
	DimMass:             {"kg"},
	DimTime:             {"s"},
}

// DefaultUnit returns the unit a quantity is shown in when the calc names
// none: a common SI unit for its dimension with a prefix that keeps the
// number readable, else the SI base-unit form.
func DefaultUnit(q Quantity) Unit { return defaultUnit(q) }

// siUnit builds the base-unit form of a dimension ("kg/(m*s^2)").
func siUnit(d Dim) Unit {
	u := Unit{Factor: 1, Dim: d}
	for i, e := range d {
		if e != 0 {
			u.factors = append(u.factors, pow1{baseSymbols[i], int(e)})
		}
	}
	return u
}

// SIUnitText returns the canonical SI base-unit text of a dimension, as the
// machine-readable output reports it ("m^2/s^2"); "1" for a pure number.
func SIUnitText(d Dim) string { return d.String() }

// FormatSig formats v with the given number of significant figures. Fixed
// notation is used for magnitudes from 1e-3 up to 1e7; otherwise scientific
// notation "1.234e-5". Negative zero prints as 0.
func FormatSig(v float64, digits int) string {
	if digits < 1 {
		digits = 1
	}
	if v == 0 {
		return strconv.FormatFloat(0, 'f', max(digits-1, 0), 64)
	}
	a := math.Abs(v)
	if a < 1e-3 || a >= 1e7 {
		s := strconv.FormatFloat(v, 'e', digits-1, 64)
		mant, exp, _ := strings.Cut(s, "e")
		n, _ := strconv.Atoi(exp)
		return mant + "e" + strconv.Itoa(n)
	}
	// Round to significant figures first, then choose decimals.
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'e', digits-1, 64), 64)
	mag := int(math.Floor(fpmath.Log10(math.Abs(r))))
	return strconv.FormatFloat(r, 'f', max(digits-1-mag, 0), 64)
}

// Text formats a quantity in a unit with significant figures, as a person
// reads it: "3449 kJ/kg", "87.00 %". Errors come from In.
func (q Quantity) Text(u Unit, digits int, ctx Context) (string, error) {
	v, err := q.In(u, ctx)
	if err != nil {
		return "", err
	}
	s := FormatSig(v, digits)
	if u.String() == "1" {
		return s, nil
	}
	return s + " " + u.String(), nil
}
