package main

import (
	"bytes"
	"flag"
	"github.com/vouchcalc/vouch/calcdoc/review"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/golden")

// examples lists the example calcs.
func examples(t *testing.T) []string {
	files, err := filepath.Glob(filepath.Join("..", "..", "examples", "*.calc.md"))
	if err != nil || len(files) == 0 {
		t.Fatalf("no examples: %v", err)
	}
	return files
}

// golden compares got with testdata/golden/name, or rewrites it with -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", "golden", name)
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/vouch -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs from its golden file; if the change is intended, run go test ./cmd/vouch -update and review the diff", name)
	}
}

// copyOutsideRepo copies a calc and its data and figure folders into a
// temporary folder outside any repository, so packages do not depend on the
// commit.
func copyOutsideRepo(t *testing.T, calc string) string {
	t.Helper()
	dir := t.TempDir()
	src, err := os.ReadFile(calc)
	if err != nil {
		t.Fatal(err)
	}
	dst := filepath.Join(dir, filepath.Base(calc))
	if err := os.WriteFile(dst, src, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, sub := range []string{"data", "fig"} {
		if from := filepath.Join(filepath.Dir(calc), sub); dirExists(from) {
			copyDir(t, from, filepath.Join(dir, sub))
		}
	}
	if rec, err := os.ReadFile(review.PathFor(calc)); err == nil {
		if err := os.WriteFile(review.PathFor(dst), rec, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dst
}

func dirExists(p string) bool {
	st, err := os.Stat(p)
	return err == nil && st.IsDir()
}

func copyDir(t *testing.T, from, to string) {
	t.Helper()
	if err := os.CopyFS(to, os.DirFS(from)); err != nil {
		t.Fatal(err)
	}
}

func TestGoldenRun(t *testing.T) {
	for _, f := range examples(t) {
		name := strings.TrimSuffix(filepath.Base(f), ".calc.md")
		t.Run(name, func(t *testing.T) {
			calc := copyOutsideRepo(t, f)
			var out, errs bytes.Buffer
			code := run([]string{"run", "--json", calc}, &out, &errs)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, errs.String())
			}
			golden(t, name+".json", bytes.ReplaceAll(out.Bytes(), []byte(filepath.Dir(calc)+"/"), nil))
			out.Reset()
			run([]string{"run", calc}, &out, &errs)
			golden(t, name+".txt", out.Bytes())
			out.Reset()
			if code := run([]string{"render", calc, "-o", filepath.Dir(calc)}, &out, &errs); code != exitOK {
				t.Fatalf("render exit %d: %s", code, errs.String())
			}
			html, err := os.ReadFile(filepath.Join(filepath.Dir(calc), name+".html"))
			if err != nil {
				t.Fatal(err)
			}
			golden(t, name+".html", bytes.ReplaceAll(html, []byte(filepath.Dir(calc)+"/"), nil))
		})
	}
}

func TestExitCodes(t *testing.T) {
	dir := t.TempDir()
	write := func(name, body string) string {
		p := filepath.Join(dir, name)
		os.WriteFile(p, []byte(body), 0o644)
		return p
	}
	ok := write("ok.calc.md", "```calc\na = 1 m\ncheck a > 0 m\n```\n")
	bad := write("bad.calc.md", "```calc\na = 1 xx\n```\n")
	fail := write("fail.calc.md", "```calc\na = 1 m\ncheck a > 2 m\n```\n")
	cases := []struct {
		args []string
		want int
	}{
		{[]string{"run", ok}, exitOK}, {[]string{"run", bad}, exitErrors}, {[]string{"run", fail}, exitFailed},
		{[]string{"run"}, exitUsage}, {[]string{"frobnicate"}, exitUsage}, {[]string{"run", "--nope", ok}, exitUsage},
		{[]string{"run", filepath.Join(dir, "missing.calc.md")}, exitErrors}, {[]string{"--version"}, exitOK},
		{[]string{"units"}, exitOK}, {[]string{"functions"}, exitOK}, {[]string{"help"}, exitOK},
		{[]string{"units", "--si"}, exitUsage}, {[]string{"functions", "--fluids"}, exitUsage},
	}
	for _, c := range cases {
		var out, errs bytes.Buffer
		if got := run(c.args, &out, &errs); got != c.want {
			t.Errorf("vouch %v: exit %d, want %d (%s)", c.args, got, c.want, errs.String())
		}
	}
}

// TestRenderErrorWritesNothing: a calc with errors writes no package and
// leaves the last good one untouched.
func TestRenderErrorWritesNothing(t *testing.T) {
	dir := t.TempDir()
	calc := filepath.Join(dir, "x.calc.md")
	os.WriteFile(calc, []byte("```calc\na = 1 m\n```\n"), 0o644)
	var out, errs bytes.Buffer
	if code := run([]string{"render", calc}, &out, &errs); code != exitOK {
		t.Fatalf("first render: exit %d: %s", code, errs.String())
	}
	good, _ := os.ReadFile(filepath.Join(dir, "x.html"))
	os.WriteFile(calc, []byte("```calc\na = 1 xx\n```\n"), 0o644)
	if code := run([]string{"render", calc}, &out, &errs); code != exitErrors {
		t.Fatalf("broken render: exit %d", code)
	}
	after, _ := os.ReadFile(filepath.Join(dir, "x.html"))
	if !bytes.Equal(good, after) {
		t.Error("a failed render changed the last good package")
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 3 { // the calc, the package and its manifest file
		t.Errorf("the folder holds %d entries; a failed render must leave no temporary file", len(entries))
	}
}

// TestGoldenHouse renders calcs of a repository with a full house style
// (testdata/house: a fictional firm's vouch.yaml with a logo, extra
// front-matter keys and its caution), on A4 (the firm's paper) and on
// Letter (a calc's own), and compares the packages with their golden files.
func TestGoldenHouse(t *testing.T) {
	dir := t.TempDir()
	copyDir(t, filepath.Join("testdata", "house"), dir)
	for _, name := range []string{"house-a4", "house-letter"} {
		t.Run(name, func(t *testing.T) {
			calc := filepath.Join(dir, name+".calc.md")
			var out, errs bytes.Buffer
			if code := run([]string{"render", calc}, &out, &errs); code != exitOK {
				t.Fatalf("render exit %d: %s", code, errs.String())
			}
			html, err := os.ReadFile(filepath.Join(dir, name+".html"))
			if err != nil {
				t.Fatal(err)
			}
			golden(t, name+".html", html)
		})
	}
}

// TestHouseKeys: a firm's key is read only with the firm's settings, and a
// key the firm did not declare stays an error at its line.
func TestHouseKeys(t *testing.T) {
	dir := t.TempDir()
	copyDir(t, filepath.Join("testdata", "house"), dir)
	calc := filepath.Join(dir, "typo.calc.md")
	os.WriteFile(calc, []byte("---\ntitle: T\nclient: C\nclinet_ref: X\n---\n```calc\na = 1 m\n```\n"), 0o644)
	var out, errs bytes.Buffer
	if code := run([]string{"run", calc}, &out, &errs); code != exitErrors {
		t.Fatalf("exit %d, want %d", code, exitErrors)
	}
	if want := `typo.calc.md:4:1: unknown front-matter key "clinet_ref"`; !strings.Contains(errs.String(), want) {
		t.Errorf("stderr %q lacks %q", errs.String(), want)
	}
	if strings.Contains(errs.String(), `key "client"`) {
		t.Errorf("the firm's key client was refused: %s", errs.String())
	}
	os.WriteFile(filepath.Join(dir, "vouch.yaml"), []byte("firm:\n  logo: .vouch/missing.png\nfront_matter:\n  client: Client\n"), 0o644)
	os.WriteFile(calc, []byte("---\ntitle: T\nclient: C\n---\n```calc\na = 1 m\n```\n"), 0o644)
	errs.Reset()
	if code := run([]string{"render", calc}, &out, &errs); code != exitErrors || !strings.Contains(errs.String(), "firm logo .vouch/missing.png does not exist in the repository") {
		t.Errorf("missing logo: exit %d, stderr %q", code, errs.String())
	}
	if _, err := os.Stat(filepath.Join(dir, "typo.html")); err == nil {
		t.Error("a package was written although the logo is missing")
	}
	os.WriteFile(filepath.Join(dir, "vouch.yaml"), []byte("paper: A5\n"), 0o644)
	errs.Reset()
	if code := run([]string{"run", calc}, &out, &errs); code != exitErrors || !strings.Contains(errs.String(), "vouch.yaml:1:8:") {
		t.Errorf("bad vouch.yaml: exit %d, stderr %q; want exit 1 and the error at vouch.yaml:1:8", code, errs.String())
	}
}

// TestGoldenUS renders a calc with display: US, whose results carry no
// [UNIT] (so they are shown in psia, °F, BTU/lb, lb/h, hp) and whose
// inputs are shown as written, and compares the package and the run table
// with their golden files.
func TestGoldenUS(t *testing.T) {
	dir := t.TempDir()
	copyDir(t, filepath.Join("testdata", "house"), dir)
	calc := filepath.Join(dir, "house-us.calc.md")
	var out, errs bytes.Buffer
	if code := run([]string{"run", calc}, &out, &errs); code != exitOK {
		t.Fatalf("run exit %d: %s", code, errs.String())
	}
	golden(t, "house-us.txt", out.Bytes())
	if code := run([]string{"render", calc}, &out, &errs); code != exitOK {
		t.Fatalf("render exit %d: %s", code, errs.String())
	}
	html, err := os.ReadFile(filepath.Join(dir, "house-us.html"))
	if err != nil {
		t.Fatal(err)
	}
	golden(t, "house-us.html", html)
	for _, want := range []string{"1692000 lb/h", "1483 BTU/lb", "340400 hp", "12.5 MPa"} {
		if !strings.Contains(strings.ReplaceAll(strings.ReplaceAll(string(html), "\u2009", " "), "\u202f", ""), want) &&
			!strings.Contains(out.String(), want) {
			t.Errorf("neither the package nor the run table shows %s", want)
		}
	}
}
