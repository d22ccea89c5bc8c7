package calcdoc

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
)

// pairState reads a package and its sidecar ("" when missing) and fails
// the test on temporary files left in the folder.
func pairState(t *testing.T, dir string) (pkg, side string) {
	t.Helper()
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.HasSuffix(e.Name(), ".tmp") {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
	a, _ := os.ReadFile(filepath.Join(dir, "x.html"))
	b, _ := os.ReadFile(filepath.Join(dir, "x.manifest.json"))
	return string(a), string(b)
}

// consistent reports whether a package and its sidecar belong together:
// the sidecar of package "P" is "P-m", or it is missing.
func consistent(pkg, side string) bool {
	return side == "" || side == pkg+"-m"
}

// TestPackagePairNeverTorn: issue 11 item 12. The manifest file was
// written before the package, so a full disk or a kill between the two
// writes left a new manifest beside the old signed package, which then no
// longer verified, and a temporary file behind. A fault is injected at
// every step of the write: each leaves a consistent pair (or the package
// alone) and no temporary file.
func TestPackagePairNeverTorn(t *testing.T) {
	steps := []string{"create x.html", "write x.html", "sync x.html", "create x.manifest.json",
		"write x.manifest.json", "sync x.manifest.json", "remove old sidecar", "rename file", "rename sidecar"}
	for _, at := range steps {
		t.Run(at, func(t *testing.T) {
			dir := t.TempDir()
			dest, side := filepath.Join(dir, "x.html"), filepath.Join(dir, "x.manifest.json")
			os.WriteFile(dest, []byte("old"), 0o644)
			os.WriteFile(side, []byte("old-m"), 0o644)
			seen := false
			writeHook = func(s string) error {
				if s == at {
					seen = true
					return errors.New("no space left on device")
				}
				return nil
			}
			defer func() { writeHook = nil }()
			if err := WritePairAtomic(dest, []byte("new"), side, []byte("new-m")); err == nil {
				t.Fatal("the write did not fail")
			}
			if !seen {
				t.Fatalf("step %q never ran", at)
			}
			pkg, sc := pairState(t, dir)
			if !consistent(pkg, sc) {
				t.Errorf("torn pair: package %q beside sidecar %q", pkg, sc)
			}
			if pkg != "old" && pkg != "new" {
				t.Errorf("package %q", pkg)
			}
		})
	}
	dir := t.TempDir()
	if err := WritePairAtomic(filepath.Join(dir, "x.html"), []byte("new"), filepath.Join(dir, "x.manifest.json"), []byte("new-m")); err != nil {
		t.Fatal(err)
	}
	if pkg, sc := pairState(t, dir); pkg != "new" || sc != "new-m" {
		t.Errorf("pair %q, %q", pkg, sc)
	}
}

// TestPairRefusesFolderDestination: issue 11 item 12. When NAME.html was a
// folder the manifest file was still written.
func TestPairRefusesFolderDestination(t *testing.T) {
	dir := t.TempDir()
	os.Mkdir(filepath.Join(dir, "x.html"), 0o755)
	err := WritePairAtomic(filepath.Join(dir, "x.html"), []byte("new"), filepath.Join(dir, "x.manifest.json"), []byte("new-m"))
	if err == nil || !strings.Contains(err.Error(), "is not a regular file (a folder)") {
		t.Fatalf("error %v", err)
	}
	if _, sc := pairState(t, dir); sc != "" {
		t.Error("the manifest file was written beside a folder")
	}
}

// TestPairConcurrentWriters: issue 11 item 12. Two renders into one folder
// at once tore the pair in 1 run of 40. Many writers at once, and readers
// that take the same lock, always see a consistent pair.
func TestPairConcurrentWriters(t *testing.T) {
	dir := t.TempDir()
	dest, side := filepath.Join(dir, "x.html"), filepath.Join(dir, "x.manifest.json")
	var wg sync.WaitGroup
	stop := make(chan struct{})
	var torn []string
	var mu sync.Mutex
	readerDone := make(chan struct{})
	go func() {
		defer close(readerDone)
		for {
			select {
			case <-stop:
				return
			default:
			}
			unlock, err := lockFolder(dir)
			if err != nil {
				continue
			}
			a, _ := os.ReadFile(dest)
			b, _ := os.ReadFile(side)
			unlock()
			if len(a) > 0 && !consistent(string(a), string(b)) {
				mu.Lock()
				torn = append(torn, string(a)+" / "+string(b))
				mu.Unlock()
			}
		}
	}()
	for i := 0; i < 24; i++ {
		wg.Add(1)
		go func(i int) {
			defer wg.Done()
			for j := 0; j < 5; j++ {
				p := fmt.Sprintf("p%d.%d", i, j)
				if err := WritePairAtomic(dest, []byte(p), side, []byte(p+"-m")); err != nil {
					t.Error(err)
				}
			}
		}(i)
	}
	wg.Wait()
	close(stop)
	<-readerDone
	if len(torn) > 0 {
		t.Errorf("%d torn pairs seen, such as %s", len(torn), torn[0])
	}
	pkg, sc := pairState(t, dir)
	if sc != pkg+"-m" {
		t.Errorf("final pair %q, %q", pkg, sc)
	}
}
