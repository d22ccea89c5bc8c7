package audit

import (
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// checkSignatures reports each role's signature: whether it verifies over
// the reproduced manifest, is made as the person the front matter names,
// and with a key an allowed-signers file allows for that person at the
// signing time (the file given, or else the one committed at the package's
// commit). The status is the stamp the signatures that hold reach.
func (v *verifier) checkSignatures() bool {
	states := slices.Clone(v.repro.record.Signatures)
	if tr := v.repro.trust; v.opt.Signers == "" && tr.file != "" {
		v.rep.Signers = tr.file + " as committed at the package's commit"
	}
	revoked := v.revokedAtHead()
	for i := range states {
		if states[i].Valid {
			v.checkKey(&states[i], revoked)
		}
	}
	for _, role := range calcdoc.Roles {
		v.reportRole(role, states)
	}
	for _, st := range states {
		if !slices.Contains(calcdoc.Roles, st.Sig.Role) {
			v.rep.addRole(Fails, st.Sig.Role, st.Reason)
		}
	}
	v.rep.Status = keysNote(status(states), states)
	v.noteUnchecked(states)
	return true
}

// noteUnchecked says how to check the keys of signatures that hold but
// whose keys no signers file checked.
func (v *verifier) noteUnchecked(states []calcdoc.SignatureState) {
	n := 0
	for _, st := range states {
		if st.Valid && !st.Checked {
			n++
		}
	}
	what := fmt.Sprintf("%d signatures are intact, but no allowed-signers file said whose keys they are", n)
	if n == 1 {
		what = "1 signature is intact, but no allowed-signers file said whose key it is"
	}
	if n > 0 {
		v.rep.add(Note, "keys", "%s: commit one at %s, or give --signers FILE", what, v.repro.trust.cfg.Signers)
	}
}

// revokedAtHead reads the revoked-keys file as HEAD holds it, so that a key
// revoked after the package was signed fails too; nil when there is none.
func (v *verifier) revokedAtHead() provenance.RevokedKeys {
	head, err := v.repo.Head()
	if err != nil {
		return nil
	}
	keys, err := readRevoked(v.repo, head, v.repro.trust.revFile)
	if err != nil {
		v.rep.add(Fails, "signers", "%v", err)
	}
	return keys
}

// checkKey checks a signature's signing time against the present, its key
// against the revoked keys at HEAD and, when one was given, against the
// outside allowed-signers file at the signing time.
func (v *verifier) checkKey(st *calcdoc.SignatureState, revoked provenance.RevokedKeys) {
	s := st.Sig
	pub, err := v.repro.record.Manifest.VerifySignature(s)
	if err != nil {
		st.Valid, st.Reason = false, err.Error()
		return
	}
	signed, err := provenance.ParseSigningTime(s.Signed)
	if err == nil {
		err = provenance.CheckSigningTime(signed, signed, time.Now())
	}
	if err != nil {
		st.Valid, st.Reason = false, err.Error()
		return
	}
	if revoked.Revoked(pub) {
		st.Valid, st.Reason = false, fmt.Sprintf("key %s is listed as revoked at HEAD: a revoked key fails at any time", s.Fingerprint)
		return
	}
	if v.opt.Signers == "" {
		return
	}
	st.Checked = false
	if v.allowed.AllowsAt(s.Principal, pub, provenance.Namespace, signed) {
		st.Checked = true
		return
	}
	st.Valid = false
	file := filepath.Base(v.opt.Signers)
	if who := v.allowed.LookupAt(pub, provenance.Namespace, signed); len(who) > 0 {
		st.Reason = fmt.Sprintf("%s lists key %s for %s, not for %s, whom the front matter names as %s",
			file, s.Fingerprint, strings.Join(who, ", "), s.Principal, s.Role)
	} else {
		st.Reason = fmt.Sprintf("key %s is not in %s for %s at the signing time %s: %v",
			s.Fingerprint, file, s.Principal, s.Signed, v.allowed.Check(s.Principal, pub, provenance.Namespace, signed))
	}
}

// reportRole adds the findings of one role.
func (v *verifier) reportRole(role string, states []calcdoc.SignatureState) {
	p := v.repro.doc.Person(role)
	signed := false
	for _, st := range states {
		if st.Sig.Role != role {
			continue
		}
		if st.Sig.Withdrawn != "" {
			v.rep.addRole(Note, role, fmt.Sprintf("%s <%s>, signed %s, withdrawn %s", st.Sig.Name, st.Sig.Principal, st.Sig.Signed, st.Sig.Withdrawn))
			continue
		}
		signed = true
		if !st.Valid {
			v.rep.addRole(Fails, role, st.Reason)
			continue
		}
		v.rep.addRole(Holds, role, v.roleText(st))
	}
	if !signed {
		who := "the front matter names no " + role
		if p.Email != "" {
			who = "the front matter names " + p.Text
		}
		v.rep.addRole(Unsigned, role, "not signed; "+who)
	}
}

// roleText describes a signature that holds: signer, key, signing time,
// commit date, what was attested, and who checked the key.
func (v *verifier) roleText(st calcdoc.SignatureState) string {
	s := st.Sig
	text := fmt.Sprintf("%s <%s>, key %s, signed %s (commit of %s), attesting %q", s.Name, s.Principal, s.Fingerprint, s.Signed, day(s.Date), s.Attestation)
	switch {
	case !st.Checked:
		text += "; " + calcdoc.KeysNotChecked
	case v.opt.Signers != "":
		text += "; key allowed at the signing time by " + filepath.Base(v.opt.Signers)
	default:
		text += "; key allowed at the signing time by " + v.repro.trust.file + " as committed"
	}
	if st.Exception != "" {
		text += "; " + st.Exception
	}
	return text
}

// noteHead says whether HEAD has moved on from the recorded commit and
// whether the source changed since.
func (v *verifier) noteHead() bool {
	m := v.m
	head, err := v.repo.Head()
	if err != nil || head == m.Commit {
		return true
	}
	b, err := v.repo.ReadAt(head, m.Source)
	switch {
	case err != nil:
		v.rep.add(Note, "head", "HEAD %s has moved on from the recorded commit, and no longer holds %s; the package verifies against its recorded commit", shortHash(head), m.Source)
	case provenance.BlobHash(b) == m.SourceHash:
		v.rep.add(Note, "head", "HEAD %s has moved on from the recorded commit; the source is unchanged there", shortHash(head))
	default:
		v.rep.add(Note, "head", "HEAD %s has moved on from the recorded commit, and the source has changed since%s; the package verifies against its recorded commit, but is not the latest revision of the calc",
			shortHash(head), v.laterChanges())
	}
	return true
}

// laterChanges counts the commits after the recorded one that change the
// source, as " in N later commits (newest: HASH subject)".
func (v *verifier) laterChanges() string {
	revs, err := v.repo.History(v.m.Source)
	hist := v.repro.record.History
	if err != nil || len(revs) == 0 || len(hist) == 0 {
		return ""
	}
	n := 0
	for n < len(revs) && revs[n].Commit != hist[0].Commit {
		n++
	}
	if n == len(revs) {
		return ""
	}
	return fmt.Sprintf(" in %d later %s (newest: %s %q)", n, plural(n, "commit"), shortHash(revs[0].Commit), revs[0].Subject)
}
