package calcdoc

import (
	"html"
	"strconv"
	"strings"

	gast "github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// kindCalcBlock and kindCalcInline are the Markdown node kinds that stand
// for calc blocks and inline values when the body is rendered.
var (
	kindCalcBlock  = gast.NewNodeKind("CalcBlock")
	kindCalcInline = gast.NewNodeKind("CalcInline")
	kindFigure     = gast.NewNodeKind("CalcFigure")
)

// figureBlock replaces a sweep or diagram fence; html is built by this
// package (tables with escaped text, SVG from svgplot, which escapes its
// labels).
type figureBlock struct {
	gast.BaseBlock
	html string
}

func (n *figureBlock) Kind() gast.NodeKind        { return kindFigure }
func (n *figureBlock) Dump(src []byte, level int) { gast.DumpHelper(n, src, level, nil, nil) }
func (n *figureBlock) IsRaw() bool                { return true }

// calcBlock replaces a calc fence in the Markdown tree.
type calcBlock struct {
	gast.BaseBlock
	items []*Item
}

func (n *calcBlock) Kind() gast.NodeKind         { return kindCalcBlock }
func (n *calcBlock) Dump(src []byte, level int)  { gast.DumpHelper(n, src, level, nil, nil) }
func (n *calcBlock) IsRaw() bool                 { return true }
func (n *calcInline) Kind() gast.NodeKind        { return kindCalcInline }
func (n *calcInline) Dump(src []byte, level int) { gast.DumpHelper(n, src, level, nil, nil) }
func (n *calcInline) Inline()                    {}

// calcInline replaces an inline `=expr` span.
type calcInline struct {
	gast.BaseInline
	item *Item
}

// replaceCalcNodes swaps calc fences and inline values for the nodes the
// body renderer draws.
func (d *Doc) replaceCalcNodes() {
	byBlock := map[int][]*Item{}
	inline := map[int]*Item{}
	for _, it := range d.Items {
		if it.Inline {
			inline[it.Stmt.ExprOff] = it
		} else {
			byBlock[it.Block] = append(byBlock[it.Block], it)
		}
	}
	fs := &d.fences
	for i, f := range fs.sweeps {
		if i < len(d.Sweeps) {
			f.Parent().ReplaceChild(f.Parent(), f, &figureBlock{html: d.sweepHTML(d.Sweeps[i])})
		}
	}
	for i, f := range fs.budgets {
		if i < len(d.Budgets) {
			f.Parent().ReplaceChild(f.Parent(), f, &figureBlock{html: d.budgetHTML(d.Budgets[i])})
		}
	}
	for i, f := range fs.diagrams {
		if i < len(d.diagramBlocks) {
			f.Parent().ReplaceChild(f.Parent(), f, &figureBlock{html: d.diagramHTML(d.diagramBlocks[i])})
		}
	}
	for i, f := range fs.assumptions {
		f.Parent().ReplaceChild(f.Parent(), f, &figureBlock{html: d.assumptionsHTML(i)})
	}
	for i, f := range fs.states {
		if i < len(d.stateTables) {
			f.Parent().ReplaceChild(f.Parent(), f, &figureBlock{html: d.stateTableHTML(d.stateTables[i])})
		}
	}
	for i, f := range fs.calcs {
		f.Parent().ReplaceChild(f.Parent(), f, &calcBlock{items: byBlock[i]})
	}
	for _, s := range fs.spans {
		if it := d.spanItem(s, inline); it != nil {
			s.Parent().ReplaceChild(s.Parent(), s, &calcInline{item: it})
		}
	}
}

func (d *Doc) spanItem(s *gast.CodeSpan, inline map[int]*Item) *Item {
	if t, ok := s.FirstChild().(*gast.Text); ok {
		return inline[t.Segment.Start+1+leadingSpaces(d.body[t.Segment.Start+1:])]
	}
	return nil
}

func leadingSpaces(b []byte) int {
	n := 0
	for n < len(b) && b[n] == ' ' {
		n++
	}
	return n
}

// demoteHeadings moves the prose headings one level down, below the
// package's own section headings.
func demoteHeadings(doc gast.Node) {
	gast.Walk(doc, func(n gast.Node, entering bool) (gast.WalkStatus, error) {
		if h, ok := n.(*gast.Heading); ok && entering && h.Level < 6 {
			h.Level++
		}
		return gast.WalkContinue, nil
	})
}

// bodyRenderer draws calc blocks and inline values; every other node is
// drawn by goldmark's own HTML renderer, with raw HTML off.
type bodyRenderer struct{ d *Doc }

// RegisterFuncs registers the drawing of calc blocks, figures and inline values.
func (r *bodyRenderer) RegisterFuncs(reg renderer.NodeRendererFuncRegisterer) {
	reg.Register(kindCalcBlock, r.block)
	reg.Register(kindCalcInline, r.inline)
	reg.Register(kindFigure, r.figure)
	reg.Register(gast.KindImage, r.image)
}

func (r *bodyRenderer) figure(w util.BufWriter, _ []byte, n gast.Node, entering bool) (gast.WalkStatus, error) {
	if entering {
		w.WriteString(n.(*figureBlock).html)
	}
	return gast.WalkSkipChildren, nil
}

func (r *bodyRenderer) block(w util.BufWriter, _ []byte, n gast.Node, entering bool) (gast.WalkStatus, error) {
	if !entering {
		return gast.WalkContinue, nil
	}
	w.WriteString("<div class=\"calc\">\n")
	items := n.(*calcBlock).items
	for i := 0; i < len(items); i++ {
		it := items[i]
		if it.Outcome == nil {
			continue
		}
		if !isInputItem(it) {
			r.d.writeLine(w, it, false)
			continue
		}
		j := i
		for j+1 < len(items) && items[j+1].Outcome != nil && isInputItem(items[j+1]) {
			j++
		}
		w.WriteString(inputRefHTML(items[i : j+1]))
		for _, in := range items[i : j+1] {
			r.d.writeLine(w, in, true)
		}
		i = j
	}
	w.WriteString("</div>\n")
	return gast.WalkSkipChildren, nil
}

// inputRefHTML is the printed stand-in for a run of input lines, whose
// values the Inputs table lists: the lines and the names they define.
// On screen the lines themselves are shown (the package's styles choose).
func inputRefHTML(run []*Item) string {
	lines := sprintf("%d", run[0].Stmt.Line)
	if n := len(run); n > 1 {
		lines += "–" + sprintf("%d", run[n-1].Stmt.Line)
	}
	names := make([]string, len(run))
	for i, it := range run {
		names[i] = nameText(it.Stmt.Name)
	}
	what := "Input "
	if len(run) > 1 {
		what = "Inputs "
	}
	return "<div class=\"input-ref\"><div class=\"ln\">" + lines + "</div><div>" + what + strings.Join(names, ", ") +
		" defined here; their values are listed in the Inputs table.</div></div>\n"
}

func (r *bodyRenderer) inline(w util.BufWriter, _ []byte, n gast.Node, entering bool) (gast.WalkStatus, error) {
	if entering {
		it := n.(*calcInline).item
		w.WriteString("<span class=\"val\">" + r.d.valueHTML(it.Outcome) + "</span>")
	}
	return gast.WalkSkipChildren, nil
}

// stringWriter is where a calc line is written: goldmark's writer of the
// body.
type stringWriter interface {
	WriteString(s string) (int, error)
}

// writeLine draws one calc line into b: formula = numbers substituted =
// result. An input line (input set) carries the class the styles use to
// show it on screen and leave it out of print.
func (d *Doc) writeLine(b stringWriter, it *Item, input bool) {
	s, o := it.Stmt, it.Outcome
	b.WriteString("<div class=\"calc-line")
	switch {
	case s.Kind == eval.Check:
		b.WriteString(" check")
	case input:
		b.WriteString(" input")
	}
	line := strconv.Itoa(s.Line)
	b.WriteString("\" id=\"L" + line + "\"><div class=\"ln\">" + line + "</div><div>")
	d.writeEquation(b, it)
	if s.Kind == eval.Check {
		b.WriteString(verdictHTML(o.Pass))
		if cs := d.Comparisons(it); len(cs) > 0 {
			b.WriteString("<div class=\"desc margin\">" + d.marginHTML(cs, false) + "</div>")
		}
	}
	if vs, ok := o.Value.(*eval.Values); ok {
		b.WriteString("<div class=\"state\">" + d.valuesHTML(vs) + "</div>")
	} else if st, ok := o.Value.(eval.Record); ok {
		b.WriteString("<div class=\"state\">" + stateHTML(st, d.Front.Digits, d.systemUnit) + "</div>")
	}
	if t, ok := o.Value.(*eval.Table); ok {
		b.WriteString("<div class=\"state\">" + tableNoteHTML(t) + "</div>")
	}
	for _, ip := range o.Interps {
		b.WriteString(d.interpHTML(ip))
	}
	if s.Desc != "" {
		b.WriteString("<div class=\"desc\">" + html.EscapeString(s.Desc) + "</div>")
	}
	if s.Source != "" {
		b.WriteString("<div class=\"src\">Source: " + d.sourceHTML(s.Source) + "</div>")
	}
	b.WriteString(d.uncLineHTML(it))
	if sv := o.Solve; sv != nil {
		b.WriteString(sprintf("<div class=\"desc\">Solved by bracketing (Brent's method) in %d evaluations; remaining residual %s.</div>",
			sv.Iterations, quantityText(sv.Residual, units.DefaultUnit(sv.Residual), 3, d.Front.Ctx)))
	}
	for _, src := range o.Sources {
		b.WriteString("<div class=\"src\">Properties: " + html.EscapeString(src) + "</div>")
	}
	b.WriteString("</div></div>\n")
}

func verdictHTML(pass bool) string {
	if pass {
		return "<span class=\"verdict pass\">PASS</span>"
	}
	return "<span class=\"verdict fail\">FAIL</span>"
}

// stackAfter is the expression length beyond which the numbers
// substituted and the result go on a line of their own.
const stackAfter = 36

// writeEquation writes the MathML lines of a calc line: name = formula =
// numbers substituted = result, leaving out the parts that would repeat,
// and starting a second line when the first would be long.
func (d *Doc) writeEquation(b stringWriter, it *Item) {
	s, o := it.Stmt, it.Outcome
	if s.Kind == eval.Corr {
		writeMath(b, false, corrMathML(s))
		return
	}
	if o.Solve != nil {
		writeMath(b, false, d.formula(s, false))
		writeMath(b, true, d.typeset.name(s.Name), "<mo>=</mo>", d.resultMathML(o))
		return
	}
	formula := d.formula(s, false)
	if s.Kind == eval.Check {
		if sub := d.checkFormula(it); sub != formula {
			writeMath(b, false, formula, "<mo>⇒</mo>", sub)
			return
		}
		writeMath(b, false, formula)
		return
	}
	var parts [8]string // name = formula ± u, then = substituted = result
	k := 1
	parts[0] = formula
	if s.Kind == eval.Def {
		parts[0], parts[1], parts[2], parts[3] = d.typeset.name(s.Name), "<mo>=</mo>", formula, uncMathML(s)
		k = 4
	}
	head := k
	if !s.IsLiteralInput() && (!s.IsPlainNumber() || s.HasDisplayUnit()) { // an input: the value as written is the result
		k = d.appendRest(parts[:], k, s, o, formula)
	}
	if len(s.Expr) > stackAfter && k-head > 2 {
		writeMath(b, false, parts[:head]...)
		writeMath(b, true, parts[head:k]...)
		return
	}
	writeMath(b, false, parts[:k]...)
}

// appendRest puts "= numbers substituted" and "= result" into parts from
// k on, each only when it differs from what precedes it, and returns the
// new end.
func (d *Doc) appendRest(parts []string, k int, s *eval.Stmt, o *eval.Outcome, formula string) int {
	sub := ""
	if len(s.Deps()) > 0 && !s.IsLoneName() {
		if sub = d.formula(s, true); sub != formula {
			parts[k], parts[k+1] = "<mo>=</mo>", sub
			k += 2
		} else {
			sub = ""
		}
	}
	if res := d.resultMathML(o); res != "" && res != sub {
		parts[k], parts[k+1] = "<mo>=</mo>", res
		k += 2
	}
	return k
}

// writeMath writes one block math line of pieces; cont marks the second
// line of a stacked equation.
func writeMath(b stringWriter, cont bool, pieces ...string) {
	b.WriteString("<math display=\"block\"")
	if cont {
		b.WriteString(" class=\"cont\"")
	}
	b.WriteString("><mrow>")
	for _, p := range pieces {
		b.WriteString(p)
	}
	b.WriteString("</mrow></math>")
}

// checkFormula writes a check with values substituted, each comparison
// of quantities as its two sides evaluated in one unit.
func (d *Doc) checkFormula(it *Item) string {
	cmp := map[*eval.Binary]string{}
	for _, c := range d.Comparisons(it) {
		cmp[c.Node] = d.comparisonMathML(c)
	}
	return d.formulaWith(it.Stmt, true, cmp)
}

// formula writes the expression with symbols, or with values substituted.
func (d *Doc) formula(s *eval.Stmt, substitute bool) string {
	return d.formulaWith(s, substitute, nil)
}

func (d *Doc) formulaWith(s *eval.Stmt, substitute bool, cmp map[*eval.Binary]string) string {
	m := mathml{stmt: s, digits: d.Front.Digits, ctx: d.Front.Ctx, cmp: cmp, shown: d.shownUnit, cache: &d.typeset}
	if substitute {
		m.sub = d
	}
	m.root = s.Syntax()
	m.b.Grow(32 + 8*len(s.Expr))
	m.node(m.root)
	return m.b.String()
}

// resultMathML writes a line's result in its display unit.
func (d *Doc) resultMathML(o *eval.Outcome) string {
	if q, ok := o.Value.(units.Quantity); ok {
		return quantityMathML(q, d.shownUnit(o, q), d.Front.Digits, d.Front.Ctx)
	}
	if b, ok := o.Value.(bool); ok {
		return "<mi>" + boolText(b) + "</mi>"
	}
	return ""
}

// valueHTML formats an outcome's value as HTML text.
func (d *Doc) valueHTML(o *eval.Outcome) string {
	if o.Written != "" {
		return html.EscapeString(o.Written)
	}
	if isNumberInput(o) {
		return groupDigits(o.Stmt.Expr)
	}
	if o.Stmt != nil && o.Stmt.Kind == eval.Def && o.Stmt.IsLiteralInput() {
		l := o.Stmt.LoneLiteral()
		s := groupDigits(l.Num)
		if t := unitText(l.Unit); t != "" {
			s += "\u2009" + html.EscapeString(t)
		}
		return s
	}
	switch v := o.Value.(type) {
	case units.Quantity:
		return quantityText(v, d.shownUnit(o, v), d.Front.Digits, d.Front.Ctx)
	case bool:
		return boolText(v)
	case string:
		return html.EscapeString(v)
	case *eval.Table:
		return html.EscapeString(v.String())
	case *eval.Values:
		return html.EscapeString(v.String())
	}
	return "(state)"
}

// stateFields shown under a property call, in order.
var stateShown = []string{"p", "T", "h", "s", "v", "x", "hf", "hg", "sf", "sg", "vf", "vg"}

// stateHTML lists a state's main fields on one line, each in the unit
// shown(q, si) picks for it from its SI unit.
func stateHTML(st eval.Record, digits int, shown func(units.Quantity, units.Unit) units.Unit) string {
	var parts []string
	phase := ""
	if ph, err := st.Field("phase"); err == nil {
		phase, _ = ph.(string)
	}
	for _, f := range stateShown {
		if f == "x" && phase != "two-phase" {
			continue // the quality of a single-phase state says nothing
		}
		v, err := st.Field(f)
		if err != nil {
			continue
		}
		q, ok := v.(units.Quantity)
		if !ok {
			continue
		}
		u := units.DefaultUnit(q)
		if f == "T" {
			u = degC
		}
		u = shown(q, u)
		parts = append(parts, nameText(f)+"&#8239;=&#8239;"+quantityText(q, u, digits, units.StandardAtmosphere))
	}
	if phase != "" {
		parts = append(parts, html.EscapeString(phaseText(st, phase)))
	}
	return strings.Join(parts, ", ")
}

// sweepHTML draws a sweep: a table of the shown results at every point,
// with the checks that fail there, and the plots.
func (d *Doc) sweepHTML(sw *Sweep) string {
	if len(sw.Rows) == 0 || len(sw.Rows) != sw.Len() {
		return "" // a sweep that did not run has an error, and no package is written
	}
	var b strings.Builder
	b.WriteString(sprintf("<figure class=\"sweep\" id=\"L%d\"><figcaption>Sweep of %s (line %d): %d points</figcaption>", sw.Line, nameText(sw.Var), sw.Line, sw.Len()))
	b.WriteString("<table class=\"grid\"><tr><th>" + nameText(sw.Var) + unitHeading(sw.XUnit) + "</th>")
	cols := make([]units.Unit, len(sw.Show))
	for j, c := range sw.Show {
		cols[j] = d.ColumnUnit(c, sw.Rows[0][j])
		b.WriteString("<th>" + columnName(c) + unitHeading(cols[j]) + "</th>")
	}
	b.WriteString("<th>Checks</th></tr>\n")
	for i := 0; i < sw.Len(); i++ {
		b.WriteString("<tr><td class=\"num\">" + d.sweepXHTML(sw, i) + "</td>")
		for j := range sw.Show {
			b.WriteString("<td class=\"num\">" + numberIn(sw.Rows[i][j], cols[j], d) + "</td>")
		}
		b.WriteString("<td>" + failedHTML(sw.Failed[i]) + "</td></tr>\n")
	}
	b.WriteString("</table>")
	for _, svg := range sw.SVGs {
		b.WriteString("<div class=\"plot\">" + string(svg) + "</div>")
	}
	b.WriteString("</figure>\n")
	return b.String()
}

func unitHeading(u units.Unit) string {
	if t := unitText(u); t != "" {
		return " [" + html.EscapeString(t) + "]"
	}
	return ""
}

func numberIn(q units.Quantity, u units.Unit, d *Doc) string {
	v, err := q.In(u, d.Front.Ctx)
	if err != nil {
		return html.EscapeString(err.Error())
	}
	return numberText(v, d.Front.Digits)
}

func failedHTML(lines []int) string {
	if len(lines) == 0 {
		return "<span class=\"verdict pass\">PASS</span>"
	}
	var parts []string
	for _, l := range lines {
		parts = append(parts, sprintf("<a href=\"#L%d\">%d</a>", l, l))
	}
	return "<span class=\"verdict fail\">FAIL</span> line " + strings.Join(parts, ", ")
}

// diagramHTML places the diagrams of a block.
func (d *Doc) diagramHTML(blk *diagramBlock) string {
	var b strings.Builder
	for _, dg := range blk.diagrams {
		b.WriteString("<figure class=\"diagram\">" + string(dg.SVG) + "</figure>\n")
	}
	return b.String()
}

// phaseText names a state's phase, calling the ends of the two-phase line
// saturated liquid and saturated vapour.
func phaseText(st eval.Record, phase string) string {
	if phase != "two-phase" {
		return phase
	}
	if v, err := st.Field("x"); err == nil {
		if x, ok := v.(units.Quantity); ok && x.V == 0 {
			return "saturated liquid"
		} else if ok && x.V == 1 {
			return "saturated vapour"
		}
	}
	return phase
}

// sweepXHTML is the varied input at point i for the table.
func (d *Doc) sweepXHTML(sw *Sweep, i int) string {
	if sw.Texts != nil {
		return html.EscapeString(sw.Texts[i])
	}
	return numberIn(sw.X[i], sw.XUnit, d)
}

// valuesHTML lists the values of a yaml() line's file as written (its own
// digits and units), in file order, so a checker sees them.
func (d *Doc) valuesHTML(vs *eval.Values) string {
	var parts []string
	for _, kv := range vs.Pairs() {
		parts = append(parts, nameText(kv.Key)+"&#8239;=&#8239;"+writtenHTML(kv))
	}
	return strings.Join(parts, ", ")
}

// isNumberInput reports whether an outcome is a definition by one plain
// number, shown as written.
func isNumberInput(o *eval.Outcome) bool {
	return o.Stmt != nil && o.Stmt.Kind == eval.Def && o.Stmt.IsPlainNumber() && !o.Stmt.HasDisplayUnit()
}
