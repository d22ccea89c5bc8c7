package qualify

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"slices"
	"strings"
	"unicode/utf8"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"golang.org/x/crypto/ssh"
)

// SignatureFormat is the first line of a qualification report's signed
// payload; a calc package's payload starts with provenance.PayloadFormat
// instead, so neither can stand for the other.
const SignatureFormat = "vouch-qualification/1"

// Attestation is what a person signing a qualification report attests.
const Attestation = "I reviewed this qualification report of the engine build it names and file it as our record of that build's verification."

// SignatureRoles are the roles a qualification report may be signed in.
var SignatureRoles = []string{"preparer", "checker", "approver"}

// ErrReport reports a qualification report that cannot be read as one:
// not its JSON format, an unknown field, or a digest that does not match.
var ErrReport = errors.New("not a valid qualification report")

// Signature is a signature of a qualification report, stored in its JSON
// (not covered by the report's digest, as a package's signatures are not
// covered by its manifest digest).
type Signature struct {
	Role        string `json:"role"`
	Principal   string `json:"principal"`
	Name        string `json:"name"`
	Fingerprint string `json:"fingerprint"`
	Signed      string `json:"signed"`
	Attestation string `json:"attestation"`
	Signature   string `json:"signature"`
}

// Payload returns the exact bytes a signature of the report covers: six
// lines, each ended by a newline (the last one too):
//
//	vouch-qualification/1
//	role: ROLE
//	signer: NAME <PRINCIPAL>
//	signed: SIGNING TIME
//	attestation: TEXT
//	report-sha256: DIGEST
//
// DIGEST is the report's Digest (its JSON without digest and signatures),
// which covers the engine's identity and every check.
func (r *Report) Payload(s Signature) ([]byte, error) {
	if !slices.Contains(SignatureRoles, s.Role) {
		return nil, fmt.Errorf("%w: role %q; the roles are %s", ErrReport, s.Role, strings.Join(SignatureRoles, ", "))
	}
	if s.Principal == "" || strings.ContainsAny(s.Principal, " \t\r\n<>") {
		return nil, fmt.Errorf("%w: signer's e-mail %q must be one word", ErrReport, s.Principal)
	}
	if _, err := provenance.ParseSigningTime(s.Signed); err != nil {
		return nil, err
	}
	for _, v := range []string{s.Name, s.Attestation} {
		if v == "" || v != strings.TrimSpace(v) || strings.ContainsAny(v, "\r\n<>") || !utf8.ValidString(v) {
			return nil, fmt.Errorf("%w: %q must be one line of text, not empty, without < or >", ErrReport, v)
		}
	}
	if len(r.Digest) != 64 {
		return nil, fmt.Errorf("%w: it records no digest", ErrReport)
	}
	return []byte(SignatureFormat + "\nrole: " + s.Role + "\nsigner: " + s.Name + " <" + s.Principal + ">\nsigned: " +
		s.Signed + "\nattestation: " + s.Attestation + "\nreport-sha256: " + r.Digest + "\n"), nil
}

// SignAs signs the report's Payload for s with signer and returns s with
// its fingerprint and signature filled in.
func (r *Report) SignAs(s Signature, signer ssh.Signer) (Signature, error) {
	payload, err := r.Payload(s)
	if err != nil {
		return s, err
	}
	armored, err := provenance.Sign(payload, signer, provenance.Namespace)
	if err != nil {
		return s, err
	}
	s.Fingerprint = provenance.Fingerprint(signer.PublicKey())
	s.Signature = string(armored)
	return s, nil
}

// VerifySignature checks s over the report's Payload and its recorded
// fingerprint, and returns the key. Whether the key is the signer's is for
// an allowed-signers file to say.
func (r *Report) VerifySignature(s Signature) (ssh.PublicKey, error) {
	payload, err := r.Payload(s)
	if err != nil {
		return nil, err
	}
	pub, err := provenance.VerifySig(payload, []byte(s.Signature), provenance.Namespace)
	if err != nil {
		return nil, fmt.Errorf("%s signature of %s: %w", s.Role, s.Principal, err)
	}
	if fp := provenance.Fingerprint(pub); fp != s.Fingerprint {
		return nil, fmt.Errorf("%w: %s signature of %s is made with key %s, the report records %s",
			provenance.ErrBadSignature, s.Role, s.Principal, fp, s.Fingerprint)
	}
	return pub, nil
}

// ReadReport reads a report's JSON (qualification.json): its format, no
// unknown field, nothing after it, and a digest that matches its content.
func ReadReport(data []byte) (*Report, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var r Report
	if err := dec.Decode(&r); err != nil {
		return nil, fmt.Errorf("%w: %v", ErrReport, err)
	}
	if dec.More() {
		return nil, fmt.Errorf("%w: data after the report", ErrReport)
	}
	if r.Format != FormatName {
		return nil, fmt.Errorf("%w: format %q, want %q", ErrReport, r.Format, FormatName)
	}
	if d := r.ComputeDigest(); d != r.Digest {
		return nil, fmt.Errorf("%w: its content digests to %s, the report records %s: it was edited", ErrReport, d, r.Digest)
	}
	return &r, nil
}
