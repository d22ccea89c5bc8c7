package calcdoc

import (
	"html"
	"strings"

	"go.yaml.in/yaml/v3"

	"github.com/vouchcalc/vouch/eval"
)

// Reference is a document the calc cites, listed under the front-matter
// key references. A source that starts with its ID links to it.
type Reference struct {
	ID       string
	Title    string
	Revision string // the revision or the edition, as written
	Date     string // optional
}

// referenceKeys are the keys of one reference.
var referenceKeys = []string{"id", "title", "revision", "edition", "date"}

// setReferences reads the references list: each item a mapping of id,
// title, revision (or edition) and an optional date.
func (f *Front) setReferences(v *yaml.Node) []*frontErr {
	if v.Kind != yaml.SequenceNode {
		return nodeErr(v, "references must be a list of documents, each with id, title and revision (or edition), such as - {id: HB-001, title: Heat balance diagram, revision: C}")
	}
	var errs []*frontErr
	seen := map[string]bool{}
	for _, n := range v.Content {
		r, e := readReference(n)
		if e != nil {
			errs = append(errs, e...)
			continue
		}
		if seen[r.ID] {
			errs = append(errs, nodeErr(n, "reference %q is listed twice; give each document one entry", r.ID)...)
			continue
		}
		seen[r.ID] = true
		f.References = append(f.References, r)
	}
	return errs
}

// readReference reads one item of the references list.
func readReference(n *yaml.Node) (Reference, []*frontErr) {
	var r Reference
	if n.Kind != yaml.MappingNode {
		return r, nodeErr(n, "a reference must have id, title and revision (or edition) keys")
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		dst := map[string]*string{"id": &r.ID, "title": &r.Title, "revision": &r.Revision, "edition": &r.Revision, "date": &r.Date}[k.Value]
		if dst == nil {
			return r, nodeErr(k, "unknown key %q in a reference; the keys are %s", k.Value, strings.Join(referenceKeys, ", "))
		}
		if *dst != "" {
			return r, nodeErr(k, "a reference has one revision or edition, not both")
		}
		s, e := scalar(k, v)
		if e != nil {
			return r, e
		}
		*dst = strings.TrimSpace(s)
	}
	switch {
	case r.ID == "":
		return r, nodeErr(n, "a reference needs an id, such as id: HB-001")
	case strings.ContainsAny(r.ID, " \t|"):
		return r, nodeErr(n, "reference id %q must be one word, without spaces or |", r.ID)
	case r.Title == "":
		return r, nodeErr(n, "reference %s needs a title", r.ID)
	case r.Revision == "":
		return r, nodeErr(n, "reference %s needs a revision or an edition", r.ID)
	}
	return r, nil
}

// checkSources reports a | source on a line that is not an input: a check,
// or a definition that reads other names (its formula is its provenance).
func (d *Doc) checkSources() {
	for _, it := range d.Items {
		s := it.Stmt
		if s == nil || s.Source == "" {
			continue
		}
		switch {
		case s.Kind == eval.Check:
			d.errorf(s.SourceOff, "a check has no source: a source (| %s) belongs on an input line", s.Source)
		case len(s.Deps()) > 0:
			d.errorf(s.SourceOff, "%s is computed from %s, so its formula is its provenance; put the source (| %s) on the input lines it reads", s.Name, strings.Join(s.Deps(), ", "), s.Source)
		}
	}
}

// checkRecordSource reports a source on a line whose value is a state: a
// state is not an input; its sources belong on the inputs it is made from.
func (d *Doc) checkRecordSource(it *Item) {
	_, isData := it.Outcome.Value.(*eval.Values) // a data file: its values are inputs
	if _, ok := it.Outcome.Value.(eval.Record); ok && !isData && it.Stmt.Source != "" {
		d.errorf(it.Stmt.SourceOff, "%s is a state, not an input; put the source (| %s) on input lines and make the state from them", it.Stmt.Name, it.Stmt.Source)
	}
}

// referenceAnchor is the id of a reference's row in the References list.
func referenceAnchor(id string) string {
	var b strings.Builder
	b.WriteString("ref-")
	for _, r := range id {
		if r < 128 && (r == '-' || r == '_' || r == '.' || r >= '0' && r <= '9' || r >= 'A' && r <= 'Z' || r >= 'a' && r <= 'z') {
			b.WriteRune(r)
		} else {
			b.WriteByte('-')
		}
	}
	return b.String()
}

// referenceOf returns the reference a source starts with: its id followed
// by the end, a space or a comma. The longest id wins.
func (d *Doc) referenceOf(source string) *Reference {
	var best *Reference
	for i := range d.Front.References {
		r := &d.Front.References[i]
		rest, ok := strings.CutPrefix(source, r.ID)
		if !ok || (rest != "" && rest[0] != ' ' && rest[0] != ',') {
			continue
		}
		if best == nil || len(r.ID) > len(best.ID) {
			best = r
		}
	}
	return best
}

// sourceHTML is a source as HTML, its reference id linked to the
// References list.
func (d *Doc) sourceHTML(source string) string {
	r := d.referenceOf(source)
	if r == nil {
		return html.EscapeString(source)
	}
	return `<a href="#` + referenceAnchor(r.ID) + `">` + html.EscapeString(r.ID) + `</a>` + html.EscapeString(source[len(r.ID):])
}

// refView is a row of the References list.
type refView struct{ Anchor, ID, Title, Revision, Date string }

func (d *Doc) referenceRows() []refView {
	var rows []refView
	for _, r := range d.Front.References {
		rows = append(rows, refView{Anchor: referenceAnchor(r.ID), ID: r.ID, Title: r.Title, Revision: r.Revision, Date: r.Date})
	}
	return rows
}
