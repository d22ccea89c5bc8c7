package eval

import (
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// TestQuickAgrees: with and without the quick path, every line gives the
// same value, display unit and sources, or the same error at the same place.
func TestQuickAgrees(t *testing.T) {
	pre := []string{"p = 2 MPa", "T = 500 K", "z = 0 m", "b = true", "t = \"R-245fa\""}
	lines := []string{
		"a = p * 2 + 3 kPa - -p / 4", "a = (p / 1 MPa)^2 * 1 m", "a = 2 ** 0.5 * T", "a = -(T - 300 K) * 2",
		"a = water(p, T).h - water(p * 1.1, T + 10 K).h", "a = sqrt(p * 1 m^3/kg) + 1 m/s",
		"a = 1 m / z", "a = p + T", "a = 10^400", "a = T * (b ? 2 : 3)", "a = 2 * b", "a = 1 + water(p, -T).h",
		"a = 100 degC + 100 degC", "a = (T > 300 K ? T : 0 K) * 2", "a = 1 + solve(a == 2, 0, 3)",
		"a = fluid(t, p, T).h * 2 - 1 kJ/kg", "a = 3 - undefinedname * 2", "a [kPa] = p * 1e300 * 1e300",
		"check p * 2 > 3 MPa",
	}
	run := func(line string) (*Outcome, *Error) {
		e := NewEngine(units.StandardAtmosphere)
		for i, l := range pre {
			s, _ := ParseLine(l, 0, i+1, e.Ctx)
			e.Exec(s)
		}
		s, errs := ParseLine(line, 100, 9, e.Ctx)
		if errs != nil {
			t.Fatalf("%s: %s", line, errs[0].Msg)
		}
		out, err := e.Exec(s)
		if err != nil {
			return out, err.(*Error)
		}
		return out, nil
	}
	for _, line := range lines {
		quick, qerr := run(line)
		noQuick = true
		slow, serr := run(line)
		noQuick = false
		if (qerr == nil) != (serr == nil) || qerr != nil && *qerr != *serr {
			t.Errorf("%s: error %v with the quick path, %v without", line, qerr, serr)
			continue
		}
		if qerr != nil {
			continue
		}
		if quick.Value != slow.Value || quick.Display.String() != slow.Display.String() || len(quick.Sources) != len(slow.Sources) {
			t.Errorf("%s: %v %s %v with the quick path, %v %s %v without", line,
				quick.Value, quick.Display, quick.Sources, slow.Value, slow.Display, slow.Sources)
		}
	}
}
