package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestCompareCommand: an alternate calc within tolerance exits 0, one
// outside exits 3, and the report is the same bytes on every run.
func TestCompareCommand(t *testing.T) {
	dir := t.TempDir()
	write := func(name, src string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	orig := write("fp.calc.md", testkit.SignCalc)
	alt := func(eff string) string {
		return write("alt.calc.md", "---\ntitle: Feed pump, alternate (fictional)\ncompare: {maps: {P: P_pump}}\n---\n```calc\n"+
			"P [MW] = 213.2 kg/s * 1.008e-3 m^3/kg * (12.5 MPa - 8 kPa) / "+eff+"\n```\n")
	}
	var reports [2][]byte
	for i := range reports {
		var out, errb bytes.Buffer
		report := filepath.Join(dir, "report.html")
		if code := run([]string{"compare", orig, alt("80 %"), "-o", report}, &out, &errb); code != exitOK {
			t.Fatalf("within tolerance: exit %d\n%s%s", code, out.String(), errb.String())
		}
		if !strings.Contains(out.String(), "PASS  P_pump = P: ") {
			t.Errorf("output:\n%s", out.String())
		}
		reports[i], _ = os.ReadFile(report)
	}
	if len(reports[0]) == 0 || !bytes.Equal(reports[0], reports[1]) {
		t.Error("the report differs between two runs")
	}
	var out, errb bytes.Buffer
	if code := run([]string{"compare", orig, alt("78 %")}, &out, &errb); code != exitFailed || !strings.Contains(out.String(), "1 pair, 0 within tolerance, 1 outside") {
		t.Fatalf("outside tolerance: exit %d\n%s%s", code, out.String(), errb.String())
	}
	if code := run([]string{"compare", orig}, &out, &errb); code != exitUsage {
		t.Errorf("one file: exit %d", code)
	}
}
