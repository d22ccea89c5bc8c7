package calcdoc

import (
	"math"
	"runtime"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// uOf evaluates a calc and returns the propagated standard uncertainty of
// name in SI units.
func uOf(t *testing.T, src, name string) float64 {
	t.Helper()
	d := evalSrc(t, src)
	u, ok := d.Unc.U(name)
	if !ok {
		t.Fatalf("%s has no propagated uncertainty", name)
	}
	return u
}

func near(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if math.Abs(got-want) > rel*math.Abs(want) {
		t.Errorf("%s = %.12g, want %.12g (relative %.2g, allowed %.1g)", what, got, want, math.Abs(got-want)/math.Abs(want), rel)
	}
}

// Closed forms of the law of propagation (JCGM 100, 5.1.2 and 5.2.2):
// sums, products and powers, with and without correlation, to 1e-9.
func TestPropagationClosedForm(t *testing.T) {
	ua, ub := 0.1, 0.2/2 // b's ± 0.2 (k=2) is u = 0.1
	a, b := 3.0, 4.0
	calc := "```calc\na = 3 ± 0.1\nb = 4 kg ± 0.2 kg (k=2)\nc = 2 m ± 0.3 m rect\n%s" +
		"s = a * 1 kg + 2 * b\np = a * b\nq = (b / 1 kg)^2.5 / c\n```\n"
	uc := 0.3 / math.Sqrt(3)
	for _, r := range []float64{0, 0.6, -0.4} {
		corr := ""
		if r != 0 {
			corr = "corr(a, b) = " + strings.TrimRight(strings.TrimRight(sprintf("%.1f", r), "0"), ".") + "\n"
		}
		src := sprintf(calc, corr)
		// s = a + 2b: u² = ua² + 4ub² + 2·1·2·r·ua·ub
		near(t, sprintf("u(s), r = %g", r), uOf(t, src, "s"), math.Sqrt(ua*ua+4*ub*ub+4*r*ua*ub), 1e-9)
		// p = a·b: u² = b²ua² + a²ub² + 2ab·r·ua·ub
		near(t, sprintf("u(p), r = %g", r), uOf(t, src, "p"), math.Sqrt(b*b*ua*ua+a*a*ub*ub+2*a*b*r*ua*ub), 1e-9)
	}
	// q = b^2.5/c: (u/q)² = (2.5 ub/b)² + (uc/c)², c rectangular
	q := math.Pow(b, 2.5) / 2
	want := q * math.Sqrt(math.Pow(2.5*ub/b, 2)+math.Pow(uc/2, 2))
	near(t, "u(q)", uOf(t, sprintf(calc, ""), "q"), want, 1e-9)
}

// JCGM 100:2008, Annex H.2 (simultaneous measurement of resistance and
// reactance), approach 1. The five sets of observations of Table H.2, the
// results of Table H.3 and their uncertainties are typed from memory of the
// annex: V = 5.007, 4.994, 5.005, 4.990, 4.999 V; I = 19.663, 19.639,
// 19.640, 19.685, 19.678 mA; φ = 1.0456, 1.0438, 1.0468, 1.0428,
// 1.0433 rad; R = 127.732 Ω, u(R) = 0.071 Ω; X = 219.847 Ω,
// u(X) = 0.295 Ω; Z = 254.260 Ω, u(Z) = 0.236 Ω. The test computes the
// means, the standard uncertainties of the means and the correlations from
// the observations, as the annex does, and holds the results to one unit
// of the last printed digit.
func TestPropagationGUMAnnexH2(t *testing.T) {
	obs := [3][5]float64{
		{5.007, 4.994, 5.005, 4.990, 4.999},
		{19.663, 19.639, 19.640, 19.685, 19.678},
		{1.0456, 1.0438, 1.0468, 1.0428, 1.0433},
	}
	var mean, u [3]float64
	for k := range obs {
		for _, x := range obs[k] {
			mean[k] += x / 5
		}
		for _, x := range obs[k] {
			u[k] += (x - mean[k]) * (x - mean[k]) / 4 / 5
		}
		u[k] = math.Sqrt(u[k])
	}
	r := func(a, b int) float64 {
		var s float64
		for i := range obs[a] {
			s += (obs[a][i] - mean[a]) * (obs[b][i] - mean[b]) / 4 / 5
		}
		return s / u[a] / u[b]
	}
	src := sprintf("```calc\nV_m = %.17g V ± %.17g V\nI_m = %.17g mA ± %.17g mA\nphi = %.17g ± %.17g\n", mean[0], u[0], mean[1], u[1], mean[2], u[2]) +
		sprintf("corr(V_m, I_m) = %.17f\ncorr(V_m, phi) = %.17f\ncorr(I_m, phi) = %.17f\n", r(0, 1), r(0, 2), r(1, 2)) +
		"R = V_m / I_m * cos(phi)\nX = V_m / I_m * sin(phi)\nZ = V_m / I_m\n```\n"
	d := evalSrc(t, src)
	for _, c := range []struct {
		name string
		y, u float64 // Table H.3, printed to 0.001 Ω
	}{
		{"R", 127.732, 0.071},
		{"X", 219.847, 0.295},
		{"Z", 254.260, 0.236},
	} {
		v, _ := d.engine.Value(c.name)
		got, _ := d.Unc.U(c.name)
		if y := qv(v); math.Abs(y-c.y) > 0.001 {
			t.Errorf("%s = %.4f Ω, Annex H.2 prints %.3f Ω", c.name, y, c.y)
		}
		if math.Abs(got-c.u) > 0.001 {
			t.Errorf("u(%s) = %.5f Ω, Annex H.2 (Table H.3) prints %.3f Ω", c.name, got, c.u)
		}
	}
}

// On a linear model the Monte Carlo standard deviation and mean agree with
// the GUM within the Monte Carlo's own statistical spread: the standard
// deviation of a sample standard deviation is about σ/√(2(N−1)), of the
// mean σ/√N; four of each are allowed.
func TestMonteCarloLinear(t *testing.T) {
	src := "```calc\na = 10 kg ± 0.1 kg\nb = 5 kg ± 0.4 kg rect\nc = 2 kg ± 0.2 kg (k=2)\ncorr(a, c) = 0.5\ny = a + 2*b - 3*c\n```\n```budget\ny mc 100000\n```\n"
	d := evalSrc(t, src)
	e := d.Budgets[0].Entries[0]
	m := e.MCRes
	if m == nil {
		t.Fatal("no Monte Carlo result")
	}
	ua, ub, uc := 0.1, 0.4/math.Sqrt(3), 0.1
	want := math.Sqrt(ua*ua + 4*ub*ub + 9*uc*uc - 2*3*0.5*ua*uc)
	near(t, "u_c", e.Uc, want, 1e-9)
	n := float64(m.N)
	if math.Abs(m.Std-want) > 4*want/math.Sqrt(2*(n-1)) {
		t.Errorf("MC std %.6g, GUM %.6g: further apart than 4 standard deviations of the MC's std", m.Std, want)
	}
	if math.Abs(m.Mean-14) > 4*want/math.Sqrt(n) {
		t.Errorf("MC mean %.6g, y = 14: further apart than 4 standard deviations of the mean", m.Mean)
	}
	if !(m.Low < 14 && m.High > 14) {
		t.Errorf("95 %% interval [%g, %g] does not hold y", m.Low, m.High)
	}
}

// The draws are the same bits on one core and on several.
func TestMonteCarloSameOnAnyCores(t *testing.T) {
	src := "```calc\np_1 = 10 MPa ± 0.05 MPa\nT_1 = 500 degC ± 1 K (k=2)\nh [kJ/kg] = water(p_1, T_1).h\n```\n```budget\nh mc 5000\n```\n"
	old := runtime.GOMAXPROCS(1)
	one := *evalSrc(t, src).Budgets[0].Entries[0].MCRes
	runtime.GOMAXPROCS(4)
	four := *evalSrc(t, src).Budgets[0].Entries[0].MCRes
	runtime.GOMAXPROCS(old)
	if one != four {
		t.Errorf("Monte Carlo differs between 1 and 4 cores:\n%+v\n%+v", one, four)
	}
}

// A sensitivity table works without uncertainties: for y = a²·b/c the
// relative sensitivities are 2, 1 and −1.
func TestSensitivityTable(t *testing.T) {
	d := evalSrc(t, "```calc\na = 3 m\nb = 4 kg\nc = 5 s\ny = a^2 * b / c\n```\n```budget\nsensitivity y\n```\n")
	rows := d.Budgets[0].Entries[0].Rows
	want := []struct {
		name string
		rel  float64
	}{{"a", 2}, {"b", 1}, {"c", -1}}
	if len(rows) != 3 {
		t.Fatalf("%d rows, want 3", len(rows))
	}
	for i, w := range want {
		if rows[i].In.Name != w.name {
			t.Errorf("row %d is %s, want %s (sorted by magnitude)", i, rows[i].In.Name, w.name)
		}
		near(t, "relative sensitivity to "+w.name, rows[i].Rel, w.rel, 1e-9)
	}
}

func TestUncertaintyErrors(t *testing.T) {
	base := "```calc\na = 3 m ± 0.1 m\nb = 4 m ± 0.1 m\nc = 5 m\ny = a + b\n"
	cases := map[string]string{
		"```calc\np = 12.5 MPa ± 0 MPa\n```\n":              "an uncertainty must be above zero",
		"```calc\np = 12.5 MPa ± -0.1 MPa\n```\n":           "expected a positive number after ±",
		"```calc\np = 12.5 MPa ± 0.1 K\n```\n":              "the uncertainty is temperature, but p is pressure",
		"```calc\nT = 500 degC ± 1 degC\n```\n":             "the uncertainty of a temperature is a difference",
		"```calc\np = 12.5 MPa ± 0.1 MPa (k=0)\n```\n":      "the coverage factor k must be above zero",
		"```calc\np = 12.5 MPa ± 0.1 MPa (q=2)\n```\n":      "expected a coverage factor (k=2)",
		"```calc\np = 12.5 MPa\nq = 2 * p ± 0.1 MPa\n```\n": "only an input takes an uncertainty",
		base + "corr(a, b) = 1.2\n```\n":                    "a correlation coefficient lies from -1 to 1",
		base + "corr(a, c) = 0.5\n```\n":                    "c has no uncertainty",
		base + "corr(a, zz) = 0.5\n```\n":                   "the calc does not define zz",
		base + "```\n```budget\nc\n```\n":                   "c depends on no input with an uncertainty",
		base + "```\n```budget\ny mc 2000000\n```\n":        "at most 1000000 draws are allowed",
		base + "```\n```budget\ny k=-1\n```\n":              "the coverage factor k must be a number above zero",
		base + "```\n```budget\na\n```\n":                   "budget a: a is an input, whose uncertainty is stated on line 2",
		base + "```\n```budget\nzz\n```\n":                  "budget zz: the calc does not define zz",
		base + "```\n```budget\nsensitivity a\n```\n":       "sensitivity a: a depends on no input of the calc",
		"```calc\na = 1 ± 0.1\nb = 1 ± 0.1\nc = 1 ± 0.1\ncorr(a, b) = 0.9\ncorr(b, c) = 0.9\ncorr(a, c) = -0.9\n```\n": "not positive semi-definite",
	}
	for src, want := range cases {
		d := Read("/tmp/e.calc.md", []byte(src))
		d.Evaluate()
		msg := d.Errors.Format("e.calc.md", d.Src)
		if !strings.Contains(msg, want) {
			t.Errorf("%q:\ngot  %s\nwant %q", src, msg, want)
		}
	}
}

// qv is the SI value of a quantity.
func qv(v any) float64 {
	return v.(units.Quantity).V
}

// A sweep's u(NAME) column at the calc's own point is the propagated
// uncertainty, to the bit; elsewhere it differs as the coefficients do.
func TestSweepUncertaintyColumn(t *testing.T) {
	d := evalSrc(t, "```calc\np_1 = 12 MPa ± 0.05 MPa\nT_1 = 540 degC ± 1 K (k=2)\nT_2 [degC] = water(p_1, water(p_1, T_1).h - 400 kJ/kg).T\n```\n"+
		"```sweep\nvary p_1 over [8 MPa, 12 MPa]\nshow T_2, u(T_2)\nplot T_2\n```\n")
	sw := d.Sweeps[0]
	want, _ := d.Unc.U("T_2")
	if got := sw.Rows[1][1].V; got != want {
		t.Errorf("u(T_2) at p_1 = 12 MPa: %.17g in the sweep, %.17g propagated", got, want)
	}
	if sw.Rows[0][1].V == want || !(sw.Rows[0][1].V > 0) {
		t.Errorf("u(T_2) at p_1 = 8 MPa: %g; want a different positive value", sw.Rows[0][1].V)
	}
	if len(sw.SVGs) != 1 || !strings.Contains(string(sw.SVGs[0]), "± U (k = 2)") {
		t.Error("the plot of T_2 has no band T_2 ± U")
	}
	if u := d.ColumnUnit(sw.Show[1], sw.Rows[0][1]); u.String() != "K" {
		t.Errorf("u(T_2) is shown in %s, want K (a difference)", u)
	}
	bad := Read("/tmp/s.calc.md", []byte("```calc\na = 1 m\nb = 2 * a\n```\n```sweep\nvary a over [1 m, 2 m]\nshow u(b)\n```\n"))
	bad.Evaluate()
	if msg := bad.Errors.Format("s.calc.md", bad.Src); !strings.Contains(msg, "show u(b): b depends on no input with an uncertainty") {
		t.Errorf("got %s", msg)
	}
}

// A coefficient that changes when its step is halved is refined, and
// noted in the budget when it does not settle: y jumps at a point just
// above x.
func TestSensitivityStepCheck(t *testing.T) {
	src := "```calc\nx = 1 ± 0.01\ny = x < %s ? 2 * x : 3 * x + 1\n```\n```budget\ny\n```\n"
	// the jump at 1.0003 is inside ±h and ±h/2 (h = 0.001) but not ±h/4:
	// settled after two more halvings, at the slope 2
	d := evalSrc(t, sprintf(src, "1.0003"))
	row := d.Budgets[0].Entries[0].Rows[0]
	if !row.Coef.Stable || math.Abs(row.Coef.C-2) > 1e-9 || row.Coef.Step != 0.001/8 {
		t.Errorf("jump at 1.0003: %+v, want c = 2, stable, at the step 0.001/8", row.Coef)
	}
	// the jump at 1.000001 stays inside the finest step: noted
	d = evalSrc(t, sprintf(src, "1.000001"))
	row = d.Budgets[0].Entries[0].Rows[0]
	if row.Coef.Stable {
		t.Errorf("jump at 1.000001: %+v, want a coefficient noted as not settled", row.Coef)
	}
	pkg, err := d.Render(RenderOptions{Engine: "test"})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(pkg.HTML), "changed by") {
		t.Error("the budget does not note the step-sensitive coefficient")
	}
}

// Through solve(): y^3 + y = a gives dy/da = 1/(3y² + 1) (implicit
// differentiation); held to the solver's tolerance, 1e-6 relative. And
// through a property call: T_sat of an uncertain pressure, against the
// slope of the saturation line from the same formulation at ±1 kPa
// (Clausius–Clapeyron would be a second, looser check).
func TestPropagationThroughSolveAndProperties(t *testing.T) {
	d := evalSrc(t, "```calc\na = 10 ± 0.1\ny = solve(y^3 + y == a, 0, 5)\n```\n")
	v, _ := d.engine.Value("y")
	y := qv(v)
	u, _ := d.Unc.U("y")
	near(t, "u(y) through solve", u, 0.1/(3*y*y+1), 1e-6)

	d = evalSrc(t, "```calc\np = 1 MPa ± 0.01 MPa\nT_s = water_sat(p).T\n```\n")
	u, _ = d.Unc.U("T_s")
	hi := evalSrc(t, "```calc\nT_s = water_sat(1.001 MPa).T\n```\n")
	lo := evalSrc(t, "```calc\nT_s = water_sat(0.999 MPa).T\n```\n")
	vh, _ := hi.engine.Value("T_s")
	vl, _ := lo.engine.Value("T_s")
	slope := (qv(vh) - qv(vl)) / 2e3
	near(t, "u(T_s) through water_sat", u, slope*1e4, 1e-6)
}
