package calcdoc

import (
	"path/filepath"
	"slices"
	"testing"
)

// TestManifestRecordsUses: the manifest lists the property functions and
// fluids a calc called, including inside solve, and nothing it did not call.
func TestManifestRecordsUses(t *testing.T) {
	cases := []struct {
		name, body string
		want       []string
	}{
		{"none", "a = 2 m\nb = a * 3", nil},
		{"water and saturation", "s = water(1 MPa, 500 K)\nq = water_sat(1 MPa)\nh = s.h - q.hf", []string{"water", "water_sat"}},
		{"organic fluid", "f = fluid(\"Isopentane\", 1 bar, 300 K)\nh = f.h", []string{"fluid", "fluid:isopentane"}},
		{"gauge pressure", "p = 2 barg + 50 kPa", []string{"gauge units"}},
		{"inside solve", "T = solve(water_sat(T).p == 1 MPa, 400 K, 500 K)", []string{"water_sat"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			d := Read(filepath.Join(t.TempDir(), "t.calc.md"), []byte("```calc\n"+c.body+"\n```\n"))
			d.Evaluate()
			if len(d.Errors) > 0 {
				t.Fatalf("errors:\n%s", d.Errors.Format("t.calc.md", d.Src))
			}
			m, err := d.Manifest("test")
			if err != nil {
				t.Fatal(err)
			}
			if !slices.Equal(m.Uses, c.want) {
				t.Errorf("uses %q, want %q", m.Uses, c.want)
			}
		})
	}
}
