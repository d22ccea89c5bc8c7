package calcdoc

import (
	"strings"
	"testing"
)

// diagramCalc is a small regenerative cycle (values common practice, not
// from a source): the states a diagram block below it can name.
const diagramCalc = "```calc\n" +
	"st_1 = water(10 MPa, 500 degC)\n" +
	"st_b = water(1 MPa, st_1.s)\n" +
	"st_2 = water(10 kPa, st_1.s)\n" +
	"st_3 = water(10 kPa, 0)\n" +
	"st_4 = water(1 MPa, st_3.s)\n" +
	"st_5 = water(1 MPa, 0)\n" +
	"st_6 = water(10 MPa, st_5.s)\n" +
	"st_r = fluid(\"isopentane\", 1 MPa, 400 K)\n" +
	"n = 3\n" +
	"```\n"

func diagramDoc(t *testing.T, block string) *Doc {
	t.Helper()
	src := "---\ntitle: t\n---\n" + diagramCalc + "```diagram\n" + block + "\n```\n"
	d := Read("t.calc.md", []byte(src))
	d.Evaluate()
	return d
}

// TestDiagramErrors: each bad diagram line gives one exact error at its
// place (line 1 is the first line of the diagram block).
func TestDiagramErrors(t *testing.T) {
	first := 4 + strings.Count(diagramCalc, "\n") + 1 // lines before the block's first line
	for _, c := range []struct{ name, block, want string }{
		{"unknown kind", "P-v: st_1, st_2", "1:1: write a diagram line as T-s: st_1, st_2, ... or h-s: st_1, st_2, ..., and a branch of the cycle above it as branch: st_1, st_2, ... or its quality lines as quality: 0.2, 0.4, ..."},
		{"one state", "T-s: st_1", "1:1: a T-s line needs at least two states"},
		{"branch first", "branch: st_b, st_5", "1:1: a branch line belongs to the T-s or h-s line above it in the same block; write that line first"},
		{"branch of one state", "T-s: st_1, st_2, st_3, st_4\nbranch: st_b", "2:1: a branch line needs at least two states"},
		{"not a state", "T-s: st_1, n, st_3", "1:12: diagram: n is not a state; name states made with water(...) or fluid(...)"},
		{"unknown name", "T-s: st_1, st_9, st_3", "1:12: diagram: st_9 is not a state; name states made with water(...) or fluid(...)"},
		{"two fluids", "T-s: st_1, st_2, st_r", "1:18: diagram: st_r is isopentane, but the cycle is water; a diagram shows one fluid"},
		{"branch of another fluid", "T-s: st_1, st_2, st_3, st_4\nbranch: st_b, st_r", "2:15: diagram: st_r is isopentane, but the cycle is water; a diagram shows one fluid"},
	} {
		t.Run(c.name, func(t *testing.T) {
			d := diagramDoc(t, c.block)
			if len(d.Errors) == 0 {
				t.Fatalf("no error; want %q", c.want)
			}
			e := d.Errors[0]
			if got := sprintf("%d:%d: %s", e.Pos.Line-first+1, e.Pos.Col, e.Msg); got != c.want {
				t.Errorf("got  %s\nwant %s", got, c.want)
			}
		})
	}
}

// TestDiagramBranches: a branch line draws an open dashed path from its
// first state to its last, along the isobar where it exchanges heat, and
// labels each state once.
func TestDiagramBranches(t *testing.T) {
	d := diagramDoc(t, "T-s: st_1, st_b, st_2, st_3, st_4, st_5, st_6\nbranch: st_b, st_5")
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format("t.calc.md", nil))
	}
	dg := d.diagramBlocks[0].diagrams[0]
	if len(dg.Branches) != 1 || len(dg.Branches[0]) != 2 {
		t.Fatalf("branches %+v", dg.Branches)
	}
	svg := string(dg.SVG)
	if n := strings.Count(svg, `class="series branch"`); n != 1 {
		t.Fatalf("%d branch series, want 1", n)
	}
	for _, name := range []string{"st_b", "st_5"} {
		if n := strings.Count(svg, "<title>"+name+"</title>"); n != 1 {
			t.Errorf("%s is labelled %d times, want once", name, n)
		}
	}
	if n := strings.Count(svg, ">branch</text>"); n != 1 {
		t.Errorf("the legend names the branch %d times, want once", n)
	}
	// The path itself: open (first point st_b, last st_5) and, since the
	// bleed condenses at 1 MPa, running through the dome along the isobar.
	states, _ := d.diagramStates(dg.Branches[0], "")
	path, err := processPath(states, false)
	if err != nil {
		t.Fatal(err)
	}
	a, b := path[0], path[len(path)-1]
	if a.S != states[0].s || b.S != states[1].s || a.T != states[0].T || b.T != states[1].T {
		t.Errorf("the branch runs from (%g, %g) to (%g, %g), not from st_b to st_5", a.S, a.T, b.S, b.T)
	}
	if len(path) < 10 {
		t.Errorf("the branch has %d points; heat exchange follows the isobar", len(path))
	}
	for _, c := range path[1 : len(path)-1] {
		if c.T > states[0].T+1e-9 || c.T < states[1].T-1e-9 {
			t.Errorf("a point of the branch at %g K lies outside [%g, %g] K", c.T, states[1].T, states[0].T)
		}
	}
	// The same states as the main loop with two branches of one block
	// give the same bytes twice.
	again := diagramDoc(t, "T-s: st_1, st_b, st_2, st_3, st_4, st_5, st_6\nbranch: st_b, st_5")
	if string(again.diagramBlocks[0].diagrams[0].SVG) != svg {
		t.Error("the same diagram drew different bytes")
	}
}
