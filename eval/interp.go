package eval

import (
	"math"
	"strconv"
	"strings"

	"github.com/expr-lang/expr/ast"

	"github.com/vouchcalc/vouch/units"
)

// Record is a value with named fields, such as a water state; calcs read
// its fields as st.h.
type Record interface {
	Field(name string) (any, error)
	FieldNames() []string
}

// Sourced is a value that names the formulation it comes from, such as a
// water state ("IAPWS-IF97").
type Sourced interface {
	Source() string
}

// scope evaluates one statement's tree.
type scope struct {
	e        *Engine
	s        *Stmt
	sources  []string         // formulations of the property calls, in order
	uses     []string         // property functions and fluids called, in order
	solution *Solution        // set by solve
	interps  []*Interpolation // the interp calls, in order
	res      *resolution      // the statement's slot numbers; nil: look names up by text
	slow     bool             // a quick path failed: evaluate the general way (quick.go)
	written  *units.Unit      // the unit of a data-file value the whole line reads (NAME = data.key)
	wtext    string           // that value as the file writes it
	wfrom    string           // and where: "PATH line N"
}

// note records the formulation of a property result once.
func (c *scope) note(v any) {
	src, ok := v.(Sourced)
	if !ok {
		return
	}
	for _, s := range c.sources {
		if s == src.Source() {
			return
		}
	}
	if c.sources == nil {
		c.sources = oneSource(src.Source()) // shared; its capacity of 1 makes the next append copy
		return
	}
	c.sources = append(c.sources, src.Source())
}

// errAt builds an error at a node.
func (c *scope) errAt(n ast.Node, format string, args ...any) *Error {
	return &Error{Off: c.s.offOfRune(n.Location().From), Msg: sprintf(format, args...)}
}

func (c *scope) eval(n ast.Node) (any, *Error) {
	switch v := n.(type) {
	case *ast.IntegerNode:
		return units.Num(float64(v.Value)), nil
	case *ast.FloatNode:
		return units.Num(v.Value), nil
	case *ast.BoolNode:
		return v.Value, nil
	case *ast.StringNode:
		return v.Value, nil
	case *ast.IdentifierNode:
		return c.ident(v)
	case *ast.UnaryNode:
		return c.unary(v)
	case *ast.BinaryNode:
		return c.binary(v)
	case *ast.ConditionalNode:
		return c.conditional(v)
	case *ast.MemberNode:
		return c.member(v)
	case *ast.CallNode:
		return c.call(v)
	}
	return nil, c.errAt(n, "%s is not supported in a calc expression", describeNode(n))
}

func describeNode(n ast.Node) string {
	switch n.(type) {
	case *ast.ArrayNode:
		return "a list"
	case *ast.MapNode:
		return "a map"
	case *ast.NilNode:
		return "nil"
	case *ast.VariableDeclaratorNode:
		return "let"
	case *ast.PointerNode, *ast.PredicateNode:
		return "a predicate"
	}
	return "this expression (" + n.String() + ")"
}

func (c *scope) ident(v *ast.IdentifierNode) (any, *Error) {
	if l, ok := c.s.Literal(v.Value); ok {
		return l.Q, nil
	}
	if v.Value == "pi" {
		return units.Num(math.Pi), nil
	}
	if val, ok := c.valueOf(v.Value); ok {
		return val, nil
	}
	if line, ok := c.e.Ahead[v.Value]; ok && line > c.s.Line {
		return nil, c.errAt(v, "%s is defined later, on line %d; a line can use only names defined above it", v.Value, line)
	}
	msg := "undefined name " + v.Value
	if near := units.Nearest(v.Value, c.e.Names()); near != "" {
		msg += "; did you mean " + near + "?"
	}
	return nil, c.errAt(v, "%s", msg)
}

func (c *scope) unary(v *ast.UnaryNode) (any, *Error) {
	x, err := c.eval(v.Node)
	if err != nil {
		return nil, err
	}
	switch v.Operator {
	case "-", "+":
		q, ok := x.(units.Quantity)
		if !ok {
			return nil, c.errAt(v, "%s needs a number or quantity, not %s", v.Operator, kindOf(x))
		}
		if v.Operator == "-" {
			n, err := units.Neg(q)
			if err != nil {
				return nil, c.errAt(v, "%s", err.Error())
			}
			q = n
		}
		return q, nil
	case "!", "not":
		b, ok := x.(bool)
		if !ok {
			return nil, c.errAt(v, "%s needs a true/false value, not %s", v.Operator, kindOf(x))
		}
		return !b, nil
	}
	return nil, c.errAt(v, "operator %s is not supported", v.Operator)
}

func (c *scope) binary(v *ast.BinaryNode) (any, *Error) {
	if q, done, slowed := c.quickBinary(v); done { // quick.go
		return q, nil
	} else if slowed {
		defer c.endSlow()
	}
	switch v.Operator {
	case "&&", "and", "||", "or":
		return c.logical(v)
	}
	l, err := c.eval(v.Left)
	if err != nil {
		return nil, err
	}
	r, err := c.eval(v.Right)
	if err != nil {
		return nil, err
	}
	if v.Operator == "==" || v.Operator == "!=" {
		if lb, ok := l.(bool); ok {
			if rb, ok := r.(bool); ok {
				return (lb == rb) == (v.Operator == "=="), nil
			}
		}
	}
	a, aok := l.(units.Quantity)
	b, bok := r.(units.Quantity)
	if !aok || !bok {
		return nil, c.errAt(v, "operator %s needs numbers or quantities, not %s and %s", v.Operator, kindOf(l), kindOf(r))
	}
	return c.arith(v, a, b)
}

func (c *scope) arith(v *ast.BinaryNode, a, b units.Quantity) (any, *Error) {
	switch v.Operator {
	case "<", "<=", ">", ">=", "==", "!=":
		return c.compare(v, a, b)
	case "+", "-", "*", "^", "**":
	case "/":
		if b.V == 0 {
			return nil, c.errAt(v, "division by zero: %s is 0", v.Right.String())
		}
	default:
		return nil, c.errAt(v, "operator %s is not supported in a calc", v.Operator)
	}
	q, err := arithStep(v.Operator, a, b)
	if err != nil {
		return nil, c.errAt(v, "%s", err.Error())
	}
	if math.IsNaN(q.V) || math.IsInf(q.V, 0) {
		return nil, c.errAt(v, "the result of %s is not a finite number", strings.TrimSpace(c.text(v)))
	}
	return q, nil
}

// arithStep applies an arithmetic operator (+ - * / ^ **) to two
// quantities with the unit rules; the general and the quick evaluator share
// it, so both give the same value and the same unit error.
func arithStep(op string, a, b units.Quantity) (units.Quantity, error) {
	switch op {
	case "+":
		return units.Add(a, b)
	case "-":
		return units.Sub(a, b)
	case "*":
		return units.Mul(a, b)
	case "/":
		return units.Div(a, b)
	default: // "^", "**"
		return units.Pow(a, b)
	}
}

// text returns the source text of a node as written (literals included).
func (c *scope) text(n ast.Node) string {
	loc := n.Location()
	from, to := c.s.offOfRune(loc.From)-c.s.ExprOff, c.s.offOfRune(loc.To)-c.s.ExprOff
	if from < 0 || to > len(c.s.Expr) || from >= to {
		return n.String()
	}
	return c.s.Expr[from:to]
}

func (c *scope) compare(v *ast.BinaryNode, a, b units.Quantity) (any, *Error) {
	k, err := units.Compare(a, b)
	if err != nil {
		return nil, c.errAt(v, "%s", err.Error())
	}
	switch v.Operator {
	case "<":
		return k < 0, nil
	case "<=":
		return k <= 0, nil
	case ">":
		return k > 0, nil
	case ">=":
		return k >= 0, nil
	case "==":
		return k == 0, nil
	}
	return k != 0, nil
}

func (c *scope) logical(v *ast.BinaryNode) (any, *Error) {
	l, err := c.evalBool(v.Left, v.Operator)
	if err != nil {
		return nil, err
	}
	and := v.Operator == "&&" || v.Operator == "and"
	if l != and { // short-circuit: false && …, true || …
		return l, nil
	}
	return c.evalBool(v.Right, v.Operator)
}

func (c *scope) evalBool(n ast.Node, op string) (bool, *Error) {
	x, err := c.eval(n)
	if err != nil {
		return false, err
	}
	b, ok := x.(bool)
	if !ok {
		return false, c.errAt(n, "%s needs true/false values, not %s", op, kindOf(x))
	}
	return b, nil
}

func (c *scope) conditional(v *ast.ConditionalNode) (any, *Error) {
	cond, err := c.evalBool(v.Cond, "a condition")
	if err != nil {
		return nil, err
	}
	if cond {
		return c.eval(v.Exp1)
	}
	return c.eval(v.Exp2)
}

func (c *scope) member(v *ast.MemberNode) (any, *Error) {
	x, err := c.eval(v.Node)
	if err != nil {
		return nil, err
	}
	prop, ok := v.Property.(*ast.StringNode)
	if !ok || v.Method {
		return nil, c.errAt(v, "only a field name may follow a dot")
	}
	rec, ok := x.(Record)
	if !ok {
		return nil, c.errAt(v, "%s has no fields; .%s needs a state", kindOf(x), prop.Value)
	}
	f, ferr := rec.Field(prop.Value)
	if ferr != nil {
		return nil, c.errAt(v.Property, "%s", ferr.Error())
	}
	if vs, ok := rec.(*Values); ok && ast.Node(v) == c.s.tree {
		if u, ok := vs.WrittenUnit(prop.Value); ok {
			c.written = &u
		}
		kv := vs.Pairs()[vs.index[prop.Value]]
		c.wtext, c.wfrom = kv.Value, vs.Path+" line "+strconv.Itoa(kv.Line)
	}
	return f, nil
}

// kindOf names a value's kind for messages.
func kindOf(x any) string {
	switch v := x.(type) {
	case units.Quantity:
		if v.D.IsNone() {
			return "a number"
		}
		return "a quantity of " + v.D.Name() + " (" + units.DefaultUnit(v).String() + ")"
	case bool:
		return "true/false"
	case string:
		return "text"
	case *Values:
		return "a data file"
	case Record:
		return "a state"
	case *Table:
		return "a table"
	}
	return "a value"
}
