package eval

import (
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// Issue 11 item 4 and its class, in calc lines: gauge pressures and
// absolute temperatures through the operators and functions of a calc.
func TestGaugeAndAbsoluteInCalcLines(t *testing.T) {
	cases := []struct {
		line, want string // want "" when the line must evaluate
	}{
		{"a = 1 barg + 1 barg", "cannot add two gauge pressures"},
		{"a = 1 psig + 1 MPag", "cannot add two gauge pressures"},
		{"a = -(1 barg)", "cannot negate a gauge pressure"},
		{"a = abs(-0.5 barg)", "cannot take abs of a gauge pressure"},
		{"a = -(20 degC)", "cannot negate an absolute temperature"},
		{"a = abs(-20 degC)", "cannot take abs of an absolute temperature"},
		{"a = min(1 barg, 2 barg - 1 barg)", "cannot compare a gauge pressure with a pressure difference"},
		{"a = max(2 barg - 1 barg, 1 barg)", "cannot compare a gauge pressure with a pressure difference"},
		{"a = 2 barg - 1 barg > 0 barg", "cannot compare a gauge pressure with a pressure difference"},
		{"a [barg] = 2 barg - 1 barg", "cannot be shown in barg"},
		{"a = 1 barg + 0.5 bar", ""},
		{"a = min(1 barg, 1 bara)", ""},
		{"a = abs(1 barg - 2 barg)", ""},
		{"a = -(1 barg - 2 barg)", ""},
		{"a = -0.5 barg", ""}, // a negative reading written as a literal is a vacuum gauge reading
		{"a = -20 degC", ""},
	}
	for _, c := range cases {
		e := NewEngine(units.StandardAtmosphere)
		s, errs := ParseLine(c.line, 0, 1, e.Ctx)
		var msg string
		if len(errs) > 0 {
			msg = errs[0].Msg
		} else if _, err := e.Exec(s); err != nil {
			msg = err.Error()
		}
		switch {
		case c.want == "" && msg != "":
			t.Errorf("%q: %s", c.line, msg)
		case c.want != "" && !strings.Contains(msg, c.want):
			t.Errorf("%q: error %q, want one containing %q", c.line, msg, c.want)
		}
	}
}
