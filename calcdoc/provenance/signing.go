package provenance

import (
	"fmt"

	"golang.org/x/crypto/ssh"
)

// SignAs signs the manifest's Payload for s with signer and returns s with
// its Fingerprint and Signature filled in. The caller sets Role, Principal,
// Name, Date, Signed and Attestation, and appends the result to m.Signatures; the manifest's Digest
// does not change by that.
func (m *Manifest) SignAs(s Signature, signer ssh.Signer) (Signature, error) {
	payload, err := m.Payload(s)
	if err != nil {
		return s, err
	}
	armored, err := Sign(payload, signer, Namespace)
	if err != nil {
		return s, fmt.Errorf("sign as %s: %w", s.Role, err)
	}
	s.Fingerprint = Fingerprint(signer.PublicKey())
	s.Signature = string(armored)
	return s, nil
}

// VerifySignature checks that s is a valid signature of the manifest's
// Payload for s (its role, signer, signing time, attestation and method
// of checking) and that its key has the recorded fingerprint, and returns
// the key.
// Whether the key belongs to s.Principal is for an allowed-signers file to
// say (AllowedSigners.Allows).
func (m *Manifest) VerifySignature(s Signature) (ssh.PublicKey, error) {
	payload, err := m.Payload(s)
	if err != nil {
		return nil, err
	}
	pub, err := VerifySig(payload, []byte(s.Signature), Namespace)
	if err != nil {
		return nil, fmt.Errorf("%s signature of %s: %w%s", s.Role, s.Principal, err, m.unsignedMethod(s))
	}
	if fp := Fingerprint(pub); fp != s.Fingerprint {
		return nil, fmt.Errorf("%w: %s signature of %s is made with key %s, the manifest records %s",
			ErrBadSignature, s.Role, s.Principal, fp, s.Fingerprint)
	}
	return pub, nil
}

// unsignedMethod explains a signature that does not verify over its
// payload but does over the payload without its method of checking: it
// was made by an earlier vouch, which recorded the method beside the
// signature without signing it. Such a signature still fails; "" when
// that is not the reason.
func (m *Manifest) unsignedMethod(s Signature) string {
	if s.Method == "" {
		return ""
	}
	s.Method, s.MethodRef, s.Report, s.ReportHash = "", "", "", ""
	payload, err := m.Payload(s)
	if err != nil {
		return ""
	}
	if _, err := VerifySig(payload, []byte(s.Signature), Namespace); err != nil {
		return ""
	}
	return " (it signs the payload without the method of checking: an earlier vouch recorded the method beside the signature unsigned, so the method cannot be trusted; withdraw the signature and sign again)"
}
