package examples

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/units"
)

// uncertCycle is the cycle of recompute/uncert_crosscheck.py, as a calc.
const uncertCycle = "```calc\n" +
	"p_1 = 12 MPa ± 0.05 MPa\n" +
	"T_1 = 540 degC ± 1 K (k=2)\n" +
	"p_c = 8 kPa ± 0.1 kPa\n" +
	"eta_t = 0.85 ± 0.01 rect\n" +
	"m_dot = 100 kg/s ± 0.5 kg/s\n" +
	"corr(p_1, p_c) = 0.3\n" +
	"st_1 = water(p_1, T_1)\n" +
	"h_2 = st_1.h - eta_t * (st_1.h - water(p_c, st_1.s).h)\n" +
	"st_3 = water(p_c, 0)\n" +
	"st_4 = water(p_1, st_3.s)\n" +
	"w_net = (st_1.h - h_2) - (st_4.h - st_3.h)\n" +
	"eta = w_net / (st_1.h - st_4.h)\n" +
	"P = m_dot * w_net\n" +
	"```\n"

// uncertTol is the relative difference allowed between vouch's combined
// standard uncertainties and the script's: both are first-order GUM
// figures from central differences, but python3-iapws computes the
// isentropic states with IF97's backward equations and its own iterations,
// whose small inconsistencies could show in the differences (common
// practice, no source: 1e-4; the two agree to about six digits).
const uncertTol = 1e-4

// TestUncertaintyCrossCheck compares the propagated uncertainty of a steam
// cycle's efficiency and power with an independent recomputation by
// python3-iapws and finite differences (recompute/uncert_crosscheck.py).
// It skips when python3-iapws is missing, unless CI is set.
func TestUncertaintyCrossCheck(t *testing.T) {
	if err := exec.Command(python, "-c", "import iapws").Run(); err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("%s cannot import iapws (install python3-iapws): %v", python, err)
		}
		t.Skipf("%s cannot import iapws: %v", python, err)
	}
	var stderr bytes.Buffer
	cmd := exec.Command(python, filepath.Join("recompute", "uncert_crosscheck.py"))
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("uncert_crosscheck.py: %v\n%s", err, stderr.String())
	}
	var want map[string][2]float64
	if err := json.Unmarshal(out, &want); err != nil {
		t.Fatalf("uncert_crosscheck.py output: %v", err)
	}
	d := calcdoc.Read(filepath.Join(t.TempDir(), "u.calc.md"), []byte(uncertCycle))
	d.Evaluate()
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format("u.calc.md", d.Src))
	}
	for _, name := range []string{"eta", "P"} {
		var it *calcdoc.Item
		for _, r := range d.Results() {
			if r.Stmt.Name == name {
				it = r
			}
		}
		y := it.Outcome.Value.(units.Quantity).V
		u, _, _, ok := d.StdUnc(it)
		if !ok {
			t.Fatalf("%s has no uncertainty", name)
		}
		w := want[name]
		if math.Abs(y-w[0]) > recomputeTol*math.Abs(w[0]) {
			t.Errorf("%s = %.6g, python3-iapws %.6g", name, y, w[0])
		}
		if math.Abs(u-w[1]) > uncertTol*w[1] {
			t.Errorf("u(%s) = %.6g, python3-iapws by finite differences %.6g (relative %.2g)", name, u, w[1], math.Abs(u-w[1])/w[1])
		}
		t.Logf("%s: vouch %.6g ± %.6g, python3-iapws %.6g ± %.6g", name, y, u, w[0], w[1])
	}
}
