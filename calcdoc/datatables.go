package calcdoc

import (
	"html"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/eval"
)

// dataTables are the CSV tables the calc read, each once, in order of
// first use; the appendix prints them as written.
func (d *Doc) dataTables() []*eval.Table {
	var out []*eval.Table
	seen := map[string]bool{}
	for _, it := range d.Items {
		if it.Outcome == nil {
			continue
		}
		if t, ok := it.Outcome.Value.(*eval.Table); ok && !seen[t.Path] {
			seen[t.Path] = true
			out = append(out, t)
		}
	}
	return out
}

// tableAnchor is the id of a table in the appendix.
func tableAnchor(path string) string { return "data-" + referenceAnchor(path)[len("ref-"):] }

// tableView is a table of the data appendix: its header and rows as
// written, with the file line of each row.
type tableView struct {
	Anchor, Path string
	Header       []string
	Rows         []tableRow
}
type tableRow struct {
	Line  int
	Cells []string
}

func (d *Doc) tableViews() []tableView {
	var out []tableView
	for _, t := range d.dataTables() {
		v := tableView{Anchor: tableAnchor(t.Path), Path: t.Path}
		for _, h := range t.Header {
			v.Header = append(v.Header, strings.TrimSpace(h))
		}
		for r, line := range t.Lines {
			row := tableRow{Line: line}
			for c := range t.Names {
				row.Cells = append(row.Cells, t.Text[c][r])
			}
			v.Rows = append(v.Rows, row)
		}
		out = append(out, v)
	}
	return out
}

// tableNoteHTML stands for a csv() line's table in the body: its size and
// a link to the appendix that prints it.
func tableNoteHTML(t *eval.Table) string {
	return sprintf(`%s: %d rows of %s, printed as written in <a href="#%s">Appendix: data tables</a>`,
		html.EscapeString(t.Path), len(t.Lines), html.EscapeString(strings.Join(t.Names, ", ")), tableAnchor(t.Path))
}

// interpHTML shows the two rows an interp call used and the fraction of
// the way from the first to the second.
func (d *Doc) interpHTML(ip *eval.Interpolation) string {
	t := ip.Table
	var b strings.Builder
	b.WriteString(sprintf(`<div class="interp">Interpolated in <a href="#%s">%s</a> between the rows at lines %d and %d, fraction %s of the way:`,
		tableAnchor(t.Path), html.EscapeString(t.Path), t.Lines[ip.Rows[0]], t.Lines[ip.Rows[1]], fractionText(ip.Fraction, d.Front.Digits)))
	b.WriteString(`<table class="grid data"><tr><th>line</th><th>` + html.EscapeString(strings.TrimSpace(t.Header[ip.X])) + `</th><th>` + html.EscapeString(strings.TrimSpace(t.Header[ip.Y])) + `</th></tr>`)
	for _, r := range ip.Rows {
		b.WriteString(sprintf(`<tr><td class="num">%d</td><td class="num">%s</td><td class="num">%s</td></tr>`,
			t.Lines[r], html.EscapeString(t.Text[ip.X][r]), html.EscapeString(t.Text[ip.Y][r])))
	}
	b.WriteString("</table></div>")
	return b.String()
}

// fractionText is an interpolation fraction to the calc's digits.
func fractionText(f float64, digits int) string {
	return strconv.FormatFloat(f, 'g', digits, 64)
}
