package provenance

import (
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"

	"golang.org/x/crypto/ssh"
)

// pubLine returns the "TYPE BASE64" text of a fresh key and its signer.
func pubLine(t *testing.T) (string, ssh.Signer) {
	t.Helper()
	key := genKey(t, "ed25519", "", "")
	signer, err := LoadSigner(key)
	if err != nil {
		t.Fatal(err)
	}
	return strings.TrimSpace(string(ssh.MarshalAuthorizedKey(signer.PublicKey()))), signer
}

func TestParseAllowedSigners(t *testing.T) {
	key, _ := pubLine(t)
	file := strings.Join([]string{
		"# Signers of the Larchmoor Energy Park calcs (fictional)",
		"",
		"preparer@example.com " + key + " P. Writer",
		`checker@example.com,*@review.example.com namespaces="calc-package@vouch,file" ` + key,
		`"approver@example.com" valid-after="20240101",valid-before="20300101Z" ` + key + " E. Record",
		"*@example.com cert-authority " + key,
		`  reviewer@example.com  NAMESPACES="git"   ` + key,
	}, "\n")
	got, err := ParseAllowedSigners([]byte(file))
	if err != nil {
		t.Fatal(err)
	}
	if len(got) != 5 {
		t.Fatalf("parsed %d lines, want 5", len(got))
	}
	checks := []struct {
		i          int
		line       int
		principals []string
		namespaces []string
		comment    string
	}{
		{0, 3, []string{"preparer@example.com"}, nil, "P. Writer"},
		{1, 4, []string{"checker@example.com", "*@review.example.com"}, []string{"calc-package@vouch", "file"}, ""},
		{2, 5, []string{"approver@example.com"}, nil, "E. Record"},
		{4, 7, []string{"reviewer@example.com"}, []string{"git"}, ""},
	}
	for _, c := range checks {
		s := got[c.i]
		if s.Line != c.line || !reflect.DeepEqual(s.Principals, c.principals) ||
			!reflect.DeepEqual(s.Namespaces, c.namespaces) || s.Comment != c.comment {
			t.Errorf("entry %d = line %d %v %v %q; want line %d %v %v %q", c.i, s.Line, s.Principals,
				s.Namespaces, s.Comment, c.line, c.principals, c.namespaces, c.comment)
		}
	}
	after := time.Date(2024, 1, 1, 0, 0, 0, 0, time.Local)
	before := time.Date(2030, 1, 1, 0, 0, 0, 0, time.UTC)
	if !got[2].ValidAfter.Equal(after) || !got[2].ValidBefore.Equal(before) {
		t.Errorf("validity = %v .. %v, want %v .. %v", got[2].ValidAfter, got[2].ValidBefore, after, before)
	}
	if !got[3].CertAuthority {
		t.Error("cert-authority not recorded")
	}
}

func TestParseAllowedSignersErrors(t *testing.T) {
	key, _ := pubLine(t)
	file := strings.Join([]string{
		"good@example.com " + key,
		"lonely@example.com",
		"bad@example.com ssh-ed25519 not-base64",
		"opt@example.com no-touch-required " + key,
		`time@example.com valid-after="2024" ` + key,
		`"unterminated@example.com ` + key,
		`empty@example.com,,x@example.com ` + key,
		`ns@example.com namespaces="" ` + key,
	}, "\n")
	got, err := ParseAllowedSigners([]byte(file))
	if len(got) != 1 || got[0].Principals[0] != "good@example.com" {
		t.Errorf("good lines = %v, want the first one only", got)
	}
	if !errors.Is(err, ErrAllowedSigners) {
		t.Fatalf("got %v, want ErrAllowedSigners", err)
	}
	want := []string{
		`line 2: principals "lonely@example.com" are not followed by a key`,
		`line 3: no valid public key after the principals "bad@example.com"`,
		`line 4: unknown option "no-touch-required"`,
		`line 5: time "2024" is not YYYYMMDD[HHMM[SS]][Z]`,
		`line 6: unterminated quote in the principals`,
		`line 7: empty principal in "empty@example.com,,x@example.com"`,
		`line 8: option "namespaces" needs a value`,
	}
	if got := strings.Split(err.Error(), "\n"); !reflect.DeepEqual(got, want) {
		t.Fatalf("errors =\n%s\nwant\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
	var lineErr *AllowedSignersError
	if !errors.As(err, &lineErr) || lineErr.Line != 2 {
		t.Fatalf("errors.As gives %v, want line 2", lineErr)
	}
}

func TestLookupAndAllows(t *testing.T) {
	key, signer := pubLine(t)
	other, _ := pubLine(t)
	file := strings.Join([]string{
		"preparer@example.com " + key,
		`checker@example.com namespaces="calc-package@*" ` + key,
		`git-only@example.com namespaces="git" ` + key,
		`*@example.com,!intern@example.com namespaces="file,calc-package@vouch" ` + key,
		"*@example.com cert-authority " + key,
		`expired@example.com valid-before="20200101Z" ` + key,
		`future@example.com valid-after="29990101Z" ` + key,
		"someone@example.com " + other,
	}, "\n")
	signers, err := ParseAllowedSigners([]byte(file))
	if err != nil {
		t.Fatal(err)
	}
	pub := signer.PublicKey()
	want := []string{"preparer@example.com", "checker@example.com", "*@example.com", "!intern@example.com"}
	if got := signers.Lookup(pub); !reflect.DeepEqual(got, want) {
		t.Fatalf("Lookup = %v, want %v", got, want)
	}
	if got := signers.LookupAt(pub, "git", time.Now()); !reflect.DeepEqual(got, []string{
		"preparer@example.com", "git-only@example.com"}) {
		t.Fatalf("LookupAt(git) = %v", got)
	}
	if got := signers.LookupAt(pub, Namespace, time.Date(2019, 6, 1, 0, 0, 0, 0, time.UTC)); len(got) != 5 {
		t.Fatalf("LookupAt(2019) = %v, want the expired line too", got)
	}
	allows := map[string]bool{
		"preparer@example.com":  true,
		"checker@example.com":   true,
		"anyone@example.com":    true,
		"intern@example.com":    false,
		"git-only@example.com":  true, // matched by *@example.com
		"someone@elsewhere.org": false,
	}
	for principal, want := range allows {
		if got := signers.Allows(principal, pub); got != want {
			t.Errorf("Allows(%s) = %v, want %v", principal, got, want)
		}
	}
	otherPub, _, _, _, _ := ssh.ParseAuthorizedKey([]byte(other))
	if signers.Allows("preparer@example.com", otherPub) {
		t.Error("another key is allowed for preparer")
	}
}

func TestMatchPattern(t *testing.T) {
	tests := []struct {
		s, p string
		want bool
	}{
		{"a@example.com", "a@example.com", true},
		{"a@example.com", "*@example.com", true},
		{"a@example.com", "?@example.com", true},
		{"ab@example.com", "?@example.com", false},
		{"a@example.com", "*", true},
		{"", "*", true},
		{"a@example.com", "*@*.com", true},
		{"a@example.org", "*@*.com", false},
		{"a/b", "a*b", true},
	}
	for _, tt := range tests {
		if got := matchPattern(tt.s, tt.p); got != tt.want {
			t.Errorf("matchPattern(%q, %q) = %v, want %v", tt.s, tt.p, got, tt.want)
		}
	}
}

// TestAllowsLikeSSHKeygen checks Allows against ssh-keygen -Y verify -I on
// the same file and signature, principal by principal.
func TestAllowsLikeSSHKeygen(t *testing.T) {
	key, signer := pubLine(t)
	dir := t.TempDir()
	allowed := filepath.Join(dir, "allowed_signers")
	writeFile(t, allowed, strings.Join([]string{
		"preparer@example.com " + key,
		`checker@example.com namespaces="calc-package@*" ` + key,
		`git-only@example.com namespaces="git" ` + key,
		`*@review.example.com,!intern@review.example.com ` + key,
		"*@ca.example.com cert-authority " + key,
		`expired@example.com valid-before="20200101Z" ` + key,
	}, "\n")+"\n")
	msg := []byte("m")
	sig, err := Sign(msg, signer, Namespace)
	if err != nil {
		t.Fatal(err)
	}
	sigPath := filepath.Join(dir, "m.sig")
	writeFile(t, sigPath, string(sig))
	data, _ := os.ReadFile(allowed)
	signers, err := ParseAllowedSigners(data)
	if err != nil {
		t.Fatal(err)
	}
	for _, principal := range []string{"preparer@example.com", "checker@example.com", "git-only@example.com",
		"a@review.example.com", "intern@review.example.com", "x@ca.example.com", "expired@example.com",
		"nobody@example.com"} {
		cmd := exec.Command("ssh-keygen", "-Y", "verify", "-f", allowed, "-I", principal, "-n", Namespace, "-s", sigPath)
		cmd.Stdin = strings.NewReader(string(msg))
		want := cmd.Run() == nil
		if got := signers.Allows(principal, signer.PublicKey()); got != want {
			t.Errorf("Allows(%s) = %v, ssh-keygen -Y verify says %v", principal, got, want)
		}
	}
}
