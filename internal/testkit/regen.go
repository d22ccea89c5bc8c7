package testkit

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"testing"
)

// Regenerate runs a code generator (a `go run` package path such as
// "./gen/r7", relative to the package under test) in a scratch folder that
// sees the package's testdata, with args, and fails the test for every file
// the generator writes that differs from the package's committed file of the
// same name, and when it writes fewer than min files. It is the
// regenerate-and-compare check of every generator: a hand edit of generated
// code, or a generator change whose output was not committed, fails.
func Regenerate(t *testing.T, gen string, min int, args ...string) {
	t.Helper()
	if testing.Short() {
		t.Skip("regenerating needs a go build; skipped with -short")
	}
	pkgDir, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	genDir, err := filepath.Abs(gen)
	if err != nil {
		t.Fatal(err)
	}
	tmp := t.TempDir()
	if err := os.Symlink(filepath.Join(pkgDir, "testdata"), filepath.Join(tmp, "testdata")); err != nil {
		t.Fatal(err)
	}
	// Build the generator, then run it in the scratch folder, as go
	// generate runs it in the package's folder.
	bin := filepath.Join(t.TempDir(), "gen")
	build := exec.Command("go", "build", "-o", bin, ".")
	build.Dir = genDir
	if out, err := build.CombinedOutput(); err != nil {
		t.Fatalf("go build %s: %v\n%s", gen, err, out)
	}
	run := exec.Command(bin, args...)
	run.Dir = tmp
	if out, err := run.CombinedOutput(); err != nil {
		t.Fatalf("%s: %v\n%s", gen, err, out)
	}
	files, err := filepath.Glob(filepath.Join(tmp, "*.go"))
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < min {
		t.Fatalf("%s wrote %d Go files, want at least %d", gen, len(files), min)
	}
	for _, f := range files {
		got, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		name := filepath.Base(f)
		want, err := os.ReadFile(filepath.Join(pkgDir, name))
		if err != nil {
			t.Errorf("%s writes %s, which the package does not have: %v", gen, name, err)
			continue
		}
		if !bytes.Equal(got, want) {
			t.Errorf("%s is not what %s generates: run go generate in %s and commit the result", name, gen, pkgDir)
		}
	}
}
