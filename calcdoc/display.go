package calcdoc

import (
	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// usUnits are the units of the US display system, by dimension; a
// dimension not listed keeps its SI unit. Power follows us_power and
// temperature its kind (°F, or F deg for a difference).
var usUnits = map[units.Dim]units.Unit{
	units.DimPressure:         units.MustParse("psia"),
	units.DimSpecificEnergy:   units.MustParse("BTU/lb"),
	units.DimSpecificEntropy:  units.MustParse("BTU/(lb*degF)"),
	units.DimMassFlow:         units.MustParse("lb/h"),
	units.DimSpecificVolume:   units.MustParse("ft^3/lb"),
	units.DimDensity:          units.MustParse("lb/ft^3"),
	units.DimEnergy:           units.MustParse("BTU"),
	units.DimHeatTransferCoef: units.MustParse("BTU/(h*ft^2*degF)"),
	units.DimConductivity:     units.MustParse("BTU/(h*ft*degF)"),
	units.DimLength:           units.MustParse("ft"),
	units.DimMass:             units.MustParse("lb"),
}

var (
	degF   = units.MustParse("degF")
	fdeg   = units.MustParse("Fdeg")
	degC   = units.MustParse("degC")
	unitHP = units.MustParse("hp")
	unitKW = units.MustParse("kW")
)

// systemUnit is the unit the calc's display system shows q in when the
// calc names none; si is the SI unit the engine chose.
func (d *Doc) systemUnit(q units.Quantity, si units.Unit) units.Unit {
	if d.Display() != settings.US {
		return si
	}
	switch q.D {
	case units.DimTemperature:
		if q.T == units.Rel {
			return fdeg
		}
		return degF
	case units.DimPower:
		if d.USPower() == settings.PowerKW {
			return unitKW
		}
		return unitHP
	}
	if u, ok := usUnits[q.D]; ok {
		return u
	}
	return si
}

// shownUnit is the unit a line's quantity is shown in: its [UNIT], else
// for an input the unit it was written in, else the display system's.
func (d *Doc) shownUnit(o *eval.Outcome, q units.Quantity) units.Unit {
	s := o.Stmt
	if s == nil || s.HasDisplayUnit() || (s.Kind == eval.Def && len(s.Deps()) == 0) || s.LoneLiteral() != nil {
		return o.Display
	}
	return d.systemUnit(q, o.Display)
}
