package calcdoc

import (
	"fmt"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// Roles are the signing roles, in the order a package is signed.
var Roles = []string{"preparer", "checker", "approver"}

// stamps are the cover stamps reached by valid signatures of the first
// one, two or three Roles; with none the stamp is DRAFT.
var stamps = []string{"PREPARED", "CHECKED", "APPROVED"}

// maxHistory is the number of revisions the cover lists.
const maxHistory = 10

// sigState is a signature of a package and whether it holds.
type sigState struct {
	Sig    provenance.Signature
	Valid  bool
	Reason string // why it does not hold
}

// person returns the person the front matter names for a role.
func (d *Doc) person(role string) Person {
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

// checkSignatures checks each signature of the record, in manifest order.
// A signature holds when it verifies over the manifest for its role, is the
// only one for that role, is made as the person the front matter names for
// the role, and carries the commit's date. Whether the key is that
// person's is for an allowed-signers file to say (see Verify): a package
// cannot carry that answer itself.
func (d *Doc) checkSignatures(rec *Record) []sigState {
	seen := map[string]bool{}
	var out []sigState
	for _, s := range rec.Manifest.Signatures {
		reason := d.signatureProblem(rec, s, seen[s.Role])
		seen[s.Role] = true
		out = append(out, sigState{Sig: s, Valid: reason == "", Reason: reason})
	}
	return out
}

// signatureProblem says why a signature does not hold, or "" when it does.
func (d *Doc) signatureProblem(rec *Record, s provenance.Signature, again bool) string {
	p := d.person(s.Role)
	switch {
	case !contains(Roles, s.Role):
		return fmt.Sprintf("unknown role %q; the roles are %s", s.Role, strings.Join(Roles, ", "))
	case again:
		return "a second " + s.Role + " signature"
	case !rec.Versioned:
		return "the calc is not under version control"
	case p.Email == "":
		return "the front matter names no " + s.Role
	case s.Principal != p.Email || s.Name != p.Name:
		return fmt.Sprintf("signed as %s <%s>, but the front matter names %s <%s> as %s", s.Name, s.Principal, p.Name, p.Email, s.Role)
	case s.Date != rec.Date:
		return fmt.Sprintf("dated %s, but the commit is dated %s", s.Date, rec.Date)
	}
	if _, err := rec.Manifest.VerifySignature(s); err != nil {
		return err.Error()
	}
	return ""
}

// stamp is the cover stamp that valid signatures reach: each role counts
// only when every role before it is validly signed too.
func stamp(states []sigState) string {
	valid := map[string]bool{}
	for _, st := range states {
		if st.Valid {
			valid[st.Sig.Role] = true
		}
	}
	status := "DRAFT"
	for i, r := range Roles {
		if !valid[r] {
			break
		}
		status = stamps[i]
	}
	return status
}

// setRecord fills the cover and appendix parts of the view from the record.
func (v *view) setRecord(d *Doc, rec *Record) error {
	m := rec.Manifest
	canon, err := m.Canonical()
	if err != nil {
		return err
	}
	digest, err := m.Digest()
	if err != nil {
		return err
	}
	states := d.checkSignatures(rec)
	v.Status = stamp(states)
	v.Roles = d.roleRows(states)
	v.Signatures = signatureRows(states)
	v.History, v.HistoryMore = historyRows(rec.History)
	v.HistoryNote = historyNote(rec)
	v.Manifest, v.ManifestDigest, v.ManifestJSON = m, digest, string(canon)
	v.SourcePath, v.SourceHash, v.ResultsDigest = m.Source, m.SourceHash, m.ResultsDigest
	v.Versioned, v.Committed, v.CommitDate = rec.Versioned, rec.Committed, day(rec.Date)
	v.VerifyCommand = "vouch verify " + PackageName(m.Source) + " --signers allowed_signers"
	return nil
}

// roleRows are the cover's signature block: one row per role, with the
// person the front matter names and the role's first signature, if any.
func (d *Doc) roleRows(states []sigState) []roleView {
	var rows []roleView
	for _, role := range Roles {
		p := d.person(role)
		row := roleView{Role: title(role), Name: p.Name, Email: p.Email, State: "not signed"}
		for _, st := range states {
			if st.Sig.Role == role {
				row.Date, row.Fingerprint = day(st.Sig.Date), st.Sig.Fingerprint
				row.Valid, row.State = st.Valid, stateText(st)
				break
			}
		}
		rows = append(rows, row)
	}
	return rows
}

// signatureRows lists every signature for the appendix.
func signatureRows(states []sigState) []sigView {
	var rows []sigView
	for _, st := range states {
		s := st.Sig
		rows = append(rows, sigView{Role: s.Role, Name: s.Name, Principal: s.Principal,
			Fingerprint: s.Fingerprint, Date: day(s.Date), Valid: st.Valid, State: stateText(st)})
	}
	return rows
}

func stateText(st sigState) string {
	if st.Valid {
		return "valid"
	}
	return "not valid: " + st.Reason
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
func historyNote(rec *Record) string {
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

// PackageName is the file name of the package of a calc file: NAME.html
// for NAME.calc.md.
func PackageName(source string) string {
	base := source[strings.LastIndex(source, "/")+1:]
	return strings.TrimSuffix(strings.TrimSuffix(base, ".md"), ".calc") + ".html"
}
