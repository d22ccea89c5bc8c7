package provenance

import (
	"bytes"
	"errors"
	"fmt"
	"strings"
	"time"

	"golang.org/x/crypto/ssh"
)

// AllowedSigner is one line of an allowed-signers file, in OpenSSH's format
// (ssh-keygen(1), section ALLOWED SIGNERS):
//
//	PRINCIPALS [OPTIONS] KEYTYPE BASE64 [COMMENT]
//
// for example
//
//	checker@example.com namespaces="calc-package@vouch" ssh-ed25519 AAAA... C. Reader
type AllowedSigner struct {
	Line          int           // 1-based line in the file
	Principals    []string      // principal patterns: * and ? wildcards, ! negates
	Namespaces    []string      // namespace patterns; nil allows every namespace
	CertAuthority bool          // the key is a certificate authority: not supported, never matches
	ValidAfter    time.Time     // zero: no lower bound
	ValidBefore   time.Time     // zero: no upper bound
	Key           ssh.PublicKey // the signer's key
	Comment       string        // text after the key
}

// AllowedSigners is a parsed allowed-signers file.
type AllowedSigners []AllowedSigner

// AllowedSignersError is one bad line of an allowed-signers file. It wraps
// ErrAllowedSigners.
type AllowedSignersError struct {
	Line int
	Msg  string
}

// Error formats the error as "line N: message".
func (e *AllowedSignersError) Error() string { return fmt.Sprintf("line %d: %s", e.Line, e.Msg) }

// Unwrap returns ErrAllowedSigners.
func (e *AllowedSignersError) Unwrap() error { return ErrAllowedSigners }

// ParseAllowedSigners reads an allowed-signers file. Blank lines and lines
// starting with # are skipped. Every bad line is reported, joined into one
// error of *AllowedSignersError values; the good lines are returned as well.
//
// The options are cert-authority, namespaces="..." and valid-after/
// valid-before="YYYYMMDD[HHMM[SS]][Z]" (without Z, local time, as
// ssh-keygen reads it). Certificate-authority lines are kept but never
// match: vouch verifies plain keys only, so list each signer's own key.
func ParseAllowedSigners(data []byte) (AllowedSigners, error) {
	var out AllowedSigners
	var errs []error
	for i, line := range bytes.Split(data, []byte("\n")) {
		text := strings.TrimSpace(string(line))
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		s, err := parseAllowedLine(text)
		if err != nil {
			errs = append(errs, &AllowedSignersError{Line: i + 1, Msg: err.Error()})
			continue
		}
		s.Line = i + 1
		out = append(out, s)
	}
	return out, errors.Join(errs...)
}

// parseAllowedLine parses one non-blank line.
func parseAllowedLine(text string) (AllowedSigner, error) {
	var s AllowedSigner
	principals, rest, err := cutField(text)
	if err != nil {
		return s, err
	}
	s.Principals = strings.Split(principals, ",")
	for _, p := range s.Principals {
		if p == "" {
			return s, fmt.Errorf("empty principal in %q", principals)
		}
	}
	key, comment, options, _, err := ssh.ParseAuthorizedKey([]byte(rest))
	if err != nil {
		return s, fmt.Errorf("no valid public key after the principals %q", principals)
	}
	s.Key, s.Comment = key, comment
	for _, opt := range options {
		if err := s.setOption(opt); err != nil {
			return s, err
		}
	}
	return s, nil
}

// cutField splits off the first field, which may be double-quoted.
func cutField(text string) (field, rest string, err error) {
	if strings.HasPrefix(text, `"`) {
		end := strings.IndexByte(text[1:], '"')
		if end < 0 {
			return "", "", fmt.Errorf("unterminated quote in the principals")
		}
		return text[1 : end+1], strings.TrimSpace(text[end+2:]), nil
	}
	i := strings.IndexAny(text, " \t")
	if i < 0 {
		return "", "", fmt.Errorf("principals %q are not followed by a key", text)
	}
	return text[:i], strings.TrimSpace(text[i:]), nil
}

// setOption applies one option as ssh.ParseAuthorizedKey returns it, such
// as `namespaces="a,b"`. Option names are case-insensitive.
func (s *AllowedSigner) setOption(opt string) error {
	name, value, hasValue := strings.Cut(opt, "=")
	value = strings.Trim(value, `"`)
	switch strings.ToLower(name) {
	case "cert-authority":
		s.CertAuthority = true
		return nil
	case "namespaces":
		s.Namespaces = strings.Split(value, ",")
	case "valid-after":
		return parseValidity(value, &s.ValidAfter)
	case "valid-before":
		return parseValidity(value, &s.ValidBefore)
	default:
		return fmt.Errorf("unknown option %q", name)
	}
	if !hasValue || value == "" {
		return fmt.Errorf("option %q needs a value", name)
	}
	return nil
}

// parseValidity reads OpenSSH's YYYYMMDD[HHMM[SS]][Z] time.
func parseValidity(v string, t *time.Time) error {
	loc := time.Local
	if s, ok := strings.CutSuffix(v, "Z"); ok {
		v, loc = s, time.UTC
	}
	layouts := map[int]string{8: "20060102", 12: "200601021504", 14: "20060102150405"}
	layout, ok := layouts[len(v)]
	if !ok {
		return fmt.Errorf("time %q is not YYYYMMDD[HHMM[SS]][Z]", v)
	}
	parsed, err := time.ParseInLocation(layout, v, loc)
	if err != nil {
		return fmt.Errorf("time %q is not YYYYMMDD[HHMM[SS]][Z]", v)
	}
	*t = parsed
	return nil
}

// Lookup returns the principal patterns the file lists for pub for the
// vouch Namespace, as valid now. Certificate-authority lines never match.
func (a AllowedSigners) Lookup(pub ssh.PublicKey) []string {
	return a.LookupAt(pub, Namespace, time.Now())
}

// LookupAt is Lookup for any namespace and time.
func (a AllowedSigners) LookupAt(pub ssh.PublicKey, namespace string, at time.Time) []string {
	var out []string
	for _, s := range a {
		if s.matches(pub, namespace, at) {
			out = append(out, s.Principals...)
		}
	}
	return out
}

// Allows reports whether some line allows principal to sign with pub in
// the vouch Namespace now, matching patterns as ssh-keygen -Y verify -I
// does: a principal matched by a negated pattern (!pattern) on a line is
// not allowed by that line.
func (a AllowedSigners) Allows(principal string, pub ssh.PublicKey) bool {
	now := time.Now()
	for _, s := range a {
		if s.matches(pub, Namespace, now) && matchList(principal, s.Principals) {
			return true
		}
	}
	return false
}

// matches reports whether the line applies to pub, namespace and time.
func (s *AllowedSigner) matches(pub ssh.PublicKey, namespace string, at time.Time) bool {
	switch {
	case s.CertAuthority || !bytes.Equal(s.Key.Marshal(), pub.Marshal()):
		return false
	case s.Namespaces != nil && !matchList(namespace, s.Namespaces):
		return false
	case !s.ValidAfter.IsZero() && at.Before(s.ValidAfter):
		return false
	case !s.ValidBefore.IsZero() && !at.Before(s.ValidBefore):
		return false
	}
	return true
}

// matchList matches s against a pattern list as OpenSSH does: true when a
// pattern matches and no negated pattern does.
func matchList(s string, patterns []string) bool {
	found := false
	for _, p := range patterns {
		if neg, ok := strings.CutPrefix(p, "!"); ok {
			if matchPattern(s, neg) {
				return false
			}
		} else if matchPattern(s, p) {
			found = true
		}
	}
	return found
}

// matchPattern matches s against a pattern with * (any run) and ? (any one
// byte) wildcards.
func matchPattern(s, p string) bool {
	for len(p) > 0 {
		switch p[0] {
		case '*':
			for i := len(s); i >= 0; i-- {
				if matchPattern(s[i:], p[1:]) {
					return true
				}
			}
			return false
		case '?':
			if len(s) == 0 {
				return false
			}
		default:
			if len(s) == 0 || s[0] != p[0] {
				return false
			}
		}
		s, p = s[1:], p[1:]
	}
	return len(s) == 0
}
