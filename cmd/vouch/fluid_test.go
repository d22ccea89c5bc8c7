package main

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// siResults maps each result name of a run to its value in SI base units.
func siResults(r jsonRun) map[string]float64 {
	got := map[string]float64{}
	for _, res := range r.Results {
		got[res.Name] = res.SI
	}
	return got
}

// TestFluidPairsThroughRun: every input pair that fluid() accepts finds the
// state again, for a liquid, a vapour, a supercritical and a two-phase state
// of isopentane and of R-245fa.
func TestFluidPairsThroughRun(t *testing.T) {
	r, code, errs := runJSON(t, filepath.Join("testdata", "calcs", "fluid-pairs.calc.md"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	got := siResults(r)
	const tol = 1e-9 // relative; the solvers settle to about 1e-13 on these states
	type trip struct{ got, want string }
	single := []trip{
		{"T_ph", "T"}, {"T_ps", "T"}, {"p_hs", "p"}, {"T_hs", "T"},
		{"p_Tv", "p"}, {"p_Trho", "p"}, {"h_Trho", "h"}, {"h_sT", "h"},
		{"T_pv", "T"}, {"T_prho", "T"},
	}
	twoPhase := []trip{
		{"T_px", "T"}, {"x_ph", "x"}, {"x_ps", "x"}, {"x_hs", "x"}, {"p_hs", "p"},
		{"x_Tv", "x"}, {"x_Trho", "x"}, {"x_pv", "x"}, {"x_prho", "x"}, {"T_sat", "T"}, {"p_sat", "p"},
		{"h_lin", "h"}, {"s_lin", "s"}, {"v_lin", "v"},
		{"hf", "hf_sat"}, {"hg", "hg_sat"}, {"sf", "sf_sat"}, {"sg", "sg_sat"},
	}
	compare := func(suffix string, trips []trip) {
		for _, tr := range trips {
			g, ok1 := got[tr.got+"_"+suffix]
			w, ok2 := got[tr.want+"_"+suffix]
			if tr.want == "x" {
				w, ok2 = 0.3, true // the quality given in the calc
			}
			if !ok1 || !ok2 {
				t.Errorf("%s_%s or %s_%s missing from the results", tr.got, suffix, tr.want, suffix)
				continue
			}
			if math.Abs(g-w) > tol*math.Abs(w) {
				t.Errorf("%s_%s = %.15g, want %s_%s = %.15g", tr.got, suffix, g, tr.want, suffix, w)
			}
		}
	}
	for _, f := range []string{"i", "r"} { // isopentane, R-245fa
		for _, s := range []string{"l", "v", "c"} { // liquid, vapour, supercritical
			compare(f+"_"+s, single)
		}
		compare(f+"_x", twoPhase)
	}
}

// TestFluidCheckValuesThroughRun compares fluid() and fluid_sat() with the
// check values printed in the papers of the equations of state. Tolerance:
// half a unit of the last printed digit.
func TestFluidCheckValuesThroughRun(t *testing.T) {
	r, code, errs := runJSON(t, filepath.Join("testdata", "calcs", "fluid-check-values.calc.md"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	got := map[string]float64{}
	for _, res := range r.Results {
		got[res.Name] = res.Value // in the display unit of the calc line
	}
	want := []struct {
		name string
		v    float64
		tol  float64 // absolute, in the display unit
	}{
		{"p_i", 3458.617, 5e-4},         // kPa; isopentane, 462 K, 3 mol/dm3: Lemmon & Span (2006) J. Chem. Eng. Data 51, Table 10, p. 842
		{"h_i", 37318.534, 5e-4},        // J/mol; Lemmon & Span (2006) J. Chem. Eng. Data 51, Table 10, p. 842
		{"s_i", 94.634, 5e-4},           // J/(mol K); Lemmon & Span (2006) J. Chem. Eng. Data 51, Table 10, p. 842
		{"cv_i", 190.631, 5e-4},         // J/(mol K); Lemmon & Span (2006) J. Chem. Eng. Data 51, Table 10, p. 842
		{"cp_i", 4660.943, 5e-4},        // J/(mol K); Lemmon & Span (2006) J. Chem. Eng. Data 51, Table 10, p. 842
		{"w_i", 96.324, 5e-4},           // m/s; Lemmon & Span (2006) J. Chem. Eng. Data 51, Table 10, p. 842
		{"psat_r", 2.210563, 5e-7},      // MPa; R-245fa saturation at 400 K: Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"rhof_r", 7.1518, 5e-5},        // mol/dm3; Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"rhog_r", 1.068455, 5e-7},      // mol/dm3; Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"hf_r", 51.5591, 5e-5},         // kJ/mol; Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"hg_r", 65.2749, 5e-5},         // kJ/mol; Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"sf_r", 0.206989, 5e-7},        // kJ/(mol K); Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"sg_r", 0.241278, 5e-7},        // kJ/(mol K); Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"cpf_r", 0.255135, 5e-7},       // kJ/(mol K); Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"cpg_r", 0.234947, 5e-7},       // kJ/(mol K); Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"wg_r", 106.449, 5e-4},         // m/s; Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"psat250_r", 0.01646009, 5e-9}, // MPa; saturation at 250 K: Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"p_rv", 1.352988, 5e-7},        // MPa; 400 K, 0.5 mol/dm3: Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"h_rv", 67.9067, 5e-5},         // kJ/mol; Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"s_rv", 0.250859, 5e-7},        // kJ/(mol K); Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"cv_rv", 0.138842, 5e-7},       // kJ/(mol K); Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"cp_rv", 0.162544, 5e-7},       // kJ/(mol K); Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"w_rv", 135.712, 5e-4},         // m/s; Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"p_rl", 7.454017, 5e-7},        // MPa; 250 K, 11 mol/dm3: Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"cp_rl", 0.162059, 5e-7},       // kJ/(mol K); Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"w_rl", 908.590, 5e-4},         // m/s; Akasaka, Zhou & Lemmon (2015) J. Phys. Chem. Ref. Data 44, 013104, Table 7, p. 12
		{"T_rl", 250, 1e-9},             // K; round trip of the 250 K liquid state through (p, h)
	}
	for _, w := range want {
		g, ok := got[w.name]
		if !ok {
			t.Errorf("%s missing from the results", w.name)
			continue
		}
		if math.Abs(g-w.v) > w.tol {
			t.Errorf("%s = %.10g, want %.10g ± %g", w.name, g, w.v, w.tol)
		}
	}
}

// TestFluidWaterIsIF97ThroughRun: fluid("water", ...) and fluid_sat("water",
// ...) give the numbers of water(...) and water_sat(...), bit for bit.
func TestFluidWaterIsIF97ThroughRun(t *testing.T) {
	r, code, errs := runJSON(t, filepath.Join("testdata", "calcs", "fluid-water.calc.md"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	got := siResults(r)
	n := 0
	for name, w := range got {
		base, ok := strings.CutSuffix(name, "_w")
		if !ok {
			continue
		}
		n++
		if f, ok := got[base+"_f"]; !ok || f != w {
			t.Errorf("%s_f = %v, want %s_w = %v", base, f, base, w)
		}
	}
	if n < 12 {
		t.Errorf("only %d pairs compared", n)
	}
}

// TestFluidBadInputsThroughRun: a wrong fluid name, an input outside an
// equation's range, an undefined property or a pair the solvers do not take
// is an error that says what is wrong, never a NaN.
func TestFluidBadInputsThroughRun(t *testing.T) {
	cases := map[string]string{
		`a = fluid("isopentan", 1 bar, 300 K)`:        `unknown fluid "isopentan"; did you mean "isopentane"?`,
		`a = fluid("R-245fb", 1 bar, 300 K)`:          `unknown fluid "R-245fb"; did you mean "R-245fa"?`,
		`a = fluid_sat("R245-fx", 300 K)`:             `unknown fluid "R245-fx"; did you mean "R-245fa"?`,
		`a = fluid("isopentane", 1 MPa, 520 K)`:       `T = 520 K (246.85 °C) is above the 500 K (226.85 °C) limit of Lemmon & Span (2006) for isopentane`,
		`a = fluid("isopentane", 1 MPa, 100 K)`:       `T = 100 K (−173.15 °C) is below the 112.65 K (−160.5 °C) limit of Lemmon & Span (2006) for isopentane`,
		`a = fluid("R-245fa", 1 bar, 150 K)`:          `T = 150 K (−123.15 °C) is below the 170 K (−103.15 °C) limit of Akasaka, Zhou & Lemmon (2015) for R-245fa`,
		`a = fluid("R-245fa", 250 MPa, 300 K)`:        `p = 250 MPa is above the 200 MPa limit of Akasaka, Zhou & Lemmon (2015) for R-245fa`,
		`a = fluid("isopentane", 1200 MPa, 300 K)`:    `p = 1200 MPa is above the 1000 MPa limit of Lemmon & Span (2006) for isopentane`,
		`a = fluid("n-pentane", 700 K, 200 kg/m^3)`:   `T = 700 K (426.85 °C) is above the 600 K (326.85 °C) limit of Span & Wagner (2003) for n-pentane`,
		`a = fluid_sat("isopentane", 470 K)`:          `T = 470 K (196.85 °C) is above the 460.35 K (187.2 °C) limit of Lemmon & Span (2006) for isopentane (critical temperature, where saturation ends)`,
		`a = fluid_sat("isopentane", 4 MPa)`:          `p = 4 MPa is above the 3.37822 MPa limit of Lemmon & Span (2006) for isopentane (critical pressure, where saturation ends)`,
		`a = fluid_sat("R-245fa", 100 K)`:             `T = 100 K (−173.15 °C) is below the 170 K (−103.15 °C) limit of Akasaka, Zhou & Lemmon (2015) for R-245fa`,
		`a = fluid("isopentane", 1 bar, 10000 kJ/kg)`: `h = 10000 kJ/kg is above the`,
		`a = fluid("isopentane", 400 K, 2000 kg/m^3)`: `rho = 2000 kg/m^3 is above the`,
		`a = fluid("isopentane", 1 bar, 1.5)`:         `x = 1.5 is above the 1 limit`,
		`a = fluid("isopentane", -1 bar, 300 K)`:      `p = −0.1 MPa must be above zero`,
		`a = fluid("isopentane", 1 bar, 0.5).cp`:      `cp is not defined here: the state is a two-phase mixture`,
		`a = fluid("isopentane", 1 bar, 0.5).cv`:      `cv is not defined here: the state is a two-phase mixture`,
		`a = fluid("isopentane", 1 bar, 0.5).w`:       `w is not defined here: the state is a two-phase mixture`,
		`a = fluid("R-245fa", 300 K, 0.5).cp`:         `cp is not defined here: the state is a two-phase mixture`,
		`a = fluid("isopentane", 1 bar, 300 K).mu`:    `mu is not defined here: vouch has no transport-property correlation for isopentane`,
		`a = fluid("isopentane", 1 bar, 2 bar)`:       `fluid("isopentane", p, p) is not a pair the fluid functions can solve`,
		`a = fluid("isopentane", 1 bar)`:              `takes 3 arguments, not 2`,
		`a = fluid_sat("isopentane", 1 m)`:            `fluid_sat needs a pressure or a temperature, not length`,
		// A specific volume beyond the vapour at the highest temperature of
		// the equation at that pressure is out of range.
		`a = fluid("R-245fa", 1 bar, 1 m^3/kg)`: `is above the 0.270684 m^3/kg limit`,
	}
	dir := t.TempDir()
	for line, want := range cases {
		calc := filepath.Join(dir, "bad.calc.md")
		if err := os.WriteFile(calc, []byte("```calc\n"+line+"\n```\n"), 0o644); err != nil {
			t.Fatal(err)
		}
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

const (
	isopentaneExample = "geothermal-binary-isopentane"
	switchExample     = "geothermal-binary-switch-fluid"
)

// runExample runs an example calc, with its text changed by edit, in a
// folder outside the repository.
func runExample(t *testing.T, name string, edit func(string) string) (jsonRun, int, string) {
	t.Helper()
	src, err := os.ReadFile(filepath.Join("..", "..", "examples", name+".calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	calc := filepath.Join(t.TempDir(), name+".calc.md")
	if err := os.WriteFile(calc, []byte(edit(string(src))), 0o644); err != nil {
		t.Fatal(err)
	}
	return runJSON(t, calc)
}

// TestFluidSwitchInExample: changing the one input wf of the geothermal
// binary example changes the cycle's results, leaves the brine side alone,
// and the calc still evaluates (its checks may fail for a fluid the design
// does not suit).
func TestFluidSwitchInExample(t *testing.T) {
	const line = `wf = "isopentane"`
	base, code, errs := runExample(t, isopentaneExample, func(s string) string {
		if strings.Count(s, line) != 1 {
			t.Fatalf("the example no longer has exactly one line %s", line)
		}
		return s
	})
	if code != exitOK {
		t.Fatalf("isopentane: exit %d: %s", code, errs)
	}
	b := siResults(base)
	for _, fl := range []string{"R-245fa", "n-pentane", "cyclopentane", "R-1233zd(E)"} {
		r, code, errs := runExample(t, isopentaneExample, func(s string) string {
			return strings.Replace(s, line, `wf = "`+fl+`"`, 1)
		})
		if (code != exitOK && code != exitFailed) || len(r.Errors) > 0 {
			t.Errorf("%s: exit %d, errors %v: %s", fl, code, r.Errors, errs)
			continue
		}
		g := siResults(r)
		for _, n := range []string{"p_c", "T_bub", "h_1", "m_dot_wf", "P_net", "eta_th", "eta_u", "dT_pp", "Q_cond"} {
			if math.Abs(g[n]-b[n]) <= 1e-3*math.Abs(b[n]) {
				t.Errorf("%s: %s = %g is the isopentane value %g", fl, n, g[n], b[n])
			}
		}
		for _, n := range []string{"p_1", "Q_in", "e_b", "T_c", "rho_air"} { // inputs and the brine and air sides
			if g[n] != b[n] {
				t.Errorf("%s: %s = %g changed from %g", fl, n, g[n], b[n])
			}
		}
		if len(r.Checks) != len(base.Checks) {
			t.Errorf("%s: %d checks, want %d", fl, len(r.Checks), len(base.Checks))
		}
		if fl == "n-pentane" { // n-pentane condenses below the site air pressure at the design condensing temperature
			for _, c := range r.Checks {
				if c.Expr == "p_c > p_amb" && c.Pass {
					t.Errorf("n-pentane: check %s passes", c.Expr)
				}
			}
		}
	}
}

// calcLines returns the statements of a calc file's calc blocks without
// their descriptions, keyed by name (checks by their expression).
func calcLines(t *testing.T, path string) map[string]string {
	t.Helper()
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]string{}
	in := false
	for _, l := range strings.Split(string(src), "\n") {
		switch {
		case strings.HasPrefix(l, "```calc"):
			in = true
		case strings.HasPrefix(l, "```"):
			in = false
		case in:
			code, _, _ := strings.Cut(l, "//")
			code = strings.Join(strings.Fields(code), " ")
			if code == "" {
				continue
			}
			name, _, ok := strings.Cut(code, "=")
			if strings.HasPrefix(code, "check ") || !ok {
				name = code
			}
			out[strings.TrimSpace(name)] = code
		}
	}
	return out
}

// TestFluidSwitchExample: the R-245fa example is the isopentane example
// with only the working fluid, the turbine inlet pressure and one added
// illustration line changed, and it runs with every check passing.
func TestFluidSwitchExample(t *testing.T) {
	ex := filepath.Join("..", "..", "examples")
	a := calcLines(t, filepath.Join(ex, isopentaneExample+".calc.md"))
	b := calcLines(t, filepath.Join(ex, switchExample+".calc.md"))
	allowed := map[string]bool{"wf": true, "p_1": true, "T_bub_iso [degC]": true}
	for name, la := range a {
		if lb := b[name]; lb != la && !allowed[name] {
			t.Errorf("line %q differs between the examples: %q", la, lb)
		}
	}
	for name := range b {
		if _, ok := a[name]; !ok && !allowed[name] {
			t.Errorf("the switched example adds %q", b[name])
		}
	}
	if a["wf"] == b["wf"] {
		t.Errorf("both examples use %s", a["wf"])
	}
	r, code, errs := runExample(t, switchExample, func(s string) string { return s })
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, c := range r.Checks {
		if !c.Pass {
			t.Errorf("check %s fails", c.Expr)
		}
	}
}
