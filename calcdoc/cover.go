package calcdoc

import (
	"path/filepath"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// Roles are the signing roles, in the order a package is signed.
var Roles = []string{"preparer", "checker", "approver"}

// maxHistory is the number of revisions the cover lists.
const maxHistory = 10

// Person returns the person the front matter names for a role.
func (d *Doc) Person(role string) Person {
	switch role {
	case "preparer":
		return d.Front.People.Preparer
	case "checker":
		return d.Front.People.Checker
	case "approver":
		return d.Front.People.Approver
	}
	return Person{}
}

// setStamp fills the cover and appendix parts of the view from the stamp.
func (v *view) setStamp(d *Doc, rec *Stamp) error {
	m := rec.Manifest
	canon, digest, err := m.Encode()
	if err != nil {
		return err
	}
	states := rec.Signatures
	v.Status = rec.Status
	if v.Status == "" {
		v.Status = "DRAFT"
	}
	v.Preliminary = strings.HasPrefix(v.Status, "PRELIMINARY") // open assumptions (audit.Preliminary)
	v.Roles = d.roleRows(states)
	v.Signatures = signatureRows(states)
	v.Exceptions, v.KeysNote = signerNotes(m, states)
	v.History, v.HistoryMore = historyRows(rec.History)
	v.HistoryNote = historyNote(rec)
	v.Revisions, v.RevisionNote = d.revisionRows(rec), revisionNoteText(rec)
	v.Draft = m.Draft
	if m.Draft {
		v.Status = "DRAFT"
	}
	v.Manifest, v.ManifestDigest, v.ManifestJSON = m, digest, string(canon)
	v.SourcePath, v.SourceHash, v.ResultsDigest = m.Source, m.SourceHash, m.ResultsDigest
	v.Versioned, v.Committed, v.CommitDate = rec.Versioned, rec.Committed, day(rec.Date)
	v.VerifyCommand = "vouch verify " + PackageName(m.Source) + " --signers allowed_signers"
	if m.SignersFile != "" { // verify reads the committed file itself
		v.VerifyCommand = "vouch verify " + PackageName(m.Source)
	}
	if m.Draft {
		v.VerifyCommand = strings.Replace(v.VerifyCommand, PackageName(m.Source), strings.TrimSuffix(PackageName(m.Source), ".html")+".draft.html", 1)
	}
	return nil
}

// roleRows are the cover's signature block: one row per role, with the
// person the front matter names and the role's first signature, if any.
func (d *Doc) roleRows(states []SignatureState) []roleView {
	var rows []roleView
	for _, role := range Roles {
		p := d.Person(role)
		row := roleView{Role: title(role), Name: p.Name, Email: p.Email, State: "not signed"}
		for _, st := range states {
			if st.Sig.Role == role && st.Sig.Withdrawn == "" {
				row.Date, row.Fingerprint = day(st.Sig.Date), st.Sig.Fingerprint
				row.Valid, row.State, row.Checked = st.Valid, stateText(st), st.Checked
				row.Signed, row.Attestation = st.Sig.Signed, st.Sig.Attestation
				row.Method = st.Sig.MethodSummary()
				break
			}
		}
		rows = append(rows, row)
	}
	return rows
}

// signatureRows lists every signature for the appendix.
func signatureRows(states []SignatureState) []sigView {
	var rows []sigView
	for _, st := range states {
		s := st.Sig
		rows = append(rows, sigView{Role: s.Role, Name: s.Name, Principal: s.Principal,
			Fingerprint: s.Fingerprint, Date: day(s.Date), Valid: st.Valid, State: stateText(st),
			Checked: st.Checked, Signed: s.Signed, Withdrawn: s.Withdrawn})
	}
	return rows
}

// KeysNotChecked is the state of a signature that verifies and is made as
// the person named, when no allowed-signers file said whose key it is.
const KeysNotChecked = "intact; key not checked against a signers file"

func stateText(st SignatureState) string {
	switch {
	case st.Valid && st.Checked:
		return "valid"
	case st.Valid:
		return KeysNotChecked
	}
	return "not valid: " + st.Reason
}

// signerNotes are the cover's exceptions to independent roles and its note
// on which allowed-signers file checked the keys.
func signerNotes(m *provenance.Manifest, states []SignatureState) ([]string, string) {
	var ex []string
	for _, st := range states {
		if st.Valid && st.Exception != "" {
			ex = append(ex, st.Exception)
		}
	}
	switch {
	case len(states) == 0:
		return ex, ""
	case m.SignersFile == "":
		return ex, "The repository has no allowed-signers file at the commit, so no key was checked against a person: a signature that verifies is shown as intact, never as valid."
	}
	return ex, "Keys are checked against " + m.SignersFile + " as committed at the commit (blob " + shortHash(m.SignersHash) + "), each at its signing time."
}

// historyRows lists the newest revisions and counts the rest.
func historyRows(revs []provenance.Revision) ([]revView, int) {
	var rows []revView
	for i, r := range revs {
		if i == maxHistory {
			return rows, len(revs) - maxHistory
		}
		rows = append(rows, revView{Date: day(r.Date), Commit: shortHash(r.Commit), Author: r.Author, Subject: r.Subject})
	}
	return rows, 0
}

// historyNote says under the revision table how the package relates to
// version control.
func historyNote(rec *Stamp) string {
	m := rec.Manifest
	switch {
	case !rec.Versioned:
		return "The calc is not under version control: it has no recorded revisions and cannot be signed."
	case !rec.Committed:
		return "Rendered from uncommitted changes to the calc file on top of commit " + shortHash(m.Commit) +
			": this package cannot be signed. Commit the calc and render it again."
	case !m.Clean:
		return "Rendered from commit " + shortHash(m.Commit) + " while the work tree had uncommitted changes: " +
			"this package cannot be signed. Commit the changes and render it again."
	}
	return "Rendered from commit " + shortHash(m.Commit) + " of " + day(rec.Date) + ", with a clean work tree."
}

// day is the date part of an RFC 3339 time.
func day(t string) string {
	if len(t) >= 10 {
		return t[:10]
	}
	return t
}

// shortHash abbreviates a commit hash to 12 hex digits.
func shortHash(h string) string {
	if len(h) > 12 {
		return h[:12]
	}
	return h
}

// title capitalises a role name.
func title(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// PackageName is the file name of the package of a calc file, NAME.html
// for NAME.calc.md (or NAME.md), whatever folder the path names. It is
// the one naming rule: render, register, sign and the cover use it.
func PackageName(source string) string {
	base := filepath.Base(filepath.FromSlash(source))
	return strings.TrimSuffix(strings.TrimSuffix(base, ".md"), ".calc") + ".html"
}
