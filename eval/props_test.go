package eval

import (
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// TestSaturatedConductivityLines: the calc lines of the defect report read
// the thermal conductivity of saturated water and steam. Regression: each
// failed with "k is not defined here" (the conductivity solved for the
// state again, and rounding put it in the two-phase region).
func TestSaturatedConductivityLines(t *testing.T) {
	e := run(t,
		"k1 = water(1 MPa, 1).k",
		"k2 = water(0.1 MPa, 1).k",
		"k3 = water(100 degC, 0).k",
		`k4 = fluid("water", 1 MPa, 1).k`,
	)
	for _, n := range []string{"k1", "k2", "k3", "k4"} {
		v, _ := e.Value(n)
		if q, ok := v.(units.Quantity); !ok || q.D != units.DimConductivity || !(q.V > 0) {
			t.Errorf("%s = %v", n, v)
		}
	}
}

// TestCriticalPointLines: at the critical point cp and k are errors that
// say so, and the state's defined fields stay readable. Regression: cp = 0
// and k = 0.2563 W/(m K) were given.
func TestCriticalPointLines(t *testing.T) {
	e := run(t, "st = water(647.096 K, 322 kg/m^3)", "h = st.h", "rho = st.rho")
	for i, l := range []string{"c1 = st.cp", "c2 = water(22.064 MPa, 0).k", `c3 = fluid("R-134a", fluid_crit("R-134a").T, fluid_crit("R-134a").rho).cp`} {
		s, errs := ParseLine(l, 0, 10+i, e.Ctx)
		if len(errs) > 0 {
			t.Fatal(errs[0].Msg)
		}
		_, err := e.Exec(s)
		if err == nil || !strings.Contains(err.Error(), "is not defined here") || !strings.Contains(err.Error(), "critical point") {
			t.Errorf("%s: %v, want an error at the critical point", l, err)
		}
	}
}
