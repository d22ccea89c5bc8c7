package props

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/props/if97"
	"github.com/vouchcalc/vouch/units"
)

// IF97 names the water formulation in packages and manifests.
const (
	IF97          = "IAPWS-IF97"
	IF97Version   = "IAPWS R7-97(2012), SR2-01(2014), SR3-03(2014), SR4-04(2014), SR5-05(2016); transport R12-08, R15-11"
	IF97Reference = "IF97: u and s of saturated liquid at the triple point are zero"
)

// Water returns the state of water or steam from two properties, read from
// their dimensions (IAPWS-IF97).
func Water(a, b units.Quantity) (*State, error) {
	ka, kb, qa, qb, err := pair(waterName, a, b)
	if err != nil {
		return nil, err
	}
	if err := positive(waterName, ka, qa, kb, qb); err != nil {
		return nil, err
	}
	var p if97.Props
	switch [2]kind{ka, kb} {
	case [2]kind{kP, kT}:
		p, err = if97.StatePT(qa.V, qb.V)
	case [2]kind{kP, kH}:
		p, err = if97.StatePH(qa.V, qb.V)
	case [2]kind{kP, kS}:
		p, err = if97.StatePS(qa.V, qb.V)
	case [2]kind{kH, kS}:
		p, err = if97.StateHS(qa.V, qb.V)
	case [2]kind{kP, kX}:
		p, err = if97.StatePX(qa.V, qb.V)
	case [2]kind{kT, kX}:
		p, err = if97.StateTX(qa.V, qb.V)
	case [2]kind{kP, kV}:
		p, err = if97.StatePV(qa.V, qb.V)
	case [2]kind{kT, kV}:
		p, err = if97.StateTV(qa.V, qb.V)
	default:
		return nil, fmt.Errorf("water(%s, %s) is not a pair the formulation can solve; use one of %s", ka, kb, joinFields(Pairs))
	}
	if err != nil {
		call := fmt.Sprintf("water(%s, %s)", ka, kb)
		if noStateErr(err) {
			return nil, noStateMessage(call, IF97, ka, qa, kb, qb)
		}
		if onSatErr(err) {
			return nil, onSatMessage(call, "water(", qa, qb)
		}
		return nil, rangeMessage(call, IF97, err)
	}
	return waterState(p), nil
}

func waterName() string { return "water" }

// waterState converts an IF97 state; mu and k are computed from it when
// they are read.
func waterState(p if97.Props) *State {
	n := numState{P: p.P, T: p.T, V: p.V, Rho: p.Rho, H: p.H, S: p.S, U: p.U, Cp: p.Cp, Cv: p.Cv, W: p.W, X: p.X,
		Tc: if97.Tc, RhoC: if97.Rhoc, Phase: p.Phase.String(), Region: p.Region, TwoPhase: p.Phase == if97.TwoPhase}
	s := n.state("water", IF97, IF97Reference)
	s.water, s.isWater = p, true
	return s
}

// WaterSat returns the saturation line of water at a pressure or a
// temperature (IAPWS-IF97 region 4).
func WaterSat(x units.Quantity) (*Sat, error) {
	var s if97.Sat
	var err error
	var name string
	switch x.D {
	case units.DimPressure:
		name = "water_sat(p)"
		s, err = if97.SatP(x.V)
	case units.DimTemperature:
		name = "water_sat(T)"
		s, err = if97.SatT(x.V)
	default:
		return nil, fmt.Errorf("water_sat needs a pressure or a temperature, not %s", x.D.Name())
	}
	if err != nil {
		return nil, rangeMessage(name, IF97, err)
	}
	return numSat{P: s.P, T: s.T, Hf: s.Hf, Hg: s.Hg, Sf: s.Sf, Sg: s.Sg, Vf: s.Vf, Vg: s.Vg}.sat("water", IF97, IF97Reference), nil
}

// positive refuses non-positive pressures, temperatures and volumes before
// the numerics see them.
func positive(fn func() string, ka kind, qa units.Quantity, kb kind, qb units.Quantity) error {
	for _, a := range []struct {
		k kind
		q units.Quantity
	}{{ka, qa}, {kb, qb}} {
		if (a.k == kP || a.k == kT || a.k == kV) && !(a.q.V > 0) {
			return fmt.Errorf("%s: %s = %s must be above zero", fn(), a.k, showValue(string(a.k), a.q.V))
		}
	}
	return nil
}

// rangeError is what both numerics packages return for an input outside
// their range.
type rangeError interface {
	error
	Detail() (input string, value, limit float64, above bool, reason string)
}

// noStateErr reports whether err says that no state has the given pair
// (both numerics packages have such an error).
func noStateErr(err error) bool {
	var ns interface{ NoState() bool }
	return errors.As(err, &ns) && ns.NoState()
}

// onSatErr reports whether err says that (p, T) lies on the saturation
// line (both numerics packages have such an error).
func onSatErr(err error) bool {
	var os interface{ OnSaturation() bool }
	return errors.As(err, &os) && os.OnSaturation()
}

// onSatMessage says that (p, T) lies on the saturation line and how to
// name the state instead; prefix is the call up to its first input, as
// `water(` or `fluid("R-245fa", `.
func onSatMessage(call, prefix string, p, T units.Quantity) error {
	return fmt.Errorf("%s: p = %s and T = %s lie on the saturation line, where they do not fix the state; give the quality instead: %sp, 0) for saturated liquid, %sp, 1) for saturated vapour",
		call, showValue("p", p.V), showValue("T", T.V), prefix, prefix)
}

// noStateMessage says that no state of a formulation has the two given
// properties, with their values.
func noStateMessage(call, formulation string, ka kind, qa units.Quantity, kb kind, qb units.Quantity) error {
	return fmt.Errorf("%s: no state of %s has %s = %s and %s = %s", call, formulation,
		ka, showValue(string(ka), qa.V), kb, showValue(string(kb), qb.V))
}

// rangeMessage turns a numerics range error into a message with values.
func rangeMessage(call, formulation string, err error) error {
	var re *if97.RangeError
	if errors.As(err, &re) {
		return fmt.Errorf("%s: %s", call, limitText(re.Input, re.Value, re.Limit, re.Above, re.Reason, formulation))
	}
	if r, ok := err.(rangeError); ok {
		in, v, l, above, why := r.Detail()
		return fmt.Errorf("%s: %s", call, limitText(in, v, l, above, why, formulation))
	}
	return fmt.Errorf("%s: %v", call, err)
}

func limitText(input string, v, limit float64, above bool, reason, formulation string) string {
	side := "below"
	if above {
		side = "above"
	}
	msg := fmt.Sprintf("%s = %s is %s the %s limit of %s", input, showValue(input, v), side, showValue(input, limit), formulation)
	if reason != "" && !strings.Contains(reason, formulation) {
		msg += " (" + reason + ")"
	}
	return msg
}

// showNum writes a number with up to six significant figures and no
// trailing zeros.
func showNum(v float64) string {
	s := strconv.FormatFloat(v, 'g', 6, 64)
	if strings.Contains(s, "e") && math.Abs(v) >= 1e-3 && math.Abs(v) < 1e7 {
		s = strconv.FormatFloat(v, 'f', -1, 64)
	}
	return strings.Replace(s, "-", "−", 1)
}

// showValue formats an SI value of a named input in the unit engineers use
// for it.
func showValue(input string, v float64) string {
	unit := map[string]string{"p": "MPa", "T": "K", "h": "kJ/kg", "s": "kJ/(kg*K)", "v": "m^3/kg", "rho": "kg/m^3", "u": "kJ/kg"}[input]
	if input == "p" && math.Abs(v) < 1e5 {
		unit = "kPa"
		if math.Abs(v) < 100 {
			unit = "Pa"
		}
	}
	if unit == "" {
		return showNum(v)
	}
	u := units.MustParse(unit)
	s := showNum(v/u.Factor) + " " + unit
	if input == "T" {
		s += " (" + showNum(math.Round(float64((v-273.15)*1e6))/1e6) + " °C)"
	}
	return s
}
