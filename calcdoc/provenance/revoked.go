package provenance

import (
	"bytes"
	"errors"
	"strings"

	"golang.org/x/crypto/ssh"
)

// RevokedKeys is a list of revoked public keys. OpenSSH's allowed-signers
// format has no revocation marker (a line beginning @revoked is a line for
// the principal "@revoked", and a malformed one at that): ssh-keygen -Y
// verify takes the revoked keys in a separate file, -r FILE, and a key
// listed there fails at any time. RevokedKeys reads the plain form of that
// file; the binary KRL form is not read.
type RevokedKeys []ssh.PublicKey

// krlMagic begins a binary key revocation list.
const krlMagic = "SSHKRL\n\x00"

// ParseRevokedKeys reads a revoked-keys file as ssh-keygen -Y verify -r
// reads its plain form: blank lines and # comments are skipped, and every
// other line is KEYTYPE BASE64 [COMMENT], as in a .pub file. A line that is
// not a key is an error at its line (ssh-keygen then fails every
// verification, so nothing is lost by refusing the file); errors are
// *AllowedSignersError values, joined.
func ParseRevokedKeys(data []byte) (RevokedKeys, error) {
	if bytes.HasPrefix(data, []byte(krlMagic)) {
		return nil, &AllowedSignersError{Line: 1, Msg: "a binary key revocation list (KRL) is not read: list the revoked public keys one per line, as in .pub files"}
	}
	var out RevokedKeys
	var errs []error
	for i, line := range bytes.Split(data, []byte("\n")) {
		text := strings.TrimRight(string(line), "\r")
		if blankOrComment(text) {
			continue
		}
		key, _, err := readKey(strings.TrimLeft(text, " \t"))
		if err != nil {
			errs = append(errs, &AllowedSignersError{Line: i + 1, Msg: "not a public key: " + err.Error()})
			continue
		}
		out = append(out, key)
	}
	return out, errors.Join(errs...)
}

// Revoked reports whether pub is in the list.
func (r RevokedKeys) Revoked(pub ssh.PublicKey) bool {
	want := pub.Marshal()
	for _, k := range r {
		if bytes.Equal(k.Marshal(), want) {
			return true
		}
	}
	return false
}
