package audit

import (
	"bytes"
	"errors"
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strings"
	"time"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// ErrNotVerified is returned by Sign when the package does not verify and
// reproduce: nothing is signed.
var ErrNotVerified = errors.New("the package does not verify")

// ErrKeyRejected marks a signing key or a signature made elsewhere that
// cannot stand: the allowed-signers file does not list the key for the
// signer, or the signature does not check out. It is a verification that
// failed (exit 3), not a misuse of the command.
var ErrKeyRejected = errors.New("the key or signature is rejected")

// rejected is an error that is ErrKeyRejected, with its own message.
type rejected struct{ err error }

func (e *rejected) Error() string        { return e.err.Error() }
func (e *rejected) Unwrap() error        { return e.err }
func (e *rejected) Is(target error) bool { return target == ErrKeyRejected }

func rejectErr(format string, args ...any) error {
	return &rejected{fmt.Errorf(format, args...)}
}

// SignOptions say who signs a package, for which role and with which key.
type SignOptions struct {
	VerifyOptions
	Role string // preparer, checker or approver
	// Key is an SSH private key file, or a public key file (KEY.pub) whose
	// private key the ssh-agent holds. With "" the ssh-agent's key is used:
	// its only key, or the one the allowed-signers file lists for the
	// signer.
	Key string
	// Signature is an armored SSHSIG made elsewhere, such as with
	// ssh-keygen -Y sign -n calc-package@vouch over the manifest's Payload
	// for the role; when set, no key is used, and Signed gives the signing
	// time the signature's payload holds.
	Signature []byte
	Signed    string // signing time of Signature, as 2026-03-14T09:26:53Z
	// Withdraw withdraws the role's standing signature instead of signing:
	// it stays in the manifest, marked with the time of withdrawal, and
	// the role may then be signed again.
	Withdraw bool
	// Now is the clock that gives the signing time; nil means time.Now.
	Now func() time.Time
	// Method is how the checker checked; recorded with the checker's
	// signature only (method.go).
	Method CheckMethod
}

// Signed is a package with one more signature, ready to be written.
type Signed struct {
	HTML         []byte               // the package, rendered again
	ManifestFile []byte               // the manifest file to write beside it
	Signature    provenance.Signature // the new signature
	Status       string               // the stamp the package now carries
}

// Sign adds one signature to a package. It first verifies and reproduces
// the package as Verify does, and refuses one that does not verify (a
// failure about the role being signed is no obstacle: that signature is
// replaced), one rendered from uncommitted changes, and one whose earlier
// roles are not validly signed. The signature is an SSHSIG over the
// manifest's Payload for the role, made as the person the front matter
// names for the role, and dated with the commit's date. Signatures of the
// other roles are kept. The package is rendered again from the source at
// the commit, so its cover shows the signature.
func Sign(pkgPath string, opt SignOptions) (*Signed, *Report, error) {
	if !slices.Contains(calcdoc.Roles, opt.Role) {
		return nil, nil, usageErr("role %q: the roles are %s", opt.Role, strings.Join(calcdoc.Roles, ", "))
	}
	v, err := newVerifier(pkgPath, opt.VerifyOptions)
	if err != nil {
		return nil, nil, err
	}
	v.run()
	if v.m != nil && v.m.Draft {
		return nil, v.rep, fmt.Errorf("%w: the package was rendered with --draft, and a draft is never signed: render it again without --draft; not signed", ErrNotVerified)
	}
	if v.rep.Different && !v.sameBytes {
		return nil, v.rep, fmt.Errorf("%w: the package was made by %s, and this engine build (%s) does not reproduce it byte for byte: sign it with that build, or render a new revision with this one; not signed", ErrNotVerified, v.madeBy(), v.thisEngine())
	}
	if blocked(v.rep, opt.Role) || v.repro == nil {
		return nil, v.rep, fmt.Errorf("%w; not signed", ErrNotVerified)
	}
	if opt.Withdraw {
		signed, err := v.withdraw(opt)
		return signed, v.rep, err
	}
	if err := v.checkOrder(opt.Role); err != nil {
		return nil, v.rep, err
	}
	if err := v.checkUnsigned(opt.Role); err != nil {
		return nil, v.rep, err
	}
	if err := v.checkReview(opt.Role); err != nil {
		return nil, v.rep, err
	}
	if err := openAssumptionsBlock(v.repro.doc, opt.Role); err != nil {
		return nil, v.rep, err
	}
	signed, err := v.sign(opt)
	return signed, v.rep, err
}

// blocked reports a failure that is not about the role being signed.
func blocked(rep *Report, role string) bool {
	for _, f := range rep.Failures() {
		if f.Role != role {
			return true
		}
	}
	return false
}

// checkOrder refuses a signature whose earlier roles are not validly
// signed: the checker signs after the preparer, the approver after both.
func (v *verifier) checkOrder(role string) error {
	states := v.repro.record.Signatures
	for _, r := range calcdoc.Roles {
		if r == role {
			return nil
		}
		if !validRole(states, r) {
			return fmt.Errorf("%w: the %s signs after the %s, and the package has no valid %s signature", ErrNotVerified, role, r, r)
		}
	}
	return nil
}

func validRole(states []calcdoc.SignatureState, role string) bool {
	for _, st := range states {
		if st.Sig.Role == role && st.Valid {
			return true
		}
	}
	return false
}

// sign makes the signature and renders the signed package. The signing
// time is now, which must not be before the commit; the signature attests
// the firm's text for the role as the commit holds it. A signature the
// signed package would not count (another role's key or person, a key the
// committed signers file does not allow) is refused.
func (v *verifier) sign(opt SignOptions) (*Signed, error) {
	d := v.repro.doc
	p := d.Person(opt.Role)
	if p.Email == "" {
		return nil, usageErr("%s names no %s under people: in the front matter; add one, commit, render and sign again", v.m.Source, opt.Role)
	}
	rec := *v.repro.record
	m := *rec.Manifest
	s := provenance.Signature{Role: opt.Role, Principal: p.Email, Name: p.Name, Date: rec.Date,
		Attestation: v.repro.trust.cfg.Attestation[opt.Role]}
	if err := v.signingTime(&s, opt); err != nil {
		return nil, err
	}
	s, err := v.withMethod(s, opt.Method)
	if err != nil {
		return nil, err
	}
	s, err = v.signWith(&m, s, opt)
	if err != nil {
		return nil, err
	}
	m.Signatures = withSignature(m.Signatures, s)
	signed, err := v.renderSigned(&rec, &m, s)
	if err != nil {
		return nil, err
	}
	for _, st := range signed.states {
		if st.Sig.Signature == s.Signature && st.Sig.Withdrawn == "" && !st.Valid {
			return nil, rejectErr("the %s signature would not hold: %s; not signed", s.Role, st.Reason)
		}
	}
	return signed.Signed, nil
}

// signedRender is a signed package with its signatures' verdicts.
type signedRender struct {
	*Signed
	states []calcdoc.SignatureState
}

// renderSigned renders the package again with manifest m and returns it
// with its manifest file; s is the signature just made or withdrawn.
func (v *verifier) renderSigned(rec *calcdoc.Stamp, m *provenance.Manifest, s provenance.Signature) (*signedRender, error) {
	rec.Manifest = m
	html, err := v.repro.render(v.opt.Engine, rec)
	if err != nil {
		return nil, err
	}
	file, err := ManifestFile(m)
	if err != nil {
		return nil, err
	}
	return &signedRender{&Signed{HTML: html, ManifestFile: file, Signature: s, Status: rec.Status}, rec.Signatures}, nil
}

// signingTime sets the signature's signing time: now, or for a signature
// made elsewhere the time it was made over. It must not be before the
// commit nor later than now.
func (v *verifier) signingTime(s *provenance.Signature, opt SignOptions) error {
	now := clock(opt)
	s.Signed = provenance.FormatSigningTime(now)
	if len(opt.Signature) > 0 {
		if opt.Signed == "" {
			return usageErr("a signature made elsewhere needs its signing time: give --signed TIME, the time its payload holds")
		}
		s.Signed = opt.Signed
	}
	t, err := provenance.ParseSigningTime(s.Signed)
	if err != nil {
		return &calcdoc.UsageError{Err: err}
	}
	commit, err := v.repo.CommitDate(v.m.Commit)
	if err != nil {
		return err
	}
	if err := provenance.CheckSigningTime(t, commit, now); err != nil {
		return &calcdoc.UsageError{Err: fmt.Errorf("%w; not signed", err)}
	}
	return nil
}

func clock(opt SignOptions) time.Time {
	if opt.Now != nil {
		return opt.Now()
	}
	return time.Now()
}

// checkUnsigned refuses to sign a role that already has a standing
// signature: the earlier one must be withdrawn first, so that the
// manifest keeps it.
func (v *verifier) checkUnsigned(role string) error {
	for _, s := range v.m.Signatures {
		if s.Role == role && s.Withdrawn == "" {
			return usageErr("the package already has a %s signature (%s <%s>, signed %s): withdraw it first with vouch sign PACKAGE --role %s --withdraw, then sign again",
				role, s.Name, s.Principal, s.Signed, role)
		}
	}
	return nil
}

// withdraw marks the role's standing signature withdrawn at the present
// time and renders the package again; the signature stays in the manifest.
func (v *verifier) withdraw(opt SignOptions) (*Signed, error) {
	rec := *v.repro.record
	m := *rec.Manifest
	m.Signatures = slices.Clone(m.Signatures)
	for i, s := range m.Signatures {
		if s.Role != opt.Role || s.Withdrawn != "" {
			continue
		}
		now := provenance.FormatSigningTime(clock(opt))
		if s.Signed != "" && now < s.Signed {
			return nil, usageErr("the %s signature was signed %s, later than now (%s): check the clock", opt.Role, s.Signed, now)
		}
		m.Signatures[i].Withdrawn = now
		signed, err := v.renderSigned(&rec, &m, m.Signatures[i])
		if err != nil {
			return nil, err
		}
		return signed.Signed, nil
	}
	return nil, usageErr("the package has no standing %s signature to withdraw", opt.Role)
}

// withSignature adds s to the signatures, ordered by role; withdrawn
// signatures are kept, before the one that follows them.
func withSignature(sigs []provenance.Signature, s provenance.Signature) []provenance.Signature {
	out := append(slices.Clone(sigs), s)
	sort.SliceStable(out, func(i, j int) bool { return roleIndex(out[i].Role) < roleIndex(out[j].Role) })
	return out
}

func roleIndex(role string) int {
	for i, r := range calcdoc.Roles {
		if r == role {
			return i
		}
	}
	return len(calcdoc.Roles)
}

// signWith signs with the key file, or with the ssh-agent when there is
// none, or takes a signature made elsewhere, after checking the key against
// the allowed-signers file if one was given.
func (v *verifier) signWith(m *provenance.Manifest, s provenance.Signature, opt SignOptions) (provenance.Signature, error) {
	if len(opt.Signature) > 0 {
		return v.attach(m, s, opt.Signature)
	}
	if key := opt.Key; key != "" {
		signer, err := provenance.LoadSigner(key)
		if err != nil {
			return s, &calcdoc.UsageError{Err: err}
		}
		if v.opt.Signers != "" && !v.allowed.Allows(s.Principal, signer.PublicKey()) {
			return s, rejectErr("%s does not list key %s (%s) for %s", v.opt.Signers, provenance.Fingerprint(signer.PublicKey()), key, s.Principal)
		}
		return m.SignAs(s, signer)
	}
	return v.agentSign(m, s)
}

// agentSign signs with the ssh-agent's key: its only key, or the one the
// allowed-signers file (the one given, else the committed one) lists for
// the signer.
func (v *verifier) agentSign(m *provenance.Manifest, s provenance.Signature) (provenance.Signature, error) {
	if os.Getenv("SSH_AUTH_SOCK") == "" {
		return s, usageErr("no signing key: give --key KEYFILE, or start an ssh-agent holding your key")
	}
	signers, err := provenance.AgentSigners()
	if err != nil {
		return s, &calcdoc.UsageError{Err: err}
	}
	allowed, file := v.pickList()
	var fps []string
	pick := -1
	for i, sg := range signers {
		fps = append(fps, provenance.Fingerprint(sg.PublicKey()))
		if pick < 0 && file != "" && allowed.Allows(s.Principal, sg.PublicKey()) {
			pick = i
		}
	}
	switch {
	case len(signers) == 0:
		return s, usageErr("the ssh-agent holds no key: run ssh-add KEYFILE, or give --key KEYFILE")
	case pick >= 0:
	case file != "":
		return s, rejectErr("the ssh-agent holds no key that %s lists for %s (it holds %s)", file, s.Principal, strings.Join(fps, ", "))
	case len(signers) == 1:
		pick = 0
	default:
		return s, usageErr("the ssh-agent holds %d keys (%s): pick one with --key KEY.pub, or give --signers FILE", len(signers), strings.Join(fps, ", "))
	}
	return m.SignAs(s, signers[pick])
}

// pickList is the allowed-signers file that picks the agent's key: the
// one given, else the one committed at the package's commit, with its
// name; "" when there is neither.
func (v *verifier) pickList() (provenance.AllowedSigners, string) {
	if v.opt.Signers != "" {
		return v.allowed, filepath.Base(v.opt.Signers)
	}
	tr := v.repro.trust
	return tr.allowed, tr.file
}

// attach checks a signature made elsewhere and fills in its key.
func (v *verifier) attach(m *provenance.Manifest, s provenance.Signature, armored []byte) (provenance.Signature, error) {
	payload, err := m.Payload(s)
	if err != nil {
		return s, &calcdoc.UsageError{Err: err}
	}
	armored = append(bytes.TrimSpace(armored), '\n')
	pub, err := provenance.VerifySig(payload, armored, provenance.Namespace)
	if err != nil {
		return s, rejectErr("the signature is not a %s signature of this manifest (%s): %w", s.Role, payload, err)
	}
	at, _ := provenance.ParseSigningTime(s.Signed) // checked by Payload
	if v.opt.Signers != "" && !v.allowed.AllowsAt(s.Principal, pub, provenance.Namespace, at) {
		return s, rejectErr("%s does not list key %s for %s at the signing time %s", v.opt.Signers, provenance.Fingerprint(pub), s.Principal, s.Signed)
	}
	s.Fingerprint, s.Signature = provenance.Fingerprint(pub), string(armored)
	return s, nil
}
