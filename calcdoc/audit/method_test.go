package audit

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	stdhtml "html"
	"os"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/compare"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// altCalc is a checker's alternate calc of the fictional feed pump.
const altCalc = "---\ntitle: Feed pump power, alternate (fictional)\ncompare: {maps: {P: P_pump}, tolerances: {P: 1 %}}\n---\n```calc\n" +
	"P [MW] = 213.2 kg/s * 1.008e-3 m^3/kg * (12.5 MPa - 8 kPa) / 80 %  // hand formula, v from the steam table\n```\n"

// compareReport writes the comparison report of the calc and the
// alternate and reads it back as sign's flags would.
func compareReport(t *testing.T, r *gitRepo, alt string) CheckMethod {
	t.Helper()
	a, err := calcdoc.ReadFile(r.Path("calcs/fp.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	b := calcdoc.Read(r.Path("calcs/fp-alt.calc.md"), []byte(alt))
	b.Evaluate()
	if len(b.Errors) > 0 {
		t.Fatal(b.Errors)
	}
	res := compare.Compare(a, b, compare.Options{APath: "fp.calc.md", BPath: "fp-alt.calc.md", Tolerance: 0.005})
	html, err := res.Report()
	if err != nil {
		t.Fatal(err)
	}
	path := r.Path("calcs/fp-compare.html")
	if err := os.WriteFile(path, html, 0o644); err != nil {
		t.Fatal(err)
	}
	rec, err := compare.ReadReport(html)
	if err != nil {
		t.Fatal(err)
	}
	sum := sha256.Sum256(html)
	return CheckMethod{Method: "alternate", Alternate: r.Path("calcs/fp-alt.calc.md"), Report: path,
		ReportSHA256: hex.EncodeToString(sum[:]), ReportPass: rec.Pass, ReportBlobs: [2]string{rec.Original, rec.Alternate}}
}

// TestCheckerMethod: the checker's method of checking is recorded with the
// signature and shown on the cover; an alternate calculation counts only
// committed and within tolerance; no other role records a method.
func TestCheckerMethod(t *testing.T) {
	r := calcRepo(t)
	r.Write("calcs/fp-alt.calc.md", altCalc)
	r.Commit("Alternate calculation of the feed pump power")
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	prep, chk := newKey(t, "ed25519"), newKey(t, "ed25519")
	signers := allowedSigners(t, preparerEmail, prep, checkerEmail, chk)
	sign := func(role string, k key, c CheckMethod) (*Signed, error) {
		s, _, err := Sign(pkg, SignOptions{Role: role, Key: k.path, Method: c, VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}})
		return s, err
	}
	var usage *calcdoc.UsageError
	if _, err := sign("preparer", prep, CheckMethod{Method: "test", Document: "TR-7"}); !errors.As(err, &usage) {
		t.Fatalf("preparer with a method: %v, want a usage error", err)
	}
	signPkg(t, pkg, "preparer", prep, signers)
	if _, err := sign("checker", chk, CheckMethod{Method: "guess"}); !errors.As(err, &usage) || !strings.Contains(err.Error(), "the methods are review, alternate, test") {
		t.Fatalf("unknown method: %v", err)
	}
	failing := compareReport(t, r, strings.Replace(altCalc, "80 %", "70 %", 1))
	if _, err := sign("checker", chk, failing); !errors.Is(err, ErrNotVerified) || !strings.Contains(err.Error(), "outside their tolerance") {
		t.Fatalf("failing comparison: %v", err)
	}
	c := compareReport(t, r, altCalc)
	if !c.ReportPass {
		t.Fatal("the alternate calc is outside tolerance")
	}
	s, err := sign("checker", chk, c)
	if err != nil {
		t.Fatal(err)
	}
	writePkg(t, pkg, s.HTML)
	head := strings.TrimSpace(r.Git("rev-parse", "HEAD"))
	want := provenance.Signature{Method: "alternate", MethodRef: "calcs/fp-alt.calc.md@" + head, Report: "calcs/fp-compare.html", ReportHash: c.ReportSHA256}
	got := s.Signature
	if got.Method != want.Method || got.MethodRef != want.MethodRef || got.Report != want.Report || got.ReportHash != want.ReportHash {
		t.Errorf("signature records %+v, want %+v", got, want)
	}
	if rep := verifyPkg(t, pkg, signers); !rep.OK() || rep.Status != "CHECKED" {
		t.Fatalf("verify: %s\n%s", rep.Status, rep)
	}
	if !strings.Contains(verifyPkg(t, pkg, signers).String(), "method of checking: alternate calc calcs/fp-alt.calc.md at commit "+head[:12]+"; comparison report calcs/fp-compare.html as recorded") {
		t.Error("verify does not check the alternate calc and the report")
	}
	if err := os.WriteFile(c.Report, []byte("changed"), 0o644); err != nil {
		t.Fatal(err)
	}
	if rep := verifyPkg(t, pkg, signers); rep.OK() || !strings.Contains(rep.String(), "has changed since the checker signed") {
		t.Errorf("verify passes with a changed report:\n%s", rep)
	}
	cover := stdhtml.UnescapeString(string(r.Read("calcs/fp.html")))
	if !strings.Contains(cover, "method of checking (signed): alternate calculation calcs/fp-alt.calc.md at commit "+head[:12]+"; comparison report calcs/fp-compare.html (SHA-256 "+c.ReportSHA256[:12]+"…)") {
		t.Error("the cover does not show the method of checking")
	}
	w, _, err := Sign(pkg, SignOptions{Role: "checker", Withdraw: true, VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}})
	if err != nil {
		t.Fatal(err)
	}
	writePkg(t, pkg, w.HTML)
	r.Write("calcs/fp-alt.calc.md", altCalc+"\nEdited after the comparison.\n")
	if _, err := sign("checker", chk, compareReport(t, r, altCalc+"\nEdited after the comparison.\n")); !errors.As(err, &usage) || !strings.Contains(err.Error(), "is not committed as it is") {
		t.Fatalf("uncommitted alternate: %v", err)
	}
	s, err = sign("checker", chk, CheckMethod{Method: "test", Document: "TR-7 rev B (fictional pump test)"})
	if err != nil || s.Signature.MethodText() != "test, TR-7 rev B (fictional pump test)" {
		t.Fatalf("test method: %+v, %v", s, err)
	}
}
