package provenance

import (
	"bytes"
	"errors"
	"fmt"
	"net"
	"os"

	"golang.org/x/crypto/ssh"

	"github.com/vouchcalc/vouch/internal/safefile"
	"golang.org/x/crypto/ssh/agent"
)

// Fingerprint returns the key's SHA-256 fingerprint as ssh-keygen -l
// prints it: "SHA256:" and unpadded base64.
func Fingerprint(pub ssh.PublicKey) string {
	return ssh.FingerprintSHA256(pub)
}

// MaxKeyFileBytes is the largest key, signature or allowed-signers file
// read.
const MaxKeyFileBytes = 1 << 20

// LoadSigner returns a signer for an SSH key file. The file may hold an
// unencrypted private key, or a passphrase-protected private key or a
// public key (KEY.pub) whose private key is loaded in the ssh-agent
// reached through SSH_AUTH_SOCK: vouch never asks for a passphrase itself.
// A protected key that the agent lacks gives an error wrapping
// ErrPassphrase that says to run ssh-add.
func LoadSigner(keyfile string) (ssh.Signer, error) {
	data, err := safefile.Read(keyfile, MaxKeyFileBytes)
	if err != nil {
		return nil, fmt.Errorf("signing key: %w", err)
	}
	signer, err := ssh.ParsePrivateKey(data)
	if err == nil {
		return signer, nil
	}
	var missing *ssh.PassphraseMissingError
	switch {
	case errors.As(err, &missing):
		return agentSignerFor(keyfile, missing.PublicKey)
	case isPublicKey(data):
		pub, _, _, _, _ := ssh.ParseAuthorizedKey(data)
		return agentSignerFor(keyfile, pub)
	}
	return nil, fmt.Errorf("signing key %s: %w", keyfile, err)
}

// isPublicKey reports a file in authorized_keys form, such as KEY.pub.
func isPublicKey(data []byte) bool {
	_, _, _, _, err := ssh.ParseAuthorizedKey(data)
	return err == nil
}

// agentSignerFor finds the agent's signer for pub. pub is nil for an
// old-format encrypted key file, which does not reveal its public key.
func agentSignerFor(keyfile string, pub ssh.PublicKey) (ssh.Signer, error) {
	hint := fmt.Errorf("%w: key %s needs the ssh-agent: run ssh-add %s, then sign again",
		ErrPassphrase, keyfile, keyfile)
	if pub == nil {
		return nil, hint
	}
	signers, err := AgentSigners()
	if err != nil {
		return nil, fmt.Errorf("%w (%v)", hint, err)
	}
	want := pub.Marshal()
	for _, s := range signers {
		if bytes.Equal(s.PublicKey().Marshal(), want) {
			return s, nil
		}
	}
	return nil, fmt.Errorf("%w (the agent holds no key %s)", hint, Fingerprint(pub))
}

// AgentSigners returns the signers of the ssh-agent at SSH_AUTH_SOCK. The
// connection stays open for the signers' use until the process exits. With
// no agent the error wraps ErrNoAgent.
func AgentSigners() ([]ssh.Signer, error) {
	sock := os.Getenv("SSH_AUTH_SOCK")
	if sock == "" {
		return nil, fmt.Errorf("%w: SSH_AUTH_SOCK is not set", ErrNoAgent)
	}
	conn, err := net.Dial("unix", sock)
	if err != nil {
		return nil, fmt.Errorf("%w: %v", ErrNoAgent, err)
	}
	signers, err := agent.NewClient(conn).Signers()
	if err != nil {
		conn.Close()
		return nil, fmt.Errorf("ssh-agent at %s: %w", sock, err)
	}
	return signers, nil
}
