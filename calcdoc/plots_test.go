package calcdoc

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/svgplot"
)

// TestExampleDiagramsLayout: in every diagram and sweep plot of every
// example, each point and label lies inside the plot frame and no two
// labels overlap.
func TestExampleDiagramsLayout(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join("..", "examples", "*.calc.md"))
	plots, isobars := 0, 0
	for _, f := range files {
		src, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		d := Read(f, src)
		d.Evaluate()
		if len(d.Errors) > 0 {
			t.Fatalf("%s: %s", f, d.Errors.Format(f, src))
		}
		var svgs [][]byte
		for _, blk := range d.diagramBlocks {
			for _, dg := range blk.diagrams {
				svgs = append(svgs, dg.SVG)
				isobars += strings.Count(string(dg.SVG), "\u2009")
			}
		}
		for _, sw := range d.Sweeps {
			svgs = append(svgs, sw.SVGs...)
		}
		for i, svg := range svgs {
			plots++
			if err := svgplot.CheckLayout(svg); err != nil {
				t.Errorf("%s, plot %d: %v", filepath.Base(f), i+1, err)
			}
		}
	}
	t.Logf("%d plots, %d isobar labels", plots, isobars)
	if plots < 20 || isobars < 20 {
		t.Errorf("%d plots and %d isobar labels checked; the examples have more", plots, isobars)
	}
}

// TestDiagramIsobarLabels: each heat-exchange isobar is labelled once with
// its pressure in the unit of the calc line that gives it.
func TestDiagramIsobarLabels(t *testing.T) {
	src := "```calc\np_hi [MPa] = 10 MPa\np_lo [kPa] = 10 kPa\n" +
		"st_1 = water(p_hi, 500 degC)\nst_2 = water(p_lo, st_1.s)\nst_3 = water(p_lo, 0)\nst_4 = water(p_hi, st_3.s)\n```\n" +
		"```diagram\nT-s: st_1, st_2, st_3, st_4\nquality: 0.25, 0.5\n```\n"
	d := evalSrc(t, src)
	svg := string(d.diagramBlocks[0].diagrams[0].SVG)
	_, labels, ok := strings.Cut(svg, `class="path-labels"`)
	if !ok {
		t.Fatal("no path labels")
	}
	for _, want := range []string{">10\u2009MPa</text>", ">10\u2009kPa</text>", `x</tspan> = 0.25</text>`, `x</tspan> = 0.5</text>`} {
		if n := strings.Count(labels, want); n != 1 {
			t.Errorf("%q appears %d times, want once", want, n)
		}
	}
	if n := strings.Count(svg, `class="series dashed"`); n != 2 {
		t.Errorf("%d quality lines, want 2", n)
	}
	if err := svgplot.CheckLayout([]byte(svg)); err != nil {
		t.Error(err)
	}
}

// TestQualityLinesInsideDome: a quality line runs between the saturated
// liquid and vapour at each temperature, at the fraction x of the way.
func TestQualityLinesInsideDome(t *testing.T) {
	d := diagramDoc(t, "T-s: st_1, st_2, st_3, st_6\nquality: 0.3")
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format("t.calc.md", nil))
	}
	p := &svgplot.Plot{}
	dome := []props.CurvePoint{{T: 300, S: 1000}, {T: 400, S: 2000}, {T: 400, S: 5000}, {T: 300, S: 8000}}
	d.qualityLines(p, []float64{0.3}, dome, diagramY("T-s"))
	got := p.Series[0]
	want := []float64{(1000 + 0.3*7000) / 1000, (2000 + 0.3*3000) / 1000}
	for i, w := range want {
		if diff := got.X[i] - w; diff > 1e-12 || diff < -1e-12 {
			t.Errorf("point %d: s = %g, want %g", i, got.X[i], w)
		}
	}
	if T := 400.0; got.Y[1] != T-273.15 {
		t.Errorf("T = %g °C, want %g", got.Y[1], 400-273.15)
	}
}

// TestDiagramQualityErrors: quality lines take numbers between 0 and 1,
// below a T-s or h-s line.
func TestDiagramQualityErrors(t *testing.T) {
	for block, want := range map[string]string{
		"quality: 0.5":                        "a quality line belongs to the T-s or h-s line above it in the same block; write that line first",
		"T-s: st_1, st_2, st_3\nquality: 1.2": "quality: 1.2 is not a number between 0 and 1; write quality: 0.2, 0.4, 0.6, 0.8",
		"T-s: st_1, st_2, st_3\nquality: a":   "quality: a is not a number between 0 and 1; write quality: 0.2, 0.4, 0.6, 0.8",
		"T-s: st_1, st_2, st_3\nquality:":     "write the qualities to draw: quality: 0.2, 0.4, 0.6, 0.8",
	} {
		d := diagramDoc(t, block)
		if len(d.Errors) != 1 || d.Errors[0].Msg != want {
			t.Errorf("%q: errors %v, want %q", block, d.Errors, want)
		}
	}
}

// TestSweepPlotSeveral: plot a, b draws both on one axis with markers;
// names of different dimensions are an error at the second name.
func TestSweepPlotSeveral(t *testing.T) {
	d := evalSrc(t, sweepCalc+"```sweep\nvary p_1 from 4 MPa to 20 MPa in 4 steps\nshow w, h_2s, x_2\nplot w, h_2s\n```\n")
	sw := d.Sweeps[0]
	if len(sw.SVGs) != 1 {
		t.Fatalf("%d plots, want 1", len(sw.SVGs))
	}
	svg := string(sw.SVGs[0])
	if n := strings.Count(svg, `class="series marks"`); n != 2 {
		t.Errorf("%d marked series, want 2", n)
	}
	if !strings.Contains(svg, `<text class="plot-title"`) || !strings.Contains(svg, `<tspan baseline-shift="sub" font-size="75%">2s</tspan>`) {
		t.Error("the title does not typeset h_2s with a subscript")
	}
	src := sweepCalc + "```sweep\nvary p_1 from 4 MPa to 20 MPa in 4 steps\nshow w, x_2\nplot w, x_2\n```\n"
	bad := Read("s.calc.md", []byte(src))
	bad.Evaluate()
	want := "plot w, x_2: w is specific enthalpy but x_2 is dimensionless; one plot shows values of one dimension, so write them on two plot lines"
	if len(bad.Errors) != 1 || bad.Errors[0].Msg != want {
		t.Fatalf("errors %s, want %q", bad.Errors.Format("s.calc.md", nil), want)
	}
	if col := bad.Errors[0].Pos.Col; col != len("plot w, ")+1 {
		t.Errorf("error at column %d, want %d (the second name)", col, len("plot w, ")+1)
	}
}

// TestSweepPlotLimit: plot v limit v_max draws the value of v_max as a
// labelled dashed line; an unknown limit or one of another dimension is
// an error at the limit's name.
func TestSweepPlotLimit(t *testing.T) {
	calc := strings.Replace(sweepCalc, "```\n", "x_min = 0.78\nw_max [kJ/kg] = 1500 kJ/kg\n```\n", 1)
	d := evalSrc(t, calc+"```sweep\nvary p_1 from 4 MPa to 20 MPa in 4 steps\nshow x_2\nplot x_2 limit x_min\n```\n")
	svg := string(d.Sweeps[0].SVGs[0])
	if !strings.Contains(svg, `class="series dashed"`) || !strings.Contains(svg, `min</tspan> = 0.78</text>`) {
		t.Errorf("no labelled limit line in\n%s", svg)
	}
	for plot, want := range map[string]string{
		"plot x_2 limit x_9":   "plot limit x_9: the calc does not define x_9",
		"plot x_2 limit w_max": "plot x_2 limit w_max: x_2 is dimensionless but w_max is specific enthalpy",
		"plot x_2 limit a, b":  "write the limit as one name: plot NAME limit LIMIT_NAME",
	} {
		bad := Read("s.calc.md", []byte(calc+"```sweep\nvary p_1 from 4 MPa to 20 MPa in 4 steps\nshow x_2\n"+plot+"\n```\n"))
		bad.Evaluate()
		if len(bad.Errors) != 1 || bad.Errors[0].Msg != want {
			t.Errorf("%s: errors %s, want %q", plot, bad.Errors.Format("s.calc.md", nil), want)
		}
	}
}
