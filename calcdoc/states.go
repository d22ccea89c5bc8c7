package calcdoc

import (
	"html"
	"strings"

	gast "github.com/yuin/goldmark/ast"

	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/units"
)

// stateTable is a `states` block: a table of state points, one per line,
// each optionally with the name of its mass flow.
//
//	st_1, m_dot
//	st_2
type stateTable struct {
	off  int // the block's offset in the file
	rows []stateRow
}

// stateRow is one line of a states block.
type stateRow struct {
	state field
	flow  *field // nil when the line names no mass flow
}

// readStates parses a states block; names are checked after evaluation.
func (d *Doc) readStates(b *gast.FencedCodeBlock) {
	d.checkClosed(b)
	t := &stateTable{off: b.Info.Segment.Start}
	lines := d.directives(b)
	for _, l := range lines {
		fs := splitList(l.text, l.off)
		if len(fs) == 0 || len(fs) > 2 {
			d.errorf(l.off, "write a states line as a state's name, optionally with its mass flow: st_1 or st_1, m_dot")
			continue
		}
		row := stateRow{state: fs[0]}
		if len(fs) == 2 {
			row.flow = &fs[1]
		}
		t.rows = append(t.rows, row)
	}
	if len(lines) == 0 {
		d.errorf(b.Info.Segment.Start, "a states block lists at least one state, one per line: st_1 or st_1, m_dot")
	}
	d.stateTables = append(d.stateTables, t)
}

// resolveStateRefs gives each diagram line written `T-s: states` (or h-s)
// the states of the nearest states block above it, in the table's order.
func (d *Doc) resolveStateRefs() {
	for _, blk := range d.diagramBlocks {
		for _, dg := range blk.diagrams {
			if len(dg.States) != 1 || dg.States[0].text != "states" {
				continue
			}
			var table *stateTable
			for _, t := range d.stateTables {
				if t.off < dg.Off {
					table = t
				}
			}
			if table == nil || len(table.rows) < 2 {
				d.errorf(dg.States[0].off, "%s: states draws the states of a states block above this diagram, which lists at least two; write that block first, or list the states here", dg.Kind)
				dg.States = nil
				continue
			}
			dg.States = nil
			for _, r := range table.rows {
				dg.States = append(dg.States, r.state)
			}
		}
	}
}

// checkStates reports the names of states blocks that are not states or
// mass flows. A name whose own line has an error is not reported again.
func (d *Doc) checkStates() {
	for _, t := range d.stateTables {
		for _, r := range t.rows {
			if o, ok := d.outcomeOf(r.state.text); !ok || o == nil {
				d.unknownName(r.state, "a state made with water(...) or fluid(...)")
			} else if _, isState := o.Value.(*props.State); !isState {
				d.errorf(r.state.off, "states: %s is not a state; list states made with water(...) or fluid(...)", r.state.text)
			}
			if r.flow == nil {
				continue
			}
			if o, ok := d.outcomeOf(r.flow.text); !ok || o == nil {
				d.unknownName(*r.flow, "a mass flow such as m_dot")
			} else if q, isQ := o.Value.(units.Quantity); !isQ || q.D != units.DimMassFlow {
				d.errorf(r.flow.off, "states: %s is not a mass flow; after a state's name give the name of its mass flow, in kg/s or lb/h", r.flow.text)
			}
		}
	}
}

// unknownName reports a name of a states block that the calc does not
// define, unless a line defines it and has its own error.
func (d *Doc) unknownName(f field, want string) {
	if d.defines(f.text) {
		return
	}
	d.errorf(f.off, "states: %s is not defined in the calc; give the name of %s", f.text, want)
}

// stateColumns are the columns of a state table: the state's field, and
// its units in the SI and US systems.
var stateColumns = []struct {
	field, si, us string
}{
	{"p", "MPa", "psia"}, {"T", "degC", "degF"}, {"h", "kJ/kg", "BTU/lb"},
	{"s", "kJ/(kg*K)", "BTU/(lb*degF)"}, {"x", "1", "1"},
}

// stateTableHTML draws a states block in the calc's display system. The
// quality is a dash where it is not defined (a single-phase state). The
// heading row repeats on each printed page the table runs over.
func (d *Doc) stateTableHTML(t *stateTable) string {
	us := d.Display() == settings.US
	flows := false
	for _, r := range t.rows {
		flows = flows || r.flow != nil
	}
	var b strings.Builder
	b.WriteString("<table class=\"grid states\">\n<thead><tr><th>State</th>")
	for _, c := range stateColumns {
		b.WriteString("<th>" + nameText(c.field) + unitHeading(units.MustParse(pick(us, c.us, c.si))) + "</th>")
	}
	flowUnit := units.MustParse(pick(us, "lb/h", "kg/s"))
	if flows {
		b.WriteString("<th>" + nameText("m_dot") + unitHeading(flowUnit) + "</th>")
	}
	b.WriteString("<th>Phase</th></tr></thead>\n<tbody>\n")
	for _, r := range t.rows {
		o, _ := d.outcomeOf(r.state.text)
		st := o.Value.(*props.State)
		b.WriteString("<tr><td>" + nameText(r.state.text) + "</td>")
		for _, c := range stateColumns {
			b.WriteString("<td class=\"num\">" + d.stateCell(st, c.field, units.MustParse(pick(us, c.us, c.si))) + "</td>")
		}
		if flows {
			cell := "—"
			if r.flow != nil {
				fo, _ := d.outcomeOf(r.flow.text)
				cell = numberIn(fo.Value.(units.Quantity), flowUnit, d)
			}
			b.WriteString("<td class=\"num\">" + cell + "</td>")
		}
		b.WriteString("<td>" + html.EscapeString(phaseText(st, st.Phase)) + "</td></tr>\n")
	}
	b.WriteString("</tbody>\n</table>\n")
	return b.String()
}

// stateCell is one value of a state table, a dash when the state does not
// define it (the quality outside the two-phase region).
func (d *Doc) stateCell(st *props.State, field string, u units.Unit) string {
	if field == "x" && st.Phase != "two-phase" {
		return "—"
	}
	q, ok := st.Quantity(field)
	if !ok {
		return "—"
	}
	return numberIn(q, u, d)
}

// pick chooses between two texts.
func pick(cond bool, a, b string) string {
	if cond {
		return a
	}
	return b
}
