package examples

import (
	"crypto/sha256"
	"fmt"
	"path/filepath"
	"strconv"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/internal/archtest"
)

// resultLines evaluates every example and returns one line per result,
// "file name value unit", the value as strconv 'g' -1 (which round-trips,
// so equal lines mean equal bits), and per example one line with the
// SHA-256 of its rendered package (sweeps, diagrams and every printed
// number).
func resultLines(t *testing.T) []string {
	t.Helper()
	files, err := filepath.Glob("*.calc.md")
	if err != nil {
		t.Fatal(err)
	}
	var lines []string
	for _, f := range files {
		d := readExample(t, f)
		pkg, err := d.Render(calcdoc.RenderOptions{Engine: "test"})
		if err != nil {
			t.Fatalf("%s: render: %v", f, err)
		}
		for _, r := range pkg.Manifest.Results {
			lines = append(lines, fmt.Sprintf("%s %s %s %s", f, r.Name, strconv.FormatFloat(r.SI, 'g', -1, 64), r.Unit))
		}
		lines = append(lines, fmt.Sprintf("%s package-sha256 %x", f, sha256.Sum256(pkg.HTML)))
	}
	return lines
}

// TestResultsDump writes resultLines for TestSameBitsOnArm64 when it runs
// this test binary on arm64.
func TestResultsDump(t *testing.T) { archtest.Dump(t, resultLines) }

// TestSameBitsOnArm64: every result of every example, and every rendered
// package, is the same bits on arm64 (under qemu-user) as here.
func TestSameBitsOnArm64(t *testing.T) { archtest.SameOnArm64(t, resultLines) }
