package audit

import (
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// checkScript is the script docs/REFERENCE.md gives for checking a package
// without vouch.
var checkScript = filepath.Join("..", "..", "docs", "check-package.sh")

// runCheckScript runs the script and returns its output and whether it
// exited 0.
func runCheckScript(t *testing.T, args ...string) (string, bool) {
	t.Helper()
	needTool(t, "python3")
	needTool(t, "ssh-keygen")
	out, err := exec.Command("sh", append([]string{checkScript}, args...)...).CombinedOutput()
	if _, exit := err.(*exec.ExitError); err != nil && !exit {
		t.Fatal(err)
	}
	return string(out), err == nil
}

// TestCheckScriptOnSignedPackage: the documented script, with python3 and
// ssh-keygen only, finds the manifest digest vouch computes and verifies
// each signature of a signed package, at its signing time; a revoked key,
// another person's signers file, or an edited manifest fail it.
func TestCheckScriptOnSignedPackage(t *testing.T) {
	r := calcRepo(t)
	prep, chk := newKey(t, "ed25519"), newKey(t, "rsa")
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	signers := allowedSigners(t, preparerEmail, prep, checkerEmail, chk)
	signPkg(t, pkg, "preparer", prep, signers)
	signPkg(t, pkg, "checker", chk, signers)
	m, _ := ManifestOf(mustRead(t, pkg))
	digest, _ := m.Digest()
	for _, file := range []string{pkg, ManifestPath(pkg)} {
		out, ok := runCheckScript(t, file, signers)
		if !ok || !strings.Contains(out, "manifest digest (sha256): "+digest) ||
			!strings.Contains(out, "ok   preparer: Good \"calc-package@vouch\" signature for "+preparerEmail) ||
			!strings.Contains(out, "ok   checker: Good") {
			t.Fatalf("%s:\n%s", filepath.Base(file), out)
		}
	}
	revoked := writeTemp(t, "revoked_keys", chk.pub+"\n")
	if out, ok := runCheckScript(t, pkg, signers, revoked); ok || !strings.Contains(out, "FAIL checker") {
		t.Errorf("a revoked key passed:\n%s", out)
	}
	if out, ok := runCheckScript(t, pkg, allowedSigners(t, preparerEmail, prep)); ok || !strings.Contains(out, "FAIL checker") {
		t.Errorf("a key not in the signers file passed:\n%s", out)
	}
	replaceOnce(t, ManifestPath(pkg), `"clean":true`, `"clean":false`)
	if out, ok := runCheckScript(t, ManifestPath(pkg), signers); ok {
		t.Errorf("an edited manifest passed:\n%s", out)
	}
}

// TestCheckScriptCanonicalForm: the script's canonical JSON matches
// vouch's for numbers and strings that are easy to get wrong.
func TestCheckScriptCanonicalForm(t *testing.T) {
	k := newKey(t, "ed25519")
	var results []provenance.Result
	for i, f := range []float64{0.1, 1e-300, 5e-324, 1.0 / 3, 100000, 1e6, 1234567, 1e-4, 1e-5, -2.5e-7, 123456.7,
		math.Copysign(0, -1), 0, 1e21, 1e20, 6.02214076e23, -1, math.MaxFloat64, 2.2250738585072014e-308} {
		results = append(results, provenance.Result{Name: "r" + string(rune('a'+i)), SI: f, Unit: "kg*m^2"})
	}
	results[0].Name = "η_<pump> & \"quoted\"\t\u0001\u007f"
	m := &provenance.Manifest{Engine: "vouch test", Formulation: "IAPWS-IF97", FormulationVersion: "2007",
		Source: "calcs/fp.calc.md", SourceHash: strings.Repeat("a", 40), Commit: strings.Repeat("b", 40), Clean: true,
		Data: []provenance.DataFile{{Path: "data/ü.csv", Hash: strings.Repeat("c", 40)}}, Results: results,
		SignersFile: ".vouch/allowed_signers", SignersHash: strings.Repeat("d", 40)}
	m.ResultsDigest, _ = provenance.ResultsDigest(results)
	signer, err := provenance.LoadSigner(k.path)
	if err != nil {
		t.Fatal(err)
	}
	s, err := m.SignAs(provenance.Signature{Role: "preparer", Principal: preparerEmail, Name: "P. Writer (fictional) Ä",
		Date: "2026-01-01T00:00:00Z", Signed: provenance.FormatSigningTime(time.Now()), Attestation: "I prepared it & checked <it>."}, signer)
	if err != nil {
		t.Fatal(err)
	}
	m.Signatures = []provenance.Signature{s}
	file, err := ManifestFile(m)
	if err != nil {
		t.Fatal(err)
	}
	path := writeTemp(t, "x.manifest.json", string(file))
	digest, _ := m.Digest()
	out, ok := runCheckScript(t, path, allowedSigners(t, preparerEmail, k))
	if !ok || !strings.Contains(out, digest) {
		t.Fatalf("want digest %s:\n%s", digest, out)
	}
	if _, err := os.Stat(checkScript); err != nil {
		t.Fatal(err)
	}
}
