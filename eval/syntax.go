package eval

import (
	"github.com/expr-lang/expr/ast"
)

// Node is a node of a parsed expression in this package's own types, for
// renderers: the expression library stays behind this package.
type Node interface {
	node() ast.Node
}

type base struct{ src ast.Node }

func (b base) node() ast.Node { return b.src }

// Number is a plain number as written.
type Number struct {
	base
	Value float64
}

// Quantity is a unit literal such as 12.5 MPa.
type Quantity struct {
	base
	Lit *Literal
}

// Name is a defined name, or the constant pi.
type Name struct {
	base
	Name string
}

// Text is a string in quotes.
type Text struct {
	base
	Value string
}

// Bool is true or false.
type Bool struct {
	base
	Value bool
}

// Unary is -X, +X, !X or not X.
type Unary struct {
	base
	Op string
	X  Node
}

// Binary is L op R; Op is as written ("+", "*", "^", "**", ">=", "and", ...).
type Binary struct {
	base
	Op   string
	L, R Node
}

// Field is X.Name.
type Field struct {
	base
	X    Node
	Name string
}

// Call is Func(Args...).
type Call struct {
	base
	Func string
	Args []Node
}

// Cond is Cond ? Then : Else.
type Cond struct {
	base
	Cond, Then, Else Node
}

// Other is any expression a renderer has no form for; Text is its source.
type Other struct {
	base
	Text string
}

// Syntax returns the statement's expression tree, built on first use.
func (s *Stmt) Syntax() Node {
	if s.syntax == nil {
		s.syntax = s.convert(s.tree)
	}
	return s.syntax
}

func (s *Stmt) convert(n ast.Node) Node {
	b := base{n}
	switch v := n.(type) {
	case *ast.IntegerNode:
		return &Number{b, float64(v.Value)}
	case *ast.FloatNode:
		return &Number{b, v.Value}
	case *ast.BoolNode:
		return &Bool{b, v.Value}
	case *ast.StringNode:
		return &Text{b, v.Value}
	case *ast.IdentifierNode:
		if l, ok := s.Literal(v.Value); ok {
			return &Quantity{b, l}
		}
		return &Name{b, v.Value}
	case *ast.UnaryNode:
		return &Unary{b, v.Operator, s.convert(v.Node)}
	case *ast.BinaryNode:
		return &Binary{b, v.Operator, s.convert(v.Left), s.convert(v.Right)}
	case *ast.ConditionalNode:
		return &Cond{b, s.convert(v.Cond), s.convert(v.Exp1), s.convert(v.Exp2)}
	case *ast.MemberNode:
		if p, ok := v.Property.(*ast.StringNode); ok {
			return &Field{b, s.convert(v.Node), p.Value}
		}
	case *ast.CallNode:
		return s.convertCall(b, v)
	}
	return &Other{b, n.String()}
}

func (s *Stmt) convertCall(b base, v *ast.CallNode) Node {
	id, ok := v.Callee.(*ast.IdentifierNode)
	if !ok {
		return &Other{b, v.String()}
	}
	c := &Call{base: b, Func: id.Value}
	for _, a := range v.Arguments {
		c.Args = append(c.Args, s.convert(a))
	}
	return c
}

// EvalNode evaluates a part of a statement's expression with the names the
// engine holds now, as a renderer substituting numbers needs.
func (e *Engine) EvalNode(s *Stmt, n Node) (any, error) {
	v, err := (&scope{e: e, s: s}).eval(n.node())
	if err != nil {
		return nil, err
	}
	return v, nil
}
