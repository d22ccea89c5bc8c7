package main

import (
	"bufio"
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// fusedOp matches arm64's fused multiply-add instructions as go tool
// objdump prints them: FMADDD, FMSUBD, FNMADDD, FNMSUBD and the S forms.
var fusedOp = regexp.MustCompile(`\sF(N?M(ADD|SUB))[DS]\s`)

// fusedIn returns, per function of the module, the fused multiply-adds in
// an objdump listing.
func fusedIn(listing []byte, module string) map[string]int {
	found := map[string]int{}
	fn := ""
	sc := bufio.NewScanner(bytes.NewReader(listing))
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		line := sc.Text()
		if name, ok := strings.CutPrefix(line, "TEXT "); ok {
			fn = ""
			if strings.HasPrefix(name, module+"/") {
				fn = strings.Fields(name)[0]
			}
			continue
		}
		if fn != "" && fusedOp.MatchString(line) {
			found[fn]++
		}
	}
	return found
}

// TestNoFusedMultiplyAdd builds vouch for arm64, whose compiler fuses
// x*y + z where the Go spec allows, and fails if any function of the
// module contains a fused multiply-add: each would round differently from
// amd64. The fix is `go run ./internal/fpguard` from the module root.
func TestNoFusedMultiplyAdd(t *testing.T) {
	if testing.Short() {
		t.Skip("cross-compiles vouch for arm64; skipped with -short")
	}
	root := filepath.Join("..", "..")
	bin := filepath.Join(t.TempDir(), "vouch.arm64")
	build := exec.Command("go", "build", "-o", bin, "./cmd/vouch")
	build.Dir = root
	build.Env = append(os.Environ(), "GOARCH=arm64", "CGO_ENABLED=0")
	if out, err := build.CombinedOutput(); err != nil {
		t.Fatalf("GOARCH=arm64 go build: %v\n%s", err, out)
	}
	listing, err := exec.Command("go", "tool", "objdump", bin).Output()
	if err != nil {
		t.Fatalf("go tool objdump: %v", err)
	}
	if !bytes.Contains(listing, []byte("TEXT github.com/vouchcalc/vouch/props/if97.")) {
		t.Fatal("the listing has no function of props/if97: is the module path right?")
	}
	total := 0
	for fn, n := range fusedIn(listing, "github.com/vouchcalc/vouch") {
		t.Errorf("%s: %d fused multiply-adds", fn, n)
		total += n
	}
	if total > 0 {
		t.Errorf("%d fused multiply-adds in the module's functions: run `go run ./internal/fpguard`", total)
	}
}

// TestFusedIn: the listing parser finds fused instructions in the module's
// functions only.
func TestFusedIn(t *testing.T) {
	listing := []byte(`TEXT github.com/vouchcalc/vouch/props/if97.gibbs(SB) /x/kernel.go
  kernel.go:10	0x1000	1f420020	FMADDD F2, F0, F1, F0
  kernel.go:11	0x1004	1f420020	FNMSUBS F2, F0, F1, F0
  kernel.go:12	0x1008	1e620820	FMULD F2, F1, F0
TEXT math.Log(SB) /usr/local/go/src/math/log.go
  log.go:1	0x2000	1f420020	FMADDD F2, F0, F1, F0
`)
	got := fusedIn(listing, "github.com/vouchcalc/vouch")
	if len(got) != 1 || got["github.com/vouchcalc/vouch/props/if97.gibbs(SB)"] != 2 {
		t.Errorf("fusedIn = %v, want 2 in if97.gibbs only", got)
	}
}
