package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// runJSON runs `vouch run --json` on a calc and decodes the output.
func runJSON(t *testing.T, calc string) (jsonRun, int, string) {
	t.Helper()
	var out, errs bytes.Buffer
	code := run([]string{"run", "--json", calc}, &out, &errs)
	var r jsonRun
	if err := json.Unmarshal(out.Bytes(), &r); err != nil {
		t.Fatalf("bad JSON: %v\n%s", err, out.String())
	}
	return r, code, errs.String()
}

func TestWaterPairsThroughRun(t *testing.T) {
	r, code, errs := runJSON(t, filepath.Join("testdata", "calcs", "water-pairs.calc.md"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	got := map[string]float64{}
	for _, res := range r.Results {
		got[res.Name] = res.Value
	}
	want := []struct {
		name string
		v    float64
		tol  float64 // relative
	}{
		{"v_a", 0.100215168e-2, 5e-9},   // IAPWS R7-97(2012) Table 5, T = 300 K, p = 3 MPa
		{"h_a", 0.115331273e3, 5e-9},    // IAPWS R7-97(2012) Table 5
		{"s_a", 0.392294792, 5e-9},      // IAPWS R7-97(2012) Table 5
		{"T_ph", 300, 1e-9},             // round trip of the (p, T) input
		{"T_ps", 300, 1e-9},             // round trip
		{"p_hs", 3, 1e-7},               // round trip; liquid p from (h, s) is weakly determined (see props/if97 notes)
		{"T_pv", 300, 1e-9},             // round trip
		{"T_prho", 300, 1e-9},           // round trip
		{"p_Tv", 3, 1e-7},               // round trip; liquid p from (T, v) is weakly determined
		{"x_px", 0.25, 1e-9},            // round trip through (p, h)
		{"T_Tx", 373.15, 1e-12},         // the input
		{"h_sat", 2257.4, 5e-4},         // latent heat at 1 bar, 2257.4 kJ/kg: steam-table value (common practice, rounded)
		{"T_sat", 372.7559, 5e-6},       // Tsat(0.1 MPa) = 0.372755919e3 K: IAPWS R7-97(2012) Table 36
		{"p_sat", 0.353658941e-2, 5e-9}, // psat(300 K) = 0.353658941e-2 MPa: IAPWS R7-97(2012) Table 35
		{"T_f", 300, 1e-9},              // fluid("water", ...) is IAPWS-IF97
	}
	for _, w := range want {
		g, ok := got[w.name]
		if !ok {
			t.Errorf("%s missing from the results", w.name)
			continue
		}
		if math.Abs(g-w.v) > w.tol*math.Abs(w.v) {
			t.Errorf("%s = %.10g, want %.10g (relative tolerance %g)", w.name, g, w.v, w.tol)
		}
	}
	if got["mu_a"] <= 0 || got["k_a"] <= 0 {
		t.Errorf("transport properties missing: mu = %g, k = %g", got["mu_a"], got["k_a"])
	}
}

func TestWaterBadInputsThroughRun(t *testing.T) {
	cases := map[string]string{
		"a = water(120 MPa, 300 K)":              "water(p, T): p = 120 MPa is above the 100 MPa limit of IAPWS-IF97",
		"a = water(1 bar, 200 K)":                "water(p, T): T = 200 K (−73.15 °C) is below the 273.15 K (0 °C) limit of IAPWS-IF97",
		"a = water(1 bar, 1.5)":                  "water(p, x)",
		"a = water(3 MPa, 1 m)":                  "water: the second argument is length, which is none of pressure, temperature, specific enthalpy, specific entropy, specific volume, density or quality",
		"a = water(3 MPa, 2 MPa)":                "water(p, p) is not a pair the formulation can solve",
		"a = water(1 bar)":                       "water(A, B) takes 2 arguments, not 1",
		"a = water_sat(30 MPa)":                  "water_sat(p): p = 30 MPa is above the 22.064 MPa limit of IAPWS-IF97 (the saturation line ends at the critical pressure)",
		"a = water(-1 bar, 300 K)":               "water: p = −0.1 MPa must be above zero",
		"a = water(1 bar, 300 K).zz":             "a state has no field zz",
		"a = fluid(\"isopentan\", 1 bar, 300 K)": "unknown fluid \"isopentan\"; did you mean \"isopentane\"?",
		"a = fluid(\"R-245fa\", 1 bar, 900 K)":   "T = 900 K (626.85 °C) is above the 440 K (166.85 °C) limit of Akasaka, Zhou & Lemmon (2015) for R-245fa (highest temperature of the equation)",
		"a = water(1 bar, 0.5).cp":               "cp is not defined here: the state is a two-phase mixture",
	}
	dir := t.TempDir()
	for line, want := range cases {
		calc := filepath.Join(dir, "bad.calc.md")
		os.WriteFile(calc, []byte("```calc\n"+line+"\n```\n"), 0o644)
		r, code, _ := runJSON(t, calc)
		if code != exitErrors || len(r.Errors) == 0 {
			t.Errorf("%s: exit %d, errors %v; want exit 1", line, code, r.Errors)
			continue
		}
		if msg := r.Errors[0].Message; !strings.Contains(msg, want) || strings.Contains(msg, "NaN") {
			t.Errorf("%s:\n got %s\nwant %s", line, msg, want)
		}
	}
}
