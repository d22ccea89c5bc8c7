package calcdoc

import (
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// The fictional people of the test calcs, as their front matter names them.
const (
	preparerEmail = "preparer@example.com"
	checkerEmail  = "checker@example.com"
	approverEmail = "approver@example.com"
)

// signCalc is a small calc with all three roles, a result and a check.
const signCalc = `---
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

// needTool skips the test when an executable is missing, unless CI is set,
// where a missing tool is a failure.
func needTool(t testing.TB, name string) {
	t.Helper()
	if _, err := exec.LookPath(name); err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("%s is required when CI is set: %v", name, err)
		}
		t.Skipf("%s not found: %v", name, err)
	}
}

// gitRepo is a scratch repository built with the git executable, with
// fictional identities and dates one day apart per commit.
type gitRepo struct {
	t    testing.TB
	dir  string
	tick int
}

func newGitRepo(t testing.TB) *gitRepo {
	t.Helper()
	needTool(t, "git")
	dir, err := filepath.EvalSymlinks(t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	r := &gitRepo{t: t, dir: dir}
	r.git("init", "-q", "-b", "main")
	return r
}

func (r *gitRepo) env() []string {
	date := fmt.Sprintf("@%d +0100", 1767000000+86400*r.tick)
	return append(os.Environ(),
		"GIT_CONFIG_GLOBAL=/dev/null", "GIT_CONFIG_NOSYSTEM=1",
		"GIT_AUTHOR_NAME=P. Writer (fictional)", "GIT_AUTHOR_EMAIL="+preparerEmail,
		"GIT_COMMITTER_NAME=P. Writer (fictional)", "GIT_COMMITTER_EMAIL="+preparerEmail,
		"GIT_AUTHOR_DATE="+date, "GIT_COMMITTER_DATE="+date,
	)
}

func (r *gitRepo) git(args ...string) string {
	r.t.Helper()
	cmd := exec.Command("git", args...)
	cmd.Dir, cmd.Env = r.dir, r.env()
	out, err := cmd.CombinedOutput()
	if err != nil {
		r.t.Fatalf("git %s: %v\n%s", strings.Join(args, " "), err, out)
	}
	return strings.TrimSpace(string(out))
}

func (r *gitRepo) path(rel string) string { return filepath.Join(r.dir, filepath.FromSlash(rel)) }

func (r *gitRepo) write(rel, content string) {
	r.t.Helper()
	p := r.path(rel)
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		r.t.Fatal(err)
	}
	if err := os.WriteFile(p, []byte(content), 0o644); err != nil {
		r.t.Fatal(err)
	}
}

func (r *gitRepo) read(rel string) []byte {
	r.t.Helper()
	b, err := os.ReadFile(r.path(rel))
	if err != nil {
		r.t.Fatal(err)
	}
	return b
}

// commit stages the given paths (all when none) and commits.
func (r *gitRepo) commit(msg string, paths ...string) string {
	r.t.Helper()
	if len(paths) == 0 {
		paths = []string{"-A"}
	}
	r.git(append([]string{"add"}, paths...)...)
	r.tick++
	r.git("commit", "-q", "-m", msg)
	return r.git("rev-parse", "HEAD")
}

// calcRepo makes a repository holding calcs/fp.calc.md, committed, and
// ignoring packages so that rendering leaves the tree clean.
func calcRepo(t testing.TB) *gitRepo {
	r := newGitRepo(t)
	r.write(".gitignore", "*.html\n*.manifest.json\n")
	r.write("calcs/fp.calc.md", signCalc)
	r.commit("Feed pump power, first issue")
	return r
}

// renderFile renders a calc file from disk as vouch render does and writes
// the package and its manifest file beside it.
func renderFile(t testing.TB, calc string) string {
	t.Helper()
	d, err := ReadFile(calc)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Errors) > 0 {
		t.Fatalf("errors:\n%s", d.Errors.Format(calc, d.Src))
	}
	html, err := d.Render(RenderOptions{Engine: "test"})
	if err != nil {
		t.Fatal(err)
	}
	pkg := strings.TrimSuffix(strings.TrimSuffix(calc, ".md"), ".calc") + ".html"
	writePkg(t, pkg, html)
	return pkg
}

// writePkg writes a package and the manifest file beside it.
func writePkg(t testing.TB, pkg string, html []byte) {
	t.Helper()
	m, err := ManifestOf(html)
	if err != nil {
		t.Fatal(err)
	}
	file, err := ManifestFile(m)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(pkg, html, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(ManifestPath(pkg), file, 0o644); err != nil {
		t.Fatal(err)
	}
}

// key is an SSH key pair made with ssh-keygen.
type key struct {
	path string // private key; the public key is path + ".pub"
	pub  string // "TYPE BASE64"
}

func newKey(t testing.TB, typ string) key {
	t.Helper()
	needTool(t, "ssh-keygen")
	path := filepath.Join(t.TempDir(), "id_"+typ)
	args := []string{"-q", "-t", typ, "-N", "", "-C", "test key (fictional)", "-f", path}
	if typ == "rsa" {
		args = append(args, "-b", "2048")
	}
	if out, err := exec.Command("ssh-keygen", args...).CombinedOutput(); err != nil {
		t.Fatalf("ssh-keygen: %v\n%s", err, out)
	}
	pub, err := os.ReadFile(path + ".pub")
	if err != nil {
		t.Fatal(err)
	}
	f := strings.Fields(string(pub))
	return key{path: path, pub: f[0] + " " + f[1]}
}

// allowedSigners writes an allowed-signers file from principal, key pairs.
func allowedSigners(t testing.TB, entries ...any) string {
	t.Helper()
	var b strings.Builder
	for i := 0; i+1 < len(entries); i += 2 {
		fmt.Fprintf(&b, "%s namespaces=\"calc-package@vouch\" %s\n", entries[i].(string), entries[i+1].(key).pub)
	}
	path := filepath.Join(t.TempDir(), "allowed_signers")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// signPkg signs a package and writes it back, failing the test on error.
func signPkg(t testing.TB, pkg, role string, k key, signers string) *Signed {
	t.Helper()
	s, rep, err := Sign(pkg, SignOptions{Role: role, Key: k.path, VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}})
	if err != nil {
		msg := ""
		if rep != nil {
			msg = rep.String()
		}
		t.Fatalf("sign as %s: %v\n%s", role, err, msg)
	}
	writePkg(t, pkg, s.HTML)
	return s
}

// verifyPkg verifies a package, failing the test on a usage error.
func verifyPkg(t testing.TB, pkg, signers string) *Report {
	t.Helper()
	rep, err := Verify(pkg, VerifyOptions{Engine: "test", Signers: signers})
	if err != nil {
		t.Fatal(err)
	}
	return rep
}

// failsWith checks that a report fails, with a failure on topic whose text
// holds every part.
func failsWith(t *testing.T, rep *Report, topic string, parts ...string) {
	t.Helper()
	if rep.OK() {
		t.Fatalf("verify passed, want a %s failure:\n%s", topic, rep)
	}
	for _, f := range rep.Failures() {
		if f.Topic == topic && containsAll(f.Text, parts) {
			return
		}
	}
	t.Fatalf("no %s failure saying %q:\n%s", topic, parts, rep)
}

func containsAll(s string, parts []string) bool {
	for _, p := range parts {
		if !strings.Contains(s, p) {
			return false
		}
	}
	return true
}

// replaceOnce replaces the first old in a file, failing when absent.
func replaceOnce(t *testing.T, path, old, new string) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(b, []byte(old)) {
		t.Fatalf("%s does not hold %q", path, old)
	}
	if err := os.WriteFile(path, bytes.Replace(b, []byte(old), []byte(new), 1), 0o644); err != nil {
		t.Fatal(err)
	}
}
