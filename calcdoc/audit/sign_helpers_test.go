package audit

import (
	"bytes"
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/internal/testkit"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/calcdoc/settings"
)

// The fictional people and calc of the tests (internal/testkit).
const (
	preparerEmail = testkit.PreparerEmail
	checkerEmail  = testkit.CheckerEmail
	approverEmail = testkit.ApproverEmail
	signCalc      = testkit.SignCalc
)

var needTool = testkit.NeedTool

// gitRepo is a scratch repository (internal/testkit).
type gitRepo = testkit.Repo

func newGitRepo(t testing.TB) *gitRepo { return testkit.NewRepo(t) }

// calcRepo makes a repository holding calcs/fp.calc.md, committed, and
// ignoring packages so that rendering leaves the tree clean.
func calcRepo(t testing.TB) *gitRepo {
	r := newGitRepo(t)
	r.Write(".gitignore", "*.html\n*.manifest.json\n")
	r.Write("calcs/fp.calc.md", signCalc)
	r.Commit("Feed pump power, first issue")
	return r
}

// renderFile renders a calc file from disk as vouch render does and writes
// the package and its manifest file beside it.
func renderFile(t testing.TB, calc string) string {
	t.Helper()
	d, err := calcdoc.ReadFile(calc)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Errors) > 0 {
		t.Fatalf("errors:\n%s", d.Errors.Format(calc, d.Src))
	}
	st, err := Provenance(d, "test")
	if err != nil {
		t.Fatal(err)
	}
	p, err := d.Render(calcdoc.RenderOptions{Engine: "test", Stamp: st})
	if err != nil {
		t.Fatal(err)
	}
	pkg := strings.TrimSuffix(strings.TrimSuffix(calc, ".md"), ".calc") + ".html"
	writePkg(t, pkg, p.HTML)
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

// commitSigners commits .vouch/allowed_signers from principal, key pairs.
func commitSigners(t testing.TB, r *gitRepo, entries ...any) {
	t.Helper()
	data, err := os.ReadFile(allowedSigners(t, entries...))
	if err != nil {
		t.Fatal(err)
	}
	r.Write(".vouch/allowed_signers", string(data))
	r.Commit("Allowed signers", ".vouch/allowed_signers")
}

// forgeSignature adds a signature for role made with k, as the person the
// front matter names, without vouch sign's checks, and renders the package
// again: what a package looks like where a check was skipped.
func forgeSignature(t testing.TB, pkg, role string, k key) {
	t.Helper()
	m, err := ManifestOf(mustRead(t, pkg))
	if err != nil {
		t.Fatal(err)
	}
	signer, err := provenance.LoadSigner(k.path)
	if err != nil {
		t.Fatal(err)
	}
	d, err := calcdoc.ReadFile(strings.TrimSuffix(pkg, ".html") + ".calc.md")
	if err != nil {
		t.Fatal(err)
	}
	p := d.Person(role)
	date := m.Signatures[0].Date
	s := provenance.Signature{Role: role, Principal: p.Email, Name: p.Name, Date: date,
		Signed: provenance.FormatSigningTime(time.Now()), Attestation: settings.Default().Attestation[role]}
	if s, err = m.SignAs(s, signer); err != nil {
		t.Fatal(err)
	}
	m.Signatures = append(m.Signatures, s)
	rewriteManifest(t, pkg, m)
}

func mustRead(t testing.TB, path string) []byte {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// writeTemp writes a file in a fresh temporary folder.
func writeTemp(t testing.TB, name, content string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(path, []byte(content), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func writeFile(path string, data []byte) error { return os.WriteFile(path, data, 0o644) }
