package audit

import (
	"fmt"
	"slices"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// stamps are the cover stamps reached by valid signatures of the first
// one, two or three Roles; with none the stamp is DRAFT.
var stamps = []string{"PREPARED", "CHECKED", "APPROVED"}

// check gives the stamp its verdicts: each signature's state, judged
// also by the commit's trust (trust.go), and the status the valid ones
// reach.
func check(d *calcdoc.Doc, st *calcdoc.Stamp, tr *trust) {
	st.Signatures = checkSignatures(d, st)
	tr.judge(st)
	st.Status = preliminary(d, status(st.Signatures))
	st.Status = keysNote(st.Status, st.Signatures)
}

// checkSignatures checks each signature of the stamp, in manifest order.
// A signature holds when it verifies over the manifest for its role, is the
// only one for that role, is made as the person the front matter names for
// the role, and carries the commit's date. Whether the key is that
// person's is for an allowed-signers file to say (see Verify): a package
// cannot carry that answer itself.
func checkSignatures(d *calcdoc.Doc, st *calcdoc.Stamp) []calcdoc.SignatureState {
	seen := map[string]bool{}
	var out []calcdoc.SignatureState
	for _, s := range st.Manifest.Signatures {
		if s.Withdrawn != "" {
			out = append(out, calcdoc.SignatureState{Sig: s, Reason: "withdrawn " + s.Withdrawn})
			continue
		}
		reason := signatureProblem(d, st, s, seen[s.Role])
		seen[s.Role] = true
		out = append(out, calcdoc.SignatureState{Sig: s, Valid: reason == "", Reason: reason})
	}
	return out
}

// signatureProblem says why a signature does not hold, or "" when it does.
func signatureProblem(d *calcdoc.Doc, st *calcdoc.Stamp, s provenance.Signature, again bool) string {
	p := d.Person(s.Role)
	switch {
	case !slices.Contains(calcdoc.Roles, s.Role):
		return fmt.Sprintf("unknown role %q; the roles are %s", s.Role, strings.Join(calcdoc.Roles, ", "))
	case again:
		return "a second " + s.Role + " signature"
	case !st.Versioned:
		return "the calc is not under version control"
	case p.Email == "":
		return "the front matter names no " + s.Role
	case s.Principal != p.Email || s.Name != p.Name:
		return fmt.Sprintf("signed as %s <%s>, but the front matter names %s <%s> as %s", s.Name, s.Principal, p.Name, p.Email, s.Role)
	case s.Date != st.Date:
		return fmt.Sprintf("dated %s, but the commit is dated %s", s.Date, st.Date)
	case methodProblem(s) != "":
		return methodProblem(s)
	}
	if _, err := st.Manifest.VerifySignature(s); err != nil {
		return err.Error()
	}
	return ""
}

// status is the cover stamp that valid signatures reach: each role counts
// only when every role before it is validly signed too.
func status(states []calcdoc.SignatureState) string {
	valid := map[string]bool{}
	for _, st := range states {
		if st.Valid {
			valid[st.Sig.Role] = true
		}
	}
	out := "DRAFT"
	for i, r := range calcdoc.Roles {
		if !valid[r] {
			break
		}
		out = stamps[i]
	}
	return out
}
