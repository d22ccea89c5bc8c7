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
// Payload for s (its role, signer, signing time and attestation) and that its key has the recorded fingerprint, and returns the key.
// Whether the key belongs to s.Principal is for an allowed-signers file to
// say (AllowedSigners.Allows).
func (m *Manifest) VerifySignature(s Signature) (ssh.PublicKey, error) {
	payload, err := m.Payload(s)
	if err != nil {
		return nil, err
	}
	pub, err := VerifySig(payload, []byte(s.Signature), Namespace)
	if err != nil {
		return nil, fmt.Errorf("%s signature of %s: %w", s.Role, s.Principal, err)
	}
	if fp := Fingerprint(pub); fp != s.Fingerprint {
		return nil, fmt.Errorf("%w: %s signature of %s is made with key %s, the manifest records %s",
			ErrBadSignature, s.Role, s.Principal, fp, s.Fingerprint)
	}
	return pub, nil
}
