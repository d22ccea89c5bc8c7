package audit

import (
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"path/filepath"
	"slices"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// checkSignatures reports each role's signature: whether it verifies over
// the reproduced manifest, is made as the person the front matter names,
// and, with an allowed-signers file, with that person's key. The status is
// the stamp the signatures that hold reach.
func (v *verifier) checkSignatures() bool {
	states := slices.Clone(v.repro.record.Signatures)
	for i := range states {
		if states[i].Valid {
			v.checkKey(&states[i])
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
	v.rep.Status = status(states)
	return true
}

// checkKey checks a signature's key against the allowed-signers file.
func (v *verifier) checkKey(st *calcdoc.SignatureState) {
	if v.opt.Signers == "" {
		return
	}
	s := st.Sig
	pub, err := v.repro.record.Manifest.VerifySignature(s)
	if err != nil {
		st.Valid, st.Reason = false, err.Error()
		return
	}
	if v.allowed.Allows(s.Principal, pub) {
		return
	}
	st.Valid = false
	file := filepath.Base(v.opt.Signers)
	if who := v.allowed.Lookup(pub); len(who) > 0 {
		st.Reason = fmt.Sprintf("%s lists key %s for %s, not for %s, whom the front matter names as %s",
			file, s.Fingerprint, strings.Join(who, ", "), s.Principal, s.Role)
	} else {
		st.Reason = fmt.Sprintf("key %s is not in %s for %s (or not for namespace %s, or not at this time)",
			s.Fingerprint, file, s.Principal, provenance.Namespace)
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
		signed = true
		if !st.Valid {
			v.rep.addRole(Fails, role, st.Reason)
			continue
		}
		s := st.Sig
		text := fmt.Sprintf("%s <%s>, key %s, dated %s", s.Name, s.Principal, s.Fingerprint, day(s.Date))
		if v.opt.Signers != "" {
			text += "; key allowed by " + filepath.Base(v.opt.Signers)
		} else {
			text += "; key not checked (no allowed-signers file)"
		}
		v.rep.addRole(Holds, role, text)
	}
	if !signed {
		who := "the front matter names no " + role
		if p.Email != "" {
			who = "the front matter names " + p.Text
		}
		v.rep.addRole(Unsigned, role, "not signed; "+who)
	}
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
