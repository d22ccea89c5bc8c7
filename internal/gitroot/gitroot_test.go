package gitroot

import (
	"os"
	"path/filepath"
	"testing"
)

func TestFind(t *testing.T) {
	dir := t.TempDir()
	if err := os.Mkdir(filepath.Join(dir, ".git"), 0o755); err != nil {
		t.Fatal(err)
	}
	want, _ := filepath.Abs(dir)
	for _, at := range []string{dir, filepath.Join(dir, "calcs"), filepath.Join(dir, "calcs", "not-yet")} {
		if got, ok := Find(at); !ok || got != want {
			t.Errorf("Find(%q) = %q, %v; want %q", at, got, ok, want)
		}
	}
}

func TestFindLinkedWorkTree(t *testing.T) {
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, ".git"), []byte("gitdir: elsewhere\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if got, ok := Find(filepath.Join(dir, "a")); !ok || got != dir {
		t.Errorf("Find = %q, %v; want %q", got, ok, dir)
	}
}
