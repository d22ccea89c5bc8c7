package calcdoc

import (
	"html"
	"strconv"
	"strings"

	gast "github.com/yuin/goldmark/ast"
)

// Assumption statuses: an open assumption is still to be confirmed; a
// confirmed one names the document that confirms it.
const (
	AssumptionOpen      = "open"
	AssumptionConfirmed = "confirmed"
)

// Assumption is one line of an assumptions block:
// "ID open: text" or "ID confirmed: text | SOURCE".
type Assumption struct {
	ID     string
	Status string // AssumptionOpen or AssumptionConfirmed
	Text   string
	Source string // after the |; required when confirmed
	Line   int
	block  int // index of the assumptions fence
}

// OpenAssumptions returns the assumptions still open, in file order. A
// package with any cannot be approved.
func (d *Doc) OpenAssumptions() []Assumption {
	var out []Assumption
	for _, a := range d.Assumptions {
		if a.Status == AssumptionOpen {
			out = append(out, a)
		}
	}
	return out
}

// readAssumptions reads the lines of one assumptions fence.
func (d *Doc) readAssumptions(index int, b *gast.FencedCodeBlock, seen map[string]int) {
	if !d.checkClosed(b) {
		return // the rest of the file is not assumptions: one error, at the fence
	}
	lines := b.Lines()
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		raw := strings.TrimRight(string(seg.Value(d.body)), "\r\n")
		if strings.TrimSpace(raw) == "" {
			continue
		}
		a, col, msg := parseAssumption(raw)
		if msg != "" {
			d.errorf(seg.Start+col, "%s", msg)
			continue
		}
		a.Line, a.block = d.lines.pos(d.Src, seg.Start).Line, index
		if first, dup := seen[a.ID]; dup {
			d.errorf(seg.Start+col, "assumption %s is already defined on line %d; give each assumption its own id", a.ID, first)
			continue
		}
		seen[a.ID] = a.Line
		d.Assumptions = append(d.Assumptions, a)
	}
}

const assumptionForm = "write ID open: text, or ID confirmed: text | SOURCE"

// parseAssumption reads one assumption line. On error it returns the byte
// column (0-based) and the message.
func parseAssumption(raw string) (Assumption, int, string) {
	lead := len(raw) - len(strings.TrimLeft(raw, " \t"))
	line := strings.TrimRight(raw[lead:], " \t")
	id, rest, ok := strings.Cut(line, " ")
	if !ok || !validAssumptionID(id) {
		return Assumption{}, lead, "expected an assumption id (letters, digits, - _ .) then its status; " + assumptionForm
	}
	rest = strings.TrimLeft(rest, " ")
	stCol := lead + len(line) - len(rest)
	status, text, ok := strings.Cut(rest, ":")
	if !ok {
		return Assumption{}, stCol, "missing : after the status of " + id + "; " + assumptionForm
	}
	status = strings.TrimSpace(status)
	if status != AssumptionOpen && status != AssumptionConfirmed {
		return Assumption{}, stCol, "assumption " + id + " has status " + strconv.Quote(status) + "; the status is open or confirmed"
	}
	a := Assumption{ID: id, Status: status, Text: strings.TrimSpace(text)}
	if bar := strings.LastIndexByte(a.Text, '|'); bar >= 0 {
		a.Source = strings.TrimSpace(a.Text[bar+1:])
		a.Text = strings.TrimSpace(a.Text[:bar])
		if a.Source == "" {
			return Assumption{}, lead + strings.LastIndexByte(line, '|'), "expected a source after |, the document that confirms assumption " + id
		}
	}
	switch {
	case a.Text == "":
		return Assumption{}, stCol, "assumption " + id + " has no text; " + assumptionForm
	case status == AssumptionConfirmed && a.Source == "":
		return Assumption{}, stCol, "confirmed assumption " + id + " needs the document that confirms it: end the line with | SOURCE"
	}
	return a, 0, ""
}

func validAssumptionID(id string) bool {
	if id == "" {
		return false
	}
	for _, r := range id {
		if !(r == '-' || r == '_' || r == '.' || r >= '0' && r <= '9' || r >= 'A' && r <= 'Z' || r >= 'a' && r <= 'z') {
			return false
		}
	}
	return true
}

// assumptionView is a row of the Assumptions tables.
type assumptionView struct {
	ID, Status, Text string
	Source           string // trusted HTML (sourceHTML)
	Line             int
	Open             bool
}

func (d *Doc) assumptionRows(open bool) []assumptionView {
	var rows []assumptionView
	for _, a := range d.Assumptions {
		if open && a.Status != AssumptionOpen {
			continue
		}
		rows = append(rows, assumptionView{ID: a.ID, Status: a.Status, Text: a.Text, Source: d.sourceHTML(a.Source), Line: a.Line, Open: a.Status == AssumptionOpen})
	}
	return rows
}

// assumptionsHTML draws an assumptions fence in the body as a table.
func (d *Doc) assumptionsHTML(block int) string {
	var b strings.Builder
	b.WriteString(`<table class="grid assumptions"><tr><th>Assumption</th><th>Status</th><th>Text</th><th>Source</th></tr>`)
	for _, a := range d.Assumptions {
		if a.block != block {
			continue
		}
		cls := "verdict pass"
		if a.Status == AssumptionOpen {
			cls = "verdict open"
		}
		b.WriteString(`<tr id="A-` + html.EscapeString(a.ID) + `"><td>` + html.EscapeString(a.ID) + `</td><td><span class="` + cls + `">` + strings.ToUpper(a.Status) + `</span></td><td>` + html.EscapeString(a.Text) + `</td><td>` + d.sourceHTML(a.Source) + `</td></tr>`)
	}
	b.WriteString("</table>")
	return b.String()
}
