// Package examples holds the worked calc files and their tests: every
// example evaluates without errors or failed checks and renders, and the
// key results of the worked cycle calcs agree with an independent
// recomputation in recompute/recompute.py (python3-iapws).
package examples

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/units"
)

// python is Debian's interpreter, which has python3-iapws; the python3 on
// PATH may be another one.
const python = "/usr/bin/python3"

// recomputeTol is the largest relative difference allowed between vouch and
// the recomputation: both use IAPWS-IF97, so only the inverse-function
// iterations and the python library's backward equations separate them.
const recomputeTol = 5e-4

// TestExamplesRun evaluates every example: no errors, no failed check, and
// a package that renders.
func TestExamplesRun(t *testing.T) {
	files, err := filepath.Glob("*.calc.md")
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < 8 {
		t.Fatalf("found %d examples, want at least 8", len(files))
	}
	for _, f := range files {
		t.Run(f, func(t *testing.T) {
			d := readExample(t, f)
			if d.Failed() {
				for _, c := range d.Checks() {
					if !c.Outcome.Pass {
						t.Errorf("%s:%d: check failed", f, c.Stmt.Line)
					}
				}
			}
			pkg, err := d.Render(calcdoc.RenderOptions{Engine: "test"})
			if err != nil {
				t.Fatalf("render: %v", err)
			}
			if worked(f) && !bytes.Contains(pkg.HTML, []byte("<svg")) {
				t.Errorf("%s: the package has no T-s diagram", f)
			}
		})
	}
}

// TestExamplesRecompute compares the worked cycle calcs' key results with
// recompute.py's. It skips when python3-iapws is missing, unless CI is set.
func TestExamplesRecompute(t *testing.T) {
	if err := exec.Command(python, "-c", "import iapws").Run(); err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("%s cannot import iapws (install python3-iapws): %v", python, err)
		}
		t.Skipf("%s cannot import iapws: %v", python, err)
	}
	var stderr bytes.Buffer
	cmd := exec.Command(python, filepath.Join("recompute", "recompute.py"))
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("recompute.py: %v\n%s", err, stderr.String())
	}
	var want map[string]map[string]float64
	if err := json.Unmarshal(out, &want); err != nil {
		t.Fatalf("recompute.py output: %v", err)
	}
	files, err := filepath.Glob("*.calc.md")
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range files {
		name := strings.TrimSuffix(f, ".calc.md")
		if _, ok := want[name]; worked(f) && !ok {
			t.Errorf("recompute.py does not recompute %s", name)
		}
	}
	names := make([]string, 0, len(want))
	for name := range want {
		names = append(names, name)
	}
	sort.Strings(names)
	for _, name := range names {
		t.Run(name, func(t *testing.T) {
			got := quantities(readExample(t, name+".calc.md"))
			keys := make([]string, 0, len(want[name]))
			for k := range want[name] {
				keys = append(keys, k)
			}
			sort.Strings(keys)
			for _, k := range keys {
				w := want[name][k]
				g, ok := got[k]
				if !ok {
					t.Errorf("%s: vouch has no quantity %s", name, k)
					continue
				}
				if dev := math.Abs(g/w - 1); dev > recomputeTol {
					t.Errorf("%s: %s = %.8g, recomputed %.8g: off by %.4f %%", name, k, g, w, 100*dev)
				} else {
					t.Logf("%s: %s = %.6g, recomputed %.6g (%.1e)", name, k, g, w, dev)
				}
			}
		})
	}
}

// worked reports whether a file is one of the worked cycle calcs, named
// a-… to h-… after the cycle library's order.
func worked(file string) bool {
	m, _ := filepath.Match("[a-h]-*.calc.md", file)
	return m
}

// readExample evaluates one example and fails the test on errors.
func readExample(t *testing.T, file string) *calcdoc.Doc {
	t.Helper()
	d, err := calcdoc.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Errors) > 0 {
		t.Fatalf("%s has errors:\n%s", file, d.Errors.Format(file, d.Src))
	}
	return d
}

// quantities returns a calc's quantities in SI by name.
func quantities(d *calcdoc.Doc) map[string]float64 {
	out := map[string]float64{}
	for _, it := range d.Results() {
		if q, ok := it.Outcome.Value.(units.Quantity); ok {
			out[it.Stmt.Name] = q.V
		}
	}
	return out
}
