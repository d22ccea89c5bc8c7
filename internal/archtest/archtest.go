// Package archtest checks, from a package's tests, that the package's
// results are the same bits on arm64 as on this machine: it cross-compiles
// the package's test binary for arm64, runs it under qemu-user to list the
// results there, and compares the lists line by line.
//
// A package using it has two tests:
//
//	func TestResultsDump(t *testing.T)    { archtest.Dump(t, resultLines) }
//	func TestSameBitsOnArm64(t *testing.T) { archtest.SameOnArm64(t, resultLines) }
//
// where resultLines formats every result so that equal text means equal
// bits (strconv 'g' with precision -1 does). It is used by tests only.
package archtest

import (
	"crypto/sha256"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// DumpEnv names the file Dump writes the result lines to.
const DumpEnv = "VOUCH_RESULTS_DUMP"

// Dump writes lines(t) to the file named by DumpEnv, one a line, and skips
// when DumpEnv is unset.
func Dump(t *testing.T, lines func(*testing.T) []string) {
	path := os.Getenv(DumpEnv)
	if path == "" {
		t.Skip(DumpEnv + " is not set")
	}
	if err := os.WriteFile(path, []byte(strings.Join(lines(t), "\n")+"\n"), 0o644); err != nil {
		t.Fatal(err)
	}
}

// SameOnArm64 cross-compiles the test binary of the package in the current
// directory for arm64, runs its TestResultsDump under qemu-aarch64 and
// fails on every line that differs from lines(t) here. Without
// qemu-aarch64 it skips, unless CI is set; with -short it skips.
func SameOnArm64(t *testing.T, lines func(*testing.T) []string) {
	if testing.Short() {
		t.Skip("cross-compiles and emulates; skipped with -short")
	}
	if os.Getenv(DumpEnv) != "" {
		t.Skip("running as the dump")
	}
	qemu, err := exec.LookPath("qemu-aarch64")
	if err != nil {
		if os.Getenv("CI") != "" {
			t.Fatal("qemu-aarch64 not found (install qemu-user)")
		}
		t.Skip("qemu-aarch64 not found (install qemu-user)")
	}
	dir := t.TempDir()
	bin := filepath.Join(dir, "arm64.test")
	build := exec.Command("go", "test", "-c", "-o", bin, ".")
	build.Env = append(os.Environ(), "GOARCH=arm64", "CGO_ENABLED=0")
	if out, err := build.CombinedOutput(); err != nil {
		t.Fatalf("cross-compiling for arm64: %v\n%s", err, out)
	}
	dump := filepath.Join(dir, "arm64.txt")
	run := exec.Command(qemu, bin, "-test.run", "^TestResultsDump$", "-test.count", "1")
	run.Env = append(os.Environ(), DumpEnv+"="+dump)
	if out, err := run.CombinedOutput(); err != nil {
		t.Fatalf("running under qemu-aarch64: %v\n%s", err, out)
	}
	arm, err := os.ReadFile(dump)
	if err != nil {
		t.Fatal(err)
	}
	here := lines(t)
	there := strings.Split(strings.TrimSuffix(string(arm), "\n"), "\n")
	if len(here) != len(there) {
		t.Fatalf("%d result lines here, %d on arm64", len(here), len(there))
	}
	differ := 0
	for i := range here {
		if here[i] == there[i] {
			continue
		}
		if differ < 20 {
			t.Errorf("differs:\n  here:  %s\n  arm64: %s", here[i], there[i])
		}
		differ++
	}
	sum := sha256.Sum256([]byte(strings.Join(here, "\n") + "\n"))
	if differ > 0 || sum != sha256.Sum256(arm) {
		t.Fatalf("%d of %d result lines differ between this machine and arm64", differ, len(here))
	}
	t.Logf("%d result lines, digest %x, the same on arm64", len(here), sum[:8])
}
