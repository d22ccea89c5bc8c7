package register

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/audit"
	"github.com/vouchcalc/vouch/internal/testkit"
)

// engine is the engine version the tests register with.
const engine = "0.1.0-test"

var needTool = testkit.NeedTool

// tree is a scratch repository of generated calcs (internal/testkit) that
// ignores packages.
type tree = testkit.Repo

func newTree(t testing.TB) *tree {
	t.Helper()
	r := testkit.NewRepo(t)
	r.Write(".gitignore", "*.html\n*.manifest.json\n")
	return r
}

// genCalc is a generated feed-pump calc of a fictional plant; kind adds a
// failing check, a data file or an error.
func genCalc(i int, kind string) string {
	extra := ""
	switch kind {
	case "failing":
		extra = "check P_pump < 1 kW                 // deliberately failing check\n"
	case "data":
		extra = "curve = csv(\"../data/pump-curve.csv\")  // pump curve (fictional)\neta_c = interp(curve, \"m_dot\", m_dot, \"eta\")\n"
	case "broken":
		extra = "P_bad = P_pump + 3 kg               // deliberate unit error\n"
	}
	return fmt.Sprintf(`---
title: Feed pump %d power (fictional test plant)
number: FP-%03d
project: Test plant (fictional)
revision: A
people:
  preparer: P. Writer <preparer@example.com>
  checker: C. Reader <checker@example.com>
summary: [P_pump]
---
# Feed pump %d

`+"```calc"+`
p_in = 8 kPa                         // pump suction pressure
p_out = %.1f MPa                     // pump discharge pressure
m_dot = %d kg/s                      // feedwater flow
st_in = water(p_in, 0)               // saturated liquid at suction
w_p [kJ/kg] = st_in.v * (p_out - p_in) / 80 %%
P_pump [MW] = m_dot * w_p            // pump power
check P_pump < 5 MW                  // motor frame limit (fictional)
%s`+"```"+`
`, i, i, i, 10+0.1*float64(i), 150+i, extra)
}

// pumpCurve is the data file the "data" calcs read.
const pumpCurve = "m_dot [kg/s],eta\n100,0.70\n200,0.80\n300,0.78\n"

// renderBeside renders a calc from the work tree and writes its package and
// manifest file beside it, as vouch render does.
func renderBeside(t testing.TB, calc string) string {
	t.Helper()
	d, err := calcdoc.ReadFile(calc)
	if err != nil || len(d.Errors) > 0 {
		t.Fatalf("%v %v", err, d.Errors)
	}
	st, err := audit.Provenance(d, engine)
	if err != nil {
		t.Fatal(err)
	}
	p, err := d.Render(calcdoc.RenderOptions{Engine: engine, Stamp: st})
	if err != nil {
		t.Fatal(err)
	}
	pkg := strings.TrimSuffix(calc, ".calc.md") + ".html"
	writePackage(t, pkg, p)
	return pkg
}

func writePackage(t testing.TB, pkg string, p *calcdoc.Package) {
	t.Helper()
	file, err := audit.ManifestFile(p.Manifest)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(audit.ManifestPath(pkg), file, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(pkg, p.HTML, 0o644); err != nil {
		t.Fatal(err)
	}
}

// signAsPreparer signs a package with a fresh key.
func signAsPreparer(t testing.TB, pkg string) {
	t.Helper()
	needTool(t, "ssh-keygen")
	key := filepath.Join(t.TempDir(), "id")
	if out, err := exec.Command("ssh-keygen", "-q", "-t", "ed25519", "-N", "", "-C", "preparer@example.com", "-f", key).CombinedOutput(); err != nil {
		t.Fatalf("ssh-keygen: %v\n%s", err, out)
	}
	signed, rep, err := audit.Sign(pkg, audit.SignOptions{VerifyOptions: audit.VerifyOptions{Engine: engine}, Role: "preparer", Key: key})
	if err != nil {
		t.Fatalf("sign: %v\n%v", err, rep)
	}
	os.WriteFile(audit.ManifestPath(pkg), signed.ManifestFile, 0o644)
	os.WriteFile(pkg, signed.HTML, 0o644)
}
