package calcdoc

import (
	"html"
	"strconv"

	"github.com/vouchcalc/vouch/eval"
)

// dataInputRows lists the values a yaml() line's file gave the calc: each
// key the calc read, as written in the file (its own digits and unit), its
// line's comment as description (else the yaml() line's), with the file and
// line as its source, after the yaml() line's own | source if it has one.
func (d *Doc) dataInputRows(it *Item, vs *eval.Values) []rowView {
	var rows []rowView
	for _, kv := range vs.Read() {
		desc := kv.Comment
		if desc == "" {
			desc = it.Stmt.Desc
		}
		src := html.EscapeString(vs.Path + " line " + strconv.Itoa(kv.Line))
		if it.Stmt.Source != "" {
			src = d.sourceHTML(it.Stmt.Source) + ", as " + src
		}
		rows = append(rows, rowView{
			Name:   nameText(it.Stmt.Name) + "." + nameText(kv.Key),
			Value:  writtenHTML(kv),
			Desc:   desc,
			Source: src,
			Line:   it.Stmt.Line,
		})
	}
	return rows
}

// writtenHTML is a data-file value as the file writes it; text in quotes.
func writtenHTML(kv eval.KeyValue) string {
	if kv.Quoted {
		return "“" + html.EscapeString(kv.Value) + "”"
	}
	return html.EscapeString(kv.Value)
}
