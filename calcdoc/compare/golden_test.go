package compare

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden report")

// TestReportGolden holds the report's bytes: one pair within tolerance
// under a mapped name, one outside, one temperature, and a result of the
// original the alternate lacks.
func TestReportGolden(t *testing.T) {
	alt := alternate("compare: {maps: {W: P_shaft}, tolerances: {W: 1 %}}\n", "W = 1008 kW", "eta_p = 0.79", "T_out = 150.5 degC")
	got, err := run(t, alt).Report()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join("testdata", "report.html")
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("the report differs from %s; if the change is intended, run go test ./calcdoc/compare -update and review the diff", path)
	}
}
