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
		`empty@example.com,,x@example.com ` + key, // read by ssh-keygen: the empty pattern matches nothing
		`ns@example.com namespaces="" ` + key,     // read by ssh-keygen: no namespace matches
		`twice@example.com valid-before="20300101Z",valid-before="20200101Z" ` + key,
		`unquoted@example.com valid-before=20300101 ` + key,
		`order@example.com valid-after="20300101Z",valid-before="20200101Z" ` + key,
		"type@example.com ssh-rsa " + strings.Fields(key)[1],
		"nul@example.com " + key + " comment\x00 hidden", // ssh-keygen stops reading at the NUL
	}, "\n")
	got, err := ParseAllowedSigners([]byte(file))
	var lines []int
	for _, s := range got {
		lines = append(lines, s.Line)
	}
	if !reflect.DeepEqual(lines, []int{1, 7, 8}) {
		t.Errorf("good lines = %v, want [1 7 8]", lines)
	}
	if !errors.Is(err, ErrAllowedSigners) {
		t.Fatalf("got %v, want ErrAllowedSigners", err)
	}
	want := []string{
		`line 2: principals "lonely@example.com" are not followed by a key`,
		`line 3: the ssh-ed25519 key is not valid base64`,
		`line 4: unknown option "no-touch-required": the options are cert-authority, namespaces="...", valid-after="..." and valid-before="..."`,
		`line 5: valid-after time "2024" is not YYYYMMDD[HHMM[SS]], followed by Z for UTC (as valid-after="20300101Z")`,
		`line 6: unterminated quote in the principals: close it with "`,
		`line 9: option valid-before is given twice: give each option once`,
		`line 10: the value of valid-before must be in double quotes, as valid-before="..."`,
		`line 11: valid-before 2020-01-01T00:00:00Z is not later than valid-after 2030-01-01T00:00:00Z`,
		`line 12: the line names a ssh-rsa key but the base64 holds a ssh-ed25519 key`,
		`line 13: the line holds a NUL byte: an allowed-signers file is text`,
	}
	if got := strings.Split(err.Error(), "\n"); !reflect.DeepEqual(got, want) {
		t.Fatalf("errors =\n%s\nwant\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
	var lineErr *AllowedSignersError
	if !errors.As(err, &lineErr) || lineErr.Line != 2 {
		t.Fatalf("errors.As gives %v, want line 2", lineErr)
	}
}

// TestAllowedSignersDuplicateValidBefore is issue 11 item 16: a line with
// two valid-before options was read, the last one won, and an expired key
// verified; ssh-keygen -Y verify refuses the line ("multiple valid-before
// clauses"), and so does vouch now, at its line, whichever comes first.
func TestAllowedSignersDuplicateValidBefore(t *testing.T) {
	key, signer := pubLine(t)
	for _, opts := range []string{
		`valid-before="20200101Z",valid-before="29990101Z"`,
		`valid-before="29990101Z",valid-before="20200101Z"`,
		`VALID-BEFORE="20200101Z",valid-before="29990101Z"`,
		`valid-after="20200101Z",valid-after="20210101Z"`,
		`namespaces="calc-package@vouch",namespaces="*"`,
	} {
		file := "# fictional signer\nexpired@example.com " + opts + " " + key + "\n"
		signers, err := ParseAllowedSigners([]byte(file))
		var lineErr *AllowedSignersError
		if !errors.As(err, &lineErr) || lineErr.Line != 2 || !strings.Contains(err.Error(), "given twice") {
			t.Errorf("%s: error %v, want one at line 2 saying the option is given twice", opts, err)
		}
		if signers.Allows("expired@example.com", signer.PublicKey()) {
			t.Errorf("%s: the key is allowed", opts)
		}
	}
}

// TestAllowsAtSigningTime: a key is judged at the time asked for, both
// bounds included to the second, as ssh-keygen -Overify-time does; Check
// says why a key is refused.
func TestAllowsAtSigningTime(t *testing.T) {
	key, signer := pubLine(t)
	pub := signer.PublicKey()
	signers, err := ParseAllowedSigners([]byte(
		`retired@example.com valid-after="20200101Z",valid-before="20250101Z" ` + key + "\n" +
			`git@example.com namespaces="git" ` + key + "\n"))
	if err != nil {
		t.Fatal(err)
	}
	utc := func(y, mo, d, h, mi, s int) time.Time { return time.Date(y, time.Month(mo), d, h, mi, s, 0, time.UTC) }
	cases := []struct {
		at   time.Time
		want bool
	}{
		{utc(2019, 12, 31, 23, 59, 59), false},
		{utc(2020, 1, 1, 0, 0, 0), true},
		{utc(2022, 6, 1, 12, 0, 0), true},
		{utc(2025, 1, 1, 0, 0, 0).Add(999 * time.Millisecond), true},
		{utc(2025, 1, 1, 0, 0, 1), false},
	}
	for _, c := range cases {
		if got := signers.AllowsAt("retired@example.com", pub, Namespace, c.at); got != c.want {
			t.Errorf("AllowsAt(%v) = %v, want %v", c.at, got, c.want)
		}
	}
	if signers.Allows("retired@example.com", pub) {
		t.Error("a key retired in 2025 is allowed now")
	}
	err = signers.Check("retired@example.com", pub, Namespace, utc(2026, 1, 1, 0, 0, 0))
	if !errors.Is(err, ErrNotAllowed) || !strings.Contains(err.Error(),
		"line 1 makes it valid only until 2025-01-01T00:00:00Z, before 2026-01-01T00:00:00Z") {
		t.Errorf("Check after valid-before = %v", err)
	}
	err = signers.Check("git@example.com", pub, Namespace, utc(2022, 1, 1, 0, 0, 0))
	if !errors.Is(err, ErrNotAllowed) || !strings.Contains(err.Error(), `line 2 does not allow namespace "calc-package@vouch"`) {
		t.Errorf("Check in another namespace = %v", err)
	}
	err = signers.Check("nobody@example.com", pub, Namespace, utc(2022, 1, 1, 0, 0, 0))
	if !errors.Is(err, ErrNotAllowed) || !strings.Contains(err.Error(), "no line lists key") {
		t.Errorf("Check of an unlisted principal = %v", err)
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
