package provenance

import (
	"bytes"
	"encoding/base64"
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
//
// ParseAllowedSigners reads a line as ssh-keygen -Y verify (OpenSSH 9)
// does, and refuses the lines ssh-keygen refuses; allowed_parity_test.go
// holds the two side by side.
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

// AllowedSignersError is one bad line of an allowed-signers file (or of a
// revoked-keys list). It wraps ErrAllowedSigners.
type AllowedSignersError struct {
	Line int
	Msg  string
}

// Error formats the error as "line N: message".
func (e *AllowedSignersError) Error() string { return fmt.Sprintf("line %d: %s", e.Line, e.Msg) }

// Unwrap returns ErrAllowedSigners.
func (e *AllowedSignersError) Unwrap() error { return ErrAllowedSigners }

// ParseAllowedSigners reads an allowed-signers file. Blank lines and lines
// whose first non-blank character is # are skipped; lines may end in LF or
// CRLF. Every bad line is reported, joined into one error of
// *AllowedSignersError values; the good lines are returned as well.
//
// A line is read as OpenSSH reads it. The principals are the first field:
// a comma-separated list of patterns, double-quoted when it holds blanks.
// The options, if any, come next, separated by commas with no blanks
// between them: cert-authority, namespaces="LIST", valid-after="TIME" and
// valid-before="TIME", names in any case, values always in double quotes
// (\" inside stands for a quote). Each option may be given once, and
// valid-before must be later than valid-after. TIME is YYYYMMDD,
// YYYYMMDDHHMM or YYYYMMDDHHMMSS, in UTC when followed by Z or UTC and in
// local time otherwise, from 1970 on. The key is an OpenSSH key type name
// (ssh-ed25519, ecdsa-sha2-nistp256, ssh-rsa, ...) and the key's base64,
// whose own type must be the one named; the rest of the line is a comment.
//
// An unknown or repeated option, a value without quotes, a time that is not
// a date, a missing or malformed key: each is an error at its line, where
// ssh-keygen -Y verify refuses the line ("bad options", "invalid key").
// Certificate-authority lines are kept but never match: vouch verifies
// plain keys only, so list each signer's own key.
func ParseAllowedSigners(data []byte) (AllowedSigners, error) {
	var out AllowedSigners
	var errs []error
	for i, line := range bytes.Split(data, []byte("\n")) {
		text := strings.TrimRight(string(line), "\r")
		if blankOrComment(text) {
			continue
		}
		if strings.IndexByte(text, 0) >= 0 {
			// OpenSSH reads a line only up to a NUL byte; refuse it rather
			// than guess which part was meant.
			errs = append(errs, &AllowedSignersError{Line: i + 1, Msg: "the line holds a NUL byte: an allowed-signers file is text"})
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

// blankOrComment reports a line that holds only spaces and tabs, or a
// comment, as OpenSSH skips them (other control characters are not blank).
func blankOrComment(text string) bool {
	t := strings.TrimLeft(text, " \t")
	return t == "" || t[0] == '#'
}

// lineSpace is the set of characters OpenSSH's field splitter stops at.
const lineSpace = " \t\r\n"

// parseAllowedLine parses one line that is neither blank nor a comment.
func parseAllowedLine(text string) (AllowedSigner, error) {
	var s AllowedSigner
	principals, rest, err := cutPrincipals(strings.TrimLeft(text, " \t"))
	if err != nil {
		return s, err
	}
	s.Principals = strings.Split(principals, ",")
	key, comment, keyErr := readKey(rest)
	if keyErr == nil {
		s.Key, s.Comment = key, comment
		return s, nil
	}
	if first := strings.Fields(rest + " x"); keyLineTypes[first[0]] != "" {
		return s, keyErr // a key type, then a bad key: no options were meant
	}
	opts, rest, err := cutOptions(rest)
	if err != nil {
		return s, err
	}
	key, comment, err = readKey(rest)
	if err != nil {
		return s, err
	}
	s.Key, s.Comment = key, comment
	if err := s.parseOptions(opts); err != nil {
		return s, err
	}
	return s, nil
}

// cutPrincipals splits off the first field as OpenSSH's strdelimw does: it
// ends at the first blank, or, when a double quote comes first, the quote
// is dropped and the field runs to the next quote. Blanks after the field
// are skipped.
func cutPrincipals(text string) (field, rest string, err error) {
	i := strings.IndexAny(text, lineSpace+`"`)
	if i < 0 {
		return "", "", fmt.Errorf("principals %q are not followed by a key", text)
	}
	if text[i] != '"' {
		return text[:i], strings.TrimLeft(text[i+1:], lineSpace), nil
	}
	j := strings.IndexByte(text[i+1:], '"')
	if j < 0 {
		return "", "", fmt.Errorf("unterminated quote in the principals: close it with \"")
	}
	return text[:i] + text[i+1:i+1+j], strings.TrimLeft(text[i+2+j:], lineSpace), nil
}

// cutOptions splits off the options field, which ends at the first blank
// outside double quotes (\" inside quotes is a quote), and skips the
// blanks after it.
func cutOptions(text string) (opts, rest string, err error) {
	quoted := false
	i := 0
	for ; i < len(text) && (quoted || (text[i] != ' ' && text[i] != '\t')); i++ {
		if text[i] == '\\' && i+1 < len(text) && text[i+1] == '"' {
			i++
		} else if text[i] == '"' {
			quoted = !quoted
		}
	}
	if quoted {
		return "", "", fmt.Errorf("unterminated quote in the options: close the value with \"")
	}
	if i == len(text) {
		if text == "" {
			return "", "", fmt.Errorf("no key after the principals: add KEYTYPE BASE64, as in a .pub file")
		}
		return "", "", fmt.Errorf("no key after %q: add KEYTYPE BASE64, as in a .pub file", text)
	}
	return text[:i], strings.TrimLeft(text[i+1:], " \t"), nil
}

// keyLineTypes maps each key type name OpenSSH reads in a key line to the type
// of the key the base64 must hold. rsa-sha2-256 and rsa-sha2-512 name
// signature algorithms of RSA keys, and OpenSSH reads them as ssh-rsa.
var keyLineTypes = map[string]string{
	ssh.KeyAlgoED25519:    ssh.KeyAlgoED25519,
	ssh.KeyAlgoSKED25519:  ssh.KeyAlgoSKED25519,
	ssh.KeyAlgoECDSA256:   ssh.KeyAlgoECDSA256,
	ssh.KeyAlgoECDSA384:   ssh.KeyAlgoECDSA384,
	ssh.KeyAlgoECDSA521:   ssh.KeyAlgoECDSA521,
	ssh.KeyAlgoSKECDSA256: ssh.KeyAlgoSKECDSA256,
	ssh.KeyAlgoRSA:        ssh.KeyAlgoRSA,
	ssh.KeyAlgoRSASHA256:  ssh.KeyAlgoRSA,
	ssh.KeyAlgoRSASHA512:  ssh.KeyAlgoRSA,
	//lint:ignore SA1019 OpenSSH 9 still reads DSA key lines
	ssh.KeyAlgoDSA: ssh.KeyAlgoDSA,

	ssh.CertAlgoED25519v01:    ssh.CertAlgoED25519v01,
	ssh.CertAlgoSKED25519v01:  ssh.CertAlgoSKED25519v01,
	ssh.CertAlgoECDSA256v01:   ssh.CertAlgoECDSA256v01,
	ssh.CertAlgoECDSA384v01:   ssh.CertAlgoECDSA384v01,
	ssh.CertAlgoECDSA521v01:   ssh.CertAlgoECDSA521v01,
	ssh.CertAlgoSKECDSA256v01: ssh.CertAlgoSKECDSA256v01,
	ssh.CertAlgoRSAv01:        ssh.CertAlgoRSAv01,
	ssh.CertAlgoRSASHA256v01:  ssh.CertAlgoRSAv01,
	ssh.CertAlgoRSASHA512v01:  ssh.CertAlgoRSAv01,
	//lint:ignore SA1019 OpenSSH 9 still reads DSA certificates
	ssh.CertAlgoDSAv01: ssh.CertAlgoDSAv01,
}

// readKey reads "KEYTYPE BASE64 [COMMENT]" as OpenSSH's sshkey_read does:
// the type name is followed by a blank, the base64 runs to the next blank
// (line ends inside it are ignored), and the key it holds must be of the
// named type.
func readKey(text string) (ssh.PublicKey, string, error) {
	space := strings.IndexAny(text, " \t")
	if space < 0 {
		if text == "" {
			return nil, "", fmt.Errorf("no key after the principals: add KEYTYPE BASE64, as in a .pub file")
		}
		return nil, "", fmt.Errorf("%q is not followed by a key's base64: the key is KEYTYPE BASE64, as in a .pub file", clip(text))
	}
	name := text[:space]
	want, ok := keyLineTypes[name]
	if !ok {
		return nil, "", fmt.Errorf("%q is not an OpenSSH key type (such as ssh-ed25519, ecdsa-sha2-nistp256 or ssh-rsa)", clip(name))
	}
	rest := strings.TrimLeft(text[space:], " \t")
	end := strings.IndexAny(rest, " \t")
	if end < 0 {
		end = len(rest)
	}
	b64 := strings.TrimRight(rest[:end], "\r\n")
	if b64 == "" {
		return nil, "", fmt.Errorf("no base64 after the key type %s", name)
	}
	blob, err := base64.StdEncoding.DecodeString(b64)
	if err != nil {
		return nil, "", fmt.Errorf("the %s key is not valid base64", name)
	}
	key, err := ssh.ParsePublicKey(blob)
	if err != nil {
		return nil, "", fmt.Errorf("the %s key cannot be read: %v", name, err)
	}
	if key.Type() != want {
		return nil, "", fmt.Errorf("the line names a %s key but the base64 holds a %s key", name, key.Type())
	}
	return key, strings.TrimSpace(rest[end:]), nil
}

// clip cuts a quoted excerpt to a readable length.
func clip(s string) string {
	if len(s) > 40 {
		return s[:40] + "..."
	}
	return s
}

// optionList is the list of options, for messages.
const optionList = `cert-authority, namespaces="...", valid-after="..." and valid-before="..."`

// parseOptions reads the options field as OpenSSH's sshsigopt_parse does.
func (s *AllowedSigner) parseOptions(opts string) error {
	seen := map[string]bool{}
	for opts != "" {
		name, start := "", opts
		switch {
		case hasPrefixFold(opts, "cert-authority"):
			s.CertAuthority = true
			opts = opts[len("cert-authority"):]
		case optionIs(opts, "namespaces"), optionIs(opts, "valid-after"), optionIs(opts, "valid-before"):
			name = strings.ToLower(opts[:strings.IndexByte(opts, '=')])
			value, rest, err := dequote(opts[len(name)+1:], name)
			if err != nil {
				return err
			}
			if seen[name] {
				return fmt.Errorf("option %s is given twice: give each option once", name)
			}
			seen[name] = true
			opts = rest
			if err := s.setOption(name, value); err != nil {
				return err
			}
		}
		if opts == "" {
			break
		}
		if opts[0] != ',' {
			if name != "" {
				return fmt.Errorf("unexpected %q after the value of %s: separate options with a comma", clip(opts), name)
			}
			word, _, _ := strings.Cut(start, ",")
			return fmt.Errorf("unknown option %q: the options are %s", clip(word), optionList)
		}
		opts = opts[1:]
		if opts == "" {
			return fmt.Errorf("the options end in a comma: remove it or add an option")
		}
	}
	if !s.ValidAfter.IsZero() && !s.ValidBefore.IsZero() && !s.ValidBefore.After(s.ValidAfter) {
		return fmt.Errorf("valid-before %s is not later than valid-after %s",
			s.ValidBefore.UTC().Format(time.RFC3339), s.ValidAfter.UTC().Format(time.RFC3339))
	}
	return nil
}

// setOption stores a dequoted option value.
func (s *AllowedSigner) setOption(name, value string) error {
	switch name {
	case "namespaces":
		s.Namespaces = strings.Split(value, ",")
		return nil
	case "valid-after":
		return parseValidity(name, value, &s.ValidAfter)
	default:
		return parseValidity(name, value, &s.ValidBefore)
	}
}

// hasPrefixFold reports whether s begins with prefix, ignoring ASCII case.
func hasPrefixFold(s, prefix string) bool {
	return len(s) >= len(prefix) && strings.EqualFold(s[:len(prefix)], prefix)
}

// optionIs reports whether opts begins with name= in any case.
func optionIs(opts, name string) bool {
	return hasPrefixFold(opts, name) && len(opts) > len(name) && opts[len(name)] == '='
}

// dequote reads a double-quoted value, in which \" stands for a quote.
func dequote(s, name string) (value, rest string, err error) {
	if s == "" || s[0] != '"' {
		return "", "", fmt.Errorf(`the value of %s must be in double quotes, as %s="..."`, name, name)
	}
	var b strings.Builder
	i := 1
	for ; i < len(s) && s[i] != '"'; i++ {
		if s[i] == '\\' && i+1 < len(s) && s[i+1] == '"' {
			i++
		}
		b.WriteByte(s[i])
	}
	if i == len(s) {
		return "", "", fmt.Errorf("the value of %s has no closing quote", name)
	}
	return b.String(), s[i+1:], nil
}

// parseValidity reads a valid-after or valid-before time as OpenSSH's
// parse_absolute_time does: YYYYMMDD[HHMM[SS]], then Z or UTC (any case)
// for UTC, else local time. Each number is read as C's strptime reads it
// (leading blanks skipped, range checked: month 1-12, day 1-31, hour 0-23,
// minute 0-59, second 0-61), and the date is then normalised as mktime
// does, so 20240231 is 2 March 2024. Times before 1970, and 1970-01-01
// 00:00:00 itself, are refused, as OpenSSH refuses them.
func parseValidity(name, v string, t *time.Time) error {
	bad := fmt.Errorf("%s time %q is not YYYYMMDD[HHMM[SS]], followed by Z for UTC (as %s=\"20300101Z\")", name, clip(v), name)
	loc := time.Local
	l := len(v)
	switch {
	case l > 1 && (v[l-1] == 'Z' || v[l-1] == 'z'):
		loc, l = time.UTC, l-1
	case l > 3 && strings.EqualFold(v[l-3:], "UTC"):
		loc, l = time.UTC, l-3
	}
	var buf string
	switch l {
	case 8:
		buf = v[0:4] + "-" + v[4:6] + "-" + v[6:8]
	case 12:
		buf = v[0:4] + "-" + v[4:6] + "-" + v[6:8] + "T" + v[8:10] + ":" + v[10:12]
	case 14:
		buf = v[0:4] + "-" + v[4:6] + "-" + v[6:8] + "T" + v[8:10] + ":" + v[10:12] + ":" + v[12:14]
	default:
		return bad
	}
	fields := []struct {
		lo, hi, width int
		sep           byte
	}{{0, 9999, 4, '-'}, {1, 12, 2, '-'}, {1, 31, 2, 'T'}, {0, 23, 2, ':'}, {0, 59, 2, ':'}, {0, 61, 2, 0}}
	var n [6]int
	for i, f := range fields {
		val, rest, ok := strptimeNumber(buf, f.lo, f.hi, f.width)
		if !ok {
			return bad
		}
		n[i], buf = val, rest
		if buf == "" {
			break
		}
		if buf[0] != f.sep {
			return bad
		}
		buf = buf[1:]
	}
	if buf != "" {
		return bad
	}
	parsed := time.Date(n[0], time.Month(n[1]), n[2], n[3], n[4], n[5], 0, loc)
	if parsed.Unix() <= 0 {
		return fmt.Errorf("%s time %q is not after 1970-01-01: OpenSSH refuses it", name, clip(v))
	}
	*t = parsed
	return nil
}

// strptimeNumber reads a number as glibc's strptime does: blanks skipped,
// at least one digit, at most width digits, and no further digit once ten
// times the value would pass hi; the value must lie in [lo, hi].
func strptimeNumber(s string, lo, hi, width int) (int, string, bool) {
	s = strings.TrimLeft(s, " \t\n\v\f\r")
	if s == "" || s[0] < '0' || s[0] > '9' {
		return 0, s, false
	}
	val := 0
	for {
		val = val*10 + int(s[0]-'0')
		s = s[1:]
		width--
		if width == 0 || val*10 > hi || s == "" || s[0] < '0' || s[0] > '9' {
			break
		}
	}
	return val, s, val >= lo && val <= hi
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
	return a.AllowsAt(principal, pub, Namespace, time.Now())
}

// AllowsAt is Allows for any namespace and time: whether the file lets
// principal sign in namespace with pub at that time, as ssh-keygen -Y
// verify -Overify-time=TIME judges it. Pass the signing time a signature
// records, so that a key retired later does not break an old signature.
func (a AllowedSigners) AllowsAt(principal string, pub ssh.PublicKey, namespace string, at time.Time) bool {
	return a.Check(principal, pub, namespace, at) == nil
}

// Check is AllowsAt with the reason: nil when some line allows principal
// to sign in namespace with pub at that time, else an error wrapping
// ErrNotAllowed that says why, naming the line that lists the key for
// the principal when there is one (expired, not yet valid, another
// namespace, a certificate authority).
func (a AllowedSigners) Check(principal string, pub ssh.PublicKey, namespace string, at time.Time) error {
	var why []string
	for _, s := range a {
		if matchList(principal, s.Principals) != 1 || s.Key == nil || !bytes.Equal(s.Key.Marshal(), pub.Marshal()) {
			continue
		}
		if reason := s.refuses(namespace, at); reason != "" {
			why = append(why, fmt.Sprintf("line %d %s", s.Line, reason))
			continue
		}
		return nil
	}
	if len(why) == 0 {
		return fmt.Errorf("%w: no line lists key %s for %s", ErrNotAllowed, Fingerprint(pub), principal)
	}
	return fmt.Errorf("%w: key %s for %s: %s", ErrNotAllowed, Fingerprint(pub), principal, strings.Join(why, "; "))
}

// matches reports whether the line applies to pub, namespace and time.
func (s *AllowedSigner) matches(pub ssh.PublicKey, namespace string, at time.Time) bool {
	return s.Key != nil && bytes.Equal(s.Key.Marshal(), pub.Marshal()) && s.refuses(namespace, at) == ""
}

// refuses says why a line that lists the key does not allow it in namespace
// at that time, or "" when it allows it. Times are compared in whole
// seconds, both bounds included, as OpenSSH compares them.
func (s *AllowedSigner) refuses(namespace string, at time.Time) string {
	sec := at.Unix()
	switch {
	case s.CertAuthority:
		return "lists it as a certificate authority, which vouch does not support: list the signer's own key"
	case s.Namespaces != nil && matchList(namespace, s.Namespaces) != 1:
		return fmt.Sprintf("does not allow namespace %q", namespace)
	case !s.ValidAfter.IsZero() && sec < s.ValidAfter.Unix():
		return fmt.Sprintf("makes it valid only from %s, after %s", utcSecond(s.ValidAfter), utcSecond(at))
	case !s.ValidBefore.IsZero() && sec > s.ValidBefore.Unix():
		return fmt.Sprintf("makes it valid only until %s, before %s", utcSecond(s.ValidBefore), utcSecond(at))
	}
	return ""
}

// utcSecond formats a time as RFC 3339 in UTC to the second.
func utcSecond(t time.Time) string { return t.UTC().Format(time.RFC3339) }

// maxSubpattern is the longest pattern of a list OpenSSH matches: a list
// with a longer one matches nothing.
const maxSubpattern = 1022

// matchList matches s against a pattern list as OpenSSH's
// match_pattern_list does: -1 when a negated pattern (!pattern) matches,
// 1 when a pattern matches and no negated one does, else 0.
func matchList(s string, patterns []string) int {
	found := 0
	for _, p := range patterns {
		neg := false
		if strings.HasPrefix(p, "!") {
			neg, p = true, p[1:]
		}
		if len(p) > maxSubpattern {
			return 0
		}
		if matchPattern(s, p) {
			if neg {
				return -1
			}
			found = 1
		}
	}
	return found
}

// matchPattern matches s against a pattern with * (any run) and ? (any one
// byte) wildcards, in time proportional to len(s)·len(p) at worst.
func matchPattern(s, p string) bool {
	si, pi := 0, 0
	star, back := -1, 0
	for si < len(s) {
		switch {
		case pi < len(p) && p[pi] == '*':
			star, back = pi, si
			pi++
		case pi < len(p) && (p[pi] == '?' || p[pi] == s[si]):
			si++
			pi++
		case star >= 0:
			back++
			si, pi = back, star+1
		default:
			return false
		}
	}
	for pi < len(p) && p[pi] == '*' {
		pi++
	}
	return pi == len(p)
}
