package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/qualify"
)

// TestSignQualification: a firm signs the qualification report; verify
// reruns the suite, checks the digest, the page and the signature, also
// with stock ssh-keygen over the documented payload; a tampered report, a
// tampered signature record, a key the signers file does not list and a
// report of another engine fail.
func TestSignQualification(t *testing.T) {
	needTools(t, "ssh-keygen")
	dir := t.TempDir()
	html, json := filepath.Join(dir, "qualification.html"), filepath.Join(dir, "qualification.json")
	cmd := func(want int, args ...string) string {
		t.Helper()
		var so, se bytes.Buffer
		if code := run(args, &so, &se); code != want {
			t.Fatalf("vouch %s: exit %d, want %d\n%s%s", strings.Join(args, " "), code, want, so.String(), se.String())
		}
		return so.String() + se.String()
	}
	cmd(exitOK, "qualify", "-o", dir)
	unsigned, _ := os.ReadFile(json)
	if out := cmd(exitOK, "verify", html); !strings.Contains(out, "ok   engine: this engine reproduces the report") || !strings.Contains(out, "not signed") {
		t.Fatalf("verify of the unsigned report:\n%s", out)
	}
	key, pub := sshKey(t)
	signers := filepath.Join(dir, "allowed_signers")
	os.WriteFile(signers, []byte("approver@example.com "+pub+"\n"), 0o644)
	signer := "A. Approver (fictional) <approver@example.com>"
	cmd(exitUsage, "sign", html, "--role", "approver", "--key", key)
	cmd(exitFailed, "sign", html, "--role", "approver", "--key", key, "--signer", "B. Other <other@example.com>", "--signers", signers)
	cmd(exitOK, "sign", html, "--role", "approver", "--key", key, "--signer", signer, "--signers", signers)
	cmd(exitFailed, "sign", html, "--role", "approver", "--key", key, "--signer", signer)
	if out := cmd(exitOK, "verify", html, "--signers", signers); !strings.Contains(out, "ok   approver: VALID: A. Approver (fictional) <approver@example.com>") || !strings.Contains(out, "status VERIFIED\n") {
		t.Fatalf("verify of the signed report:\n%s", out)
	}
	if out := cmd(exitOK, "verify", json); !strings.Contains(out, "intact; key not checked") || !strings.Contains(out, "status VERIFIED — keys unchecked") {
		t.Fatalf("verify without a signers file:\n%s", out)
	}
	signed, _ := os.ReadFile(json)
	r, err := qualify.ReadReport(signed)
	if err != nil || len(r.Signatures) != 1 || r.Digest != mustReport(t, unsigned).Digest {
		t.Fatalf("the signed report: %v; signing must not change the digest", err)
	}
	payload, _ := r.Payload(r.Signatures[0])
	if !strings.HasPrefix(string(payload), "vouch-qualification/1\nrole: approver\n") || !strings.HasSuffix(string(payload), "report-sha256: "+r.Digest+"\n") {
		t.Fatalf("payload:\n%s", payload)
	}
	sig := filepath.Join(dir, "approver.sig")
	os.WriteFile(sig, []byte(r.Signatures[0].Signature), 0o644)
	keygen := exec.Command("ssh-keygen", "-Y", "verify", "-f", signers, "-I", "approver@example.com", "-n", "calc-package@vouch", "-s", sig)
	keygen.Stdin = bytes.NewReader(payload)
	if out, err := keygen.CombinedOutput(); err != nil {
		t.Fatalf("ssh-keygen -Y verify refused the report's signature: %v\n%s", err, out)
	}

	page, _ := os.ReadFile(html)
	for name, tamper := range map[string]struct{ file, old, new, says string }{
		"a computed value": {json, `"verdict": "PASS"`, `"verdict": "FAIL"`, "it was edited"},
		"the page":         {html, "Verification of the calculation engine", "Verification of the engine", "is not the page its JSON"},
		"the signer":       {json, `"name": "A. Approver (fictional)"`, `"name": "A. Approver"`, "signature does not verify"},
	} {
		t.Run(name, func(t *testing.T) {
			defer os.WriteFile(json, signed, 0o644)
			defer os.WriteFile(html, page, 0o644)
			data, _ := os.ReadFile(tamper.file)
			if !bytes.Contains(data, []byte(tamper.old)) {
				t.Fatalf("%s lacks %q", tamper.file, tamper.old)
			}
			os.WriteFile(tamper.file, bytes.Replace(data, []byte(tamper.old), []byte(tamper.new), 1), 0o644)
			if tamper.file == json && name == "the signer" {
				// the page must match its JSON, so a forger renders it again
				r, err := qualify.ReadReport(mustRead(t, json))
				if err != nil {
					t.Fatal(err)
				}
				p, _ := r.HTML()
				os.WriteFile(html, p, 0o644)
			}
			if out := cmd(exitFailed, "verify", html, "--signers", signers); !strings.Contains(out, tamper.says) || !strings.Contains(out, "status NOT VERIFIED") {
				t.Errorf("verify of a report with %s edited:\n%s", name, out)
			}
		})
	}

	t.Run("another engine", func(t *testing.T) {
		defer os.WriteFile(json, signed, 0o644)
		defer os.WriteFile(html, page, 0o644)
		other := mustReport(t, unsigned)
		other.Engine.Arch = "arm64-other"
		other.Digest = other.ComputeDigest()
		os.WriteFile(json, other.CanonicalJSON(), 0o644)
		p, _ := other.HTML()
		os.WriteFile(html, p, 0o644)
		if out := cmd(exitFailed, "verify", html); !strings.Contains(out, "FAIL engine: made by another engine") {
			t.Errorf("verify of another engine's report:\n%s", out)
		}
		cmd(exitFailed, "sign", html, "--role", "approver", "--key", key, "--signer", signer)
	})
}

func mustReport(t *testing.T, data []byte) *qualify.Report {
	t.Helper()
	r, err := qualify.ReadReport(data)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

func mustRead(t *testing.T, path string) []byte {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return data
}
