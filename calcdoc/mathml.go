package calcdoc

import (
	"html"
	"strings"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// mathml builds MathML from expression trees. Every text it writes is
// escaped, so its output is safe to pass through the one trusted door.
type mathml struct {
	stmt *eval.Stmt
	// sub is the document whose values are substituted (its outcomes,
	// and its engine for a part such as a field); nil: write symbols.
	sub    *Doc
	digits int
	ctx    units.Context
	shown  func(*eval.Outcome, units.Quantity) units.Unit // the unit a value is shown in
	b      strings.Builder
	kelvin bool // inside a product, quotient or power: temperatures in K
	root   eval.Node
	cache  *typesetCache // names and literal units typeset before; nil: none
	// cmp holds, for a check, each comparison written with both sides
	// evaluated in one unit; it takes the place of the comparison's
	// substituted sides.
	cmp map[*eval.Binary]string
}

// prec is the operator precedence for parentheses: higher binds tighter.
func prec(n eval.Node) int {
	switch v := n.(type) {
	case *eval.Cond:
		return 0
	case *eval.Binary:
		return opPrec(v.Op)
	case *eval.Unary:
		return 6
	}
	return 9
}

// opPrec is the precedence of a binary operator (0 for one not listed).
func opPrec(op string) int {
	switch op {
	case "||", "or":
		return 1
	case "&&", "and":
		return 2
	case "<", "<=", ">", ">=", "==", "!=":
		return 3
	case "+", "-":
		return 4
	case "*", "/":
		return 5
	case "^", "**":
		return 7
	}
	return 0
}

var opText = map[string]string{
	"+": "+", "-": "−", "*": "·", "<": "&lt;", "<=": "≤", ">": "&gt;", ">=": "≥", "==": "=", "!=": "≠",
	"&&": "∧", "and": "∧", "||": "∨", "or": "∨",
}

func (m *mathml) w(s string) { m.b.WriteString(s) }

// text writes an element holding escaped text, piece by piece into the
// one builder.
func (m *mathml) text(tag, s string) {
	m.w("<")
	m.w(tag)
	m.w(">")
	m.w(html.EscapeString(s))
	m.w("</")
	m.w(tag)
	m.w(">")
}

// boolText is how a truth value is written.
func boolText(v bool) string {
	if v {
		return "true"
	}
	return "false"
}

// node writes one expression node.
func (m *mathml) node(n eval.Node) {
	switch v := n.(type) {
	case *eval.Number:
		writeNumberMathML(&m.b, v.Value, 15, true)
	case *eval.Bool:
		m.text("mi", boolText(v.Value))
	case *eval.Text:
		m.text("mtext", "“"+v.Value+"”")
	case *eval.Quantity:
		m.literal(v.Lit)
	case *eval.Name:
		m.name(v.Name)
	case *eval.Unary:
		m.unary(v)
	case *eval.Binary:
		m.binaryKelvin(v)
	case *eval.Field:
		m.field(v)
	case *eval.Call:
		m.call(v)
	case *eval.Cond:
		m.w("<mrow>")
		m.node(v.Then)
		m.text("mtext", " if ")
		m.node(v.Cond)
		m.text("mtext", ", else ")
		m.node(v.Else)
		m.w("</mrow>")
	case *eval.Other:
		m.text("mtext", v.Text)
	}
}

// literal writes a unit literal as written; inside a product, when numbers
// are substituted, an absolute temperature is shown in kelvin.
func (m *mathml) literal(l *eval.Literal) {
	if m.sub != nil && m.kelvin && l.Q.D == units.DimTemperature && l.Unit.Offset != 0 {
		m.value(l.Q, units.Unit{})
		return
	}
	m.w("<mrow>")
	writeNumberMathML(&m.b, parseNum(l.Num), 15, true)
	if m.cache != nil {
		m.w(m.cache.literalUnit(l))
	} else {
		m.w(unitMathML(l.Unit))
	}
	m.w("</mrow>")
}

// name writes a name, or (when substituting) its value.
func (m *mathml) name(name string) {
	if name == "pi" {
		m.text("mi", "π")
		return
	}
	if m.sub != nil {
		if o, ok := m.sub.outcomeOf(name); ok && !isCollection(o.Value) {
			if o.Stmt != nil && o.Stmt.Kind == eval.Def && o.Stmt.IsLiteralInput() {
				m.literal(o.Stmt.LoneLiteral()) // an input as it was written
				return
			}
			if isNumberInput(o) {
				writeNumberMathML(&m.b, o.Value.(units.Quantity).V, 15, true)
				return
			}
			u := o.Display
			if q, isQ := o.Value.(units.Quantity); isQ && m.shown != nil {
				u = m.shown(o, q)
			}
			m.value(o.Value, u)
			return
		}
	}
	m.w(m.nameMathML(name))
}

// nameMathML typesets a name, through the cache when there is one.
func (m *mathml) nameMathML(name string) string {
	if m.cache != nil {
		return m.cache.name(name)
	}
	return nameMathML(name)
}

// value writes a substituted value with its unit (the default unit when u
// has no dimension but the value has).
func (m *mathml) value(v any, u units.Unit) {
	switch x := v.(type) {
	case units.Quantity:
		switch {
		case m.kelvin && x.D == units.DimTemperature:
			u = units.DefaultUnit(x) // products use the kelvin value
		case u.Dim != x.D || u.Factor == 0:
			u = units.DefaultUnit(x)
			if x.T == units.Abs {
				u = celsius // an absolute temperature as engineers read it
			}
		}
		writeQuantityMathML(&m.b, x, u, m.digits, m.ctx)
	case bool:
		m.text("mi", boolText(x))
	case string:
		m.text("mtext", "“"+x+"”")
	case *eval.Table:
		m.text("mtext", x.String())
	case *eval.Values:
		m.text("mtext", x.String())
	default:
		m.text("mtext", "(state)")
	}
}

func (m *mathml) unary(v *eval.Unary) {
	m.w("<mrow>")
	switch v.Op {
	case "-":
		m.w("<mo>−</mo>")
	case "!", "not":
		m.w("<mo>¬</mo>")
	}
	m.child(v.X, prec(v)+1)
	m.w("</mrow>")
}

// child writes a node, parenthesised when it binds looser than min.
func (m *mathml) child(n eval.Node, min int) {
	if prec(n) < min || (m.sub != nil && m.isNegative(n) && min > 4) {
		m.paren(n)
		return
	}
	m.node(n)
}

func (m *mathml) paren(n eval.Node) {
	m.w("<mrow><mo>(</mo>")
	m.node(n)
	m.w("<mo>)</mo></mrow>")
}

// isNegative tells whether a substituted leaf shows a negative number.
func (m *mathml) isNegative(n eval.Node) bool {
	switch v := n.(type) {
	case *eval.Quantity:
		return strings.HasPrefix(v.Lit.Num, "-")
	case *eval.Name:
		if o, ok := m.sub.outcomeOf(v.Name); ok {
			q, isQ := o.Value.(units.Quantity)
			return isQ && q.V < 0
		}
	}
	return false
}

// binaryKelvin writes a binary node; products, quotients and powers show
// temperatures in kelvin, since that is the value they use.
func (m *mathml) binaryKelvin(v *eval.Binary) {
	if c, ok := m.cmp[v]; ok && m.sub != nil {
		m.w(c)
		return
	}
	k := m.kelvin
	switch v.Op {
	case "*", "/", "^", "**":
		m.kelvin = true
	}
	m.binary(v)
	m.kelvin = k
}

func (m *mathml) binary(v *eval.Binary) {
	p := prec(v)
	switch v.Op {
	case "/":
		m.w("<mfrac>")
		m.node(v.L)
		m.node(v.R)
		m.w("</mfrac>")
		return
	case "^", "**":
		m.w("<msup>")
		m.base(v.L, p)
		m.node(v.R)
		m.w("</msup>")
		return
	}
	m.w("<mrow>")
	m.child(v.L, p)
	m.w("<mo>")
	m.w(opText[v.Op])
	m.w("</mo>")
	right := p
	if v.Op == "-" || v.Op == "<" || v.Op == ">" {
		right = p + 1
	}
	m.child(v.R, right)
	m.w("</mrow>")
}

// base writes the base of a power: parenthesised unless it is a plain
// symbol (a number with a unit needs parentheses: (2 m)²).
func (m *mathml) base(n eval.Node, p int) {
	_, isLit := n.(*eval.Quantity)
	_, isName := n.(*eval.Name)
	if prec(n) <= p || isLit || (isName && m.sub != nil) {
		m.paren(n)
		return
	}
	m.node(n)
}

// field writes st_1.h as h(st₁): the field of the state; when substituting,
// its value.
func (m *mathml) field(v *eval.Field) {
	_, ofCall := v.X.(*eval.Call)
	if ofCall && eval.Node(v) == m.root && m.sub != nil {
		// The whole line is a field of a property call: show the call with
		// its arguments' values; the result follows.
		m.w("<mrow>")
		m.w(m.nameMathML(v.Name))
		m.w("<mo>(</mo>")
		m.node(v.X)
		m.w("<mo>)</mo></mrow>")
		return
	}
	if m.sub != nil && m.sub.engine != nil {
		if val, err := m.sub.engine.EvalNode(m.stmt, v); err == nil {
			m.value(val, units.Unit{})
			return
		}
	}
	k := m.kelvin
	m.kelvin = false
	m.w("<mrow>")
	m.w(m.nameMathML(v.Name))
	m.w("<mo>(</mo>")
	m.symbols(v.X)
	m.w("<mo>)</mo></mrow>")
	m.kelvin = k
}

// symbols writes a node with symbols even while substituting.
func (m *mathml) symbols(n eval.Node) {
	sub := m.sub
	m.sub = nil
	m.node(n)
	m.sub = sub
}

func (m *mathml) call(v *eval.Call) {
	switch {
	case v.Func == "solve" && len(v.Args) == 3:
		m.solve(v)
		return
	case v.Func == "sqrt" && len(v.Args) == 1:
		m.w("<msqrt>")
		m.node(v.Args[0])
		m.w("</msqrt>")
		return
	case v.Func == "abs" && len(v.Args) == 1:
		m.w("<mrow><mo>|</mo>")
		m.node(v.Args[0])
		m.w("<mo>|</mo></mrow>")
		return
	}
	k := m.kelvin
	m.kelvin = false // arguments keep their own units: water(12.5 MPa, 540 °C)
	defer func() { m.kelvin = k }()
	m.w("<mrow>")
	m.text("mi", v.Func)
	m.w("<mo>(</mo>")
	for i, a := range v.Args {
		if i > 0 {
			m.w("<mo separator=\"true\">,</mo>")
		}
		m.node(a)
	}
	m.w("<mo>)</mo></mrow>")
}

// solve writes solve(L == R, LO, HI) as "solve L = R for NAME ∈ [LO, HI]".
func (m *mathml) solve(v *eval.Call) {
	m.w("<mrow><mtext>solve\u2002</mtext>")
	m.node(v.Args[0])
	m.w("<mtext>\u2002for\u2002</mtext>")
	m.w(m.nameMathML(m.stmt.Name))
	m.w("<mo>∈</mo><mo>[</mo>")
	m.node(v.Args[1])
	m.w("<mo separator=\"true\">,</mo>")
	m.node(v.Args[2])
	m.w("<mo>]</mo></mrow>")
}

var celsius = units.MustParse("degC")

// isCollection reports whether a value is a table or a set of values, which
// substitution keeps by name: its contents are shown on its own line.
func isCollection(v any) bool {
	switch v.(type) {
	case *eval.Table, *eval.Values:
		return true
	}
	return false
}
