package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/testkit"
)

// vouchIn runs the command and checks its exit code.
func vouchIn(t *testing.T, want int, args ...string) string {
	t.Helper()
	var out, errs bytes.Buffer
	if got := run(args, &out, &errs); got != want {
		t.Fatalf("vouch %s: exit %d, want %d\n%s%s", strings.Join(args, " "), got, want, out.String(), errs.String())
	}
	return out.String() + errs.String()
}

// TestRenderRefusesChangeUnderSignedRevision: an input changed and
// committed under revision A after A was signed is refused, with nothing
// written; --draft writes a separate draft that sign refuses.
func TestRenderRefusesChangeUnderSignedRevision(t *testing.T) {
	dir := signRepo(t)
	calc, pkg := filepath.Join(dir, "hb.calc.md"), filepath.Join(dir, "hb.html")
	key, _ := sshKey(t)
	vouchIn(t, exitOK, "render", calc)
	vouchIn(t, exitOK, "sign", pkg, "--role", "preparer", "--key", key)
	signed, _ := os.ReadFile(pkg)
	if out := vouchIn(t, exitOK, "render", calc); !strings.Contains(out, "kept "+pkg+": it is the signed package of revision A") {
		t.Errorf("render of the unchanged signed revision:\n%s", out)
	}
	if now, _ := os.ReadFile(pkg); !bytes.Equal(now, signed) {
		t.Error("rendering the unchanged calc replaced its signed package")
	}
	src, _ := os.ReadFile(calc)
	os.WriteFile(calc, bytes.Replace(src, []byte("P_el = 250 MW"), []byte("P_el = 260 MW"), 1), 0o644)
	r := &testkit.Repo{T: t, Dir: dir}
	r.Git("commit", "-q", "-am", "More output under the same revision")
	out := vouchIn(t, exitErrors, "render", calc)
	if !strings.Contains(out, "revision A of hb.calc.md has a signed package") || !strings.Contains(out, "no package written") {
		t.Errorf("render output:\n%s", out)
	}
	if now, _ := os.ReadFile(pkg); !bytes.Equal(now, signed) {
		t.Error("the refused render changed the signed package")
	}
	out = vouchIn(t, exitOK, "render", "--draft", calc)
	draft := filepath.Join(dir, "hb.draft.html")
	if !strings.Contains(out, "wrote "+draft) {
		t.Fatalf("render --draft output:\n%s", out)
	}
	out = vouchIn(t, exitFailed, "sign", draft, "--role", "preparer", "--key", key)
	if !strings.Contains(out, "a draft is never signed") {
		t.Errorf("sign of a draft:\n%s", out)
	}
}

// TestVerifyNamesOtherBuild: a package made by another build of the same
// release (another architecture) is verified with the engines named first
// and the results compared; its qualification digest is only noted.
func TestVerifyNamesOtherBuild(t *testing.T) {
	dir := signRepo(t)
	calc, pkg := filepath.Join(dir, "hb.calc.md"), filepath.Join(dir, "hb.html")
	vouchIn(t, exitOK, "render", calc)
	out := vouchIn(t, exitOK, "verify", pkg)
	if !strings.Contains(out, "made by this engine build: vouch 0.1.0, revision 0123456789ab, go1.0-test, testos/testarch") ||
		!strings.Contains(out, "results:  REPRODUCED bit for bit") || !strings.Contains(out, "ok    qualify") {
		t.Errorf("verify by the same build:\n%s", out)
	}
	saved := thisBuild
	defer func() { thisBuild = saved }()
	thisBuild = func() *provenance.EngineBuild { b := fixedBuild; b.Arch = "otherarch"; return &b }
	out = vouchIn(t, exitOK, "verify", pkg)
	if !strings.Contains(out, "A DIFFERENT ENGINE: the package was made by vouch 0.1.0, revision 0123456789ab, go1.0-test, testos/testarch, and this is vouch 0.1.0, revision 0123456789ab, go1.0-test, testos/otherarch") ||
		!strings.Contains(out, "result:   VERIFIED by a different engine") {
		t.Errorf("verify by another build:\n%s", out)
	}
}

// TestRegisterErrata: the register marks a signed package made by an
// affected release whose calc used an affected function, and not a signed
// package of the same release whose calc used none; --errata reads
// another list, and a malformed one is an error at its line.
func TestRegisterErrata(t *testing.T) {
	dir := signRepo(t)
	plain := "---\ntitle: Plain arithmetic (fictional)\nnumber: PA-1\nrevision: A\npeople:\n  preparer: P. Writer <preparer@example.com>\n---\n```calc\na = 2 m\nb = a * 3\n```\n"
	os.WriteFile(filepath.Join(dir, "plain.calc.md"), []byte(plain), 0o644)
	r := &testkit.Repo{T: t, Dir: dir}
	r.Git("add", "-A")
	r.Git("commit", "-q", "-m", "A plain calc")
	key, _ := sshKey(t)
	for _, name := range []string{"hb", "plain"} {
		vouchIn(t, exitOK, "render", filepath.Join(dir, name+".calc.md"))
		vouchIn(t, exitOK, "sign", filepath.Join(dir, name+".html"), "--role", "preparer", "--key", key)
	}
	out := vouchIn(t, exitOK, "register", dir, "-o", t.TempDir())
	if !strings.Contains(out, "hb.calc.md: signed package hb.html: erratum VE-2026-002 (Wrong cp and k exactly at the critical point): made by vouch 0.1.0") ||
		!strings.Contains(out, "the calc uses water") {
		t.Errorf("the affected package is not marked:\n%s", out)
	}
	if strings.Contains(out, "plain.html: erratum") {
		t.Errorf("a package whose calc used no affected function is marked:\n%s", out)
	}
	empty := filepath.Join(t.TempDir(), "errata.yaml")
	os.WriteFile(empty, []byte("format: vouch-errata/1\nerrata: []\n"), 0o644)
	if out := vouchIn(t, exitOK, "register", dir, "-o", t.TempDir(), "--errata", empty); strings.Contains(out, "erratum") {
		t.Errorf("--errata with an empty list still marks packages:\n%s", out)
	}
	os.WriteFile(empty, []byte("format: vouch-errata/1\nerrata:\n  - id: bad\n"), 0o644)
	if out := vouchIn(t, exitErrors, "register", dir, "--errata", empty); !strings.Contains(out, "errata.yaml:3:") {
		t.Errorf("a malformed errata file:\n%s", out)
	}
}
