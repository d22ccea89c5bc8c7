package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestVerifyWithSettings: a package rendered with the firm's vouch.yaml
// records the settings file and the logo among its data files, and verify
// reproduces it from the settings as committed, whatever the work tree's
// vouch.yaml now says; a package of a commit whose settings differ is not
// reproduced.
func TestVerifyWithSettings(t *testing.T) {
	needTools(t, "git")
	r := testkit.NewRepo(t)
	if err := os.CopyFS(r.Dir, os.DirFS(filepath.Join("testdata", "house"))); err != nil {
		t.Fatal(err)
	}
	r.Write(".gitignore", "*.html\n*.manifest.json\n")
	r.Commit("house-style calcs")
	calc, pkg := r.Path("house-a4.calc.md"), r.Path("house-a4.html")
	vouch := func(want int, args ...string) string {
		t.Helper()
		var out, errs bytes.Buffer
		if got := run(args, &out, &errs); got != want {
			t.Fatalf("vouch %s: exit %d, want %d\n%s%s", strings.Join(args, " "), got, want, out.String(), errs.String())
		}
		return out.String() + errs.String()
	}
	vouch(exitOK, "render", calc)
	m, _ := os.ReadFile(r.Path("house-a4.manifest.json"))
	for _, want := range []string{`"path":"vouch.yaml"`, `"path":".vouch/logo.svg"`} {
		if !bytes.Contains(m, []byte(want)) {
			t.Errorf("manifest lacks %s:\n%s", want, m)
		}
	}
	// The work tree's settings change after rendering: verify reads the
	// commit's.
	settings, _ := os.ReadFile(r.Path("vouch.yaml"))
	r.Write("vouch.yaml", strings.Replace(string(settings), "Tarnwick Thermal", "Renamed Thermal", 1))
	vouch(exitOK, "verify", pkg)
	// Committed, the new settings make a different package at the new
	// commit; the old package still verifies against its own commit.
	r.Commit("firm renamed")
	vouch(exitOK, "verify", pkg)
	vouch(exitOK, "render", calc)
	if b, _ := os.ReadFile(pkg); !bytes.Contains(b, []byte("Renamed Thermal")) {
		t.Error("the package rendered at the new commit does not show the renamed firm")
	}
}
