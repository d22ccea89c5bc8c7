package calcdoc

import (
	"fmt"
	"time"
	"unicode/utf8"

	"go.yaml.in/yaml/v3"
)

// RevisionNote is one entry of the front matter's revisions list: a
// revision letter, the date it was issued and a short description.
type RevisionNote struct {
	Letter, Date, Description string
	Line                      int // the entry's line in the front matter
}

// MaxRevisionDescription is the longest description a revision may have,
// in characters: the revision table is a summary, the commits are the
// detail.
const MaxRevisionDescription = 120

// revisionKeys are the keys of a revisions entry.
var revisionKeys = []string{"letter", "date", "description"}

// setRevisions reads the revisions list:
//
//	revisions:
//	  - {letter: A, date: 2026-11-02, description: First issue}
func (f *Front) setRevisions(v *yaml.Node) []*frontErr {
	if v.Kind != yaml.SequenceNode {
		return nodeErr(v, "revisions must be a list of entries such as - {letter: A, date: 2026-11-02, description: First issue}")
	}
	seen := map[string]bool{}
	for _, n := range v.Content {
		r, errs := revisionNote(n)
		if errs != nil {
			return errs
		}
		if seen[r.Letter] {
			return nodeErr(n, "revision %s is listed twice; list each revision once", r.Letter)
		}
		seen[r.Letter] = true
		f.Revisions = append(f.Revisions, r)
	}
	return nil
}

// revisionNote reads one entry of the revisions list.
func revisionNote(n *yaml.Node) (RevisionNote, []*frontErr) {
	r := RevisionNote{Line: n.Line}
	if n.Kind != yaml.MappingNode {
		return r, nodeErr(n, "each revision must be a mapping with letter, date and description")
	}
	dst := map[string]*string{"letter": &r.Letter, "date": &r.Date, "description": &r.Description}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		p := dst[k.Value]
		if p == nil {
			return r, nodeErr(k, "unknown key %q in a revision; the keys are letter, date and description", k.Value)
		}
		if v.Kind != yaml.ScalarNode || v.Value == "" {
			return r, nodeErr(v, "%s must be a single value", k.Value)
		}
		*p = v.Value
	}
	for _, k := range revisionKeys {
		if *dst[k] == "" {
			return r, nodeErr(n, "the revision lacks %s", k)
		}
	}
	if _, err := time.Parse("2006-01-02", r.Date); err != nil {
		return r, nodeErr(n, "revision %s: date %q must be a date such as 2026-11-02", r.Letter, r.Date)
	}
	if c := utf8.RuneCountInString(r.Description); c > MaxRevisionDescription {
		return r, nodeErr(n, "revision %s: the description is %d characters; keep it to %d (the commits in the appendix hold the detail)", r.Letter, c, MaxRevisionDescription)
	}
	return r, nil
}

// SignedRevision is an earlier revision of a calc whose package was signed,
// as the repository records it: its letter and the signers by role.
type SignedRevision struct {
	Letter string
	Commit string // the commit its package was rendered from
	// SourceHash and ResultsDigest are what that package recorded.
	SourceHash, ResultsDigest string
	Signers                   map[string]string // role → signer's name, for signatures that verify over that manifest
	Dates                     map[string]string // role → signature date, RFC 3339
}

// revisionRow is one row of the cover's revision table.
type revisionRow struct {
	Letter, Date, Description   string
	Preparer, Checker, Approver string
	Current                     bool
}

// revisionRows builds the revision table: every revision the front matter
// lists or a signed package records, newest first, with who signed it. The
// current revision's signers are this package's valid signatures.
func (d *Doc) revisionRows(rec *Stamp) []revisionRow {
	byLetter := map[string]*revisionRow{}
	var order []string
	row := func(letter string) *revisionRow {
		if r := byLetter[letter]; r != nil {
			return r
		}
		byLetter[letter] = &revisionRow{Letter: letter}
		order = append(order, letter)
		return byLetter[letter]
	}
	for _, n := range d.Front.Revisions {
		r := row(n.Letter)
		r.Date, r.Description = n.Date, n.Description
	}
	for _, s := range rec.SignedRevisions {
		r := row(s.Letter)
		r.Preparer, r.Checker, r.Approver = s.Signers["preparer"], s.Signers["checker"], s.Signers["approver"]
		if r.Date == "" {
			r.Date = day(latest(s.Dates))
		}
	}
	if cur := d.Front.Revision; cur != "" {
		r := row(cur)
		r.Current = true
		r.Preparer, r.Checker, r.Approver = "", "", ""
		for _, st := range rec.Signatures {
			if st.Valid {
				r.setSigner(st.Sig.Role, st.Sig.Name)
			}
		}
	}
	out := make([]revisionRow, 0, len(order))
	for i := len(order) - 1; i >= 0; i-- {
		out = append(out, *byLetter[order[i]])
	}
	sortRevisions(out)
	return out
}

func (r *revisionRow) setSigner(role, name string) {
	switch role {
	case "preparer":
		r.Preparer = name
	case "checker":
		r.Checker = name
	case "approver":
		r.Approver = name
	}
}

// latest is the latest of the dates.
func latest(dates map[string]string) string {
	out := ""
	for _, d := range dates {
		out = max(out, d)
	}
	return out
}

// sortRevisions orders the rows newest first: by letter, longer letters
// (AA after Z) later, so a numbered or lettered series sorts as issued.
func sortRevisions(rows []revisionRow) {
	less := func(a, b string) bool {
		if len(a) != len(b) {
			return len(a) < len(b)
		}
		return a < b
	}
	for i := 1; i < len(rows); i++ {
		for j := i; j > 0 && less(rows[j-1].Letter, rows[j].Letter); j-- {
			rows[j-1], rows[j] = rows[j], rows[j-1]
		}
	}
}

// revisionNoteText explains the revision table.
func revisionNoteText(rec *Stamp) string {
	found := "no earlier signed package is committed"
	switch n := len(rec.SignedRevisions); {
	case n == 1:
		found = "1 earlier signed package is committed"
	case n > 1:
		found = fmt.Sprintf("%d earlier signed packages are committed", n)
	}
	return "Revisions come from the front matter's revisions list and from the signed packages committed in the repository (" + found + "); a name is shown only where that revision's signature verifies over its manifest. The commits are listed in the appendix."
}
