package eval

import (
	"math"

	"github.com/expr-lang/expr/ast"

	"github.com/vouchcalc/vouch/units"
)

// Solution records how solve found a value, for the package.
type Solution struct {
	Lo, Hi     units.Quantity // the bracket
	Residual   units.Quantity // left − right at the solution
	Iterations int            // evaluations of the equation
}

// Solve tolerances: the root is found to a relative 1e-10 of the bracket
// within at most maxSolveEvals evaluations.
const (
	solveRelTol   = 1e-10
	maxSolveEvals = 100
	// rootResidual is the largest residual at a root, relative to the larger residual at the
	// bounds. With the bracket narrowed to 1e-10 of its width, a root of any equation that is
	// not steeper there than 1e4 times its mean slope over the bounds leaves far less.
	rootResidual = 1e-6
)

// solve evaluates NAME = solve(LEFT == RIGHT, LO, HI) by Brent's method:
// the value of NAME between LO and HI for which LEFT equals RIGHT.
func (c *scope) solve(v *ast.CallNode) (any, *Error) {
	if c.s.Kind != Def || c.s.tree != ast.Node(v) {
		return nil, c.errAt(v, "solve must be the whole expression of a definition: NAME = solve(LEFT == RIGHT, LO, HI)")
	}
	if len(v.Arguments) != 3 {
		return nil, c.errAt(v, "solve(LEFT == RIGHT, LO, HI) takes 3 arguments, not %d", len(v.Arguments))
	}
	eq, ok := v.Arguments[0].(*ast.BinaryNode)
	if !ok || eq.Operator != "==" {
		return nil, c.errAt(v.Arguments[0], "the first argument of solve must be an equation LEFT == RIGHT")
	}
	lo, hi, err := c.bracket(v)
	if err != nil {
		return nil, err
	}
	f := func(x float64) (float64, units.Quantity, *Error) { return c.residual(eq, lo, x) }
	return c.brent(v, f, lo, hi)
}

// bracket evaluates LO and HI and checks that they agree in dimension.
func (c *scope) bracket(v *ast.CallNode) (units.Quantity, units.Quantity, *Error) {
	var q [2]units.Quantity
	for i, a := range v.Arguments[1:] {
		x, err := c.eval(a)
		if err != nil {
			return q[0], q[1], err
		}
		qq, ok := x.(units.Quantity)
		if !ok {
			return q[0], q[1], c.errAt(a, "a solve bound must be a number or quantity, not %s", kindOf(x))
		}
		q[i] = qq
	}
	if q[0].D != q[1].D {
		return q[0], q[1], c.errAt(v, "the bounds of solve disagree: %s and %s", kindOf(q[0]), kindOf(q[1]))
	}
	if c.s.hasUnit && c.s.display.Dim != q[0].D {
		return q[0], q[1], c.errAt(v, "the bounds of solve are %s, but %s is shown in %s, which is %s", kindOf(q[0]), c.s.Name, c.s.Unit, c.s.display.Dim.Name())
	}
	if !(q[0].V < q[1].V) {
		return q[0], q[1], c.errAt(v, "solve needs LO below HI")
	}
	return q[0], q[1], nil
}

// residual evaluates LEFT − RIGHT with NAME set to x (in the bounds' unit kind).
func (c *scope) residual(eq *ast.BinaryNode, like units.Quantity, x float64) (float64, units.Quantity, *Error) {
	name := c.s.Name
	sl := c.e.slotFor(name)
	sl.val, sl.has = units.Quantity{V: x, D: like.D, T: like.T, P: like.P}, true
	defer c.e.unset(name)
	l, err := c.eval(eq.Left)
	if err != nil {
		return 0, units.Quantity{}, err
	}
	r, err := c.eval(eq.Right)
	if err != nil {
		return 0, units.Quantity{}, err
	}
	lq, ok1 := l.(units.Quantity)
	rq, ok2 := r.(units.Quantity)
	if !ok1 || !ok2 {
		return 0, units.Quantity{}, c.errAt(eq, "both sides of the equation must be numbers or quantities")
	}
	if lq.D != rq.D {
		return 0, units.Quantity{}, c.errAt(eq, "the two sides of the equation disagree: %s and %s", kindOf(lq), kindOf(rq))
	}
	return lq.V - rq.V, units.Quantity{V: lq.V - rq.V, D: lq.D}, nil
}

type residualFunc func(x float64) (float64, units.Quantity, *Error)

// brent finds the root of f between lo and hi (R. P. Brent, Algorithms for
// Minimization without Derivatives, 1973, ch. 4: bisection, secant and
// inverse quadratic interpolation).
func (c *scope) brent(v *ast.CallNode, f residualFunc, lo, hi units.Quantity) (any, *Error) {
	a, b := lo.V, hi.V
	fa, _, err := f(a)
	if err != nil {
		return nil, err
	}
	fb, rb, err := f(b)
	if err != nil {
		return nil, err
	}
	if float64(fa*fb) > 0 {
		_, ra, _ := f(a)
		return nil, c.errAt(v, "the equation does not change sign between the bounds: left − right is %s at %s and %s at %s; choose bounds around the root",
			quantityText(ra), quantityText(lo), quantityText(rb), quantityText(hi))
	}
	scale := math.Max(math.Abs(fa), math.Abs(fb)) // the residual's size at the bounds
	tol := float64(solveRelTol * (b - a))
	n := 2
	cc, fc := a, fa
	d := b - a
	e := d
	for n < maxSolveEvals {
		if fb == 0 {
			break
		}
		if float64(fb*fc) > 0 {
			cc, fc, d = a, fa, b-a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, cc = b, cc, b
			fa, fb, fc = fb, fc, fb
		}
		m := float64(0.5 * (cc - b))
		if math.Abs(m) <= tol {
			break
		}
		d, e = brentStep(a, b, cc, fa, fb, fc, m, d, e, tol)
		a, fa = b, fb
		if math.Abs(d) > tol {
			b += d
		} else {
			b += math.Copysign(tol, m)
		}
		fb, rb, err = f(b)
		if err != nil {
			return nil, err
		}
		n++
	}
	if n >= maxSolveEvals {
		return nil, c.errAt(v, "solve did not converge in %d evaluations", maxSolveEvals)
	}
	// A sign change narrowed to a point whose residual is still large may be a jump or a pole of
	// the equation rather than a root. Bisecting the last bracket down to adjacent numbers tells
	// them apart: the residual of a continuous equation falls with the bracket, that of a step
	// or a pole does not.
	if math.Abs(fb) > float64(rootResidual*scale) {
		var ok bool
		var extra int
		if b, rb, ok, extra, err = settle(f, b, cc, fb, fc, float64(rootResidual*scale)); err != nil {
			return nil, err
		}
		n += extra
		if !ok {
			x := units.Quantity{V: b, D: lo.D, T: lo.T, P: lo.P}
			return nil, c.errAt(v, "the equation changes sign between the bounds but has no root there: left − right jumps across %s, where it is still %s; look for a step or a pole in the equation, or choose bounds around a root",
				quantityText(x), quantityText(rb))
		}
	}
	c.solution = &Solution{Lo: lo, Hi: hi, Residual: rb, Iterations: n}
	return units.Quantity{V: b, D: lo.D, T: lo.T, P: lo.P}, nil
}

// settle bisects a bracket [x0, x1] whose residuals f0 and f1 differ in sign until its ends are
// adjacent numbers, and returns the end with the smaller residual, whether that residual is
// within limit, and the number of evaluations it made.
func settle(f residualFunc, x0, x1, f0, f1, limit float64) (float64, units.Quantity, bool, int, *Error) {
	n := 1
	for i := 0; i < 1100; i++ { // enough halvings to reach adjacent float64 numbers
		m := x0 + float64((x1-x0)/2)
		if m == x0 || m == x1 {
			break
		}
		fm, _, err := f(m)
		n++
		if err != nil {
			break // the equation has no value there (a division by zero at a pole): not a root
		}
		if fm == 0 {
			x0, f0 = m, 0
			break
		}
		if (fm > 0) == (f0 > 0) {
			x0, f0 = m, fm
		} else {
			x1, f1 = m, fm
		}
	}
	x := x0
	if math.Abs(f1) < math.Abs(f0) {
		x = x1
	}
	fx, rx, err := f(x)
	if err != nil {
		return 0, units.Quantity{}, false, n, err
	}
	return x, rx, math.Abs(fx) <= limit, n, nil
}

// brentStep chooses interpolation or bisection; it returns the step and the
// step before it.
func brentStep(a, b, c, fa, fb, fc, m, d, e, tol float64) (float64, float64) {
	if math.Abs(e) < tol || math.Abs(fa) <= math.Abs(fb) {
		return m, m
	}
	var p, q float64
	s := fb / fa
	if a == c {
		p, q = float64(2*m*s), 1-s
	} else {
		qq, r := fa/fc, fb/fc
		p = float64(s * (float64(2*m*qq*(qq-r)) - float64((b-a)*(r-1))))
		q = float64((qq - 1) * (r - 1) * (s - 1))
	}
	if p > 0 {
		q = -q
	} else {
		p = -p
	}
	if float64(2*p) < math.Min(float64(3*m*q)-math.Abs(float64(tol*q)), math.Abs(float64(e*q))) {
		return p / q, d
	}
	return m, m
}

func quantityText(q units.Quantity) string {
	u := units.DefaultUnit(q)
	s, err := q.Text(u, 4, units.StandardAtmosphere)
	if err != nil {
		return units.FormatSig(q.V, 4)
	}
	return s
}
