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
