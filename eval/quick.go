package eval

import (
	"math"

	"github.com/expr-lang/expr/ast"

	"github.com/vouchcalc/vouch/units"
)

// The quick path evaluates an arithmetic expression (+ − × ÷ ^ over
// numbers, quantities and whatever else yields a quantity) keeping its
// intermediate results as units.Quantity, so that only the result is boxed
// in an interface: a sweep point then allocates once per line, not once
// per operator. It gives up at anything unusual — an error, a value that is
// not a quantity, a division by zero, a result that is not finite — and
// the caller evaluates the expression again the general way, which finds the
// same values and reports the error at its position. Both paths call the
// same units functions on the same values in the same order, so they agree
// to the bit.

// quickBinary tries the quick path on an arithmetic node: done with its
// value, or not; slowed when it failed here, so that the general path below
// does not try again at every level (the caller then calls endSlow).
func (c *scope) quickBinary(v *ast.BinaryNode) (q any, done, slowed bool) {
	if c.slow || noQuick || !isArith(v.Operator) {
		return nil, false, false
	}
	if x, ok := c.quickArith(v); ok {
		return x, true, false
	}
	c.slow = true
	return nil, false, true
}

// endSlow ends the general evaluation that a failed quick path started.
func (c *scope) endSlow() { c.slow = false }

// noQuick turns the quick path off, for the test that compares the paths.
var noQuick = false

func isArith(op string) bool {
	switch op {
	case "+", "-", "*", "/", "^", "**":
		return true
	}
	return false
}

// quick evaluates a node to a quantity; false: take the general path.
func (c *scope) quick(n ast.Node) (units.Quantity, bool) {
	switch v := n.(type) {
	case *ast.IdentifierNode:
		if l, ok := c.s.Literal(v.Value); ok {
			return l.Q, true
		}
	case *ast.IntegerNode:
		return units.Num(float64(v.Value)), true
	case *ast.FloatNode:
		return units.Num(v.Value), true
	case *ast.BinaryNode:
		if isArith(v.Operator) {
			return c.quickArith(v)
		}
	case *ast.UnaryNode:
		if v.Operator == "-" || v.Operator == "+" {
			q, ok := c.quick(v.Node)
			if ok && v.Operator == "-" {
				n, err := units.Neg(q)
				if err != nil {
					return units.Quantity{}, false // the general path reports it at its node
				}
				q = n
			}
			return q, ok
		}
	}
	x, err := c.eval(n)
	if err != nil {
		return units.Quantity{}, false
	}
	q, ok := x.(units.Quantity)
	return q, ok
}

// quickArith is scope.arith for the arithmetic operators, on the quick path.
func (c *scope) quickArith(v *ast.BinaryNode) (units.Quantity, bool) {
	a, ok := c.quick(v.Left)
	if !ok {
		return a, false
	}
	b, ok := c.quick(v.Right)
	if !ok {
		return b, false
	}
	if v.Operator == "/" && b.V == 0 {
		return units.Quantity{}, false // the general path reports it at its node
	}
	q, err := arithStep(v.Operator, a, b)
	if err != nil || math.IsNaN(q.V) || math.IsInf(q.V, 0) {
		return q, false
	}
	return q, true
}
