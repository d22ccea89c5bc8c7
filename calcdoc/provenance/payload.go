package provenance

import (
	"fmt"
	"strings"
	"unicode/utf8"
)

// PayloadFormat is the first line of every signed payload.
const PayloadFormat = "vouch-signature/1"

// Payload returns the exact bytes a signature covers: six lines, each
// ended by a newline (the last one too), in this order:
//
//	vouch-signature/1
//	role: ROLE
//	signer: NAME <PRINCIPAL>
//	signed: SIGNING TIME
//	attestation: TEXT
//	manifest-sha256: DIGEST
//
// A signature that records a method of checking (a checker's, method.go)
// has up to four more lines between attestation and manifest-sha256, each
// only when its field is set, in this order:
//
//	method: METHOD
//	method-ref: REFERENCE
//	report: REPORT PATH
//	report-sha256: REPORT DIGEST
//
// ROLE is s.Role, NAME and PRINCIPAL are s.Name and s.Principal, the
// signing time is s.Signed (SigningTimeLayout, UTC to the second), TEXT is
// s.Attestation and DIGEST is the manifest's Digest in hex. Each value is
// one line of UTF-8 text without leading or trailing blanks. Binding the
// role, the signer, the time, the attestation and the method of checking
// stops a signature from being relabelled or moved to another person,
// time, meaning or method. A reader
// can rebuild the payload with printf and check a signature with
// ssh-keygen -Y verify -n calc-package@vouch.
func (m *Manifest) Payload(s Signature) ([]byte, error) {
	if err := payloadFields(s); err != nil {
		return nil, err
	}
	d, err := m.Digest()
	if err != nil {
		return nil, err
	}
	var b strings.Builder
	b.WriteString(PayloadFormat + "\n")
	b.WriteString("role: " + s.Role + "\n")
	b.WriteString("signer: " + s.Name + " <" + s.Principal + ">\n")
	b.WriteString("signed: " + s.Signed + "\n")
	b.WriteString("attestation: " + s.Attestation + "\n")
	b.WriteString(methodLines(s))
	b.WriteString("manifest-sha256: " + d + "\n")
	return []byte(b.String()), nil
}

// payloadFields checks the signature's fields that go into the payload.
func payloadFields(s Signature) error {
	if s.Role == "" || strings.ContainsAny(s.Role, " \t\r\n=:<>") {
		return fmt.Errorf("%w: role %q must be one word", ErrManifest, clip(s.Role))
	}
	if strings.ContainsAny(s.Principal, " \t\r\n<>") || s.Principal == "" {
		return fmt.Errorf("%w: principal %q must be one word, such as an e-mail address", ErrManifest, clip(s.Principal))
	}
	if strings.ContainsAny(s.Name, "<>") {
		return fmt.Errorf("%w: name %q must not hold < or >", ErrManifest, clip(s.Name))
	}
	if s.Signed == "" {
		return fmt.Errorf("%w: the %s signature records no signing time: it was made by an earlier vouch; withdraw it and sign again", ErrSigningTime, s.Role)
	}
	if _, err := ParseSigningTime(s.Signed); err != nil {
		return err
	}
	for _, f := range []struct{ name, v string }{{"name", s.Name}, {"attestation", s.Attestation}} {
		if f.v == "" || f.v != strings.TrimSpace(f.v) || strings.ContainsAny(f.v, "\r\n") || !utf8.ValidString(f.v) {
			return fmt.Errorf("%w: the %s signature's %s %q must be one line of text, not empty, without leading or trailing blanks", ErrManifest, s.Role, f.name, clip(f.v))
		}
	}
	return checkMethodFields(s)
}

// addSigningRecord adds a signature's signing time, attestation and
// withdrawal to its canonical object, each only when set, so that a
// manifest written before they existed keeps its bytes.
func addSigningRecord(o jsonObject, s Signature) {
	for k, v := range map[string]string{"signed": s.Signed, "attestation": s.Attestation, "withdrawn": s.Withdrawn} {
		if v != "" {
			o[k] = v
		}
	}
}
