package calcdoc

import (
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// readEval reads and evaluates src and returns the formatted errors.
func readEval(t *testing.T, src string) (*Doc, string) {
	t.Helper()
	d := Read(filepath.Join(t.TempDir(), "s.calc.md"), []byte(src))
	d.Evaluate()
	return d, d.Errors.Format("s.calc.md", d.Src)
}

// TestSweepVariesComputedName: varying a name computed from other names
// gave a flat table (the lines that read its inputs kept their values) and
// no error. A sweep varies only inputs; the error is at the vary line and
// names the inputs the varied name is computed from.
func TestSweepVariesComputedName(t *testing.T) {
	calc := "```calc\np_1 = 10 MPa\nT_1 = 500 degC\nst = water(p_1, T_1)\nh = st.h\nT_x = st.T\nk = 2\nc = 3 * 4 MPa\n" +
		"wf = \"isopentane\"\nwf2 = wf\np_s = fluid_sat(wf2, 35 degC).p\n```\n"
	cases := []struct{ vary, want string }{
		{"vary T_x from 400 degC to 600 degC in 2 steps\nshow h",
			"s.calc.md:14:6: vary T_x: T_x is computed on line 6 (T_x = st.T) from the inputs p_1, T_1; a sweep varies an input, a name whose line is a value written out: vary p_1 or T_1"},
		{"vary h over [3000 kJ/kg, 3100 kJ/kg]\nshow T_x",
			"vary h: h is computed on line 5 (h = st.h) from the inputs p_1, T_1"},
		{"vary c over [1 MPa, 2 MPa]\nshow h",
			"vary c: c is computed on line 8 (c = 3 * 4 MPa) and reads no input; a sweep varies an input, a name whose line is a value written out, such as c = 12.00 MPa"},
		{"vary wf2 over [\"isopentane\", \"R-245fa\"]\nshow p_s",
			"vary wf2: wf2 is computed on line 10 (wf2 = wf) from the input wf; a sweep varies an input, a name whose line is a value written out: vary wf"},
	}
	for _, c := range cases {
		_, got := readEval(t, calc+"```sweep\n"+c.vary+"\n```\n")
		if !strings.Contains(got, c.want) {
			t.Errorf("%q:\n got %s\nwant %s", c.vary, got, c.want)
		}
	}
	for _, ok := range []string{"vary T_1 from 400 degC to 600 degC in 2 steps\nshow h", "vary k over [1, 2]\nshow h",
		"vary wf over [\"isopentane\", \"R-245fa\"]\nshow p_s"} {
		d, got := readEval(t, calc+"```sweep\n"+ok+"\n```\n")
		if len(d.Errors) > 0 {
			t.Errorf("%q: %s", ok, got)
		}
	}
	d, _ := readEval(t, calc+"```sweep\nvary T_1 from 400 degC to 600 degC in 2 steps\nshow h\n```\n")
	if r := d.Sweeps[0].Rows; r[0][0].V == r[1][0].V {
		t.Error("varying the input T_1 left h flat")
	}
}

// boundCalc is a tiny calc for the bound tests: a sweep point costs
// little, so only the bounds decide what happens.
const boundCalc = "```calc\nx = 1 m\ny = 2 * x\ncheck y > 0 m\n```\n"

// TestSweepStepCountOverflow: "in 9223372036854775807 steps" overflowed
// the point count and panicked in makeslice.
func TestSweepStepCountOverflow(t *testing.T) {
	_, got := readEval(t, boundCalc+"```sweep\nvary x from 0 m to 1 m in 9223372036854775807 steps\nshow y\n```\n")
	want := "s.calc.md:7:27: vary x: 9223372036854775807 steps are more than the 99999 a sweep may have (100000 points)"
	if !strings.Contains(got, want) {
		t.Errorf("got %s\nwant %s", got, want)
	}
}

// TestSweepListTooLong: a list of 150,000 values was accepted and
// evaluated for half a minute.
func TestSweepListTooLong(t *testing.T) {
	list := strings.Repeat("1 m,", 150000)
	_, got := readEval(t, boundCalc+"```sweep\nvary x over ["+list[:len(list)-1]+"]\nshow y\n```\n")
	want := "s.calc.md:7:13: vary x over [...]: 150000 values are more than the 100000 a sweep may have"
	if !strings.Contains(got, want) {
		t.Errorf("got %.300s\nwant %s", got, want)
	}
}

// TestSweepManyColumns: 99,999 steps with one name shown 300 times took
// 2.3 GB; the table a sweep keeps is bounded by points × columns.
func TestSweepManyColumns(t *testing.T) {
	show := strings.TrimSuffix(strings.Repeat("y, ", 300), ", ")
	d, got := readEval(t, boundCalc+"```sweep\nvary x from 0 m to 1 m in 99999 steps\nshow "+show+"\n```\n")
	want := "s.calc.md:7:6: vary x: 100000 points × 301 columns (300 shown, 1 checks) are 30100000 values, more than the 1000000 one sweep may hold"
	if !strings.Contains(got, want) {
		t.Errorf("got %.300s\nwant %s", got, want)
	}
	if d.Sweeps[0].Rows != nil {
		t.Error("the sweep evaluated points after its error")
	}
}

// TestSweepSecondVaryLine: a second vary line in one block replaced the
// varied name but kept the first line's values, so the sweep set y to x's
// values without an error.
func TestSweepSecondVaryLine(t *testing.T) {
	calc := "```calc\nx = 1 m\nz = 5 m\ny = 2 * x + z\n```\n"
	d, got := readEval(t, calc+"```sweep\nvary x over [1 m, 2 m]\nvary z from 0 m to 1 m in 3 steps\nshow y\n```\n")
	want := "s.calc.md:8:1: a sweep varies one input, and this one has a vary line on line 7; write a second sweep block to vary another"
	if !strings.Contains(got, want) || len(d.Errors) != 1 {
		t.Errorf("got %s\nwant %s", got, want)
	}
}

// TestSweepPlotPoints: a 230-byte calc with 99,999 steps and eight names
// on a plot line wrote a 74 MB package; the points a sweep's plots draw
// are bounded before anything is evaluated.
func TestSweepPlotPoints(t *testing.T) {
	d, got := readEval(t, boundCalc+"```sweep\nvary x from 0 m to 1 m in 99999 steps\nshow y\nplot y, y, y\n```\n")
	want := "s.calc.md:7:6: vary x: 100000 points on its plots are 300000 plotted values, more than the 200000 a sweep's plots may draw"
	if !strings.Contains(got, want) || d.Sweeps[0].Rows != nil {
		t.Errorf("got %.300s\nwant %s", got, want)
	}
}

// TestSweepBounds runs hostile vary and show lines: each gives one clear
// error at its line and column, and evaluates no point.
func TestSweepBounds(t *testing.T) {
	cases := []struct{ block, want string }{
		{"vary x from 0 m to 1 m in 100000 steps\nshow y", "7:27: vary x: 100000 steps are more than the 99999 a sweep may have"},
		{"vary x from 0 m to 1 m in 99999999999999999999 steps\nshow y", "7:27: vary x: 99999999999999999999 steps are more than the 99999"},
		{"vary x from 0 m to 1 m in -3 steps\nshow y", "7:27: vary x: -3 steps; a sweep from A to B needs at least 1 step"},
		{"vary x from 0 m to 1 m in -99999999999999999999 steps\nshow y", "7:27: vary x: \"-99999999999999999999\" steps; N is a whole number of intervals, from 1 to 99999"},
		{"vary x from 0 m to 1 m in 0 steps\nshow y", "7:27: vary x: 0 steps; a sweep from A to B needs at least 1 step"},
		{"vary x from 0 m to 1 m in 2.5 steps\nshow y", "7:27: vary x: \"2.5\" steps; N is a whole number of intervals"},
		{"vary x from 0 m to 1 m in 1e3 steps\nshow y", "7:27: vary x: \"1e3\" steps; N is a whole number of intervals"},
		{"vary x from 0 m to 1 m in 0x10 steps\nshow y", "7:27: vary x: \"0x10\" steps; N is a whole number of intervals"},
		{"vary x from 0 m to 1 m in 3 apples\nshow y", "7:27: write: vary x from A to B in N steps"},
		{"vary x from 0 m to 1 m\nshow y", "7:8: write: vary x from A to B in N steps"},
		{"vary\nshow y", "7:5: write: vary NAME from A to B in N steps, or vary NAME over [A, B, C]"},
		{"vary   \nshow y", "7:5: write: vary NAME from A to B in N steps, or vary NAME over [A, B, C]"},
		{"vary x over [" + strings.Repeat("1 m,", 100000) + "1 m]\nshow y", "7:13: vary x over [...]: 100001 values are more than the 100000"},
		{"vary x from 0 m to 1 m in 49999 steps\nshow y, y, y, y, y, y, y, y, y, y, y, y, y, y, y, y, y, y, y, y",
			"7:6: vary x: 50000 points × 21 columns (20 shown, 1 checks) are 1050000 values, more than the 1000000"},
	}
	for _, c := range cases {
		d, got := readEval(t, boundCalc+"```sweep\n"+c.block+"\n```\n")
		if !strings.Contains(got, "s.calc.md:"+c.want) {
			t.Errorf("%.60s:\n got %.300s\nwant %s", c.block, got, c.want)
		}
		if len(d.Errors) != 1 {
			t.Errorf("%.60s: %d errors, want 1", c.block, len(d.Errors))
		}
		for _, sw := range d.Sweeps {
			if sw.Rows != nil {
				t.Errorf("%.60s: points were evaluated", c.block)
			}
		}
	}
}

// TestSweepFileBudget: the sweeps of one file share a budget of points,
// values and line evaluations; the sweep that goes over gets the error at
// its vary line and evaluates nothing.
func TestSweepFileBudget(t *testing.T) {
	d, _ := readEval(t, boundCalc+"```sweep\nvary x from 0 m to 1 m in 9 steps\nshow y\n```\n")
	sw := d.Sweeps[0]
	plan := d.planSweep("x")
	cases := []struct {
		used sweepBudget
		want string
	}{
		{sweepBudget{points: MaxFileSweepPoints - 9}, "vary x: this sweep's 10 points bring the file's sweeps to 200001 points, more than the 200000"},
		{sweepBudget{values: MaxFileSweepValues - 19}, "vary x: this sweep's 20 values (points × columns) bring the file's sweeps to 2000001"},
		{sweepBudget{evals: MaxFileSweepEvals - 19}, "vary x: 10 points × 2 lines to re-evaluate bring the file's sweeps to 20000001 line evaluations"},
	}
	sw.plots = []sweepPlot{{names: []field{{"y", 0}}}}
	cases = append(cases, struct {
		used sweepBudget
		want string
	}{sweepBudget{plotted: MaxFileSweepPlotted - 9}, "vary x: 10 points on its plots are 10 plotted values, more than the 200000 a sweep's plots may draw (400000 for all the sweeps of a file, 399991 used before)"})
	for _, c := range cases {
		d.Errors = nil
		b := c.used
		if d.admit(&b, sw, plan) {
			t.Errorf("%+v: admitted", c.used)
		}
		if len(d.Errors) != 1 || !strings.Contains(d.Errors[0].Msg, c.want) || d.Errors[0].Pos.Line != 7 {
			t.Errorf("%+v: %v, want %s at line 7", c.used, d.Errors, c.want)
		}
		if b != c.used {
			t.Errorf("%+v: a refused sweep used the budget: %+v", c.used, b)
		}
	}
	d.Errors = nil
	b := sweepBudget{points: MaxFileSweepPoints - 10, values: MaxFileSweepValues - 20, evals: MaxFileSweepEvals - 20, plotted: MaxFileSweepPlotted - 10}
	if !d.admit(&b, sw, plan) || b != (sweepBudget{MaxFileSweepPoints, MaxFileSweepValues, MaxFileSweepEvals, MaxFileSweepPlotted}) {
		t.Errorf("a sweep that fits exactly was refused: %v, %+v", d.Errors, b)
	}
}

// FuzzSweep feeds hostile vary, show and plot lines, and several copies of the
// sweep, to a tiny calc: never a panic, every error inside the file, and
// no sweep (nor the file's sweeps together) over its bounds.
func FuzzSweep(f *testing.F) {
	f.Add("x from 0 m to 1 m in 9223372036854775807 steps", "y", "", uint8(1))
	f.Add("x from 0 m to 1 m in -1 steps", "y, y", "y", uint8(1))
	f.Add("x from 0 m to 1 m in 2.5 steps", "y", "", uint8(1))
	f.Add("x from 0 m to 1 m in 99999 steps", "y, y, y, y, y, y, y, y, y, y, y", "y, y", uint8(1))
	f.Add("x over [1 m, 2 m, 3 m]", "y [mm], y", "y limit x", uint8(3))
	f.Add("y over [1 m]", "x", "", uint8(1))
	f.Add("x from 0 m to 1 m in 40000 steps", "y", "y, y", uint8(6))
	f.Add("x over ["+strings.Repeat("1 m, ", 1000)+"2 m]", "y", strings.Repeat("y, ", 9)+"y", uint8(2))
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, vary, show, plot string, copies uint8) {
		if strings.ContainsAny(vary+show+plot, "\n\r`~") {
			return
		}
		block := "```sweep\nvary " + vary + "\nshow " + show + "\n"
		if plot != "" {
			block += "plot " + plot + "\n"
		}
		src := boundCalc + strings.Repeat(block+"```\n", int(copies%8)+1)
		d := Read(filepath.Join(dir, "f.calc.md"), []byte(src))
		d.Evaluate()
		for _, e := range d.Errors {
			if e.Pos.Line < 1 || e.Pos.Col < 1 || e.Pos.Off < 0 || e.Pos.Off > len(src) {
				t.Fatalf("error outside the file: %+v", e)
			}
		}
		var points, values, plotted int
		for _, sw := range d.Sweeps {
			n, cols := len(sw.Rows), len(sw.Show)+d.planSweep(sw.Var).checks
			if n > MaxSweepPoints || n*cols > MaxSweepValues || len(sw.plots) > MaxSweepPlots {
				t.Fatalf("vary %s: %d points × %d columns, %d plots evaluated", sw.Var, n, cols, len(sw.plots))
			}
			if len(d.Errors) == 0 && n != sw.points() {
				t.Fatalf("vary %s: %d rows for %d points", sw.Var, n, sw.points())
			}
			for _, pl := range sw.plots {
				if len(pl.names) > MaxPlotNames {
					t.Fatalf("vary %s: a plot of %d names", sw.Var, len(pl.names))
				}
				plotted += n * len(pl.names)
			}
			points, values = points+n, values+n*cols
		}
		if points > MaxFileSweepPoints || values > MaxFileSweepValues || plotted > MaxFileSweepPlotted {
			t.Fatalf("the file's sweeps evaluated %d points, %d values and %d plotted values", points, values, plotted)
		}
	})
}

// TestSweepEndKinds: the values between the ends of a sweep keep the kind
// of temperature or pressure the ends give (an absolute end and a
// kelvin-scale end give absolute values, a gauge end gauge values), and an
// absolute end with a difference end is an error at the second end.
func TestSweepEndKinds(t *testing.T) {
	calc := "```calc\nT_1 = 540 degC\nT_2 = T_1 + 10 Cdeg\np_g = 2 barg\np_2 = p_g + 1 bar\n```\n"
	d, got := readEval(t, calc+"```sweep\nvary T_1 from 500 K to 600 degC in 2 steps\nshow T_2\n```\n```sweep\nvary p_g from 1 MPa to 3 barg in 2 steps\nshow p_2\n```\n")
	if len(d.Errors) > 0 {
		t.Fatal(got)
	}
	for _, x := range d.Sweeps[0].X {
		if x.T != units.Abs {
			t.Errorf("T_1 = %g K swept as kind %d, want absolute", x.V, x.T)
		}
	}
	for _, x := range d.Sweeps[1].X {
		if x.P != units.GaugeP {
			t.Errorf("p_g = %g Pa swept as kind %d, want gauge", x.V, x.P)
		}
	}
	cases := map[string]string{
		"vary T_1 from 500 degC to 10 Cdeg in 2 steps\nshow T_2":       "s.calc.md:8:27: vary T_1: 500 degC is an absolute temperature but 10 Cdeg is a temperature difference; write both ends as readings or both as differences",
		"vary p_g from 1 barg to 3 barg - 1 barg in 2 steps\nshow p_2": "s.calc.md:8:25: vary p_g: 1 barg is a gauge pressure but 3 barg - 1 barg is a difference of gauge pressures",
	}
	for block, want := range cases {
		_, got := readEval(t, calc+"```sweep\n"+block+"\n```\n")
		if !strings.Contains(got, want) {
			t.Errorf("%s:\n got %s\nwant %s", block, got, want)
		}
	}
}

// TestSweepPlotLimitVaries: a plot's limit line was drawn at the main
// pass's value even when the limit depends on the varied input, so the
// line did not show the limit at any other point.
func TestSweepPlotLimitVaries(t *testing.T) {
	calc := "```calc\nx = 1 m\ny = 2 * x\ny_max = 3 * x\nz_max = 5 m\n```\n"
	_, got := readEval(t, calc+"```sweep\nvary x from 1 m to 2 m in 4 steps\nshow y\nplot y limit y_max\n```\n")
	want := "s.calc.md:10:14: plot y limit y_max: y_max depends on x, so it changes along the sweep and is not one line; show y_max and plot it with y: plot y, y_max"
	if !strings.Contains(got, want) {
		t.Errorf("got %s\nwant %s", got, want)
	}
	if d, got := readEval(t, calc+"```sweep\nvary x from 1 m to 2 m in 4 steps\nshow y\nplot y limit z_max\n```\n"); len(d.Errors) > 0 || len(d.Sweeps[0].SVGs) != 1 {
		t.Errorf("a fixed limit: %s", got)
	}
}

// TestSweepPlotManyNames: a 180 KB calc with one plot line of 30,000 names
// ran for half a minute (each name searched among 30,000 shown ones, each
// drawn); a plot line has at most MaxPlotNames names and a sweep at most
// MaxSweepPlots plot lines.
func TestSweepPlotManyNames(t *testing.T) {
	many := strings.TrimSuffix(strings.Repeat("y, ", 30000), ", ")
	_, got := readEval(t, boundCalc+"```sweep\nvary x over [1 m, 2 m]\nshow "+many+"\nplot "+many+"\n```\n")
	want := "s.calc.md:9:6: plot: 30000 names on one plot line; a plot shows at most 8, so write a second plot line"
	if !strings.Contains(got, want) {
		t.Errorf("got %.300s\nwant %s", got, want)
	}
	_, got = readEval(t, boundCalc+"```sweep\nvary x over [1 m, 2 m]\nshow y\n"+strings.Repeat("plot y\n", 17)+"```\n")
	want = "s.calc.md:25:6: plot: a sweep draws at most 16 plots; write a second sweep block for more"
	if !strings.Contains(got, want) {
		t.Errorf("got %.300s\nwant %s", got, want)
	}
	if d, got := readEval(t, boundCalc+"```sweep\nvary x over [1 m, 2 m]\nshow y\nplot y, y, y, y, y, y, y, y\n```\n"); len(d.Errors) > 0 {
		t.Errorf("eight names: %s", got)
	}
}

// TestSweepVariesDataValue: a value read from a data file is not written
// out on its line; varying it is the error of a computed name, which says
// how to write it out.
func TestSweepVariesDataValue(t *testing.T) {
	dir := writeTree(t, map[string]string{
		"d.yaml":    "m_out: 14 kg/s\n",
		"c.calc.md": "```calc\nd = yaml(\"d.yaml\")\nm_out = d.m_out\nQ = m_out * 4.2 kJ/(kg*K) * 10 K\n```\n```sweep\nvary m_out from 10 kg/s to 20 kg/s in 2 steps\nshow Q\n```\n",
	})
	d, err := ReadFile(filepath.Join(dir, "c.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	got := d.Errors.Format("c.calc.md", d.Src)
	want := "c.calc.md:7:6: vary m_out: m_out is computed on line 3 (m_out = d.m_out) and reads no input; a sweep varies an input, a name whose line is a value written out, such as m_out = "
	if !strings.Contains(got, want) {
		t.Errorf("got %s\nwant %s", got, want)
	}
}
