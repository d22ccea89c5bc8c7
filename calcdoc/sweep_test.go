package calcdoc

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

const sweepCalc = "```calc\n" +
	"p_1 = 12 MPa\n" +
	"T_1 = 540 degC\n" +
	"st_1 = water(p_1, T_1)\n" +
	"h_2s [kJ/kg] = water(8 kPa, st_1.s).h\n" +
	"w [kJ/kg] = st_1.h - h_2s\n" +
	"x_2 = water(8 kPa, st_1.s).x\n" +
	"check x_2 >= 0.78\n" +
	"```\n"

func evalSrc(t *testing.T, src string) *Doc {
	t.Helper()
	d := Read(filepath.Join(t.TempDir(), "s.calc.md"), []byte(src))
	d.Evaluate()
	if len(d.Errors) > 0 {
		t.Fatalf("errors:\n%s", d.Errors.Format("s.calc.md", d.Src))
	}
	return d
}

// A sweep gives, at every point, what evaluating the whole calc with that
// input gives.
func TestSweepMatchesPointByPoint(t *testing.T) {
	d := evalSrc(t, sweepCalc+"```sweep\nvary p_1 from 4 MPa to 20 MPa in 8 steps\nshow w, x_2\n```\n")
	sw := d.Sweeps[0]
	if sw.Len() != 9 {
		t.Fatalf("%d points, want 9 (8 steps)", sw.Len())
	}
	for i, x := range sw.X {
		mpa := x.V / 1e6
		one := evalSrc(t, strings.Replace(sweepCalc, "p_1 = 12 MPa", fmt.Sprintf("p_1 = %.17g MPa", mpa), 1))
		for j, name := range []string{"w", "x_2"} {
			want, _ := one.engine.Value(name)
			if got := sw.Rows[i][j].V; got != want.(units.Quantity).V {
				t.Errorf("p_1 = %g MPa: %s = %.17g in the sweep, %.17g alone", mpa, name, got, want.(units.Quantity).V)
			}
		}
		failed := len(sw.Failed[i]) > 0
		if failed != one.Failed() {
			t.Errorf("p_1 = %g MPa: check failed %v in the sweep, %v alone", mpa, failed, one.Failed())
		}
	}
	if len(sw.SVGs) != 0 {
		t.Error("no plot was asked for")
	}
}

func TestSweepOverTextAndList(t *testing.T) {
	d := evalSrc(t, "```calc\nwf = \"isopentane\"\np_c [kPa] = fluid_sat(wf, 35 degC).p\n```\n```sweep\nvary wf over [\"isopentane\", \"R-245fa\"]\nshow p_c\n```\n"+
		"```sweep\nvary wf over [\"n-pentane\"]\nshow p_c\n```\n")
	if got := d.Sweeps[0].Texts; len(got) != 2 || got[1] != "R-245fa" {
		t.Fatalf("texts %v", got)
	}
	if d.Sweeps[0].Rows[0][0].V == d.Sweeps[0].Rows[1][0].V {
		t.Error("switching the fluid did not change the saturation pressure")
	}
}

func TestSweepErrors(t *testing.T) {
	cases := map[string]string{
		"vary q from 1 to 2 in 2 steps\nshow w":           "vary q: the calc does not define q",
		"vary p_1 from 1 to 2 in 2 steps\nshow w":         "vary p_1: 1 is dimensionless, but p_1 is pressure",
		"vary p_1 from 1 MPa to 2 MPa in x steps\nshow w": "vary p_1: \"x\" steps; N is a whole number of intervals, from 1 to 99999",
		"vary p_1 over [1 MPa, 2 MPa]\nshow zz":           "show zz: the calc does not define zz",
		"vary p_1 over [1 MPa]":                           "a sweep block needs a line: show NAME, ... or plot NAME",
		"vary p_1 over []\nshow w":                        "vary p_1 over [...] needs at least one value",
		"show w":                                          "a sweep block needs a line: vary NAME from A to B in N steps, or vary NAME over [A, B]",
		"vary p_1 over [2 MPa, 120 MPa]\nshow x_2":        "sweep point p_1 = 120.0 MPa: line 4: water(p, T): p = 120 MPa is above the 100 MPa limit",
		"vary p_1 over [2 MPa, 3 MPa]\nplot w":            "plot w: show w in the same sweep first",
		"vary p_1 over [2 MPa]\nfrobnicate w":             "unknown sweep line \"frobnicate\"; a sweep has vary, show and plot lines",
		"vary p_1 over [2 MPa]\nshow w [MPa]":             "show w [MPa]: cannot show specific enthalpy (kJ/kg) in MPa, which is pressure",
		"vary p_1 from 1 MPa to 2 MPa in 0 steps\nshow w": "vary p_1: 0 steps; a sweep from A to B needs at least 1 step (N steps give N+1 points)",
	}
	for body, want := range cases {
		d := Read(filepath.Join(t.TempDir(), "s.calc.md"), []byte(sweepCalc+"```sweep\n"+body+"\n```\n"))
		d.Evaluate()
		all := d.Errors.Format("s.calc.md", d.Src)
		if !strings.Contains(all, want) {
			t.Errorf("%q:\n got %s\nwant %s", body, all, want)
		}
	}
}

// BenchmarkSweep10000 runs a 10 000-point sweep of a reheat cycle.
func BenchmarkSweep10000(b *testing.B) {
	src := reheatCalc + "```sweep\nvary p_1 from 8 MPa to 20 MPa in 9999 steps\nshow eta [%]\n```\n"
	dir := b.TempDir()
	for b.Loop() {
		d := Read(filepath.Join(dir, "r.calc.md"), []byte(src))
		d.Evaluate()
		if len(d.Errors) > 0 {
			b.Fatal(d.Errors[0].Msg)
		}
	}
}

// reheatCalc is a reheat-regenerative cycle with about 40 property calls.
const reheatCalc = "```calc\n" +
	"p_1 = 16 MPa\nT_1 = 540 degC\np_r = 3.5 MPa\nT_r = 540 degC\np_b = 0.6 MPa\np_c = 8 kPa\neta_t = 0.88\n" +
	"st_1 = water(p_1, T_1)\n" +
	"h_2 = st_1.h - eta_t * (st_1.h - water(p_r, st_1.s).h)\n" +
	"st_3 = water(p_r, T_r)\n" +
	"h_4 = st_3.h - eta_t * (st_3.h - water(p_b, st_3.s).h)\n" +
	"st_4 = water(p_b, h_4)\n" +
	"h_5 = st_4.h - eta_t * (st_4.h - water(p_c, st_4.s).h)\n" +
	"st_6 = water(p_c, 0)\n" +
	"h_7 = st_6.h + st_6.v * (p_b - p_c)\n" +
	"st_8 = water(p_b, 0)\n" +
	"h_9 = st_8.h + st_8.v * (p_1 - p_b)\n" +
	"y = (st_8.h - h_7) / (h_4 - h_7)\n" +
	"w_t = st_1.h - h_2 + (1 - 0) * (st_3.h - h_4) + (1 - y) * (h_4 - h_5)\n" +
	"w_p = (1 - y) * (h_7 - st_6.h) + (h_9 - st_8.h)\n" +
	"q = st_1.h - h_9 + st_3.h - h_2\n" +
	"eta = (w_t - w_p) / q\n" +
	"T_2 = water(p_r, h_2).T\nT_4 = st_4.T\nT_5 = water(p_c, h_5).T\nx_5 = water(p_c, h_5).x\n" +
	"s_1 = water(p_1, T_1).s\ns_3 = water(p_r, T_r).s\nv_1 = water(p_1, T_1).v\nv_3 = water(p_r, T_r).v\n" +
	"T_sat1 = water_sat(p_1).T\nT_satr = water_sat(p_r).T\nT_satb = water_sat(p_b).T\nh_fb = water_sat(p_b).hf\n" +
	"h_gb = water_sat(p_b).hg\nh_fc = water_sat(p_c).hf\nh_gc = water_sat(p_c).hg\ns_fc = water_sat(p_c).sf\n" +
	"s_gc = water_sat(p_c).sg\nh_1b = water(p_1, T_satb).h\nh_rb = water(p_r, T_satb).h\nh_bb = water(p_b, T_satb + 10 K).h\n" +
	"check x_5 > 0.85\ncheck eta > 0.3\n" +
	"```\n"

// BenchmarkGeothermalSweep1000 runs the geothermal example with its sweep
// widened to 1 000 points.
func BenchmarkGeothermalSweep1000(b *testing.B) {
	src, err := os.ReadFile(filepath.Join("..", "examples", "geothermal-binary-isopentane.calc.md"))
	if err != nil {
		b.Fatal(err)
	}
	wide := strings.Replace(string(src), "vary p_1 from 0.5 MPa to 1.0 MPa in 10 steps", "vary p_1 from 0.5 MPa to 1.0 MPa in 999 steps", 1)
	if wide == string(src) {
		b.Fatal("the example's sweep line changed; update the benchmark")
	}
	dir := b.TempDir()
	for b.Loop() {
		d := Read(filepath.Join(dir, "g.calc.md"), []byte(wide))
		d.Evaluate()
		if len(d.Errors) > 0 {
			b.Fatal(d.Errors[0].Msg)
		}
	}
}

// TestHeatExchangeClassification: which processes a diagram draws along a
// heat path.
func TestHeatExchangeClassification(t *testing.T) {
	st := func(p, h, s float64) diagramState { return diagramState{p: p, h: h, s: s, fluid: "water"} }
	cases := []struct {
		name string
		a, b diagramState
		want bool
	}{
		{"boiler on the isobar", st(16e6, 700e3, 2000), st(16e6, 3400e3, 6400), true},
		{"boiler with a 5 % pressure drop", st(16.8e6, 700e3, 2000), st(16e6, 3400e3, 6400), true},
		{"condenser", st(8e3, 2300e3, 7200), st(8e3, 174e3, 590), true},
		{"real turbine: h falls, s rises", st(16e6, 3400e3, 6400), st(8e3, 2300e3, 7200), false},
		{"pump: pressure rises far", st(8e3, 174e3, 590), st(16e6, 190e3, 595), false},
		{"throttle: same enthalpy", st(1e6, 700e3, 2000), st(0.95e6, 700e3, 2010), false},
	}
	for _, c := range cases {
		if got := heatExchange(c.a, c.b); got != c.want {
			t.Errorf("%s: heat exchange %v, want %v", c.name, got, c.want)
		}
	}
}
