package provenance

import (
	"bytes"
	"crypto/rand"
	"crypto/sha256"
	"crypto/sha512"
	"encoding/base64"
	"encoding/pem"
	"fmt"
	"hash"
	"strings"

	"golang.org/x/crypto/ssh"
)

// Namespace is the SSHSIG namespace of every vouch signature. It keeps a
// signature made for a calculation package from being valid for anything
// else signed with the same key (git commits, files), and the reverse.
const Namespace = "calc-package@vouch"

// The SSHSIG format, from OpenSSH's PROTOCOL.sshsig: a 6-byte magic, then
// SSH wire-format fields. The signed data repeats the magic, then the
// namespace, a reserved string, the hash algorithm and the message's hash.
const (
	sigMagic   = "SSHSIG"
	sigVersion = 1
	sigArmor   = "SSH SIGNATURE"
	sigHash    = "sha512"
	armorWidth = 70 // as ssh-keygen writes it
)

// sigBlob is the body of an SSHSIG signature after the magic.
type sigBlob struct {
	Version   uint32
	PublicKey []byte
	Namespace string
	Reserved  string
	HashAlg   string
	Signature []byte
}

// signedData is what the key signs, after the magic.
type signedData struct {
	Namespace string
	Reserved  string
	HashAlg   string
	Hash      []byte
}

// Sign makes an armored SSHSIG signature over msg in namespace, hashing
// with SHA-512 as ssh-keygen -Y sign does. RSA keys sign with rsa-sha2-512;
// their signer must be an ssh.AlgorithmSigner (those from ssh.ParsePrivateKey
// and from the ssh-agent are).
func Sign(msg []byte, signer ssh.Signer, namespace string) ([]byte, error) {
	if namespace == "" {
		return nil, fmt.Errorf("%w: empty namespace", ErrSignatureFormat)
	}
	digest := sha512.Sum512(msg)
	data := toSign(namespace, sigHash, digest[:])
	sig, err := signData(signer, data)
	if err != nil {
		return nil, err
	}
	blob := append([]byte(sigMagic), ssh.Marshal(sigBlob{
		Version:   sigVersion,
		PublicKey: signer.PublicKey().Marshal(),
		Namespace: namespace,
		HashAlg:   sigHash,
		Signature: ssh.Marshal(sig),
	})...)
	return armor(blob), nil
}

// toSign builds the data the key signs.
func toSign(namespace, hashAlg string, digest []byte) []byte {
	return append([]byte(sigMagic), ssh.Marshal(signedData{
		Namespace: namespace,
		HashAlg:   hashAlg,
		Hash:      digest,
	})...)
}

// signData signs with the key's default algorithm, or rsa-sha2-512 for RSA.
func signData(signer ssh.Signer, data []byte) (*ssh.Signature, error) {
	if !isRSA(signer.PublicKey()) {
		return signer.Sign(rand.Reader, data)
	}
	as, ok := signer.(ssh.AlgorithmSigner)
	if !ok {
		return nil, fmt.Errorf("rsa key %s cannot sign with %s", Fingerprint(signer.PublicKey()), ssh.KeyAlgoRSASHA512)
	}
	return as.SignWithAlgorithm(rand.Reader, data, ssh.KeyAlgoRSASHA512)
}

// isRSA reports an RSA key, or a certificate for one.
func isRSA(pub ssh.PublicKey) bool {
	if cert, ok := pub.(*ssh.Certificate); ok {
		pub = cert.Key
	}
	return pub.Type() == ssh.KeyAlgoRSA
}

// armor wraps a signature blob as ssh-keygen does.
func armor(blob []byte) []byte {
	b64 := base64.StdEncoding.EncodeToString(blob)
	var out bytes.Buffer
	out.WriteString("-----BEGIN " + sigArmor + "-----\n")
	for len(b64) > armorWidth {
		out.WriteString(b64[:armorWidth] + "\n")
		b64 = b64[armorWidth:]
	}
	out.WriteString(b64 + "\n-----END " + sigArmor + "-----\n")
	return out.Bytes()
}

// VerifySig checks an armored SSHSIG signature over msg and returns the key
// that made it. It does not say whether that key is trusted: look the key up
// in an allowed-signers file for that. A signature for another namespace
// gives an error wrapping ErrNamespace, one that does not match the message
// ErrBadSignature, and a malformed one ErrSignatureFormat.
func VerifySig(msg, armored []byte, namespace string) (ssh.PublicKey, error) {
	blob, err := unarmor(armored)
	if err != nil {
		return nil, err
	}
	pub, err := ssh.ParsePublicKey(blob.PublicKey)
	if err != nil {
		return nil, fmt.Errorf("%w: public key: %v", ErrSignatureFormat, err)
	}
	if blob.Namespace != namespace {
		return nil, fmt.Errorf("%w: signature is for %q, expected %q", ErrNamespace, blob.Namespace, namespace)
	}
	sig := new(ssh.Signature)
	if err := ssh.Unmarshal(blob.Signature, sig); err != nil {
		return nil, fmt.Errorf("%w: signature field: %v", ErrSignatureFormat, err)
	}
	if sig.Format == ssh.KeyAlgoRSA {
		return nil, fmt.Errorf("%w: rsa signature uses sha-1 (ssh-rsa), need rsa-sha2-256 or rsa-sha2-512", ErrBadSignature)
	}
	h, err := newHash(blob.HashAlg)
	if err != nil {
		return nil, err
	}
	h.Write(msg)
	if err := pub.Verify(toSign(namespace, blob.HashAlg, h.Sum(nil)), sig); err != nil {
		return nil, fmt.Errorf("%w: key %s: %v", ErrBadSignature, Fingerprint(pub), err)
	}
	return pub, nil
}

// unarmor decodes the armor and the blob's fixed fields.
func unarmor(armored []byte) (*sigBlob, error) {
	block, _ := pem.Decode(armored)
	if block == nil || block.Type != sigArmor {
		return nil, fmt.Errorf("%w: no %q block", ErrSignatureFormat, "BEGIN "+sigArmor)
	}
	raw, ok := strings.CutPrefix(string(block.Bytes), sigMagic)
	if !ok {
		return nil, fmt.Errorf("%w: missing %s magic", ErrSignatureFormat, sigMagic)
	}
	blob := new(sigBlob)
	if err := ssh.Unmarshal([]byte(raw), blob); err != nil {
		return nil, fmt.Errorf("%w: %v", ErrSignatureFormat, err)
	}
	if blob.Version != sigVersion {
		return nil, fmt.Errorf("%w: version %d, want %d", ErrSignatureFormat, blob.Version, sigVersion)
	}
	return blob, nil
}

// newHash returns the hash SSHSIG names; ssh-keygen signs with sha512 and
// accepts sha256 too.
func newHash(name string) (hash.Hash, error) {
	switch name {
	case "sha512":
		return sha512.New(), nil
	case "sha256":
		return sha256.New(), nil
	}
	return nil, fmt.Errorf("%w: hash algorithm %q, want sha512 or sha256", ErrSignatureFormat, name)
}
