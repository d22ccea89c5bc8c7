package audit

import (
	"errors"
	"fmt"
	"path"
	"strings"
	"time"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/calcdoc/settings"
)

// RevokedKeysName is the revoked-keys file beside the committed
// allowed-signers file: one public key per line, as ssh-keygen -Y verify -r
// reads it. A key listed there fails at any time.
const RevokedKeysName = "revoked_keys"

// KeysUnchecked ends a status reached by a signature whose key no
// allowed-signers file checked.
const KeysUnchecked = " — keys unchecked"

// trust is what a commit says about who may sign: the firm's settings
// (attestation texts, exceptions to independent roles) and the committed
// allowed-signers and revoked-keys files.
type trust struct {
	cfg     *settings.Settings
	file    string // the committed allowed-signers file, "" when none
	hash    string // its blob hash
	allowed provenance.AllowedSigners
	revFile string // where the revoked-keys file is looked for
	revoked provenance.RevokedKeys
}

// loadTrust reads vouch.yaml, the allowed-signers file it names and the
// revoked-keys file beside it, as the commit holds them. A missing file
// is no error; a malformed one is, at its line.
func loadTrust(repo *provenance.Repo, commit string) (*trust, error) {
	tr := &trust{cfg: settings.Default()}
	src, err := readOptional(repo, commit, settings.FileName)
	if err != nil {
		return nil, err
	}
	if src != nil {
		if tr.cfg, err = settings.Parse(settings.FileName, src); err != nil {
			return nil, fmt.Errorf("%s at commit %s: %w", settings.FileName, shortHash(commit), err)
		}
	}
	tr.revFile = revokedPath(tr.cfg)
	if tr.revoked, err = readRevoked(repo, commit, tr.revFile); err != nil {
		return nil, err
	}
	file := tr.cfg.Signers
	data, err := readOptional(repo, commit, file)
	if err != nil || data == nil {
		return tr, err
	}
	if tr.allowed, err = provenance.ParseAllowedSigners(data); err != nil {
		return nil, fmt.Errorf("allowed signers %s at commit %s: %w", file, shortHash(commit), err)
	}
	tr.file, tr.hash = file, provenance.BlobHash(data)
	return tr, nil
}

// revokedPath is the revoked-keys file: RevokedKeysName beside the
// allowed-signers file the settings name, whether or not that exists.
func revokedPath(cfg *settings.Settings) string {
	return path.Join(path.Dir(cfg.Signers), RevokedKeysName)
}

// readOptional reads a file at a commit; nil when the commit has none.
func readOptional(repo *provenance.Repo, commit, rel string) ([]byte, error) {
	b, err := repo.ReadAt(commit, rel)
	if errors.Is(err, provenance.ErrNotAtCommit) {
		return nil, nil
	}
	if b == nil && err == nil {
		b = []byte{}
	}
	return b, err
}

// readRevoked reads a revoked-keys file at a commit; nil when absent.
func readRevoked(repo *provenance.Repo, commit, rel string) (provenance.RevokedKeys, error) {
	data, err := readOptional(repo, commit, rel)
	if err != nil || data == nil {
		return nil, err
	}
	keys, err := provenance.ParseRevokedKeys(data)
	if err != nil {
		return nil, fmt.Errorf("revoked keys %s at commit %s: %w", rel, shortHash(commit), err)
	}
	return append(provenance.RevokedKeys{}, keys...), nil
}

// record writes the committed signers file and its hash into a manifest.
func (tr *trust) record(m *provenance.Manifest) {
	m.SignersFile, m.SignersHash = tr.file, tr.hash
}

// judge adds to the verdicts on a stamp's signatures what the commit's
// trust says: each signature's time and meaning, its key against the
// committed files, and that no person or key holds two roles.
func (tr *trust) judge(st *calcdoc.Stamp) {
	for i := range st.Signatures {
		if s := &st.Signatures[i]; s.Valid {
			tr.judgeOne(st, s)
		}
	}
	tr.independent(st.Signatures)
}

// judgeOne checks one signature's signing time against the commit, its
// attestation against the firm's text, and its key.
func (tr *trust) judgeOne(st *calcdoc.Stamp, s *calcdoc.SignatureState) {
	sig := s.Sig
	fail := func(format string, args ...any) { s.Valid, s.Reason = false, fmt.Sprintf(format, args...) }
	signed, err := provenance.ParseSigningTime(sig.Signed)
	if err != nil {
		fail("%v", err)
		return
	}
	// The cover reads no clock: only the lower bound is checked here, and
	// verify checks the signing time against the present.
	if commit, err := time.Parse(time.RFC3339, st.Date); err == nil {
		if err := provenance.CheckSigningTime(signed, commit, signed); err != nil {
			fail("%v", err)
			return
		}
	}
	if want := tr.cfg.Attestation[sig.Role]; sig.Attestation != want {
		fail("the signature attests %q, but the firm's text for the %s is %q", sig.Attestation, sig.Role, want)
		return
	}
	pub, err := st.Manifest.VerifySignature(sig)
	if err != nil {
		fail("%v", err)
		return
	}
	if tr.revoked.Revoked(pub) {
		fail("key %s is listed in %s: a revoked key fails at any time", sig.Fingerprint, tr.revFile)
		return
	}
	if tr.file == "" {
		return
	}
	if err := tr.allowed.Check(sig.Principal, pub, provenance.Namespace, signed); err != nil {
		fail("%s at the commit does not allow key %s for %s at the signing time %s: %v", tr.file, sig.Fingerprint, sig.Principal, sig.Signed, err)
		return
	}
	s.Checked = true
}

// independent fails a signature whose key or person (the same principal
// or name, in any case) already signed an earlier role, unless the firm's
// settings allow that pair of roles; then the exception is recorded, with
// the firm's reason, for the cover to print.
func (tr *trust) independent(states []calcdoc.SignatureState) {
	for j := range states {
		for i := 0; i < j && states[j].Valid; i++ {
			a, b := states[i].Sig, states[j].Sig
			if !states[i].Valid || a.Role == b.Role {
				continue
			}
			how := sameSigner(a, b)
			if how == "" {
				continue
			}
			if reason, ok := tr.cfg.SameSignerReason(a.Role, b.Role); ok {
				states[j].Exception = fmt.Sprintf("%s signs as both %s and %s, as the firm's settings allow: %s", b.Name, a.Role, b.Role, reason)
				continue
			}
			states[j].Valid = false
			states[j].Reason = fmt.Sprintf("%s as the %s signature: one person may not hold two roles of a package (a firm allows a pair under roles: allow_same_signer: in %s)", how, a.Role, settings.FileName)
		}
	}
}

// sameSigner says how two signatures share a signer, or "".
func sameSigner(a, b provenance.Signature) string {
	switch {
	case a.Fingerprint == b.Fingerprint:
		return "signed with the same key " + a.Fingerprint
	case strings.EqualFold(a.Principal, b.Principal):
		return "signed by the same person <" + a.Principal + ">"
	case strings.EqualFold(strings.TrimSpace(a.Name), strings.TrimSpace(b.Name)):
		return "signed by the same person, " + a.Name + ","
	}
	return ""
}

// keysNote is the status with KeysUnchecked added when a signature that
// holds has a key no signers file checked.
func keysNote(status string, states []calcdoc.SignatureState) string {
	if status == "" || status == "DRAFT" {
		return status
	}
	for _, st := range states {
		if st.Valid && !st.Checked {
			return status + KeysUnchecked
		}
	}
	return status
}
