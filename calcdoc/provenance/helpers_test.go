package provenance

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// needTool skips the test when an executable is missing, unless the CI
// variable is set: there a missing tool is a failure.
func needTool(t testing.TB, name string) {
	t.Helper()
	if _, err := exec.LookPath(name); err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("%s is required when CI is set: %v", name, err)
		}
		t.Skipf("%s not found: %v", name, err)
	}
}

// testRepo is a scratch git repository built with the git executable.
// Authors are fictional; dates advance one minute per commit.
type testRepo struct {
	t    testing.TB
	dir  string
	tick int
}

func newTestRepo(t testing.TB) *testRepo {
	t.Helper()
	needTool(t, "git")
	dir, err := filepath.EvalSymlinks(t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	r := &testRepo{t: t, dir: dir}
	r.git("init", "-q", "-b", "main")
	return r
}

// env isolates git from the user's configuration and fixes identities and
// dates so that hashes are reproducible.
func (r *testRepo) env() []string {
	date := fmt.Sprintf("@%d +0200", 1700000000+60*r.tick)
	return append(os.Environ(),
		"GIT_CONFIG_GLOBAL=/dev/null", "GIT_CONFIG_NOSYSTEM=1",
		"GIT_AUTHOR_NAME=P. Writer (fictional)", "GIT_AUTHOR_EMAIL=preparer@example.com",
		"GIT_COMMITTER_NAME=C. Reader (fictional)", "GIT_COMMITTER_EMAIL=checker@example.com",
		"GIT_AUTHOR_DATE="+date, "GIT_COMMITTER_DATE="+date,
	)
}

// git runs git in the repository and returns its trimmed output.
func (r *testRepo) git(args ...string) string {
	r.t.Helper()
	return r.gitIn(r.dir, args...)
}

func (r *testRepo) gitIn(dir string, args ...string) string {
	r.t.Helper()
	cmd := exec.Command("git", args...)
	cmd.Dir = dir
	cmd.Env = r.env()
	out, err := cmd.CombinedOutput()
	if err != nil {
		r.t.Fatalf("git %s: %v\n%s", strings.Join(args, " "), err, out)
	}
	return strings.TrimSpace(string(out))
}

// write writes a work-tree file, making its directories.
func (r *testRepo) write(rel, content string) {
	r.t.Helper()
	p := filepath.Join(r.dir, filepath.FromSlash(rel))
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		r.t.Fatal(err)
	}
	if err := os.WriteFile(p, []byte(content), 0o644); err != nil {
		r.t.Fatal(err)
	}
}

// commit stages everything and commits, returning the new hash.
func (r *testRepo) commit(msg string) string {
	r.t.Helper()
	r.git("add", "-A")
	r.tick++
	r.git("commit", "-q", "--allow-empty", "-m", msg)
	return r.git("rev-parse", "HEAD")
}

// merge merges a branch with a fixed date and returns the new hash.
func (r *testRepo) merge(args ...string) string {
	r.t.Helper()
	r.tick++
	r.git(append([]string{"merge", "-q", "--no-edit", "--no-ff"}, args...)...)
	return r.git("rev-parse", "HEAD")
}

// open opens the repository through a path inside it.
func (r *testRepo) open(rel string) *Repo {
	r.t.Helper()
	repo, err := Open(filepath.Join(r.dir, filepath.FromSlash(rel)))
	if err != nil {
		r.t.Fatalf("Open: %v", err)
	}
	return repo
}

// gitLog lists the commits git itself shows for a path, newest first.
func (r *testRepo) gitLog(dir, rel string) []string {
	r.t.Helper()
	out := r.gitIn(dir, "log", "--format=%H", "--", rel)
	if out == "" {
		return nil
	}
	return strings.Split(out, "\n")
}

// hashes returns the commit hashes of revisions.
func hashes(revs []Revision) []string {
	var out []string
	for _, r := range revs {
		out = append(out, r.Commit)
	}
	return out
}
