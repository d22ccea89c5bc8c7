package calcdoc

import (
	"path/filepath"
	"strings"
	"testing"
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
			"vary wf2: wf2 is computed on line 10 (wf2 = wf) from the inputs wf; a sweep varies an input, a name whose line is a value written out: vary wf"},
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
