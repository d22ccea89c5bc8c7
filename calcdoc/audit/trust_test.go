package audit

import (
	"errors"
	stdhtml "html"
	"strings"
	"testing"
	"time"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// signAt signs a package at a given signing time, returning the error.
func signAt(t *testing.T, pkg, role string, k key, signers string, at time.Time) error {
	t.Helper()
	s, _, err := Sign(pkg, SignOptions{Role: role, Key: k.path, Now: func() time.Time { return at },
		VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}})
	if err == nil {
		writePkg(t, pkg, s.HTML)
	}
	return err
}

// commitTime is the date of the repository's HEAD commit.
func commitTime(t *testing.T, r *gitRepo) time.Time {
	t.Helper()
	at, err := time.Parse(time.RFC3339, r.Git("log", "-1", "--format=%cI", "HEAD"))
	if err != nil {
		t.Fatal(err)
	}
	return at
}

// TestOneKeySignsAllRoles: one key signing preparer, checker and approver
// is refused by sign, and a package where it happened fails verify and
// stays PREPARED, even with that key listed for all three people.
func TestOneKeySignsAllRoles(t *testing.T) {
	r := calcRepo(t)
	k := newKey(t, "ed25519")
	commitSigners(t, r, preparerEmail, k, checkerEmail, k, approverEmail, k)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	signPkg(t, pkg, "preparer", k, "")
	err := signAt(t, pkg, "checker", k, "", time.Now())
	if err == nil || !strings.Contains(err.Error(), "signed with the same key") || !strings.Contains(err.Error(), "one person may not hold two roles") {
		t.Fatalf("checker with the preparer's key: %v, want a refusal", err)
	}
	forgeSignature(t, pkg, "checker", k)
	forgeSignature(t, pkg, "approver", k)
	rep := verifyPkg(t, pkg, "")
	failsWith(t, rep, "checker", "signed with the same key "+fingerprint(t, k)+" as the preparer signature")
	failsWith(t, rep, "approver", "signed with the same key")
	if rep.Status != "PREPARED" {
		t.Errorf("status %s, want PREPARED", rep.Status)
	}
	html := stdhtml.UnescapeString(string(mustRead(t, pkg)))
	if !strings.Contains(html, `<div class="stamp">PREPARED</div>`) || strings.Count(html, ">VALID<") != 2 || !strings.Contains(html, ">NOT VALID<") {
		t.Errorf("cover and appendix: want PREPARED, VALID for the preparer only, and NOT VALID")
	}
}

// TestPreparerKeySignsAsNamedChecker: the front matter names C. Reader as
// checker, and the preparer's key signs the checker role under C. Reader's
// name: sign refuses, verify fails the package where it happened.
func TestPreparerKeySignsAsNamedChecker(t *testing.T) {
	r := calcRepo(t)
	prep := newKey(t, "ed25519")
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	signPkg(t, pkg, "preparer", prep, "")
	if err := signAt(t, pkg, "checker", prep, "", time.Now()); err == nil {
		t.Fatal("sign accepted the preparer's key for the checker")
	}
	forgeSignature(t, pkg, "checker", prep)
	rep := verifyPkg(t, pkg, "")
	failsWith(t, rep, "checker", "the same key")
	html := stdhtml.UnescapeString(string(mustRead(t, pkg)))
	if strings.Contains(html, `class="stamp">CHECKED`) {
		t.Error("cover stamps CHECKED")
	}

	// The preparer's second key, which the committed file lists for the
	// preparer, signing as C. Reader: refused, and failed where it happened.
	r2 := calcRepo(t)
	second := newKey(t, "ed25519")
	commitSigners(t, r2, preparerEmail, prep, preparerEmail, second)
	pkg2 := renderFile(t, r2.Path("calcs/fp.calc.md"))
	signPkg(t, pkg2, "preparer", prep, "")
	if err := signAt(t, pkg2, "checker", second, "", time.Now()); err == nil || !strings.Contains(err.Error(), "does not allow key") {
		t.Fatalf("the preparer's second key as checker: %v", err)
	}
	forgeSignature(t, pkg2, "checker", second)
	failsWith(t, verifyPkg(t, pkg2, ""), "checker", ".vouch/allowed_signers at the commit does not allow key "+fingerprint(t, second)+" for checker@example.com")
}

// TestSameSignerAllowedBySettings: a firm that lets its approver also
// check says so in vouch.yaml; one person then signs both, and the cover
// prints the exception with the firm's reason.
func TestSameSignerAllowedBySettings(t *testing.T) {
	r := newGitRepo(t)
	r.Write(".gitignore", "*.html\n*.manifest.json\n")
	r.Write("vouch.yaml", "roles:\n  allow_same_signer:\n    - roles: [checker, approver]\n      reason: a two-person office (fictional); the approver checks\n")
	r.Write("calcs/fp.calc.md", strings.Replace(signCalc, "approver: E. Record <approver@example.com>", "approver: C. Reader <checker@example.com>", 1))
	r.Commit("Feed pump power, two-person office")
	prep, chk := newKey(t, "ed25519"), newKey(t, "ed25519")
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	signPkg(t, pkg, "preparer", prep, "")
	signPkg(t, pkg, "checker", chk, "")
	if err := signAt(t, pkg, "approver", chk, "", time.Now()); err != nil {
		t.Fatalf("approver allowed by vouch.yaml: %v", err)
	}
	html := stdhtml.UnescapeString(string(mustRead(t, pkg)))
	for _, want := range []string{"Exception to independent roles: C. Reader signs as both checker and approver, as the firm's settings allow: a two-person office (fictional); the approver checks", `class="stamp">APPROVED`} {
		if !strings.Contains(html, want) {
			t.Errorf("cover lacks %q", want)
		}
	}
	if err := signAt(t, pkg, "checker", prep, "", time.Now()); err == nil {
		t.Error("a second checker signature was accepted")
	}
}

// TestNoSignersFileKeysUnchecked: without any signers file the cover and
// verify say each signature is intact with its key not checked, never
// VALID, and the stamp says the keys are unchecked.
func TestNoSignersFileKeysUnchecked(t *testing.T) {
	r := calcRepo(t)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	signPkg(t, pkg, "preparer", newKey(t, "ed25519"), "")
	s := signPkg(t, pkg, "checker", newKey(t, "ed25519"), "")
	if s.Status != "CHECKED"+KeysUnchecked {
		t.Errorf("status %q", s.Status)
	}
	html := stdhtml.UnescapeString(string(mustRead(t, pkg)))
	if strings.Contains(html, ">VALID<") || !strings.Contains(html, calcdoc.KeysNotChecked) || !strings.Contains(html, "CHECKED — keys unchecked") {
		t.Errorf("cover claims VALID, or does not say the keys are unchecked")
	}
	rep := verifyPkg(t, pkg, "")
	if rep.Status != "CHECKED — keys unchecked" || strings.Count(rep.String(), "intact; key not checked against a signers file") != 2 ||
		!strings.Contains(rep.String(), "2 signatures are intact, but no allowed-signers file said whose keys they are: commit one at .vouch/allowed_signers") {
		t.Errorf("verify:\n%s", rep)
	}
}

// TestRetiredKeyKeepsOldSignature: a key retired with valid-before after
// it signed still counts for that signature, in the committed file of a
// later commit and in an outside file, because keys are judged at the
// signing time.
func TestRetiredKeyKeepsOldSignature(t *testing.T) {
	r := calcRepo(t)
	prep := newKey(t, "ed25519")
	commitSigners(t, r, preparerEmail, prep)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	at := commitTime(t, r).Add(time.Hour)
	if err := signAt(t, pkg, "preparer", prep, "", at); err != nil {
		t.Fatal(err)
	}
	retired := preparerEmail + ` namespaces="calc-package@vouch",valid-before="` + at.Add(24*time.Hour).UTC().Format("20060102") + `Z" ` + prep.pub + "\n"
	r.Write(".vouch/allowed_signers", retired)
	r.Commit("Retire the preparer's key", ".vouch/allowed_signers")
	outside := writeTemp(t, "allowed_signers", retired)
	a, err := provenance.ParseAllowedSigners([]byte(retired))
	if err != nil || a.Allows(preparerEmail, a[0].Key) {
		t.Fatalf("the retired key should not be allowed now: %v", err)
	}
	for _, signers := range []string{"", outside} {
		if rep := verifyPkg(t, pkg, signers); !rep.OK() || rep.Status != "PREPARED" {
			t.Fatalf("verify with signers %q:\n%s", signers, rep)
		}
	}
}

// TestRevokedKeyFails: a key listed in .vouch/revoked_keys fails at any
// time, even when it was revoked after the package was signed.
func TestRevokedKeyFails(t *testing.T) {
	r := calcRepo(t)
	prep := newKey(t, "ed25519")
	commitSigners(t, r, preparerEmail, prep)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	signPkg(t, pkg, "preparer", prep, "")
	r.Write(".vouch/revoked_keys", "# lost laptop (fictional)\n"+prep.pub+"\n")
	r.Commit("Revoke the preparer's key", ".vouch/revoked_keys")
	failsWith(t, verifyPkg(t, pkg, ""), "preparer", "is listed as revoked")

	// Without a signers file a revoked key fails as well.
	r3 := calcRepo(t)
	pkg3 := renderFile(t, r3.Path("calcs/fp.calc.md"))
	signPkg(t, pkg3, "preparer", prep, "")
	r3.Write(".vouch/revoked_keys", prep.pub+"\n")
	r3.Commit("Revoke the preparer's key", ".vouch/revoked_keys")
	failsWith(t, verifyPkg(t, pkg3, ""), "preparer", "is listed as revoked")

	// Revoked at the commit: the cover says so, and sign refuses the key.
	r2 := calcRepo(t)
	commitSigners(t, r2, preparerEmail, prep)
	r2.Write(".vouch/revoked_keys", prep.pub+"\n")
	r2.Commit("Revoke the preparer's key", ".vouch/revoked_keys")
	pkg2 := renderFile(t, r2.Path("calcs/fp.calc.md"))
	if err := signAt(t, pkg2, "preparer", prep, "", time.Now()); err == nil || !strings.Contains(err.Error(), "revoked") {
		t.Fatalf("sign with a revoked key: %v", err)
	}
}

// TestSigningTimeOutOfBounds: a signing time before the commit is refused
// by sign, and one in the future fails verify.
func TestSigningTimeOutOfBounds(t *testing.T) {
	r := calcRepo(t)
	prep := newKey(t, "ed25519")
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	err := signAt(t, pkg, "preparer", prep, "", commitTime(t, r).Add(-time.Hour))
	var usage *calcdoc.UsageError
	if !errors.As(err, &usage) || !errors.Is(err, provenance.ErrSigningTime) || !strings.Contains(err.Error(), "before the package's commit") {
		t.Fatalf("signing before the commit: %v", err)
	}
	if err := signAt(t, pkg, "preparer", prep, "", time.Now().Add(48*time.Hour)); err != nil {
		t.Fatal(err)
	}
	failsWith(t, verifyPkg(t, pkg, ""), "preparer", "later than now")
}

// TestAttestationFromSettings: the firm's attestation text is signed and
// printed; a signature attesting another text fails.
func TestAttestationFromSettings(t *testing.T) {
	r := calcRepo(t)
	text := "I prepared this calculation under procedure QP-7 (fictional)."
	r.Write("vouch.yaml", "roles:\n  attestation:\n    preparer: "+text+"\n")
	r.Commit("Firm settings", "vouch.yaml")
	prep := newKey(t, "ed25519")
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	signPkg(t, pkg, "preparer", prep, "")
	m, _ := ManifestOf(mustRead(t, pkg))
	payload, _ := m.Payload(m.Signatures[0])
	if !strings.Contains(string(payload), "\nattestation: "+text+"\n") || !strings.Contains(stdhtml.UnescapeString(string(mustRead(t, pkg))), text) {
		t.Fatalf("payload or cover lacks the firm's attestation:\n%s", payload)
	}
	forged := m.Signatures[0]
	forged.Attestation = "I approve this calculation for issue."
	signer, _ := provenance.LoadSigner(prep.path)
	forged, _ = m.SignAs(forged, signer)
	m.Signatures[0] = forged
	rewriteManifest(t, pkg, m)
	failsWith(t, verifyPkg(t, pkg, ""), "preparer", "but the firm's text for the preparer is")
}

// TestSignersHashRecorded: the committed signers file's blob is in the
// manifest, and a manifest that names another blob does not reproduce.
func TestSignersHashRecorded(t *testing.T) {
	r := calcRepo(t)
	prep := newKey(t, "ed25519")
	commitSigners(t, r, preparerEmail, prep)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	m, _ := ManifestOf(mustRead(t, pkg))
	want := provenance.BlobHash(r.Read(".vouch/allowed_signers"))
	if m.SignersFile != ".vouch/allowed_signers" || m.SignersHash != want {
		t.Fatalf("signers %q %q, want the blob %s", m.SignersFile, m.SignersHash, want)
	}
	m.SignersHash = strings.Repeat("0", 40)
	file, _ := ManifestFile(m)
	if err := writeFile(ManifestPath(pkg), file); err != nil {
		t.Fatal(err)
	}
	html := strings.Replace(string(mustRead(t, pkg)), want, m.SignersHash, 1)
	if err := writeFile(pkg, []byte(html)); err != nil {
		t.Fatal(err)
	}
	failsWith(t, verifyPkg(t, pkg, ""), "manifest", "signers_hash")
}

// TestMalformedCommittedSigners: a committed signers file or revoked-keys
// file with a bad line stops the render with an error at its line.
func TestMalformedCommittedSigners(t *testing.T) {
	for _, c := range []struct{ file, content, want string }{
		{".vouch/allowed_signers", "preparer@example.com nosuch=\"x\" ssh-ed25519 AAAA\n", "allowed signers .vouch/allowed_signers at commit"},
		{".vouch/revoked_keys", "not a key\n", "revoked keys .vouch/revoked_keys at commit"},
	} {
		r := calcRepo(t)
		if c.file == ".vouch/revoked_keys" {
			commitSigners(t, r, preparerEmail, newKey(t, "ed25519"))
		}
		r.Write(c.file, c.content)
		r.Commit("Bad file", c.file)
		d, err := calcdoc.ReadFile(r.Path("calcs/fp.calc.md"))
		if err != nil {
			t.Fatal(err)
		}
		_, err = Provenance(d, "test")
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), "line 1") {
			t.Errorf("%s: %v", c.file, err)
		}
	}
}
