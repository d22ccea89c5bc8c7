package qualify

import (
	"bytes"
	"errors"
	"strings"
	"testing"
)

// TestReportSignaturesOutsideDigest: signatures are left out of the digest
// and out of an unsigned report's JSON; ReadReport reads a signed report
// back and refuses an unknown key, another format and an edited value.
func TestReportSignaturesOutsideDigest(t *testing.T) {
	r, err := Run(Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	unsigned := r.CanonicalJSON()
	if bytes.Contains(unsigned, []byte(`"signatures"`)) {
		t.Error("an unsigned report writes a signatures key")
	}
	r.Signatures = []Signature{{Role: "approver", Principal: "approver@example.com", Name: "A. Approver", Fingerprint: "SHA256:x",
		Signed: "2026-03-14T09:26:53Z", Attestation: Attestation, Signature: "-----BEGIN SSH SIGNATURE-----\n"}}
	if r.ComputeDigest() != r.Digest {
		t.Fatal("a signature changes the digest")
	}
	back, err := ReadReport(r.CanonicalJSON())
	if err != nil || len(back.Signatures) != 1 || !bytes.Equal(back.CanonicalJSON(), r.CanonicalJSON()) {
		t.Fatalf("ReadReport: %v", err)
	}
	signed := string(r.CanonicalJSON())
	for name, bad := range map[string]string{
		"unknown key":  strings.Replace(signed, `"summary"`, `"summaryx"`, 1),
		"format":       strings.Replace(signed, FormatName, "vouch-qualification/9", 1),
		"edited value": strings.Replace(signed, `"verdict": "PASS"`, `"verdict": "FAIL"`, 1),
		"extra data":   signed + "{}",
	} {
		if _, err := ReadReport([]byte(bad)); !errors.Is(err, ErrReport) {
			t.Errorf("%s: ReadReport = %v, want ErrReport", name, err)
		}
	}
	if _, err := r.Payload(Signature{Role: "auditor", Principal: "a@example.com", Name: "A", Signed: "2026-03-14T09:26:53Z", Attestation: "x"}); !errors.Is(err, ErrReport) {
		t.Errorf("a role outside the three: %v", err)
	}
}
