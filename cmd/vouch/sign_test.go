package main

import (
	"bytes"
	"github.com/vouchcalc/vouch/internal/testkit"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// needTools skips the test when an executable is missing, unless CI is
// set, where a missing tool is a failure.
func needTools(t *testing.T, names ...string) {
	t.Helper()
	for _, name := range names {
		testkit.NeedTool(t, name)
	}
}

// signRepo makes a repository holding the example calc, committed, with a
// fictional identity and date, and returns its folder.
func signRepo(t *testing.T) string {
	t.Helper()
	needTools(t, "git", "ssh-keygen")
	src, err := os.ReadFile(filepath.Join("..", "..", "examples", "rankine-simple.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	r := testkit.NewRepo(t)
	r.Write("hb.calc.md", string(src))
	r.Write(".gitignore", "*.html\n*.manifest.json\n")
	r.Commit("Unit 1 heat balance")
	return r.Dir
}

// sshKey makes an Ed25519 key and returns its path and public key text.
func sshKey(t *testing.T) (string, string) {
	t.Helper()
	path := filepath.Join(t.TempDir(), "id")
	if out, err := exec.Command("ssh-keygen", "-q", "-t", "ed25519", "-N", "", "-f", path).CombinedOutput(); err != nil {
		t.Fatalf("ssh-keygen: %v\n%s", err, out)
	}
	pub, _ := os.ReadFile(path + ".pub")
	f := strings.Fields(string(pub))
	return path, f[0] + " " + f[1]
}

// TestSignVerifyCommands runs render, sign and verify as a user would and
// checks the exit codes and that a refused sign leaves the package alone.
func TestSignVerifyCommands(t *testing.T) {
	dir := signRepo(t)
	calc, pkg := filepath.Join(dir, "hb.calc.md"), filepath.Join(dir, "hb.html")
	key, pub := sshKey(t)
	signers := filepath.Join(dir, "..", "allowed_signers")
	os.WriteFile(signers, []byte("preparer@example.com "+pub+"\n"), 0o644)
	vouch := func(want int, args ...string) string {
		t.Helper()
		var out, errs bytes.Buffer
		if got := run(args, &out, &errs); got != want {
			t.Fatalf("vouch %s: exit %d, want %d\n%s%s", strings.Join(args, " "), got, want, out.String(), errs.String())
		}
		return out.String() + errs.String()
	}
	vouch(exitOK, "render", calc)
	vouch(exitOK, "verify", pkg)
	vouch(exitUsage, "sign", pkg)
	vouch(exitUsage, "sign", pkg, "--role", "reviewer", "--key", key)
	vouch(exitUsage, "verify", filepath.Join(dir, "missing.html"))
	vouch(exitUsage, "sign", pkg, "--role", "preparer", "--key", filepath.Join(dir, "no-such-key"))
	before, _ := os.ReadFile(pkg)
	vouch(exitFailed, "sign", pkg, "--role", "checker", "--key", key)
	if after, _ := os.ReadFile(pkg); !bytes.Equal(before, after) {
		t.Error("a refused sign changed the package")
	}
	out := vouch(exitOK, "sign", pkg, "--role", "preparer", "--key", key, "--signers", signers)
	if !strings.Contains(out, "status PREPARED") {
		t.Errorf("sign output:\n%s", out)
	}
	out = vouch(exitOK, "verify", pkg, "--signers", signers)
	if !strings.Contains(out, "status:   PREPARED") || !strings.Contains(out, "result:   VERIFIED") {
		t.Errorf("verify output:\n%s", out)
	}
	os.WriteFile(signers, []byte("checker@example.com "+pub+"\n"), 0o644)
	out = vouch(exitFailed, "verify", pkg, "--signers", signers)
	if !strings.Contains(out, "FAIL  preparer") {
		t.Errorf("verify with the key listed for another person:\n%s", out)
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.HasSuffix(e.Name(), ".tmp") {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
}

// TestSignWithdrawCommand: signing a role twice exits with a usage error
// naming --withdraw; --withdraw keeps the signature in the manifest,
// marked, and lets the role be signed again.
func TestSignWithdrawCommand(t *testing.T) {
	dir := signRepo(t)
	calc, pkg := filepath.Join(dir, "hb.calc.md"), filepath.Join(dir, "hb.html")
	key, _ := sshKey(t)
	vouch := func(want int, args ...string) string {
		t.Helper()
		var out, errs bytes.Buffer
		if got := run(args, &out, &errs); got != want {
			t.Fatalf("vouch %s: exit %d, want %d\n%s%s", strings.Join(args, " "), got, want, out.String(), errs.String())
		}
		return out.String() + errs.String()
	}
	vouch(exitOK, "render", calc)
	out := vouch(exitOK, "sign", pkg, "--role", "preparer", "--key", key)
	for _, want := range []string{"attests: I prepared this calculation", "status PREPARED — keys unchecked", " signed 20"} {
		if !strings.Contains(out, want) {
			t.Errorf("sign output lacks %q:\n%s", want, out)
		}
	}
	out = vouch(exitUsage, "sign", pkg, "--role", "preparer", "--key", key)
	if !strings.Contains(out, "--withdraw") {
		t.Errorf("second preparer signature:\n%s", out)
	}
	out = vouch(exitOK, "sign", pkg, "--role", "preparer", "--withdraw")
	if !strings.Contains(out, "withdrew the preparer signature") || !strings.Contains(out, "status DRAFT") {
		t.Errorf("withdraw output:\n%s", out)
	}
	vouch(exitUsage, "sign", pkg, "--role", "checker", "--withdraw")
	for _, bad := range [][]string{{"--withdraw", "--key", key}, {"--signed", "2026-03-14T09:26:53Z", "--key", key}, {"--signature", key}} {
		out = vouch(exitUsage, append([]string{"sign", pkg, "--role", "preparer"}, bad...)...)
		if !strings.Contains(out, "vouch: sign: ") {
			t.Errorf("sign %v: %s", bad, out)
		}
	}
	vouch(exitOK, "sign", pkg, "--role", "preparer", "--key", key)
	m, _ := os.ReadFile(filepath.Join(dir, "hb.manifest.json"))
	if strings.Count(string(m), `"role":"preparer"`) != 2 || strings.Count(string(m), `"withdrawn":`) != 1 {
		t.Errorf("manifest does not keep the withdrawn signature:\n%s", m)
	}
	out = vouch(exitOK, "verify", pkg)
	if !strings.Contains(out, "withdrawn") || !strings.Contains(out, "intact; key not checked against a signers file") {
		t.Errorf("verify output:\n%s", out)
	}
}

// TestSignApproverOpenAssumption: the approver is refused, with the open
// assumption named, exit 1 and the package left alone.
func TestSignApproverOpenAssumption(t *testing.T) {
	needTools(t, "git", "ssh-keygen")
	src, err := os.ReadFile(filepath.Join("..", "..", "examples", "rankine-simple.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	withOpen := string(src) + "\n```assumptions\nA1 open: condenser pressure until the vendor confirms it\n```\n"
	r := testkit.NewRepo(t)
	r.Write("hb.calc.md", withOpen)
	r.Write(".gitignore", "*.html\n*.manifest.json\n")
	r.Commit("Unit 1 heat balance, open assumption")
	calc, pkg := r.Path("hb.calc.md"), r.Path("hb.html")
	prep, _ := sshKey(t)
	chk, _ := sshKey(t)
	key, _ := sshKey(t)
	var out, errs bytes.Buffer
	for _, args := range [][]string{{"render", calc}, {"sign", pkg, "--role", "preparer", "--key", prep}, {"sign", pkg, "--role", "checker", "--key", chk}} {
		if code := run(args, &out, &errs); code != exitOK {
			t.Fatalf("vouch %s: exit %d\n%s", strings.Join(args, " "), code, errs.String())
		}
	}
	if !strings.Contains(out.String(), "status PRELIMINARY") {
		t.Errorf("a signed package with an open assumption is not PRELIMINARY:\n%s", out.String())
	}
	before, _ := os.ReadFile(pkg)
	errs.Reset()
	if code := run([]string{"sign", pkg, "--role", "approver", "--key", key}, &out, &errs); code != exitFailed {
		t.Fatalf("approver with an open assumption: exit %d, want %d\n%s", code, exitFailed, errs.String())
	}
	line := strings.Count(withOpen, "\n") - 1
	want := "not approved: 1 assumption is still open: A1 (line " + strconv.Itoa(line) + ")"
	if !strings.Contains(errs.String(), want) {
		t.Errorf("the refusal does not say why:\n%s\nwant %q", errs.String(), want)
	}
	if after, _ := os.ReadFile(pkg); !bytes.Equal(before, after) {
		t.Error("a refused approver signature changed the package")
	}
}
