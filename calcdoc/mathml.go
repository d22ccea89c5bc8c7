package calcdoc

import (
	"html"
	"strings"

	"github.com/expr-lang/expr/ast"

	"vouch/eval"
	"vouch/units"
)

// mathml builds MathML from expression trees. Every text it writes is
// escaped, so its output is safe to pass through the one trusted door.
type mathml struct {
	stmt   *eval.Stmt
	values func(name string) (*eval.Outcome, bool) // nil: write symbols, not numbers
	digits int
	ctx    units.Context
	b      strings.Builder
}

// operator precedence for parentheses: higher binds tighter.
func prec(n ast.Node) int {
	switch v := n.(type) {
	case *ast.ConditionalNode:
		return 0
	case *ast.BinaryNode:
		switch v.Operator {
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
	case *ast.UnaryNode:
		return 6
	}
	return 9
}

var opText = map[string]string{
	"+": "+", "-": "−", "*": "·", "<": "&lt;", "<=": "≤", ">": "&gt;", ">=": "≥", "==": "=", "!=": "≠",
	"&&": "∧", "and": "∧", "||": "∨", "or": "∨",
}

func (m *mathml) w(s string) { m.b.WriteString(s) }

func (m *mathml) text(tag, s string) {
	m.w("<" + tag + ">" + html.EscapeString(s) + "</" + tag + ">")
}

// node writes one expression node.
func (m *mathml) node(n ast.Node) {
	switch v := n.(type) {
	case *ast.IntegerNode, *ast.FloatNode:
		m.number(n)
	case *ast.BoolNode:
		m.text("mi", map[bool]string{true: "true", false: "false"}[v.Value])
	case *ast.StringNode:
		m.text("mtext", "“"+v.Value+"”")
	case *ast.IdentifierNode:
		m.ident(v.Value)
	case *ast.UnaryNode:
		m.unary(v)
	case *ast.BinaryNode:
		m.binary(v)
	case *ast.MemberNode:
		m.member(v)
	case *ast.CallNode:
		m.call(v)
	case *ast.ConditionalNode:
		m.w("<mrow>")
		m.node(v.Exp1)
		m.text("mtext", " if ")
		m.node(v.Cond)
		m.text("mtext", ", else ")
		m.node(v.Exp2)
		m.w("</mrow>")
	default:
		m.text("mtext", n.String())
	}
}

func (m *mathml) number(n ast.Node) {
	var v float64
	switch x := n.(type) {
	case *ast.IntegerNode:
		v = float64(x.Value)
	case *ast.FloatNode:
		v = x.Value
	}
	m.w(numberMathML(v, 15, true))
}

// ident writes a name, a unit literal, or (when substituting) a value.
func (m *mathml) ident(name string) {
	if l, ok := m.stmt.Literal(name); ok {
		m.w("<mrow>")
		m.w(numberMathML(parseNum(l.Num), 15, true))
		m.w(unitMathML(l.Unit))
		m.w("</mrow>")
		return
	}
	if name == "pi" {
		m.text("mi", "π")
		return
	}
	if m.values != nil {
		if o, ok := m.values(name); ok {
			m.value(o.Value, o.Display)
			return
		}
	}
	m.w(NameMathML(name))
}

// value writes a substituted value with its unit (the default unit when u
// has no dimension but the value has).
func (m *mathml) value(v any, u units.Unit) {
	switch x := v.(type) {
	case units.Quantity:
		if u.Dim != x.D || u.Factor == 0 {
			u = units.DefaultUnit(x)
		}
		m.w(quantityMathML(x, u, m.digits, m.ctx))
	case bool:
		m.text("mi", map[bool]string{true: "true", false: "false"}[x])
	case string:
		m.text("mtext", "“"+x+"”")
	default:
		m.text("mtext", "(state)")
	}
}

func (m *mathml) unary(v *ast.UnaryNode) {
	m.w("<mrow>")
	switch v.Operator {
	case "-":
		m.w("<mo>−</mo>")
	case "!", "not":
		m.w("<mo>¬</mo>")
	}
	m.child(v.Node, prec(v)+1)
	m.w("</mrow>")
}

// child writes a node, parenthesised when it binds looser than min.
func (m *mathml) child(n ast.Node, min int) {
	if prec(n) < min || (m.values != nil && m.isNegative(n) && min > 4) {
		m.w("<mrow><mo>(</mo>")
		m.node(n)
		m.w("<mo>)</mo></mrow>")
		return
	}
	m.node(n)
}

// isNegative tells whether a substituted leaf shows a negative number.
func (m *mathml) isNegative(n ast.Node) bool {
	id, ok := n.(*ast.IdentifierNode)
	if !ok {
		return false
	}
	if l, ok := m.stmt.Literal(id.Value); ok {
		return strings.HasPrefix(l.Num, "-")
	}
	if o, ok := m.values(id.Value); ok {
		q, isQ := o.Value.(units.Quantity)
		return isQ && q.V < 0
	}
	return false
}

func (m *mathml) binary(v *ast.BinaryNode) {
	p := prec(v)
	switch v.Operator {
	case "/":
		m.w("<mfrac>")
		m.node(v.Left)
		m.node(v.Right)
		m.w("</mfrac>")
		return
	case "^", "**":
		m.w("<msup>")
		m.base(v.Left, p)
		m.node(v.Right)
		m.w("</msup>")
		return
	}
	m.w("<mrow>")
	m.child(v.Left, p)
	m.w("<mo>" + opText[v.Operator] + "</mo>")
	right := p
	if v.Operator == "-" || v.Operator == "<" || v.Operator == ">" {
		right = p + 1
	}
	m.child(v.Right, right)
	m.w("</mrow>")
}

// base writes the base of a power: parenthesised unless it is a plain
// symbol (a number with a unit needs parentheses: (2 m)²).
func (m *mathml) base(n ast.Node, p int) {
	id, isID := n.(*ast.IdentifierNode)
	_, isLit := m.stmt.Literal(idName(id, isID))
	if prec(n) <= p || isLit || (isID && m.values != nil) {
		m.w("<mrow><mo>(</mo>")
		m.node(n)
		m.w("<mo>)</mo></mrow>")
		return
	}
	m.node(n)
}

func idName(id *ast.IdentifierNode, ok bool) string {
	if !ok {
		return ""
	}
	return id.Value
}

// member writes st_1.h as h(st₁): the field of the state.
func (m *mathml) member(v *ast.MemberNode) {
	prop, _ := v.Property.(*ast.StringNode)
	if m.values != nil {
		if val, ok := m.memberValue(v); ok {
			m.value(val, units.Unit{})
			return
		}
	}
	field := "?"
	if prop != nil {
		field = prop.Value
	}
	m.w("<mrow>" + NameMathML(field) + "<mo>(</mo>")
	m.node(v.Node)
	m.w("<mo>)</mo></mrow>")
}

// memberValue looks up a field of a named state for substitution.
func (m *mathml) memberValue(v *ast.MemberNode) (any, bool) {
	id, ok := v.Node.(*ast.IdentifierNode)
	prop, ok2 := v.Property.(*ast.StringNode)
	if !ok || !ok2 {
		return nil, false
	}
	st, ok := m.values(id.Value)
	if !ok {
		return nil, false
	}
	rec, ok := st.Value.(eval.Record)
	if !ok {
		return nil, false
	}
	f, err := rec.Field(prop.Value)
	return f, err == nil
}

func (m *mathml) call(v *ast.CallNode) {
	name := v.Callee.String()
	if name == "solve" && len(v.Arguments) == 3 {
		m.solve(v)
		return
	}
	if name == "sqrt" && len(v.Arguments) == 1 {
		m.w("<msqrt>")
		m.node(v.Arguments[0])
		m.w("</msqrt>")
		return
	}
	if name == "abs" && len(v.Arguments) == 1 {
		m.w("<mrow><mo>|</mo>")
		m.node(v.Arguments[0])
		m.w("<mo>|</mo></mrow>")
		return
	}
	m.w("<mrow>")
	m.text("mi", name)
	m.w("<mo>(</mo>")
	for i, a := range v.Arguments {
		if i > 0 {
			m.w("<mo separator=\"true\">,</mo>")
		}
		m.node(a)
	}
	m.w("<mo>)</mo></mrow>")
}

// solve writes solve(L == R, LO, HI) as "L = R, solved for NAME in [LO, HI]".
func (m *mathml) solve(v *ast.CallNode) {
	m.w("<mrow>")
	m.node(v.Arguments[0])
	m.text("mtext", " solved for ")
	m.w(NameMathML(m.stmt.Name))
	m.text("mtext", " in ")
	m.w("<mo>[</mo>")
	m.node(v.Arguments[1])
	m.w("<mo separator=\"true\">,</mo>")
	m.node(v.Arguments[2])
	m.w("<mo>]</mo></mrow>")
}
