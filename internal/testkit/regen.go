package testkit

import (
	"bytes"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// Regenerate runs `go generate` for the package under test in a scratch
// copy of the module and fails the test for every Go file of the package
// that the generators (and the float guard they run after) write
// differently from the committed file, and when fewer than min files are
// generated. It is the regenerate-and-compare check of every generator: a
// hand edit of generated code, or a generator change whose output was not
// committed, fails.
func Regenerate(t *testing.T, min int) {
	t.Helper()
	if testing.Short() {
		t.Skip("regenerating builds the generators; skipped with -short")
	}
	pkgDir, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	root := pkgDir
	for {
		if _, err := os.Stat(filepath.Join(root, "go.mod")); err == nil {
			break
		}
		up := filepath.Dir(root)
		if up == root {
			t.Fatal("no go.mod above " + pkgDir)
		}
		root = up
	}
	rel, err := filepath.Rel(root, pkgDir)
	if err != nil {
		t.Fatal(err)
	}
	tmp := t.TempDir()
	if err := copyTree(root, tmp); err != nil {
		t.Fatal(err)
	}
	scratch := filepath.Join(tmp, rel)
	before := stamps(t, scratch)
	gen := exec.Command("go", "generate", "./"+filepath.ToSlash(rel))
	gen.Dir = tmp
	if out, err := gen.CombinedOutput(); err != nil {
		t.Fatalf("go generate ./%s: %v\n%s", rel, err, out)
	}
	n := 0
	for name, old := range stamps(t, scratch) {
		got, err := os.ReadFile(filepath.Join(scratch, name))
		if err != nil {
			t.Fatal(err)
		}
		if before[name] != old {
			n++ // written by the generators
		}
		want, err := os.ReadFile(filepath.Join(pkgDir, name))
		if err != nil || !bytes.Equal(got, want) {
			t.Errorf("%s/%s is not what go generate writes: run go generate ./%s and commit the result", rel, name, rel)
		}
	}
	if n < min {
		t.Errorf("go generate ./%s wrote %d Go files, want at least %d", rel, n, min)
	}
}

// stamps lists the Go files of dir with their modification times.
func stamps(t *testing.T, dir string) map[string]int64 {
	t.Helper()
	files, err := filepath.Glob(filepath.Join(dir, "*.go"))
	if err != nil {
		t.Fatal(err)
	}
	m := map[string]int64{}
	for _, f := range files {
		st, err := os.Stat(f)
		if err != nil {
			t.Fatal(err)
		}
		m[filepath.Base(f)] = st.ModTime().UnixNano()
	}
	return m
}

// copyTree copies the module's files, without .git, from src to dst.
func copyTree(src, dst string) error {
	return filepath.WalkDir(src, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(src, p)
		if d.IsDir() && (d.Name() == ".git" || strings.HasPrefix(d.Name(), ".") && rel != ".") {
			return filepath.SkipDir
		}
		out := filepath.Join(dst, rel)
		if d.IsDir() {
			return os.MkdirAll(out, 0o755)
		}
		if !d.Type().IsRegular() {
			return nil
		}
		b, err := os.ReadFile(p)
		if err != nil {
			return err
		}
		return os.WriteFile(out, b, 0o644)
	})
}
