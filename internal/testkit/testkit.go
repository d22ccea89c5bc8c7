// Package testkit holds the fixtures the tests of several packages share:
// scratch git repositories built with the git executable, fictional
// people and a small signed-calc source. It is imported only by tests.
//
// Files: testkit.go (tools, repositories, the fictional calc).
package testkit

import (
	"encoding/base64"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// The fictional people of the test calcs, as their front matter names them.
const (
	PreparerEmail = "preparer@example.com"
	CheckerEmail  = "checker@example.com"
	ApproverEmail = "approver@example.com"
)

// SignCalc is a small calc of a fictional plant with all three roles, a
// result and a check.
const SignCalc = `---
title: Feed pump power (fictional test plant)
number: FP-001
project: Test plant (fictional)
revision: A
people:
  preparer: P. Writer <preparer@example.com>
  checker: C. Reader <checker@example.com>
  approver: E. Record <approver@example.com>
summary: [P_pump]
---
# Feed pump

` + "```calc" + `
p_in = 8 kPa                         // pump suction pressure
p_out = 12.5 MPa                     // pump discharge pressure
m_dot = 213.2 kg/s                   // feedwater flow
st_in = water(p_in, 0)               // saturated liquid at suction
w_p [kJ/kg] = st_in.v * (p_out - p_in) / 80 %
P_pump [MW] = m_dot * w_p            // pump power
check P_pump < 5 MW                  // motor frame limit (fictional)
` + "```" + `
`

// NeedTool skips the test when an executable is missing, unless CI is set,
// where a missing tool is a failure.
func NeedTool(t testing.TB, name string) {
	t.Helper()
	if _, err := exec.LookPath(name); err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("%s is required when CI is set: %v", name, err)
		}
		t.Skipf("%s not found: %v", name, err)
	}
}

// Repo is a scratch repository built with the git executable, with
// fictional identities and dates one day apart per commit.
type Repo struct {
	T    testing.TB
	Dir  string // the work tree, symbolic links resolved
	tick int
}

// NewRepo makes an empty repository on branch main in a fresh folder.
func NewRepo(t testing.TB) *Repo {
	t.Helper()
	NeedTool(t, "git")
	r := &Repo{T: t, Dir: TempDir(t)}
	r.Git("init", "-q", "-b", "main")
	return r
}

// Folder is a Repo's helpers over a plain folder that is no repository.
func Folder(t testing.TB) *Repo { return &Repo{T: t, Dir: TempDir(t)} }

// TempDir is t.TempDir with symbolic links resolved, so paths compare
// equal to the ones git and the code under test report.
func TempDir(t testing.TB) string {
	t.Helper()
	dir, err := filepath.EvalSymlinks(t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	return dir
}

// Env is the environment git runs in: no user configuration, the
// fictional preparer as author and committer, and the commit's date.
func (r *Repo) Env() []string {
	date := fmt.Sprintf("@%d +0100", 1767000000+86400*r.tick)
	return append(os.Environ(),
		"GIT_CONFIG_GLOBAL=/dev/null", "GIT_CONFIG_NOSYSTEM=1",
		"GIT_AUTHOR_NAME=P. Writer (fictional)", "GIT_AUTHOR_EMAIL="+PreparerEmail,
		"GIT_COMMITTER_NAME=P. Writer (fictional)", "GIT_COMMITTER_EMAIL="+PreparerEmail,
		"GIT_AUTHOR_DATE="+date, "GIT_COMMITTER_DATE="+date,
	)
}

// Git runs git in the work tree and returns its trimmed output.
func (r *Repo) Git(args ...string) string {
	r.T.Helper()
	cmd := exec.Command("git", args...)
	cmd.Dir, cmd.Env = r.Dir, r.Env()
	out, err := cmd.CombinedOutput()
	if err != nil {
		r.T.Fatalf("git %s: %v\n%s", strings.Join(args, " "), err, out)
	}
	return strings.TrimSpace(string(out))
}

// Path is the file path of a slash path in the work tree.
func (r *Repo) Path(rel string) string { return filepath.Join(r.Dir, filepath.FromSlash(rel)) }

// Write writes a file of the work tree, making its folders.
func (r *Repo) Write(rel, content string) {
	r.T.Helper()
	p := r.Path(rel)
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		r.T.Fatal(err)
	}
	if err := os.WriteFile(p, []byte(content), 0o644); err != nil {
		r.T.Fatal(err)
	}
}

// Read reads a file of the work tree.
func (r *Repo) Read(rel string) []byte {
	r.T.Helper()
	b, err := os.ReadFile(r.Path(rel))
	if err != nil {
		r.T.Fatal(err)
	}
	return b
}

// Commit stages the given paths (all when none), commits a day after the
// last commit and returns the commit's hash.
func (r *Repo) Commit(msg string, paths ...string) string {
	r.T.Helper()
	if len(paths) == 0 {
		paths = []string{"-A"}
	}
	r.Git(append([]string{"add"}, paths...)...)
	r.tick++
	r.Git("commit", "-q", "-m", msg)
	return r.Git("rev-parse", "HEAD")
}

// TinyPNG is a 1×1 PNG image (made for these tests).
var TinyPNG, _ = base64.StdEncoding.DecodeString("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==")
