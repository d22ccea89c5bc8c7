package main

import (
	"bytes"
	"fmt"
	"go/ast"
	"go/constant"
	"go/format"
	"go/token"
	"go/types"
	"math"
	"os"
	"sort"
	"strconv"
	"strings"
)

// fpmathPath is the package of guarded copies, below the module path.
const fpmathPath = "/internal/fpmath"

// inexact are the functions of package math whose results are not exactly
// specified (so may differ by architecture); provided marks those that
// internal/fpmath copies. A use of another one is an error.
var inexact = map[string]bool{
	"Exp": true, "Exp2": true, "Expm1": true, "Log": true, "Log2": true, "Log10": true, "Log1p": true,
	"Pow": true, "Cbrt": true, "Hypot": true, "Sin": true, "Cos": true, "Tan": true,
	"Asin": true, "Acos": true, "Atan": true,
	"Atan2": false, "Sincos": false, "Sinh": false, "Cosh": false, "Tanh": false,
	"Asinh": false, "Acosh": false, "Atanh": false, "Erf": false, "Erfc": false, "Erfinv": false,
	"Erfcinv": false, "Gamma": false, "Lgamma": false, "J0": false, "J1": false, "Jn": false,
	"Y0": false, "Y1": false, "Yn": false, "Logb": false, "Ilogb": false, "Remainder": false,
}

// FileResult says how many edits one file needed.
type FileResult struct {
	Path  string
	Edits int
}

// Result lists the files that needed edits.
type Result struct {
	Changed []FileResult
}

// Run guards the packages in dirs (every package below the current
// directory when dirs is empty). With write false it only reports.
func Run(dirs []string, write bool) (*Result, error) {
	pkgs, err := load(patternsOf(dirs))
	if err != nil {
		return nil, err
	}
	res := &Result{}
	for _, p := range pkgs {
		for i := range p.files {
			g := &guard{pkg: p, file: p.files[i], src: p.srcs[i]}
			out, n, err := g.rewrite()
			if err != nil {
				return nil, fmt.Errorf("%s: %v", p.names[i], err)
			}
			if n == 0 {
				continue
			}
			res.Changed = append(res.Changed, FileResult{p.names[i], n})
			if write {
				if err := os.WriteFile(p.names[i], out, 0o644); err != nil {
					return nil, err
				}
			}
		}
	}
	return res, nil
}

// edit inserts text at off, or replaces src[off:end] with it. span orders
// insertions at one offset: openers of wider nodes first, closers of
// narrower nodes first.
type edit struct {
	off, end int
	text     string
	span     int
	kind     int // 0 closer, 1 opener, 2 replacement
}

// guard rewrites one file.
type guard struct {
	pkg   *pkg
	file  *ast.File
	src   []byte
	edits []edit
	errs  []string
	// math uses: replaced and kept
	replaced, kept int
}

func (g *guard) off(p token.Pos) int { return g.pkg.fset.Position(p).Offset }

func (g *guard) errorf(p token.Pos, format string, args ...any) {
	g.errs = append(g.errs, fmt.Sprintf("%s: %s", g.pkg.fset.Position(p), fmt.Sprintf(format, args...)))
}

// wrap adds conv( before n and ) after it.
func (g *guard) wrap(n ast.Node, conv string) {
	a, b := g.off(n.Pos()), g.off(n.End())
	g.edits = append(g.edits, edit{off: a, end: a, text: conv + "(", span: b - a, kind: 1},
		edit{off: b, end: b, text: ")", span: b - a, kind: 0})
}

// rewrite returns the guarded file and the number of edits.
func (g *guard) rewrite() ([]byte, int, error) {
	var stack []ast.Node
	ast.Inspect(g.file, func(n ast.Node) bool {
		if n == nil {
			stack = stack[:len(stack)-1]
			return true
		}
		g.visit(n, stack)
		stack = append(stack, n)
		return true
	})
	if g.replaced > 0 {
		g.fixImports()
	}
	if len(g.errs) > 0 {
		return nil, 0, fmt.Errorf("%s", strings.Join(g.errs, "\n"))
	}
	if len(g.edits) == 0 {
		return g.src, 0, nil
	}
	out, err := format.Source(g.apply())
	if err != nil {
		return nil, 0, fmt.Errorf("the rewritten file does not format: %v", err)
	}
	if bytes.Equal(out, g.src) {
		return g.src, 0, nil
	}
	return out, len(g.edits), nil
}

func (g *guard) visit(n ast.Node, stack []ast.Node) {
	switch n := n.(type) {
	case *ast.BinaryExpr:
		if n.Op == token.MUL || n.Op == token.QUO && g.halving(n.Y) {
			g.product(n, stack)
		}
	case *ast.AssignStmt:
		if n.Tok == token.MUL_ASSIGN || n.Tok == token.QUO_ASSIGN && len(n.Rhs) == 1 && g.halving(n.Rhs[0]) {
			g.mulAssign(n)
		}
	case *ast.SelectorExpr:
		g.mathUse(n)
	}
}

// halving reports whether e is a constant power of two (2, 16, 0.5, ...):
// the compiler turns x / e into the exact product x * (1/e), which may
// then fuse with an addition like any other product.
func (g *guard) halving(e ast.Expr) bool {
	tv, ok := g.pkg.info.Types[e]
	if !ok || tv.Value == nil {
		return false
	}
	v, _ := constant.Float64Val(constant.ToFloat(tv.Value))
	frac, _ := math.Frexp(v)
	return frac == 0.5 || frac == -0.5
}

// floatConv returns the conversion that rounds a value of type t, or ""
// when t is not a floating-point type.
func (g *guard) floatConv(t types.Type, at token.Pos) string {
	b, ok := types.Unalias(t).Underlying().(*types.Basic)
	if !ok {
		return ""
	}
	if b.Info()&types.IsComplex != 0 {
		g.errorf(at, "complex product: fpguard does not guard complex arithmetic")
		return ""
	}
	if b.Info()&types.IsFloat == 0 {
		return ""
	}
	switch t := types.Unalias(t).(type) {
	case *types.Basic:
		return t.Name()
	case *types.Named:
		if t.Obj().Pkg() == g.pkg.types {
			return t.Obj().Name()
		}
	}
	g.errorf(at, "product of type %s: fpguard guards only basic and local float types", t)
	return ""
}

// product wraps a floating-point product (or a quotient by a power of two,
// which the compiler makes a product) unless it is constant, already
// converted to its own type, or consumed by a multiplication or division.
func (g *guard) product(n *ast.BinaryExpr, stack []ast.Node) {
	tv, ok := g.pkg.info.Types[n]
	if !ok || tv.Value != nil {
		return
	}
	conv := g.floatConv(tv.Type, n.Pos())
	if conv == "" {
		return
	}
	i := len(stack) - 1
	for i >= 0 {
		if _, paren := stack[i].(*ast.ParenExpr); !paren {
			break
		}
		i--
	}
	if i >= 0 {
		switch p := stack[i].(type) {
		case *ast.BinaryExpr:
			if p.Op == token.MUL || p.Op == token.QUO {
				return
			}
		case *ast.CallExpr:
			if ft, ok := g.pkg.info.Types[p.Fun]; ok && ft.IsType() && len(p.Args) == 1 && types.Identical(ft.Type, tv.Type) {
				return
			}
		case *ast.AssignStmt:
			if p.Tok == token.MUL_ASSIGN || p.Tok == token.QUO_ASSIGN {
				return
			}
		}
	}
	g.wrap(n, conv)
}

// mulAssign rewrites x *= y as x = T(x * y), parenthesising y when it is
// an operation, so the product is rounded like any other; likewise x /= 2
// as x = T(x / 2).
func (g *guard) mulAssign(n *ast.AssignStmt) {
	if len(n.Lhs) != 1 || len(n.Rhs) != 1 {
		return
	}
	conv := g.floatConv(g.pkg.info.Types[n.Lhs[0]].Type, n.Pos())
	if conv == "" {
		return
	}
	if !pure(n.Lhs[0]) {
		g.errorf(n.Pos(), "x *= y with a left side that has calls: rewrite it by hand")
		return
	}
	lhs := string(g.src[g.off(n.Lhs[0].Pos()):g.off(n.Lhs[0].End())])
	tok := g.off(n.TokPos)
	op := " *"
	if n.Tok == token.QUO_ASSIGN {
		op = " /"
	}
	g.edits = append(g.edits, edit{off: tok, end: tok + 2, text: "= " + conv + "(" + lhs + op, kind: 2})
	rhs := n.Rhs[0]
	a, b := g.off(rhs.Pos()), g.off(rhs.End())
	if _, op := rhs.(*ast.BinaryExpr); op {
		g.edits = append(g.edits, edit{off: a, end: a, text: "(", span: b - a, kind: 1},
			edit{off: b, end: b, text: ")", span: b - a, kind: 0})
	}
	whole := g.off(n.End()) - g.off(n.Pos())
	g.edits = append(g.edits, edit{off: b, end: b, text: ")", span: whole, kind: 0})
}

// pure reports whether evaluating e twice is the same as once: names,
// fields and indexes by names or literals.
func pure(e ast.Expr) bool {
	switch e := e.(type) {
	case *ast.Ident, *ast.BasicLit:
		return true
	case *ast.ParenExpr:
		return pure(e.X)
	case *ast.SelectorExpr:
		return pure(e.X)
	case *ast.IndexExpr:
		return pure(e.X) && pure(e.Index)
	case *ast.StarExpr:
		return pure(e.X)
	}
	return false
}

// mathUse replaces math.F by fpmath.F for the inexact functions.
func (g *guard) mathUse(n *ast.SelectorExpr) {
	id, ok := n.X.(*ast.Ident)
	if !ok {
		return
	}
	pn, ok := g.pkg.info.Uses[id].(*types.PkgName)
	if !ok || pn.Imported().Path() != "math" {
		return
	}
	provided, isInexact := inexact[n.Sel.Name]
	if !isInexact || g.pkg.path == g.pkg.module+fpmathPath {
		g.kept++
		return
	}
	if !provided {
		g.errorf(n.Pos(), "math.%s may differ by architecture and internal/fpmath has no copy of it: add one", n.Sel.Name)
		return
	}
	a := g.off(id.Pos())
	g.edits = append(g.edits, edit{off: a, end: g.off(id.End()), text: "fpmath", kind: 2})
	g.replaced++
}

// fixImports adds the fpmath import and drops math when nothing uses it.
func (g *guard) fixImports() {
	path := g.pkg.module + fpmathPath
	var mathSpec *ast.ImportSpec
	var decl *ast.GenDecl
	has := false // fpmath is imported already
	for _, d := range g.file.Decls {
		gd, ok := d.(*ast.GenDecl)
		if !ok || gd.Tok != token.IMPORT {
			continue
		}
		for _, s := range gd.Specs {
			is := s.(*ast.ImportSpec)
			p, _ := strconv.Unquote(is.Path.Value)
			if p == path {
				has = true
				if is.Name != nil && is.Name.Name != "fpmath" {
					g.errorf(is.Pos(), "fpmath is imported as %s: import it plainly", is.Name.Name)
				}
			}
			if p == "math" && is.Name == nil {
				mathSpec, decl = is, gd
			}
		}
	}
	if mathSpec == nil {
		g.errorf(g.file.Pos(), "math is used but not imported plainly")
		return
	}
	if has {
		if g.kept == 0 {
			g.dropLine(mathSpec, decl)
		}
		return
	}
	quoted := strconv.Quote(path)
	if !decl.Lparen.IsValid() {
		text := "import " + quoted
		if g.kept > 0 {
			text = "import (\n\t\"math\"\n\n\t" + quoted + "\n)"
		}
		g.edits = append(g.edits, edit{off: g.off(decl.Pos()), end: g.off(decl.End()), text: text, kind: 2})
		return
	}
	if g.kept == 0 {
		g.dropLine(mathSpec, decl)
	}
	var last *ast.ImportSpec
	for _, s := range decl.Specs {
		if s != mathSpec || g.kept > 0 {
			last = s.(*ast.ImportSpec)
		}
	}
	at := g.off(decl.Rparen)
	if last != nil {
		sep := "\n\t"
		if p, _ := strconv.Unquote(last.Path.Value); !strings.Contains(strings.SplitN(p, "/", 2)[0], ".") {
			sep = "\n\n\t" // a new group after the standard library
		}
		at = g.off(last.End())
		g.edits = append(g.edits, edit{off: at, end: at, text: sep + quoted, span: 1 << 30, kind: 1})
		return
	}
	g.edits = append(g.edits, edit{off: at, end: at, text: "\t" + quoted + "\n", span: 1 << 30, kind: 1})
}

// dropLine removes an import spec: its line in a block, the whole
// declaration when it stands alone.
func (g *guard) dropLine(spec *ast.ImportSpec, decl *ast.GenDecl) {
	if !decl.Lparen.IsValid() {
		g.edits = append(g.edits, edit{off: g.off(decl.Pos()), end: g.off(decl.End()), text: "", kind: 2})
		return
	}
	a, b := g.off(spec.Pos()), g.off(spec.End())
	for a > 0 && g.src[a-1] != '\n' {
		a--
	}
	if b < len(g.src) && g.src[b] == '\n' {
		b++
	}
	g.edits = append(g.edits, edit{off: a, end: b, text: "", kind: 2})
}

// apply returns the source with the edits made.
func (g *guard) apply() []byte {
	sort.SliceStable(g.edits, func(i, j int) bool {
		a, b := g.edits[i], g.edits[j]
		if a.off != b.off {
			return a.off < b.off
		}
		if a.kind != b.kind {
			return a.kind < b.kind
		}
		if a.kind == 0 {
			return a.span < b.span
		}
		return a.span > b.span
	})
	var out bytes.Buffer
	cur := 0
	for _, e := range g.edits {
		if e.off > cur {
			out.Write(g.src[cur:e.off])
			cur = e.off
		}
		out.WriteString(e.text)
		if e.end > cur {
			cur = e.end
		}
	}
	out.Write(g.src[cur:])
	return out.Bytes()
}
