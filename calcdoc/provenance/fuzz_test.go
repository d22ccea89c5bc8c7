package provenance

import (
	"bytes"
	"crypto/ed25519"
	"testing"

	"golang.org/x/crypto/ssh"
)

// A package's signatures and manifest come from a file anyone can edit:
// their parsers must refuse bad input with an error, never panic.

// fuzzSigner is an ed25519 key made from a fixed seed (for tests only).
func fuzzSigner(f *testing.F) ssh.Signer {
	s, err := ssh.NewSignerFromKey(ed25519.NewKeyFromSeed(bytes.Repeat([]byte{7}, ed25519.SeedSize)))
	if err != nil {
		f.Fatal(err)
	}
	return s
}

// FuzzVerifySig: a mutated signature never verifies against a message it
// was not made for, and garbage is an error.
func FuzzVerifySig(f *testing.F) {
	msg := []byte("calc-package role=checker manifest-sha256=00")
	good, err := Sign(msg, fuzzSigner(f), Namespace)
	if err != nil {
		f.Fatal(err)
	}
	f.Add(good)
	f.Add([]byte("-----BEGIN SSH SIGNATURE-----\nU1NIU0lH\n-----END SSH SIGNATURE-----\n"))
	f.Add([]byte{})
	f.Fuzz(func(t *testing.T, sig []byte) {
		if _, err := VerifySig([]byte("another message"), sig, Namespace); err == nil {
			t.Fatal("a signature verified for a message it was not made for")
		}
		_, _ = VerifySig(msg, sig, Namespace)
	})
}

// FuzzParseManifest: a manifest that parses writes canonical JSON that
// parses again to the same canonical JSON.
func FuzzParseManifest(f *testing.F) {
	f.Add([]byte(`{"format":"vouch-manifest/1","engine":"vouch 0.1.0","results":[{"name":"a","si":1.5,"unit":"m"}],"signatures":[]}`))
	f.Add([]byte(`{"format":"vouch-manifest/1","results":[{"name":"x","si":-0,"unit":""}]}`))
	f.Add([]byte(`{}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		m, err := ParseManifest(data)
		if err != nil {
			return
		}
		a, err := m.Canonical()
		if err != nil {
			return // a manifest that cannot be written (say, a NaN) is refused there
		}
		m2, err := ParseManifest(a)
		if err != nil {
			t.Fatalf("canonical JSON does not parse: %v\n%s", err, a)
		}
		b, err := m2.Canonical()
		if err != nil || !bytes.Equal(a, b) {
			t.Fatalf("canonical JSON is not stable:\n%s\n%s", a, b)
		}
	})
}

// FuzzParseAllowedSigners: any file is a list of signers or an error.
func FuzzParseAllowedSigners(f *testing.F) {
	pub := string(ssh.MarshalAuthorizedKey(fuzzSigner(f).PublicKey()))
	f.Add([]byte("checker@example.com " + pub))
	f.Add([]byte("# comment\n\"a b\",c@example.com namespaces=\"vouch\" " + pub))
	f.Fuzz(func(t *testing.T, data []byte) {
		_, _ = ParseAllowedSigners(data)
	})
}
