package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc/audit"
	"github.com/vouchcalc/vouch/internal/testkit"
)

// failingCalc is a calc whose one design check fails (fictional plant).
const failingCalc = "---\ntitle: Header pressure (fictional plant)\n---\n```calc\np_hdr = 1.2 MPa\np_min = 11 barg // minimum\ncheck p_hdr >= p_min // header pressure at least the minimum\n```\n"

// vouchT runs the command line and fails unless it exits with want; it
// returns stdout and stderr.
func vouchT(t *testing.T, want int, args ...string) (string, string) {
	t.Helper()
	var out, errs bytes.Buffer
	if got := run(args, &out, &errs); got != want {
		t.Fatalf("vouch %s: exit %d, want %d\n%s%s", strings.Join(args, " "), got, want, out.String(), errs.String())
	}
	return out.String(), errs.String()
}

// writeFile writes a file or fails the test.
func writeFile(t *testing.T, path, content string) {
	t.Helper()
	if err := os.WriteFile(path, []byte(content), 0o644); err != nil {
		t.Fatal(err)
	}
}

// failingRepo commits failingCalc in a fresh repository.
func failingRepo(t *testing.T) *testkit.Repo {
	t.Helper()
	needTools(t, "git")
	r := testkit.NewRepo(t)
	r.Write("hp.calc.md", failingCalc)
	r.Write(".gitignore", "*.html\n*.manifest.json\n")
	r.Commit("Header pressure")
	return r
}

// TestVerifyKeepsDesignChecksApart: issue 11 item 19. verify ended with
// "VERIFIED: every check holds" for a package whose design check FAILs.
// The verification steps and the calc's design checks are now reported
// apart, with the design checks' tally, and verify exits 3.
func TestVerifyKeepsDesignChecksApart(t *testing.T) {
	r := failingRepo(t)
	vouchT(t, exitFailed, "render", r.Path("hp.calc.md"))
	out, _ := vouchT(t, exitFailed, "verify", r.Path("hp.html"))
	if strings.Contains(out, "every check holds") {
		t.Errorf("verify still says every check holds:\n%s", out)
	}
	for _, want := range []string{
		"design checks: 0 passed, 1 failed",
		"FAIL  line 7  header pressure at least the minimum (10.99 barg >= 11.00 barg, margin -0.01325 bar)",
		"result:   VERIFIED: every verification step holds",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("verify output lacks %q:\n%s", want, out)
		}
	}
}

// TestRenderNamesFailedChecks: issue 11 item 20. render exited 3 when a
// design check failed but printed only "wrote …".
func TestRenderNamesFailedChecks(t *testing.T) {
	dir := t.TempDir()
	calc := filepath.Join(dir, "hp.calc.md")
	writeFile(t, calc, failingCalc)
	out, errs := vouchT(t, exitFailed, "render", calc)
	if !strings.Contains(out, "wrote ") {
		t.Errorf("render output:\n%s", out)
	}
	for _, want := range []string{"1 of 1 design check FAIL", "FAIL  line 7  header pressure at least the minimum (10.99 barg >= 11.00 barg, margin -0.01325 bar)"} {
		if !strings.Contains(errs, want) {
			t.Errorf("render's messages lack %q:\n%s", want, errs)
		}
	}
}

// TestHelpExitsZeroForEveryCommand: issue 11 item 20. --help exited 2;
// asking for help is not bad usage. Each command prints its usage.
func TestHelpExitsZeroForEveryCommand(t *testing.T) {
	for _, c := range commands {
		for _, flag := range []string{"--help", "-h"} {
			out, _ := vouchT(t, exitOK, c.name, flag)
			if !strings.HasPrefix(out, "usage: vouch "+c.name) {
				t.Errorf("vouch %s %s printed:\n%s", c.name, flag, out)
			}
		}
	}
	out, _ := vouchT(t, exitOK, "render", "x.calc.md", "--help")
	if !strings.Contains(out, "-pdf") {
		t.Errorf("render --help lacks --pdf:\n%s", out)
	}
}

// TestRenderUsageNamesPDF: issue 11 item 20. render's usage omitted --pdf.
func TestRenderUsageNamesPDF(t *testing.T) {
	_, errs := vouchT(t, exitUsage, "render")
	if !strings.Contains(errs, "[--pdf]") {
		t.Errorf("render's usage lacks --pdf: %s", errs)
	}
}

// TestCheckTallyPlural: issue 11 item 20. "1 checks, 1 passed".
func TestCheckTallyPlural(t *testing.T) {
	for n, want := range map[int]string{0: "0 checks, 0 passed, 0 failed", 1: "1 check, 1 passed, 0 failed", 2: "2 checks, 2 passed, 0 failed"} {
		if got := checkTally(n, 0); got != want {
			t.Errorf("checkTally(%d) = %q, want %q", n, got, want)
		}
	}
	dir := t.TempDir()
	calc := filepath.Join(dir, "one.calc.md")
	writeFile(t, calc, "```calc\nx = 2\ncheck x > 1\n```\n")
	out, _ := vouchT(t, exitOK, "run", calc)
	if !strings.Contains(out, "1 check, 1 passed, 0 failed") {
		t.Errorf("run output:\n%s", out)
	}
}

// TestRejectedKeyExitCode: issue 11 item 20. A key the allowed-signers
// file does not list for the signer exited 2 (bad usage); it is a failed
// verification (3). A signers file with errors is an input with errors (1).
func TestRejectedKeyExitCode(t *testing.T) {
	dir := signRepo(t)
	calc, pkg := filepath.Join(dir, "hb.calc.md"), filepath.Join(dir, "hb.html")
	key, pub := sshKey(t)
	signers := filepath.Join(t.TempDir(), "allowed_signers")
	writeFile(t, signers, "someone-else@example.com "+pub+"\n")
	vouchT(t, exitOK, "render", calc)
	vouchT(t, exitFailed, "sign", pkg, "--role", "preparer", "--key", key, "--signers", signers)
	writeFile(t, signers, "preparer@example.com not-a-key-type AAAA\n")
	vouchT(t, exitErrors, "verify", pkg, "--signers", signers)
}

// TestRenderRefusesPackageClash: issue 11 item 13. render a/x.calc.md
// b/x.calc.md -o out silently overwrote the first package with the second.
func TestRenderRefusesPackageClash(t *testing.T) {
	dir := t.TempDir()
	a, b, out := filepath.Join(dir, "a", "x.calc.md"), filepath.Join(dir, "b", "x.calc.md"), filepath.Join(dir, "out")
	os.MkdirAll(filepath.Dir(a), 0o755)
	os.MkdirAll(filepath.Dir(b), 0o755)
	writeFile(t, a, "```calc\nx = 1\n```\n")
	writeFile(t, b, "```calc\nx = 2\n```\n")
	_, errs := vouchT(t, exitUsage, "render", a, b, "-o", out)
	if !strings.Contains(errs, "would both be written to") {
		t.Errorf("render's message: %s", errs)
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Error("render wrote something before refusing the clash")
	}
	vouchT(t, exitOK, "render", a, b) // beside each calc: no clash
	vouchT(t, exitOK, "render", a, a, "-o", out)
}

// TestPDFInFolderWithHashOrQuery: issue 11 item 14. render --pdf in a
// folder whose name holds # or ? printed another file (the URL was cut at
// the # or ?) and reported success.
func TestPDFInFolderWithHashOrQuery(t *testing.T) {
	if testing.Short() {
		t.Skip("runs Chromium")
	}
	needTools(t, "chromium")
	for _, name := range []string{"a#b", "c?d", "e%41f", "g h"} {
		dir := filepath.Join(t.TempDir(), name)
		os.MkdirAll(dir, 0o755)
		calc := filepath.Join(dir, "p.calc.md")
		writeFile(t, calc, "---\ntitle: Feed pump η and head (fictional)\n---\n```calc\nx = 2\n```\n")
		vouchT(t, exitOK, "render", "--pdf", calc)
		pdf, err := os.ReadFile(filepath.Join(dir, "p.pdf"))
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		// the archival rewrite keeps the title in ASCII (Ghostscript drops
		// a title with non-ASCII characters or brackets)
		if err := checkPDF(pdf, asciiTitle(" Feed pump η and head (fictional)")); err != nil {
			t.Errorf("%s: %v", name, err)
		}
	}
}

// TestFileURLEscapes: the file URL keeps #, ? and % as parts of the path.
func TestFileURLEscapes(t *testing.T) {
	for path, want := range map[string]string{
		"/w/a#b/p.html":  "file:///w/a%23b/p.html",
		"/w/c?d/p.html":  "file:///w/c%3Fd/p.html",
		"/w/e%41/p.html": "file:///w/e%2541/p.html",
		"/w/g h/p.html":  "file:///w/g%20h/p.html",
	} {
		if got := fileURL(path); got != want {
			t.Errorf("fileURL(%q) = %q, want %q", path, got, want)
		}
	}
}

// TestCheckPDFRefusesAnotherPage: a PDF without pages, or with a title
// other than the package's, is not reported as the package's PDF.
func TestCheckPDFRefusesAnotherPage(t *testing.T) {
	good := "%PDF-1.4\n1 0 obj <</Type /Pages /Count 3 /Kids []>> endobj\n2 0 obj <</Title <FEFF0048002003B7> /Producer (x)>> endobj\n"
	if err := checkPDF([]byte(good), "H η"); err != nil {
		t.Errorf("good PDF refused: %v", err)
	}
	for _, c := range []struct{ pdf, title, want string }{
		{good, "Index of /w/a", "not the package's"},
		{"%PDF-1.4\n2 0 obj <</Title (H \\(x\\))>> endobj\n", "H (x)", "no pages"},
		{"%PDF-1.4\n1 0 obj <</Type /Pages /Count 1>> endobj\n", "H", "no title"},
		{"<html>", "H", "not a PDF"},
	} {
		err := checkPDF([]byte(c.pdf), c.title)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("checkPDF(%q, %q) = %v, want %q", c.pdf, c.title, err, c.want)
		}
	}
	if got := pdfString([]byte(`(H \(x\) \101)`)); got != "H (x) A" {
		t.Errorf("pdfString = %q", got)
	}
}

// TestRenderIntoFolderNamedLikePackage: issue 11 item 12. When NAME.html
// was a folder, render failed but still wrote NAME.manifest.json.
func TestRenderIntoFolderNamedLikePackage(t *testing.T) {
	dir := t.TempDir()
	calc := filepath.Join(dir, "x.calc.md")
	writeFile(t, calc, "```calc\nx = 1\n```\n")
	os.Mkdir(filepath.Join(dir, "x.html"), 0o755)
	_, errs := vouchT(t, exitErrors, "render", calc)
	if !strings.Contains(errs, "is not a regular file (a folder)") {
		t.Errorf("render's message: %s", errs)
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if n := e.Name(); n != "x.calc.md" && n != "x.html" {
			t.Errorf("render left %s behind", n)
		}
	}
}

// TestConcurrentRendersKeepThePair: issue 11 item 12. Two renders into one
// folder at once tore the package and manifest pair. Many renders of two
// different calcs into one folder at once leave a package whose manifest
// file is its own.
func TestConcurrentRendersKeepThePair(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "out")
	var calcs []string
	for i, sub := range []string{"a", "b"} {
		calc := filepath.Join(dir, sub, "x.calc.md")
		os.MkdirAll(filepath.Dir(calc), 0o755)
		writeFile(t, calc, fmt.Sprintf("```calc\nx = %d kg\n```\n", i+1))
		calcs = append(calcs, calc)
	}
	var wg sync.WaitGroup
	for i := 0; i < 16; i++ {
		wg.Add(1)
		go func(calc string) {
			defer wg.Done()
			var o, e bytes.Buffer
			if code := run([]string{"render", calc, "-o", out}, &o, &e); code != exitOK {
				t.Errorf("render: exit %d\n%s", code, e.String())
			}
		}(calcs[i%2])
	}
	wg.Wait()
	pkg, err := os.ReadFile(filepath.Join(out, "x.html"))
	if err != nil {
		t.Fatal(err)
	}
	m, err := audit.ManifestOf(pkg)
	if err != nil {
		t.Fatal(err)
	}
	want, _ := audit.ManifestFile(m)
	got, _ := os.ReadFile(filepath.Join(out, "x.manifest.json"))
	if !bytes.Equal(got, want) {
		t.Errorf("the manifest file is not the package's own:\n%s\nwant\n%s", got, want)
	}
	entries, _ := os.ReadDir(out)
	if len(entries) != 2 {
		t.Errorf("files left in the folder: %v", entries)
	}
}
