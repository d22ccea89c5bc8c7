package eval

import (
	"math"
	"sort"
	"strings"

	"github.com/expr-lang/expr/ast"

	"github.com/vouchcalc/vouch/internal/fpmath"
	"github.com/vouchcalc/vouch/units"
)

// Func is a function a calc can call.
type Func struct {
	Name    string
	Args    string // argument kinds, for listings: "x", "A, B"
	Doc     string // one line
	Range   string // validity range, for listings; "" when unrestricted
	MinArgs int
	MaxArgs int // -1: any number
	// Call computes the result; an error is reported at the call. args is
	// lent for the call only (the engine reuses its storage): keep values,
	// not the slice.
	Call func(args []any) (any, error)
}

// funcs is the function table; property functions are added in props.go.
var funcs = map[string]*Func{}

func register(f *Func) {
	if f.Call == nil { // evaluated by the engine itself (solve, csv, yaml)
		name := f.Name
		f.Call = func([]any) (any, error) { return nil, errorf("%s must be called in a calc line", name) }
	}
	funcs[f.Name] = f
}

// Funcs returns every function sorted by name, for `vouch functions`.
func Funcs() []*Func {
	out := make([]*Func, 0, len(funcs))
	for _, f := range funcs {
		out = append(out, f)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out
}

// LookupFunc returns the function of a name.
func LookupFunc(name string) (*Func, bool) {
	f, ok := funcs[name]
	return f, ok
}

func init() {
	for _, m := range []struct {
		name, doc string
		f         func(float64) float64
	}{
		{"exp", "e raised to x", fpmath.Exp},
		{"ln", "natural logarithm", fpmath.Log},
		{"log10", "base-10 logarithm", fpmath.Log10},
		{"sin", "sine of an angle in radians", fpmath.Sin},
		{"cos", "cosine of an angle in radians", fpmath.Cos},
		{"tan", "tangent of an angle in radians", fpmath.Tan},
		{"asin", "arc sine, in radians", fpmath.Asin},
		{"acos", "arc cosine, in radians", fpmath.Acos},
		{"atan", "arc tangent, in radians", fpmath.Atan},
		{"floor", "largest whole number not above x", math.Floor},
		{"ceil", "smallest whole number not below x", math.Ceil},
		{"round", "nearest whole number, halves away from zero", math.Round},
	} {
		register(&Func{Name: m.name, Args: "x (dimensionless)", Doc: m.doc, MinArgs: 1, MaxArgs: 1, Call: dimensionless(m.name, m.f)})
	}
	register(&Func{Name: "solve", Args: "LEFT == RIGHT, LO, HI", MinArgs: 3, MaxArgs: 3,
		Doc: "NAME = solve(...): the NAME between LO and HI for which LEFT equals RIGHT (Brent's method, to 1e-10 of the bracket)"})
	register(&Func{Name: "sqrt", Args: "x", Doc: "square root; the dimension's exponents must be even", MinArgs: 1, MaxArgs: 1, Call: callSqrt})
	register(&Func{Name: "abs", Args: "x", Doc: "absolute value", MinArgs: 1, MaxArgs: 1, Call: callAbs})
	register(&Func{Name: "min", Args: "x, y, ...", Doc: "smallest of its arguments (same dimension)", MinArgs: 1, MaxArgs: -1, Call: extreme(-1)})
	register(&Func{Name: "max", Args: "x, y, ...", Doc: "largest of its arguments (same dimension)", MinArgs: 1, MaxArgs: -1, Call: extreme(1)})
}

func dimensionless(name string, f func(float64) float64) func([]any) (any, error) {
	return func(args []any) (any, error) {
		q, err := quantityArg(args, 0)
		if err != nil {
			return nil, err
		}
		if !q.D.IsNone() {
			return nil, errorf("%s needs a dimensionless argument, not %s (%s)", name, q.D.Name(), units.DefaultUnit(q))
		}
		return units.Num(f(q.V)), nil
	}
}

func callSqrt(args []any) (any, error) {
	q, err := quantityArg(args, 0)
	if err != nil {
		return nil, err
	}
	var d units.Dim
	for i, e := range q.D {
		if e%2 != 0 {
			return nil, errorf("sqrt of %s (%s) has no unit: its exponents are not all even", q.D.Name(), units.DefaultUnit(q))
		}
		d[i] = e / 2
	}
	if q.V < 0 {
		return nil, errorf("sqrt of a negative value")
	}
	return units.Quantity{V: math.Sqrt(q.V), D: d, T: scaleIfTemp(d)}, nil
}

func scaleIfTemp(d units.Dim) units.Temp {
	if d == units.DimTemperature {
		return units.Scale
	}
	return units.Rel
}

func callAbs(args []any) (any, error) {
	q, err := quantityArg(args, 0)
	if err != nil {
		return nil, err
	}
	return units.AbsValue(q)
}

func extreme(sign int) func([]any) (any, error) {
	return func(args []any) (any, error) {
		best, err := quantityArg(args, 0)
		if err != nil {
			return nil, err
		}
		for i := 1; i < len(args); i++ {
			q, err := quantityArg(args, i)
			if err != nil {
				return nil, err
			}
			k, err := units.Compare(q, best)
			if err != nil {
				return nil, err
			}
			if k == sign {
				best = q
			}
		}
		return best, nil
	}
}

// quantityArg returns argument i as a quantity.
func quantityArg(args []any, i int) (units.Quantity, error) {
	q, ok := args[i].(units.Quantity)
	if !ok {
		return q, errorf("argument %d must be a number or quantity, not %s", i+1, kindOf(args[i]))
	}
	return q, nil
}

func (c *scope) call(v *ast.CallNode) (any, *Error) {
	id, ok := v.Callee.(*ast.IdentifierNode)
	if !ok {
		return nil, c.errAt(v, "only a function name can be called")
	}
	if id.Value == "solve" {
		return c.solve(v)
	}
	switch id.Value {
	case "csv":
		return c.withArgs(v, c.e.readTable)
	case "yaml":
		return c.withArgs(v, c.e.readValues)
	}
	f, ok := funcs[id.Value]
	if !ok {
		names := make([]string, 0, len(funcs))
		for n := range funcs {
			names = append(names, n)
		}
		msg := "unknown function " + id.Value
		if near := units.Nearest(id.Value, names); near != "" {
			msg += "; did you mean " + near + "?"
		}
		return nil, c.errAt(v, "%s", msg)
	}
	if n := len(v.Arguments); n < f.MinArgs || (f.MaxArgs >= 0 && n > f.MaxArgs) {
		return nil, c.errAt(v, "%s(%s) takes %s, not %d", f.Name, f.Args, argCount(f), n)
	}
	args, base, err := c.pushArgs(v.Arguments)
	if err != nil {
		return nil, err
	}
	var out any
	var ferr error
	if f.Name == "interp" {
		var ip *Interpolation
		out, ip, ferr = interpDetail(args)
		if ip != nil {
			c.interps = append(c.interps, ip)
		}
	} else {
		out, ferr = f.Call(args)
	}
	if ferr == nil && propertyFuncs[f.Name] {
		c.use(f.Name, args)
	}
	c.e.popArgs(base)
	if ferr != nil {
		return nil, c.errAt(v, "%s", ferr.Error())
	}
	c.note(out)
	if q, ok := out.(units.Quantity); ok && (math.IsNaN(q.V) || math.IsInf(q.V, 0)) {
		return nil, c.errAt(v, "%s gives no finite result here", f.Name)
	}
	return out, nil
}

// propertyFuncs are the property functions whose use a manifest records.
var propertyFuncs = map[string]bool{"water": true, "water_sat": true, "fluid": true, "fluid_sat": true, "fluid_crit": true}

// use records that the statement called a property function, and for the
// fluid functions which fluid, as "fluid:NAME" (lower case).
func (c *scope) use(name string, args []any) {
	c.addUse(name)
	if strings.HasPrefix(name, "fluid") && len(args) > 0 {
		if fl, ok := args[0].(string); ok {
			c.addUse("fluid:" + strings.ToLower(strings.TrimSpace(fl)))
		}
	}
}

func (c *scope) addUse(u string) {
	for _, x := range c.uses {
		if x == u {
			return
		}
	}
	c.uses = append(c.uses, u)
}

func argCount(f *Func) string {
	switch {
	case f.MaxArgs < 0:
		return sprintf("at least %d arguments", f.MinArgs)
	case f.MinArgs == f.MaxArgs && f.MinArgs == 1:
		return "1 argument"
	case f.MinArgs == f.MaxArgs:
		return sprintf("%d arguments", f.MinArgs)
	}
	return sprintf("%d to %d arguments", f.MinArgs, f.MaxArgs)
}

// withArgs evaluates a call's arguments and runs f on them.
func (c *scope) withArgs(v *ast.CallNode, f func([]any) (any, error)) (any, *Error) {
	args := make([]any, len(v.Arguments))
	for i, a := range v.Arguments {
		x, err := c.eval(a)
		if err != nil {
			return nil, err
		}
		args[i] = x
	}
	if len(args) != 1 {
		return nil, c.errAt(v, "%s(\"path\") takes 1 argument, not %d", v.Callee.String(), len(args))
	}
	out, err := f(args)
	if err != nil {
		return nil, c.errAt(v, "%s", err.Error())
	}
	return out, nil
}
