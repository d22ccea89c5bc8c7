package calcdoc

import (
	"html"
	"strconv"

	"github.com/vouchcalc/vouch/eval"
)

// dataInputRows lists the values a yaml() line's file gave the calc: each
// key the calc read, as written in the file (its own digits and unit), with
// the file and line as its source.
func (d *Doc) dataInputRows(it *Item, vs *eval.Values) []rowView {
	var rows []rowView
	for _, kv := range vs.Read() {
		rows = append(rows, rowView{
			Name:   nameText(it.Stmt.Name) + "." + nameText(kv.Key),
			Value:  writtenHTML(kv),
			Desc:   it.Stmt.Desc,
			Source: html.EscapeString(vs.Path + " line " + strconv.Itoa(kv.Line)),
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
