package main

import (
	"bytes"
	"path/filepath"
	"strings"
	"testing"

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
		"FAIL  line 7  header pressure at least the minimum",
		"result:   VERIFIED: every verification step holds",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("verify output lacks %q:\n%s", want, out)
		}
	}
	_ = filepath.Join
}
