package provenance

import (
	"bytes"
	"crypto/ecdsa"
	"crypto/ed25519"
	"crypto/elliptic"
	"crypto/rand"
	"crypto/rsa"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"golang.org/x/crypto/ssh"
)

// Verdicts of one allowed-signers line for one principal and time.
const (
	verdictAllow  = "allow"  // the line lets the principal sign with the key
	verdictDeny   = "deny"   // the line is read but does not allow it
	verdictRefuse = "refuse" // the line is malformed
)

// parityKeys are the keys the parity cases name: the signing key (ed25519,
// from a fixed seed) and keys of other types that never signed anything.
type parityKeys struct {
	signer                 ssh.Signer
	ed, p256, p384, rsa    string // "TYPE BASE64"
	edB64, p256B64, rsaB64 string
}

func newParityKeys(t *testing.T) parityKeys {
	t.Helper()
	signer, err := ssh.NewSignerFromKey(ed25519.NewKeyFromSeed(bytes.Repeat([]byte{11}, ed25519.SeedSize)))
	if err != nil {
		t.Fatal(err)
	}
	line := func(pub any) string {
		k, err := ssh.NewPublicKey(pub)
		if err != nil {
			t.Fatal(err)
		}
		return strings.TrimSpace(string(ssh.MarshalAuthorizedKey(k)))
	}
	p256, _ := ecdsa.GenerateKey(elliptic.P256(), rand.Reader)
	p384, _ := ecdsa.GenerateKey(elliptic.P384(), rand.Reader)
	rsaKey, err := rsa.GenerateKey(rand.Reader, 2048)
	if err != nil {
		t.Fatal(err)
	}
	k := parityKeys{signer: signer, ed: strings.TrimSpace(string(ssh.MarshalAuthorizedKey(signer.PublicKey()))), p256: line(&p256.PublicKey),
		p384: line(&p384.PublicKey), rsa: line(&rsaKey.PublicKey)}
	b64 := func(l string) string { return strings.Fields(l)[1] }
	k.edB64, k.p256B64, k.rsaB64 = b64(k.ed), b64(k.p256), b64(k.rsa)
	return k
}

// parityCase is one allowed-signers file (usually one line), the principal
// asked for, the verify time ("" for now, else OpenSSH's time syntax) and
// the verdict both vouch and ssh-keygen -Y verify must give.
type parityCase struct {
	name, file, principal, at, want string
}

// parityCases are the read lines first, then the malformed ones.
func parityCases(k parityKeys) []parityCase {
	return append(readParityCases(k), malformedParityCases(k)...)
}

// readParityCases are files that are read: they allow the signer or not.
func readParityCases(k parityKeys) []parityCase {
	K := k.ed
	return []parityCase{
		{"plain", "a@x " + K, "a@x", "", verdictAllow},
		{"comment after the key", "a@x " + K + " P. Writer (fictional) \"quoted\"", "a@x", "", verdictAllow},
		{"tab between fields", "a@x\t" + strings.Replace(K, " ", "\t", 1), "a@x", "", verdictAllow},
		{"leading blanks", "  \t a@x " + K, "a@x", "", verdictAllow},
		{"CRLF line end", "a@x " + K + "\r", "a@x", "", verdictAllow},
		{"comments and blank lines", "# signers (fictional)\n\n   # indented comment\n\t\na@x " + K, "a@x", "", verdictAllow},
		{"quoted principals with a blank", `"a@x b" ` + K, "a@x b", "", verdictAllow},
		{"quoted principals glued to the key", `"a@x"` + K, "a@x", "", verdictAllow},
		{"second principal of a list", "a@x,b@y " + K, "b@y", "", verdictAllow},
		{"star pattern", "*@x " + K, "a@x", "", verdictAllow},
		{"question-mark pattern", "?@x " + K, "a@x", "", verdictAllow},
		{"empty principal in a list", "a@x,,b " + K, "a@x", "", verdictAllow},
		{"principal @revoked is only a name", "@revoked " + K, "@revoked", "", verdictAllow},
		{"namespaces exact", `a@x namespaces="calc-package@vouch" ` + K, "a@x", "", verdictAllow},
		{"namespaces pattern", `a@x namespaces="file,calc-*" ` + K, "a@x", "", verdictAllow},
		{"namespaces in capitals", `a@x NAMESPACES="calc-package@vouch" ` + K, "a@x", "", verdictAllow},
		{"escaped quote in a value", `a@x namespaces="a\"b,calc-package@vouch" ` + K, "a@x", "", verdictAllow},
		{"blank inside a quoted value", `a@x namespaces="a b,calc-package@vouch" ` + K, "a@x", "", verdictAllow},
		{"valid-before, UTC, before it", `a@x valid-before="20200101Z" ` + K, "a@x", "20191231Z", verdictAllow},
		{"valid-before, at it exactly", `a@x valid-before="20200101Z" ` + K, "a@x", "20200101Z", verdictAllow},
		{"valid-after, at it exactly", `a@x valid-after="20200101Z" ` + K, "a@x", "20200101Z", verdictAllow},
		{"validity window, local time", `a@x valid-after="20200101",valid-before="20300101" ` + K, "a@x", "20250101Z", verdictAllow},
		{"lower-case z", `a@x valid-before="20300101z" ` + K, "a@x", "20250101Z", verdictAllow},
		{"UTC suffix", `a@x valid-before="20300101UTC" ` + K, "a@x", "20250101Z", verdictAllow},
		{"utc suffix", `a@x valid-before="20300101utc" ` + K, "a@x", "20250101Z", verdictAllow},
		{"minutes", `a@x valid-before="203001011230Z" ` + K, "a@x", "203001011230Z", verdictAllow},
		{"seconds", `a@x valid-before="20300101123045Z" ` + K, "a@x", "20300101123045Z", verdictAllow},
		{"day 31 of February rolls over", `a@x valid-before="20240231Z" ` + K, "a@x", "20240302Z", verdictAllow},
		{"second 60 rolls over", `a@x valid-before="20300101000060Z" ` + K, "a@x", "203001010001Z", verdictAllow},
		{"blanks inside a date", `a@x valid-before="2030 1 1" ` + K, "a@x", "20250101Z", verdictAllow},
		{"option name in mixed case", `a@x Valid-Before="20300101Z" ` + K, "a@x", "20250101Z", verdictAllow},
		{"leading comma in the options", `a@x ,namespaces="calc-package@vouch" ` + K, "a@x", "", verdictAllow},
		{"rsa-sha2-512 names an RSA key", "a@x rsa-sha2-512 " + k.rsaB64 + "\nb@x " + K, "b@x", "", verdictAllow},

		// Lines that are read but do not allow the signer.
		{"other principal", "b@x " + K, "a@x", "", verdictDeny},
		{"negated pattern", "*@x,!a@x " + K, "a@x", "", verdictDeny},
		{"question mark is one character", "?@x " + K, "ab@x", "", verdictDeny},
		{"namespaces elsewhere", `a@x namespaces="git,file" ` + K, "a@x", "", verdictDeny},
		{"namespaces negated", `a@x namespaces="*,!calc-package@vouch" ` + K, "a@x", "", verdictDeny},
		{"namespaces empty", `a@x namespaces="" ` + K, "a@x", "", verdictDeny},
		{"cert-authority", "a@x cert-authority " + K, "a@x", "", verdictDeny},
		{"cert-authority twice", "a@x cert-authority,cert-authority " + K, "a@x", "", verdictDeny},
		{"CERT-AUTHORITY", "a@x CERT-AUTHORITY " + K, "a@x", "", verdictDeny},
		{"expired a second ago", `a@x valid-before="20200101Z" ` + K, "a@x", "20200101000001Z", verdictDeny},
		{"not yet valid", `a@x valid-after="20200101Z" ` + K, "a@x", "20191231235959Z", verdictDeny},
		{"day 31 of February is 2 March", `a@x valid-before="20240231Z" ` + K, "a@x", "20240302000001Z", verdictDeny},
		{"another ed25519 key", "a@x " + strings.Replace(K, k.edB64[60:64], "AAAA", 1), "a@x", "", verdictDeny},
		{"ecdsa key", "a@x " + k.p256, "a@x", "", verdictDeny},
		{"rsa key", "a@x " + k.rsa, "a@x", "", verdictDeny},
		{"ecdsa p384 key", "a@x " + k.p384, "a@x", "", verdictDeny},
		{"only comments", "# nobody\n\n", "a@x", "", verdictDeny},
		{"empty file", "", "a@x", "", verdictDeny},
	}
}

// malformedParityCases are files that both readers refuse.
func malformedParityCases(k parityKeys) []parityCase {
	K := k.ed
	return []parityCase{
		{"valid-before twice, the later one expired", `a@x valid-before="20300101Z",valid-before="20200101Z" ` + K, "a@x", "20250101Z", verdictRefuse},
		{"valid-before twice, the later one in force", `a@x valid-before="20200101Z",valid-before="20300101Z" ` + K, "a@x", "20250101Z", verdictRefuse},
		{"valid-after twice", `a@x valid-after="20200101Z",valid-after="20210101Z" ` + K, "a@x", "", verdictRefuse},
		{"namespaces twice", `a@x namespaces="calc-package@vouch",namespaces="git" ` + K, "a@x", "", verdictRefuse},
		{"unknown option", "a@x foo " + K, "a@x", "", verdictRefuse},
		{"authorized_keys option", "a@x no-touch-required " + K, "a@x", "", verdictRefuse},
		{"unknown option with a value", `a@x from="*.example.com" ` + K, "a@x", "", verdictRefuse},
		{"@revoked marker", "@revoked a@x " + K, "@revoked", "", verdictRefuse},
		{"unquoted value", "a@x valid-before=20300101 " + K, "a@x", "", verdictRefuse},
		{"value without a closing quote", `a@x valid-before="20300101 ` + K, "a@x", "", verdictRefuse},
		{"text after a value", `a@x valid-before="20300101Z"x ` + K, "a@x", "", verdictRefuse},
		{"options end in a comma", "a@x cert-authority, " + K, "a@x", "", verdictRefuse},
		{"flag with a tail", "a@x cert-authorityx " + K, "a@x", "", verdictRefuse},
		{"options separated by a blank", `a@x valid-after="20200101Z" valid-before="20300101Z" ` + K, "a@x", "", verdictRefuse},
		{"year only", `a@x valid-before="2030" ` + K, "a@x", "", verdictRefuse},
		{"ten digits", `a@x valid-before="2030010112" ` + K, "a@x", "", verdictRefuse},
		{"month 13", `a@x valid-before="20301301Z" ` + K, "a@x", "", verdictRefuse},
		{"day 0", `a@x valid-before="20300100Z" ` + K, "a@x", "", verdictRefuse},
		{"hour 24", `a@x valid-before="20300101240000Z" ` + K, "a@x", "", verdictRefuse},
		{"ISO date", `a@x valid-before="2030-01-01" ` + K, "a@x", "", verdictRefuse},
		{"before 1970", `a@x valid-before="19691231Z" ` + K, "a@x", "", verdictRefuse},
		{"the epoch itself", `a@x valid-after="19700101Z" ` + K, "a@x", "", verdictRefuse},
		{"Z twice", `a@x valid-before="20300101ZZ" ` + K, "a@x", "", verdictRefuse},
		{"valid-before earlier than valid-after", `a@x valid-after="20300101Z",valid-before="20200101Z" ` + K, "a@x", "", verdictRefuse},
		{"valid-before equal to valid-after", `a@x valid-after="20300101Z",valid-before="20300101Z" ` + K, "a@x", "", verdictRefuse},
		{"principals only", "a@x", "a@x", "", verdictRefuse},
		{"principals and blanks only", "a@x   ", "a@x", "", verdictRefuse},
		{"key type only", "a@x ssh-ed25519", "a@x", "", verdictRefuse},
		{"base64 that is not", "a@x ssh-ed25519 not-base64!", "a@x", "", verdictRefuse},
		{"truncated key", "a@x ssh-ed25519 " + k.edB64[:40], "a@x", "", verdictRefuse},
		{"short key type name", "a@x ED25519 " + k.edB64, "a@x", "", verdictRefuse},
		{"unknown key type", "a@x ssh-foo " + k.edB64, "a@x", "", verdictRefuse},
		{"type and key disagree", "a@x ssh-rsa " + k.edB64, "a@x", "", verdictRefuse},
		{"ecdsa curve disagrees", "a@x ecdsa-sha2-nistp384 " + k.p256B64, "a@x", "", verdictRefuse},
		{"unterminated quote in the principals", `"a@x ` + K, "a@x", "", verdictRefuse},
		{"quote inside the principals", `a"@x b"c ` + K, "a@x b", "", verdictRefuse},
		{"vertical tab before a comment", "\v# not a comment to OpenSSH\na@x " + K, "a@x", "", verdictRefuse},
		{"NUL byte in the principals", "a@x\x00 " + K, "a@x", "", verdictRefuse},
		{"bad line for another principal", "zz@x foo " + K + "\na@x " + K, "a@x", "", verdictRefuse},
		{"bad line before a good one", "a@x foo " + K + "\na@x " + K, "a@x", "", verdictRefuse},
	}
}

// vouchVerdict is the verdict of ParseAllowedSigners and AllowsAt.
func vouchVerdict(t *testing.T, c parityCase, pub ssh.PublicKey) string {
	t.Helper()
	signers, err := ParseAllowedSigners([]byte(c.file))
	if err != nil {
		if !strings.HasPrefix(err.Error(), "line ") {
			t.Errorf("error %q does not name its line", err)
		}
		return verdictRefuse
	}
	at := time.Now()
	if c.at != "" {
		if err := parseValidity("verify time", c.at, &at); err != nil {
			t.Fatal(err)
		}
	}
	if signers.AllowsAt(c.principal, pub, Namespace, at) {
		return verdictAllow
	}
	return verdictDeny
}

// keygenRefusal matches what ssh-keygen logs for a line it cannot read.
var keygenRefusal = regexp.MustCompile(`allowed_signers(_nonblank)?:\d+: (bad options|invalid key|invalid line|missing key|invalid options)`)

// keygenVerdict is the verdict of ssh-keygen -Y verify on the same file.
// ssh-keygen logs a line it cannot read, skips it and goes on with the
// next; vouch refuses the whole file, so a file is refused when ssh-keygen
// logged a line of it as unreadable.
func keygenVerdict(t *testing.T, dir string, c parityCase, sigPath string, msg []byte) (string, string) {
	t.Helper()
	allowed := filepath.Join(dir, "allowed_signers")
	writeFile(t, allowed, c.file+"\n")
	args := []string{"-Y", "verify", "-f", allowed, "-I", c.principal, "-n", Namespace, "-s", sigPath}
	if c.at != "" {
		args = append(args, "-Overify-time="+c.at)
	}
	cmd := exec.Command("ssh-keygen", args...)
	cmd.Stdin = bytes.NewReader(msg)
	out, err := cmd.CombinedOutput()
	// -Y verify -I reads only the lines whose principals match; -Y
	// find-principals reads every line, as vouch does. It also logs blank
	// lines as "missing key" (OpenSSH 9.2), which its manual and -Y verify
	// ignore, so it is given the file without them.
	var kept []string
	for _, l := range strings.Split(c.file, "\n") {
		if strings.TrimSpace(l) != "" {
			kept = append(kept, l)
		}
	}
	nonblank := filepath.Join(dir, "allowed_signers_nonblank")
	writeFile(t, nonblank, strings.Join(append(kept, ""), "\n"))
	find := exec.Command("ssh-keygen", "-Y", "find-principals", "-f", nonblank, "-s", sigPath)
	found, _ := find.CombinedOutput()
	switch {
	case keygenRefusal.Match(out) || keygenRefusal.Match(found):
		return verdictRefuse, string(out) + string(found)
	case err == nil:
		return verdictAllow, string(out)
	}
	return verdictDeny, string(out)
}

// TestAllowedSignersParityWithSSHKeygen feeds each case to vouch and to
// ssh-keygen -Y verify and expects the verdict the case states from both:
// allowed, read but not allowed, or refused as malformed. Without
// ssh-keygen (and CI unset) only vouch's side runs.
func TestAllowedSignersParityWithSSHKeygen(t *testing.T) {
	k := newParityKeys(t)
	pub := k.signer.PublicKey()
	msg := []byte("calc-package role=checker manifest-sha256=00")
	sig, err := Sign(msg, k.signer, Namespace)
	if err != nil {
		t.Fatal(err)
	}
	_, lookErr := exec.LookPath("ssh-keygen")
	useKeygen := lookErr == nil
	if !useKeygen && os.Getenv("CI") != "" {
		t.Fatalf("ssh-keygen is required when CI is set: %v", lookErr)
	}
	dir := t.TempDir()
	sigPath := filepath.Join(dir, "msg.sig")
	writeFile(t, sigPath, string(sig))
	seen := map[string]int{}
	for _, c := range parityCases(k) {
		seen[c.want]++
		if got := vouchVerdict(t, c, pub); got != c.want {
			t.Errorf("%s: vouch says %s, want %s\n%s", c.name, got, c.want, c.file)
		}
		if !useKeygen {
			continue
		}
		if got, out := keygenVerdict(t, dir, c, sigPath, msg); got != c.want {
			t.Errorf("%s: ssh-keygen says %s, want %s\n%s\nssh-keygen: %s", c.name, got, c.want, c.file, out)
		}
	}
	if !useKeygen {
		t.Skip("ssh-keygen not found: vouch's verdicts checked, not ssh-keygen's")
	}
	t.Logf("%d cases: %v", len(parityCases(k)), seen)
}
