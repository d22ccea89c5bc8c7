package provenance

import (
	"bytes"
	"errors"
	"net"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"golang.org/x/crypto/ssh"
	"golang.org/x/crypto/ssh/agent"
)

const signerEmail = "checker@example.com" // fictional

// keyTypes are the key kinds tested against ssh-keygen.
var keyTypes = []struct{ name, typ, bits string }{
	{"ed25519", "ed25519", ""},
	{"rsa3072", "rsa", "3072"},
}

// genKey makes a key pair with ssh-keygen and returns the private key path.
func genKey(t *testing.T, typ, bits, passphrase string) string {
	t.Helper()
	needTool(t, "ssh-keygen")
	path := filepath.Join(t.TempDir(), "id_"+typ)
	args := []string{"-q", "-t", typ, "-N", passphrase, "-C", signerEmail, "-f", path}
	if bits != "" {
		args = append(args, "-b", bits)
	}
	if out, err := exec.Command("ssh-keygen", args...).CombinedOutput(); err != nil {
		t.Fatalf("ssh-keygen %v: %v\n%s", args, err, out)
	}
	return path
}

// keygenVerify runs ssh-keygen -Y verify and reports whether it accepted.
func keygenVerify(t *testing.T, keyPath string, msg, sig []byte, namespace string) (bool, string) {
	t.Helper()
	dir := t.TempDir()
	pub, err := os.ReadFile(keyPath + ".pub")
	if err != nil {
		t.Fatal(err)
	}
	allowed := filepath.Join(dir, "allowed_signers")
	sigPath := filepath.Join(dir, "msg.sig")
	writeFile(t, allowed, signerEmail+` namespaces="`+Namespace+`" `+string(pub))
	writeFile(t, sigPath, string(sig))
	cmd := exec.Command("ssh-keygen", "-Y", "verify", "-f", allowed, "-I", signerEmail,
		"-n", namespace, "-s", sigPath)
	cmd.Stdin = bytes.NewReader(msg)
	out, err := cmd.CombinedOutput()
	return err == nil, string(out)
}

// keygenSign signs msg with ssh-keygen -Y sign.
func keygenSign(t *testing.T, keyPath string, msg []byte, namespace string) []byte {
	t.Helper()
	msgPath := filepath.Join(t.TempDir(), "msg")
	writeFile(t, msgPath, string(msg))
	out, err := exec.Command("ssh-keygen", "-Y", "sign", "-f", keyPath, "-n", namespace, msgPath).CombinedOutput()
	if err != nil {
		t.Fatalf("ssh-keygen -Y sign: %v\n%s", err, out)
	}
	sig, err := os.ReadFile(msgPath + ".sig")
	if err != nil {
		t.Fatal(err)
	}
	return sig
}

func writeFile(t *testing.T, path, content string) {
	t.Helper()
	if err := os.WriteFile(path, []byte(content), 0o600); err != nil {
		t.Fatal(err)
	}
}

func TestSignVerifiesWithSSHKeygen(t *testing.T) {
	msg := []byte("calc-package role=checker manifest-sha256=00ff")
	for _, kt := range keyTypes {
		t.Run(kt.name, func(t *testing.T) {
			key := genKey(t, kt.typ, kt.bits, "")
			signer, err := LoadSigner(key)
			if err != nil {
				t.Fatal(err)
			}
			sig, err := Sign(msg, signer, Namespace)
			if err != nil {
				t.Fatal(err)
			}
			if ok, out := keygenVerify(t, key, msg, sig, Namespace); !ok {
				t.Fatalf("ssh-keygen rejected our signature:\n%s\n%s", out, sig)
			}
			if ok, _ := keygenVerify(t, key, append(msg, '!'), sig, Namespace); ok {
				t.Fatal("ssh-keygen accepted our signature over a tampered message")
			}
			if ok, _ := keygenVerify(t, key, msg, sig, "file"); ok {
				t.Fatal("ssh-keygen accepted our signature in another namespace")
			}
			if pub, err := VerifySig(msg, sig, Namespace); err != nil || Fingerprint(pub) != Fingerprint(signer.PublicKey()) {
				t.Fatalf("VerifySig of our own signature: %v", err)
			}
		})
	}
}

func TestVerifySSHKeygenSignature(t *testing.T) {
	msg := []byte("calc-package role=approver manifest-sha256=abcd")
	for _, kt := range keyTypes {
		t.Run(kt.name, func(t *testing.T) {
			key := genKey(t, kt.typ, kt.bits, "")
			sig := keygenSign(t, key, msg, Namespace)
			pub, err := VerifySig(msg, sig, Namespace)
			if err != nil {
				t.Fatalf("VerifySig of an ssh-keygen signature: %v", err)
			}
			want := fingerprintOfFile(t, key+".pub")
			if Fingerprint(pub) != want {
				t.Fatalf("key %s, want %s", Fingerprint(pub), want)
			}
			if _, err := VerifySig(append(msg, '!'), sig, Namespace); !errors.Is(err, ErrBadSignature) {
				t.Fatalf("tampered message: got %v, want ErrBadSignature", err)
			}
			if _, err := VerifySig(msg, sig, "git"); !errors.Is(err, ErrNamespace) {
				t.Fatalf("wrong namespace: got %v, want ErrNamespace", err)
			}
		})
	}
}

// fingerprintOfFile asks ssh-keygen -l for a public key's fingerprint.
func fingerprintOfFile(t *testing.T, pubPath string) string {
	t.Helper()
	out, err := exec.Command("ssh-keygen", "-l", "-E", "sha256", "-f", pubPath).Output()
	if err != nil {
		t.Fatal(err)
	}
	return strings.Fields(string(out))[1]
}

func TestVerifySigMalformed(t *testing.T) {
	key := genKey(t, "ed25519", "", "")
	signer, err := LoadSigner(key)
	if err != nil {
		t.Fatal(err)
	}
	msg := []byte("m")
	good, _ := Sign(msg, signer, Namespace)
	flipped := bytes.Replace(good, []byte("U1NIU0lH"), []byte("U1NIU0lI"), 1) // SSHSIG -> SSHSIH
	tests := []struct {
		name string
		sig  []byte
		want error
	}{
		{"empty", nil, ErrSignatureFormat},
		{"other pem", []byte("-----BEGIN PUBLIC KEY-----\nAAAA\n-----END PUBLIC KEY-----\n"), ErrSignatureFormat},
		{"bad magic", flipped, ErrSignatureFormat},
		{"truncated", append(good[:60:60], []byte("\n-----END SSH SIGNATURE-----\n")...), ErrSignatureFormat},
	}
	for _, tt := range tests {
		if _, err := VerifySig(msg, tt.sig, Namespace); !errors.Is(err, tt.want) {
			t.Errorf("%s: got %v, want %v", tt.name, err, tt.want)
		}
	}
	if _, err := Sign(msg, signer, ""); !errors.Is(err, ErrSignatureFormat) {
		t.Errorf("Sign with an empty namespace: got %v", err)
	}
}

func TestManifestSignAndVerify(t *testing.T) {
	key := genKey(t, "ed25519", "", "")
	signer, err := LoadSigner(key)
	if err != nil {
		t.Fatal(err)
	}
	m := sampleManifest(t)
	s, err := m.SignAs(Signature{Role: "checker", Principal: signerEmail, Name: "C. Reader",
		Date: "2025-03-04T05:06:07Z", Signed: "2025-03-05T10:11:12Z", Attestation: "I checked it.",
		Method: MethodTest, MethodRef: "TR-7 rev B (fictional pump test)"}, signer)
	if err != nil {
		t.Fatal(err)
	}
	m.Signatures = append(m.Signatures, s)
	if _, err := m.VerifySignature(s); err != nil {
		t.Fatalf("VerifySignature: %v", err)
	}
	payload, _ := m.Payload(s)
	if ok, out := keygenVerify(t, key, payload, []byte(s.Signature), Namespace); !ok {
		t.Fatalf("ssh-keygen rejected the manifest signature: %s", out)
	}
	for name, edit := range map[string]func(*Signature){
		"relabelled as approver": func(x *Signature) { x.Role = "approver" },
		"moved to another time":  func(x *Signature) { x.Signed = "2025-03-06T10:11:12Z" },
		"given another meaning":  func(x *Signature) { x.Attestation = "I approve it." },
		"moved to another name":  func(x *Signature) { x.Name = "P. Writer" },
		"another method":         func(x *Signature) { x.Method = MethodReview },
		"another test document":  func(x *Signature) { x.MethodRef = "TR-8 rev A" },
		"method dropped":         func(x *Signature) { x.Method, x.MethodRef = "", "" },
	} {
		changed := s
		edit(&changed)
		if _, err := m.VerifySignature(changed); !errors.Is(err, ErrBadSignature) {
			t.Errorf("signature %s: got %v, want ErrBadSignature", name, err)
		}
	}
	wrongKey := s
	wrongKey.Fingerprint = "SHA256:other"
	if _, err := m.VerifySignature(wrongKey); !errors.Is(err, ErrBadSignature) {
		t.Fatalf("wrong fingerprint: got %v, want ErrBadSignature", err)
	}
	m.Results[0].SI++
	m.ResultsDigest, _ = ResultsDigest(m.Results)
	if _, err := m.VerifySignature(s); !errors.Is(err, ErrBadSignature) {
		t.Fatalf("edited result: got %v, want ErrBadSignature", err)
	}
}

// TestUnsignedMethodNamed: a signature made over the payload without the
// method of checking (as an earlier vouch made them, with the method only
// recorded beside it) fails, and the error says why.
func TestUnsignedMethodNamed(t *testing.T) {
	signer, err := LoadSigner(genKey(t, "ed25519", "", ""))
	if err != nil {
		t.Fatal(err)
	}
	m := sampleManifest(t)
	s, err := m.SignAs(Signature{Role: "checker", Principal: signerEmail, Name: "C. Reader",
		Date: "2025-03-04T05:06:07Z", Signed: "2025-03-05T10:11:12Z", Attestation: "I checked it."}, signer)
	if err != nil {
		t.Fatal(err)
	}
	s.Method = MethodReview
	if _, err := m.VerifySignature(s); !errors.Is(err, ErrBadSignature) || !strings.Contains(err.Error(), "without the method of checking") {
		t.Fatalf("a signature that leaves the method unsigned: got %v", err)
	}
	s.Attestation = "I approve it."
	if _, err := m.VerifySignature(s); !errors.Is(err, ErrBadSignature) || strings.Contains(err.Error(), "method") {
		t.Fatalf("a signature over another payload: got %v", err)
	}
}

func TestLoadSignerPassphrase(t *testing.T) {
	key := genKey(t, "ed25519", "", "fictional secret")
	t.Setenv("SSH_AUTH_SOCK", "")
	_, err := LoadSigner(key)
	if !errors.Is(err, ErrPassphrase) || !strings.Contains(err.Error(), "ssh-add "+key) {
		t.Fatalf("LoadSigner of a protected key: got %v, want ErrPassphrase suggesting ssh-add", err)
	}
	if _, err := LoadSigner(filepath.Join(t.TempDir(), "none")); !errors.Is(err, os.ErrNotExist) {
		t.Fatalf("LoadSigner of a missing file: got %v", err)
	}
	if _, err := AgentSigners(); !errors.Is(err, ErrNoAgent) {
		t.Fatalf("AgentSigners without SSH_AUTH_SOCK: got %v, want ErrNoAgent", err)
	}
}

// startAgent serves an in-process ssh-agent holding the given keys.
func startAgent(t *testing.T, keys ...any) {
	t.Helper()
	sock := filepath.Join(t.TempDir(), "agent.sock")
	l, err := net.Listen("unix", sock)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { l.Close() })
	ring := agent.NewKeyring()
	for _, k := range keys {
		if err := ring.Add(agent.AddedKey{PrivateKey: k}); err != nil {
			t.Fatal(err)
		}
	}
	go func() {
		for {
			c, err := l.Accept()
			if err != nil {
				return
			}
			go func() { defer c.Close(); _ = agent.ServeAgent(ring, c) }()
		}
	}()
	t.Setenv("SSH_AUTH_SOCK", sock)
}

func TestLoadSignerThroughAgent(t *testing.T) {
	const pass = "fictional secret"
	for _, kt := range keyTypes {
		t.Run(kt.name, func(t *testing.T) {
			key := genKey(t, kt.typ, kt.bits, pass)
			data, _ := os.ReadFile(key)
			raw, err := ssh.ParseRawPrivateKeyWithPassphrase(data, []byte(pass))
			if err != nil {
				t.Fatal(err)
			}
			startAgent(t, raw)
			msg := []byte("calc-package role=preparer manifest-sha256=42")
			for _, file := range []string{key, key + ".pub"} {
				signer, err := LoadSigner(file)
				if err != nil {
					t.Fatalf("LoadSigner(%s) with the key in the agent: %v", file, err)
				}
				sig, err := Sign(msg, signer, Namespace)
				if err != nil {
					t.Fatal(err)
				}
				if ok, out := keygenVerify(t, key, msg, sig, Namespace); !ok {
					t.Fatalf("ssh-keygen rejected an agent signature: %s", out)
				}
			}
		})
	}
}

func TestLoadSignerAgentLacksKey(t *testing.T) {
	key := genKey(t, "ed25519", "", "fictional secret")
	startAgent(t)
	_, err := LoadSigner(key)
	if !errors.Is(err, ErrPassphrase) || !strings.Contains(err.Error(), "agent holds no key") {
		t.Fatalf("got %v, want ErrPassphrase saying the agent lacks the key", err)
	}
}
