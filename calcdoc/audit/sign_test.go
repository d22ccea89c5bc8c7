package audit

import (
	"bytes"
	"errors"
	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/internal/testkit"
	stdhtml "html"
	"net"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// TestSignAndVerify signs as preparer, checker and approver with Ed25519
// and RSA keys, and verifies after each step.
func TestSignAndVerify(t *testing.T) {
	for _, typ := range []string{"ed25519", "rsa"} {
		t.Run(typ, func(t *testing.T) {
			r := calcRepo(t)
			prep, chk, appr := newKey(t, typ), newKey(t, typ), newKey(t, typ)
			commitSigners(t, r, preparerEmail, prep, checkerEmail, chk, approverEmail, appr)
			pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
			signers := "" // the committed file
			date := r.Git("log", "-1", "--format=%cd", "--date=iso-strict-local", "HEAD")
			for i, step := range []struct {
				role string
				k    key
			}{{"preparer", prep}, {"checker", chk}, {"approver", appr}} {
				s := signPkg(t, pkg, step.role, step.k, signers)
				if s.Status != stamps[i] {
					t.Errorf("after %s: status %s, want %s", step.role, s.Status, stamps[i])
				}
				rep := verifyPkg(t, pkg, signers)
				if !rep.OK() || rep.Status != stamps[i] {
					t.Fatalf("verify after %s: status %s\n%s", step.role, rep.Status, rep)
				}
				m, _ := ManifestOf(r.Read("calcs/fp.html"))
				if len(m.Signatures) != i+1 {
					t.Errorf("after %s: %d signatures", step.role, len(m.Signatures))
				}
			}
			html := stdhtml.UnescapeString(string(r.Read("calcs/fp.html")))
			for _, want := range []string{`<div class="stamp">APPROVED</div>`, "C. Reader", day(date), fingerprint(t, chk),
				"I approve this calculation for issue.", ".vouch/allowed_signers as committed"} {
				if !strings.Contains(html, want) {
					t.Errorf("cover lacks %q", want)
				}
			}
		})
	}
}

// fingerprint is a test key's SHA256 fingerprint.
func fingerprint(t *testing.T, k key) string {
	t.Helper()
	a, err := provenance.ParseAllowedSigners([]byte("x " + k.pub))
	if err != nil {
		t.Fatal(err)
	}
	return provenance.Fingerprint(a[0].Key)
}

// TestSignRoleTwiceNeedsWithdrawal: a role signed twice is refused until
// the earlier signature is withdrawn; the withdrawn one stays in the
// manifest, marked, and counts for nothing.
func TestSignRoleTwiceNeedsWithdrawal(t *testing.T) {
	r := calcRepo(t)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	prep, chk, chk2 := newKey(t, "ed25519"), newKey(t, "ed25519"), newKey(t, "ed25519")
	signPkg(t, pkg, "preparer", prep, "")
	signPkg(t, pkg, "checker", chk, "")
	_, _, err := Sign(pkg, SignOptions{Role: "checker", Key: chk2.path, VerifyOptions: VerifyOptions{Engine: "test"}})
	if err == nil || !strings.Contains(err.Error(), "already has a checker signature") || !strings.Contains(err.Error(), "--withdraw") {
		t.Fatalf("second checker signature: %v, want a refusal naming --withdraw", err)
	}
	w, _, err := Sign(pkg, SignOptions{Role: "checker", Withdraw: true, VerifyOptions: VerifyOptions{Engine: "test"}})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(w.Status, "PREPARED") {
		t.Errorf("status after withdrawing the checker: %s", w.Status)
	}
	writePkg(t, pkg, w.HTML)
	signPkg(t, pkg, "checker", chk2, "")
	m, _ := ManifestOf(r.Read("calcs/fp.html"))
	if len(m.Signatures) != 3 || m.Signatures[1].Withdrawn == "" || m.Signatures[1].Fingerprint != fingerprint(t, chk) ||
		m.Signatures[2].Withdrawn != "" || m.Signatures[2].Fingerprint != fingerprint(t, chk2) {
		t.Fatalf("signatures = %+v", m.Signatures)
	}
	signers := allowedSigners(t, preparerEmail, prep, checkerEmail, chk2)
	rep := verifyPkg(t, pkg, signers)
	if !rep.OK() || rep.Status != "CHECKED" || !strings.Contains(rep.String(), "withdrawn") {
		t.Fatalf("verify:\n%s", rep)
	}
}

// TestSignOrder: the checker signs after the preparer, the approver after
// both.
func TestSignOrder(t *testing.T) {
	r := calcRepo(t)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	k := newKey(t, "ed25519")
	_, _, err := Sign(pkg, SignOptions{Role: "checker", Key: k.path, VerifyOptions: VerifyOptions{Engine: "test"}})
	if !errors.Is(err, ErrNotVerified) || !strings.Contains(err.Error(), "the checker signs after the preparer") {
		t.Fatalf("checker before preparer: %v", err)
	}
	_, _, err = Sign(pkg, SignOptions{Role: "reviewer", Key: k.path, VerifyOptions: VerifyOptions{Engine: "test"}})
	var usage *calcdoc.UsageError
	if !errors.As(err, &usage) {
		t.Fatalf("unknown role: %v, want a usage error", err)
	}
}

// TestSignatureInteroperability: a signature vouch makes verifies with
// ssh-keygen -Y verify, and one ssh-keygen -Y sign makes over the same
// payload is accepted by vouch.
func TestSignatureInteroperability(t *testing.T) {
	for _, typ := range []string{"ed25519", "rsa"} {
		t.Run(typ, func(t *testing.T) {
			r := calcRepo(t)
			pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
			prep, chk := newKey(t, typ), newKey(t, typ)
			signers := allowedSigners(t, preparerEmail, prep, checkerEmail, chk)
			signPkg(t, pkg, "preparer", prep, signers)

			m, _ := ManifestOf(r.Read("calcs/fp.html"))
			payload, err := m.Payload(m.Signatures[0])
			if err != nil {
				t.Fatal(err)
			}
			if !strings.Contains(string(payload), "\nsigned: "+m.Signatures[0].Signed+"\n") ||
				!strings.Contains(string(payload), "\nattestation: I prepared this calculation") {
				t.Fatalf("payload lacks the signing time or the attestation:\n%s", payload)
			}
			if ok, out := keygenVerify(t, signers, preparerEmail, payload, []byte(m.Signatures[0].Signature)); !ok {
				t.Fatalf("ssh-keygen -Y verify refused vouch's signature:\n%s", out)
			}

			signed := provenance.FormatSigningTime(time.Now().Add(-time.Minute))
			payload, _ = m.Payload(provenance.Signature{Role: "checker", Name: "C. Reader", Principal: checkerEmail,
				Signed: signed, Attestation: "I checked the inputs and their sources, the method, the arithmetic and the units, and every review comment on this calculation is resolved.",
				Method: provenance.MethodTest, MethodRef: "TR-7 rev B (fictional pump test)"})
			if !strings.Contains(string(payload), "\nmethod: test\nmethod-ref: TR-7 rev B (fictional pump test)\nmanifest-sha256: ") {
				t.Fatalf("payload lacks the method of checking:\n%s", payload)
			}
			sig := keygenSign(t, chk.path, payload)
			if _, _, err := Sign(pkg, SignOptions{Role: "checker", Signature: sig, Signed: signed, Method: CheckMethod{Method: "review"},
				VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}}); err == nil {
				t.Fatal("a signature attached with another method of checking than its payload's was accepted")
			}
			other := provenance.FormatSigningTime(time.Now().Add(-2 * time.Minute))
			if _, _, err := Sign(pkg, SignOptions{Role: "checker", Signature: sig, Signed: other, VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}}); err == nil {
				t.Fatal("a signature attached with another signing time than its payload's was accepted")
			}
			s, rep, err := Sign(pkg, SignOptions{Role: "checker", Signature: sig, Signed: signed, Method: CheckMethod{Method: "test", Document: "TR-7 rev B (fictional pump test)"},
				VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}})
			if err != nil {
				t.Fatalf("attach ssh-keygen signature: %v\n%v", err, rep)
			}
			writePkg(t, pkg, s.HTML)
			if rep := verifyPkg(t, pkg, signers); !rep.OK() || rep.Status != "CHECKED" {
				t.Fatalf("verify with an ssh-keygen signature:\n%s", rep)
			}

			// A checker's signature vouch makes, with its method, verifies with ssh-keygen.
			w, _, err := Sign(pkg, SignOptions{Role: "checker", Withdraw: true, VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}})
			if err != nil {
				t.Fatal(err)
			}
			writePkg(t, pkg, w.HTML)
			s, _, err = Sign(pkg, SignOptions{Role: "checker", Key: chk.path, Method: CheckMethod{Method: "test", Document: "TR-8 (fictional)"},
				VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}})
			if err != nil {
				t.Fatal(err)
			}
			payload, _ = m.Payload(s.Signature)
			if !strings.Contains(string(payload), "\nmethod: test\nmethod-ref: TR-8 (fictional)\n") {
				t.Fatalf("payload lacks the method of checking:\n%s", payload)
			}
			if ok, out := keygenVerify(t, signers, checkerEmail, payload, []byte(s.Signature.Signature)); !ok {
				t.Fatalf("ssh-keygen -Y verify refused vouch's checker signature:\n%s", out)
			}
			writePkg(t, pkg, s.HTML)

			wrong := keygenSign(t, chk.path, []byte(strings.Replace(string(payload), "checker", "approver", 1)))
			_, _, err = Sign(pkg, SignOptions{Role: "approver", Signature: wrong, Signed: signed, VerifyOptions: VerifyOptions{Engine: "test"}})
			if err == nil || !strings.Contains(err.Error(), "is not a approver signature of this manifest") {
				t.Errorf("a signature over another payload: %v", err)
			}
		})
	}
}

// keygenVerify runs ssh-keygen -Y verify on a payload and signature.
func keygenVerify(t *testing.T, signers, principal string, payload, sig []byte) (bool, string) {
	t.Helper()
	sigPath := filepath.Join(t.TempDir(), "role.sig")
	if err := os.WriteFile(sigPath, sig, 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command("ssh-keygen", "-Y", "verify", "-f", signers, "-I", principal, "-n", provenance.Namespace, "-s", sigPath)
	cmd.Stdin = bytes.NewReader(payload)
	out, err := cmd.CombinedOutput()
	return err == nil, string(out)
}

// keygenSign signs a payload with ssh-keygen -Y sign.
func keygenSign(t *testing.T, keyPath string, payload []byte) []byte {
	t.Helper()
	msg := filepath.Join(t.TempDir(), "payload")
	if err := os.WriteFile(msg, payload, 0o644); err != nil {
		t.Fatal(err)
	}
	if out, err := exec.Command("ssh-keygen", "-Y", "sign", "-f", keyPath, "-n", provenance.Namespace, msg).CombinedOutput(); err != nil {
		t.Fatalf("ssh-keygen -Y sign: %v\n%s", err, out)
	}
	sig, err := os.ReadFile(msg + ".sig")
	if err != nil {
		t.Fatal(err)
	}
	return sig
}

// TestSignWithAgent signs with the key an ssh-agent holds.
func TestSignWithAgent(t *testing.T) {
	needTool(t, "ssh-agent")
	needTool(t, "ssh-add")
	r := calcRepo(t)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	prep, other := newKey(t, "ed25519"), newKey(t, "ed25519")
	sock := startAgent(t)
	for _, k := range []key{prep, other} {
		cmd := exec.Command("ssh-add", "-q", k.path)
		cmd.Env = append(os.Environ(), "SSH_AUTH_SOCK="+sock)
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("ssh-add: %v\n%s", err, out)
		}
	}
	t.Setenv("SSH_AUTH_SOCK", sock)
	opt := SignOptions{Role: "preparer", VerifyOptions: VerifyOptions{Engine: "test"}}
	if _, _, err := Sign(pkg, opt); err == nil || !strings.Contains(err.Error(), "the ssh-agent holds 2 keys") {
		t.Fatalf("two agent keys, no signers file: %v", err)
	}
	opt.Signers = allowedSigners(t, preparerEmail, prep)
	s, _, err := Sign(pkg, opt)
	if err != nil {
		t.Fatal(err)
	}
	if s.Signature.Fingerprint != fingerprint(t, prep) {
		t.Error("the agent signed with the key the signers file does not list")
	}
	opt.Key = prep.path + ".pub"
	if _, _, err := Sign(pkg, opt); err != nil {
		t.Errorf("sign with KEY.pub through the agent: %v", err)
	}

	// The committed signers file picks the agent's key when none is given.
	commitSigners(t, r, preparerEmail, other)
	pkg = renderFile(t, r.Path("calcs/fp.calc.md"))
	s, _, err = Sign(pkg, SignOptions{Role: "preparer", VerifyOptions: VerifyOptions{Engine: "test"}})
	if err != nil || s.Signature.Fingerprint != fingerprint(t, other) || s.Status != "PREPARED" {
		t.Fatalf("agent key picked by the committed file: %v, %+v", err, s)
	}
}

// startAgent starts an ssh-agent on a socket in a temporary folder and
// stops it when the test ends.
func startAgent(t *testing.T) string {
	t.Helper()
	dir, err := os.MkdirTemp("", "agent")
	if err != nil {
		t.Fatal(err)
	}
	sock := filepath.Join(dir, "s")
	cmd := exec.Command("ssh-agent", "-D", "-a", sock)
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() {
		cmd.Process.Kill()
		cmd.Wait()
		os.RemoveAll(dir)
	})
	// The socket file appears when the agent binds, a moment before it
	// listens: wait until a connection is accepted, not until the file exists.
	for i := 0; i < 500; i++ {
		if c, err := net.Dial("unix", sock); err == nil {
			c.Close()
			return sock
		}
		time.Sleep(10 * time.Millisecond)
	}
	t.Fatal("ssh-agent did not start")
	return ""
}

// TestVerifyOtherEngine: a package made by another engine version is
// verified with the engines named first, its results compared, and the
// result says that a different engine verified it; it is not signed by
// that engine.
func TestVerifyOtherEngine(t *testing.T) {
	r := calcRepo(t)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	rep, err := Verify(pkg, VerifyOptions{Engine: "test-2"})
	if err != nil {
		t.Fatal(err)
	}
	if !rep.OK() || !rep.Different || rep.Reproduction != ReproducedExact {
		t.Fatalf("different %v, reproduction %q:\n%s", rep.Different, rep.Reproduction, rep)
	}
	if f := rep.Findings[1]; f.Topic != "engine" || !strings.Contains(f.Text, "the package was made by vouch test (no build recorded), and this is vouch test-2") {
		t.Errorf("the engines are not named first: %+v", f)
	}
	if s := rep.String(); !strings.Contains(s, "result:   VERIFIED by a different engine (results bit for bit)") {
		t.Errorf("the result does not say a different engine verified it:\n%s", s)
	}
	k := newKey(t, "ed25519")
	_, _, err = Sign(pkg, SignOptions{VerifyOptions: VerifyOptions{Engine: "test-2"}, Role: "preparer", Key: k.path})
	if err == nil || !strings.Contains(err.Error(), "does not reproduce it byte for byte") {
		t.Errorf("signed by another engine: %v", err)
	}
}

// TestVerifyWithImage: a package with an embedded image reproduces from
// the recorded commit, and a later change of the image is reported as a
// later change, not as tampering.
func TestVerifyWithImage(t *testing.T) {
	r := calcRepo(t)
	r.Write("calcs/fig.png", string(testkit.TinyPNG))
	src := string(r.Read("calcs/fp.calc.md"))
	r.Write("calcs/fp.calc.md", strings.Replace(src, "\n```calc", "\n![Feed pump](fig.png)\n\n```calc", 1))
	r.Commit("Feed pump sketch")
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	rep, err := Verify(pkg, VerifyOptions{Engine: "test"})
	if err != nil {
		t.Fatal(err)
	}
	if !rep.OK() {
		t.Fatalf("a package with an image does not verify:\n%s", rep)
	}
	r.Write("calcs/fig.png", string(append(append([]byte(nil), testkit.TinyPNG...), 0)))
	r.Commit("Sketch redrawn")
	rep, err = Verify(pkg, VerifyOptions{Engine: "test"})
	if err != nil {
		t.Fatal(err)
	}
	if !rep.OK() || !strings.Contains(rep.String(), "has moved on") {
		t.Errorf("after a later change of the image:\n%s", rep)
	}
}
