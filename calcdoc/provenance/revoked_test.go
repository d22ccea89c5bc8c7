package provenance

import (
	"bytes"
	"errors"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// TestRevokedKeysLikeSSHKeygen: a key in the revoked list, or a list with
// a line that is not a key, fails ssh-keygen -Y verify -r; vouch reads the
// same lists to the same verdicts (revoked, not revoked, refused).
func TestRevokedKeysLikeSSHKeygen(t *testing.T) {
	k := newParityKeys(t)
	K := k.ed
	cases := []struct{ name, file, want string }{
		{"the key", K, "revoked"},
		{"the key with a comment", K + " retired 2026 (fictional)", "revoked"},
		{"the key indented, CRLF", "  " + K + "\r", "revoked"},
		{"among others", k.p256 + "\n# retired\n\n" + K, "revoked"},
		{"other keys only", k.p256 + "\n" + k.rsa, "kept"},
		{"empty", "", "kept"},
		{"comments only", "# none yet\n\n", "kept"},
		{"a line that is not a key", k.p256 + "\ngarbage", "refused"},
		{"a truncated key", "ssh-ed25519 AAAA", "refused"},
		{"an allowed-signers line", "a@x " + K, "refused"},
		{"an option before the key", `from="x" ` + K, "refused"},
		{"type and key disagree", "ssh-rsa " + k.edB64, "refused"},
		{"a binary KRL", krlMagic + "\x00\x00", "refused"},
	}
	_, lookErr := exec.LookPath("ssh-keygen")
	dir := t.TempDir()
	msg := []byte("m")
	sig, err := Sign(msg, k.signer, Namespace)
	if err != nil {
		t.Fatal(err)
	}
	sigPath, allowed, revoked := filepath.Join(dir, "m.sig"), filepath.Join(dir, "allowed"), filepath.Join(dir, "revoked")
	writeFile(t, sigPath, string(sig))
	writeFile(t, allowed, "a@x "+K+"\n")
	for _, c := range cases {
		got := "kept"
		list, err := ParseRevokedKeys([]byte(c.file))
		switch {
		case err != nil:
			got = "refused"
			var le *AllowedSignersError
			if !errors.Is(err, ErrAllowedSigners) || !errors.As(err, &le) {
				t.Errorf("%s: error %v has no line", c.name, err)
			}
		case list.Revoked(k.signer.PublicKey()):
			got = "revoked"
		}
		if got != c.want {
			t.Errorf("%s: vouch says %s, want %s", c.name, got, c.want)
		}
		if lookErr != nil {
			continue
		}
		writeFile(t, revoked, c.file+"\n")
		cmd := exec.Command("ssh-keygen", "-Y", "verify", "-f", allowed, "-I", "a@x", "-n", Namespace, "-s", sigPath, "-r", revoked)
		cmd.Stdin = bytes.NewReader(msg)
		out, err := cmd.CombinedOutput()
		if keygenOK, wantOK := err == nil, c.want == "kept"; keygenOK != wantOK {
			t.Errorf("%s: ssh-keygen -r verifies: %v, want %v\n%s", c.name, keygenOK, wantOK, strings.TrimSpace(string(out)))
		}
	}
	needTool(t, "ssh-keygen")
}
