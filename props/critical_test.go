package props

import (
	"math"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/props/helmholtz"
	"github.com/vouchcalc/vouch/props/if97"
	"github.com/vouchcalc/vouch/units"
)

// TestSaturatedConductivityThroughProps: the thermal conductivity and the
// viscosity of saturated water and steam are given, and equal the if97
// values of the same state (cross-checked against python3-iapws in
// props/if97 TestSaturatedConductivityPythonIAPWS). Regression: these calls
// failed with "k is not defined here", because the conductivity solved for
// the state again from (T, 1/rho) and rounding put it in the two-phase
// region.
func TestSaturatedConductivityThroughProps(t *testing.T) {
	for _, c := range []struct {
		name string
		call func() (*State, error)
		num  func() (if97.Props, error)
	}{
		{"water(1 MPa, 1)", func() (*State, error) { return Water(q(1, "MPa"), units.Num(1)) },
			func() (if97.Props, error) { return if97.StatePX(1e6, 1) }},
		{"water(0.1 MPa, 1)", func() (*State, error) { return Water(q(0.1, "MPa"), units.Num(1)) },
			func() (if97.Props, error) { return if97.StatePX(0.1e6, 1) }},
		{"water(100 degC, 0)", func() (*State, error) { return Water(q(100, "degC"), units.Num(0)) },
			func() (if97.Props, error) { return if97.StateTX(373.15, 0) }},
		{`fluid("water", 1 MPa, 1)`, func() (*State, error) { return Fluid("water", q(1, "MPa"), units.Num(1)) },
			func() (if97.Props, error) { return if97.StatePX(1e6, 1) }},
		{"water(640 K, 1)", func() (*State, error) { return Water(q(640, "K"), units.Num(1)) },
			func() (if97.Props, error) { return if97.StateTX(640, 1) }},
	} {
		st, err := c.call()
		if err != nil {
			t.Fatal(err)
		}
		n, err := c.num()
		if err != nil {
			t.Fatal(err)
		}
		wantK, err := if97.ConductivityOf(&n)
		if err != nil {
			t.Fatal(err)
		}
		wantMu, _ := if97.ViscosityOf(&n)
		for _, f := range []struct {
			name string
			want float64
		}{{"k", wantK}, {"mu", wantMu}} {
			v, err := st.Field(f.name)
			if err != nil {
				t.Errorf("%s.%s: %v", c.name, f.name, err)
				continue
			}
			if got := v.(units.Quantity).V; got != f.want {
				t.Errorf("%s.%s = %.17g, want %.17g", c.name, f.name, got, f.want)
			}
		}
	}
}

// criticalStates are water at its critical point given five ways:
// (p, x), (T, rho), (p, h), (p, s) and (h, s), with h and s of the
// (T, rho) state (IAPWS R7-97(2012) Eqs. (2)-(4): Tc = 647.096 K,
// pc = 22.064 MPa, rhoc = 322 kg/m3).
func criticalStates(t *testing.T) map[string]*State {
	t.Helper()
	out := map[string]*State{}
	add := func(name string, st *State, err error) {
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		out[name] = st
	}
	st, err := Water(q(22.064, "MPa"), units.Num(0))
	add("water(22.064 MPa, 0)", st, err)
	c, err := Water(q(647.096, "K"), q(322, "kg/m^3"))
	add("water(647.096 K, 322 kg/m^3)", c, err)
	h, _ := c.Quantity("h")
	s, _ := c.Quantity("s")
	st, err = Water(q(22.064, "MPa"), h)
	add("water(22.064 MPa, h_c)", st, err)
	st, err = Water(q(22.064, "MPa"), s)
	add("water(22.064 MPa, s_c)", st, err)
	st, err = Water(h, s)
	add("water(h_c, s_c)", st, err)
	return out
}

// TestCriticalPointUndefined: at water's critical point cp and k are
// errors that say so and name the state, while p, T, h, s, rho, v and the
// finite cv and w stay readable. Regression: these states gave cp = 0 and
// k = 0.2563 W/(m K).
func TestCriticalPointUndefined(t *testing.T) {
	for name, st := range criticalStates(t) {
		for _, f := range []string{"cp", "k"} {
			v, err := st.Field(f)
			if err == nil {
				t.Errorf("%s.%s = %v, want an error", name, f, v)
				continue
			}
			msg := err.Error()
			if !strings.Contains(msg, f+" is not defined here") || !strings.Contains(msg, "critical point") || !strings.Contains(msg, "p = 22.064 MPa") {
				t.Errorf("%s.%s: %q does not say that the state is the critical point and name it", name, f, msg)
			}
		}
		for _, f := range []string{"p", "T", "h", "s", "rho", "v", "cv", "w", "mu"} {
			if _, err := st.Field(f); err != nil {
				t.Errorf("%s.%s: %v", name, f, err)
			}
		}
	}
}

// TestNearCriticalDefined: 1 K and 10 mK above the critical temperature on
// the critical isochore, cp is large but finite and given (cp/cv about 180
// and 1.8e4), so the neighbourhood where cp is refused is no wider than
// the precision of the critical constants.
func TestNearCriticalDefined(t *testing.T) {
	for _, dT := range []float64{1, 0.01} {
		st, err := Water(q(647.096+dT, "K"), q(322, "kg/m^3"))
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range []string{"cp", "k"} {
			if v, err := st.Field(f); err != nil || !(v.(units.Quantity).V > 0) {
				t.Errorf("Tc + %g K: %s = %v, %v", dT, f, v, err)
			}
		}
	}
}

// TestFluidCriticalPointUndefined: for every organic-fluid equation, cp at
// its own critical point (fluid_crit: T and rho) is an error, never a
// number; the fields that must be positive are positive wherever given.
// Regression: cp there was negative for 9 of the 14 equations (R-134a:
// -7.955e12 kJ/(kg K)).
func TestFluidCriticalPointUndefined(t *testing.T) {
	for _, name := range helmholtz.Names() {
		c, err := FluidCrit(name)
		if err != nil {
			t.Fatal(err)
		}
		T, _ := c.Field("T")
		rho, _ := c.Field("rho")
		st, err := Fluid(name, T.(units.Quantity), rho.(units.Quantity))
		if err != nil {
			t.Fatalf("%s at its critical point: %v", name, err)
		}
		if v, err := st.Field("cp"); err == nil || !strings.Contains(err.Error(), "not defined here") {
			t.Errorf("%s: cp at the critical point = %v, %v; want an error", name, v, err)
		}
		for _, f := range []string{"p", "T", "h", "s", "rho"} {
			if _, err := st.Field(f); err != nil {
				t.Errorf("%s.%s at the critical point: %v", name, f, err)
			}
		}
		for _, f := range []string{"cv", "w"} {
			if v, err := st.Field(f); err == nil && !(v.(units.Quantity).V > 0) || err != nil && !strings.Contains(err.Error(), "not defined here") {
				t.Errorf("%s.%s at the critical point: %v, %v", name, f, v, err)
			}
		}
	}
}

// TestPositiveFieldsChecked: a state whose numbers break the rules (as
// the formulations give them at and beyond their critical points) reads
// as errors, never as the number: a negative or zero cp, cv, w, a NaN,
// an infinite h.
func TestPositiveFieldsChecked(t *testing.T) {
	base := numState{Tc: 460.35, RhoC: 236, P: 1e6, T: 500, V: 0.2, Rho: 5, H: 2.8e6, S: 6.8e3, U: 2.6e6, Cp: 2e3, Cv: 1.5e3, W: 500, X: 1, Phase: "vapour"}
	for _, c := range []struct {
		field string
		set   func(n *numState)
	}{
		{"cp", func(n *numState) { n.Cp = -7.955e15 }},
		{"cp", func(n *numState) { n.Cp = 0 }},
		{"cv", func(n *numState) { n.Cv = 0 }},
		{"w", func(n *numState) { n.W = math.NaN() }},
		{"h", func(n *numState) { n.H = math.Inf(1) }},
		{"cp", func(n *numState) { n.Cp = 2e9 }}, // cp/cv above CritRatio
	} {
		n := base
		c.set(&n)
		st := n.state("isopentane", "an equation", "NBP")
		if v, err := st.Field(c.field); err == nil || !strings.Contains(err.Error(), c.field+" is not defined here") {
			t.Errorf("%s: %v, %v; want an error", c.field, v, err)
		}
		if _, err := st.Field("p"); err != nil {
			t.Errorf("p unreadable: %v", err)
		}
	}
}

// TestFieldAtRange: FieldAt outside the fields is an error, never a panic;
// StateFieldIndex and FieldAt agree with Field for every field.
func TestFieldAtRange(t *testing.T) {
	st, err := Water(q(1, "MPa"), q(300, "degC"))
	if err != nil {
		t.Fatal(err)
	}
	for _, i := range []int{-1, len(stateFields), 1 << 30} {
		if _, err := st.FieldAt(i); err == nil {
			t.Errorf("FieldAt(%d) gave no error", i)
		}
	}
	for _, n := range stateFields {
		a, errA := st.Field(n)
		b, errB := st.FieldAt(StateFieldIndex(n))
		if a != b || (errA == nil) != (errB == nil) {
			t.Errorf("%s: Field %v, %v; FieldAt %v, %v", n, a, errA, b, errB)
		}
	}
	if StateFieldIndex("hf") != -1 {
		t.Error("hf is not a state field")
	}
}
