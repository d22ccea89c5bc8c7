package calcdoc

import (
	"strings"
	"testing"
)

const statesCalc = "```calc\nst_1 = water(10 MPa, 500 degC)\nst_2 = water(10 kPa, 0.9)\nm_dot = 100 kg/s\nh = st_1.h\n```\n\n```states\n%s\n```\n"

// TestStatesErrors: each wrong line of a states block is an error at the
// name, saying what would be right.
func TestStatesErrors(t *testing.T) {
	cases := []struct{ block, want string }{
		{"st_3", "9:1: states: st_3 is not defined in the calc; give the name of a state made with water(...) or fluid(...)"},
		{"h", "9:1: states: h is not a state; list states made with water(...) or fluid(...)"},
		{"st_1, h", "9:7: states: h is not a mass flow; after a state's name give the name of its mass flow, in kg/s or lb/h"},
		{"st_1, m_dt", "9:7: states: m_dt is not defined in the calc; give the name of a mass flow such as m_dot"},
		{"st_1, m_dot, h", "9:1: write a states line as a state's name, optionally with its mass flow: st_1 or st_1, m_dot"},
	}
	for _, c := range cases {
		src := strings.Replace(statesCalc, "%s", c.block, 1)
		d := Read("s.calc.md", []byte(src))
		d.Evaluate()
		if len(d.Errors) == 0 {
			t.Errorf("%q: no error, want %s", c.block, c.want)
			continue
		}
		e := d.Errors[0]
		if got := sprintf("%d:%d: %s", e.Pos.Line, e.Pos.Col, e.Msg); got != c.want {
			t.Errorf("%q:\n got %s\nwant %s", c.block, got, c.want)
		}
	}
}

// TestStatesTable: the table shows each state's p, T, h, s and x in the
// display system, a dash for the quality of a single-phase state, and the
// mass flow where one is given.
func TestStatesTable(t *testing.T) {
	for _, c := range []struct {
		display string
		want    []string
	}{
		{"SI", []string{"[MPa]", "[°C]", "[kJ/kg]", "<td class=\"num\">10.00</td><td class=\"num\">500.0</td><td class=\"num\">3375</td>",
			"<td class=\"num\">—</td><td class=\"num\">100.0</td><td>vapour</td>", "<td class=\"num\">0.9000</td><td class=\"num\">—</td>"}},
		{"US", []string{"[psia]", "[°F]", "[BTU/lb]", "<td class=\"num\">1450</td><td class=\"num\">932.0</td><td class=\"num\">1451</td>",
			"793", "700</td><td>vapour", "[BTU/(lb·°F)]"}},
	} {
		src := "---\ndisplay: " + c.display + "\n---\n" + strings.Replace(statesCalc, "%s", "st_1, m_dot\nst_2", 1)
		d := Read("s.calc.md", []byte(src))
		d.Evaluate()
		if len(d.Errors) > 0 {
			t.Fatal(d.Errors.Format(d.Path, d.Src))
		}
		got := d.stateTableHTML(d.stateTables[0])
		for _, w := range c.want {
			if !strings.Contains(got, w) {
				t.Errorf("%s: table lacks %q:\n%s", c.display, w, got)
			}
		}
	}
}

// TestDiagramOfStates: `T-s: states` draws the states of the states block
// above the diagram; without one it is an error at the word.
func TestDiagramOfStates(t *testing.T) {
	calc := "```calc\nst_1 = water(10 MPa, 500 degC)\nst_2 = water(10 kPa, 0.9)\nst_3 = water(10 kPa, 0)\n```\n\n"
	ok := calc + "```states\nst_1\nst_2\nst_3\n```\n\n```diagram\nT-s: states\n```\n"
	d := Read("s.calc.md", []byte(ok))
	d.Evaluate()
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format(d.Path, d.Src))
	}
	dg := d.diagramBlocks[0].diagrams[0]
	var names []string
	for _, f := range dg.States {
		names = append(names, f.text)
	}
	if strings.Join(names, ",") != "st_1,st_2,st_3" || len(dg.SVG) == 0 {
		t.Errorf("diagram states %v, SVG %d bytes; want st_1,st_2,st_3 drawn", names, len(dg.SVG))
	}
	bad := calc + "```diagram\nT-s: states\n```\n\n```states\nst_1\nst_2\n```\n"
	d = Read("s.calc.md", []byte(bad))
	d.Evaluate()
	want := "8:6: T-s: states draws the states of a states block above this diagram, which lists at least two; write that block first, or list the states here"
	if len(d.Errors) == 0 || sprintf("%d:%d: %s", d.Errors[0].Pos.Line, d.Errors[0].Pos.Col, d.Errors[0].Msg) != want {
		t.Errorf("errors %v, want %s", d.Errors, want)
	}
}
