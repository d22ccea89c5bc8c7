package calcdoc

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// writeTree writes files under a fresh folder outside any repository.
func writeTree(t *testing.T, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for name, body := range files {
		p := filepath.Join(dir, filepath.FromSlash(name))
		os.MkdirAll(filepath.Dir(p), 0o755)
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

func TestDataFiles(t *testing.T) {
	dir := writeTree(t, map[string]string{
		"data/design.yaml": "p_main: 12.5 MPa\nT_main: 540 degC\neta_t: 0.87\nvendor: \"Northwind Turbines (fictional)\"\n",
		"data/cw.csv":      "T_cw [degC],p [kPa]\n10,4.5\n30,9.8\n",
		"c.calc.md": "```calc\nd = yaml(\"data/design.yaml\")\np_1 = d.p_main\nT_1 = d.T_main\ncw = csv(\"data/cw.csv\")\n" +
			"p_c = interp(cw, \"T_cw\", 20 degC, \"p\")\nv = d.vendor\n```\n",
	})
	d, err := ReadFile(filepath.Join(dir, "c.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format("c", d.Src))
	}
	p, _ := d.engine.Value("p_1")
	T, _ := d.engine.Value("T_1")
	pc, _ := d.engine.Value("p_c")
	if p.(units.Quantity).V != 12.5e6 || T.(units.Quantity).V != 813.15 || T.(units.Quantity).T != units.Abs {
		t.Errorf("yaml values %v %v", p, T)
	}
	if got := pc.(units.Quantity).V; got != 7150 { // midway between 4.5 and 9.8 kPa: exact arithmetic
		t.Errorf("interp = %g Pa", got)
	}
	if len(d.DataFiles) != 2 || d.DataFiles[0].Path != "data/design.yaml" || len(d.DataFiles[0].Hash) != 40 {
		t.Errorf("data files recorded: %+v", d.DataFiles)
	}
}

func TestDataFileErrors(t *testing.T) {
	cases := map[string]string{
		"a: [1, 2]\n":  "line 1: a: a value must be a number, a quantity such as 12.5 MPa, or text in quotes",
		"a: 1\na: 2\n": "line 2: a is already given on line 1",
		"a: 12 MPax\n": "unknown unit MPax; did you mean MPa?",
		"a: twelve\n":  `"twelve" is not a number with an optional unit (write text in quotes)`,
		"- 1\n- 2\n":   "a data file holds key: value lines",
		"a: [\n":       "not valid YAML",
		"a: 1e308 d\n": "d.yaml:1: a: 1e308 d is beyond the range of numbers in SI units",
	}
	for body, want := range cases {
		dir := writeTree(t, map[string]string{"d.yaml": body, "c.calc.md": "```calc\nd = yaml(\"d.yaml\")\n```\n"})
		d, _ := ReadFile(filepath.Join(dir, "c.calc.md"))
		if len(d.Errors) == 0 || !strings.Contains(d.Errors[0].Msg, want) {
			t.Errorf("%q: %v, want %q", body, d.Errors, want)
		}
	}
	dir := writeTree(t, map[string]string{"sub/c.calc.md": "```calc\nd = yaml(\"../../x.yaml\")\ne = csv(\"/etc/passwd\")\n```\n"})
	d, _ := ReadFile(filepath.Join(dir, "sub", "c.calc.md"))
	all := d.Errors.Format("c", d.Src)
	for _, want := range []string{"leaves the repository", "give a path relative to the calc file"} {
		if !strings.Contains(all, want) {
			t.Errorf("missing %q in\n%s", want, all)
		}
	}
}
