package main

import (
	"go/ast"
	"go/importer"
	"go/parser"
	"go/token"
	"go/types"
	"path/filepath"
	"strings"
	"testing"
)

// guardSource rewrites one file of a package "example.com/m/p" (module
// example.com/m) and returns the result and the number of edits.
func guardSource(t *testing.T, src string) (string, int) {
	t.Helper()
	return guardIn(t, "example.com/m", src)
}

// guardIn is guardSource in a package of the given module.
func guardIn(t *testing.T, module, src string) (string, int) {
	t.Helper()
	p := &pkg{path: module + "/p", module: module, fset: token.NewFileSet()}
	f, err := parser.ParseFile(p.fset, "p.go", src, parser.ParseComments)
	if err != nil {
		t.Fatal(err)
	}
	p.files, p.srcs = []*ast.File{f}, [][]byte{[]byte(src)}
	p.info = &types.Info{Types: map[ast.Expr]types.TypeAndValue{}, Uses: map[*ast.Ident]types.Object{}}
	conf := types.Config{Importer: testImporter{importer.Default()}}
	if p.types, err = conf.Check(p.path, p.fset, p.files, p.info); err != nil {
		t.Fatal(err)
	}
	g := &guard{pkg: p, file: f, src: p.srcs[0]}
	out, n, err := g.rewrite()
	if err != nil {
		t.Fatal(err)
	}
	return string(out), n
}

// testImporter imports the standard library from export data and any
// .../internal/fpmath from this module's source.
type testImporter struct{ std types.Importer }

func (im testImporter) Import(path string) (*types.Package, error) {
	if !strings.HasSuffix(path, "/internal/fpmath") {
		return im.std.Import(path)
	}
	fset := token.NewFileSet()
	names, err := filepath.Glob(filepath.Join("..", "fpmath", "*.go"))
	if err != nil {
		return nil, err
	}
	var files []*ast.File
	for _, name := range names {
		if strings.HasSuffix(name, "_test.go") {
			continue
		}
		f, err := parser.ParseFile(fset, name, nil, 0)
		if err != nil {
			return nil, err
		}
		files = append(files, f)
	}
	conf := types.Config{Importer: im.std}
	return conf.Check(path, fset, files, nil)
}

func TestRewrite(t *testing.T) {
	cases := []struct{ name, in, want string }{
		{"sum of products",
			"func f(a, b, c, d float64) float64 { return a*b + c*d }",
			"func f(a, b, c, d float64) float64 { return float64(a*b) + float64(c*d) }"},
		{"product chain wrapped once",
			"func f(a, b, c, d float64) float64 { return a*b*c + d }",
			"func f(a, b, c, d float64) float64 { return float64(a*b*c) + d }"},
		{"product through a variable",
			"func f(a, b, c float64) float64 { t := a * b; return t + c }",
			"func f(a, b, c float64) float64 { t := float64(a * b); return t + c }"},
		{"quotient consumes the product",
			"func f(a, b, c float64) float64 { return (a * b) / c }",
			"func f(a, b, c float64) float64 { return (a * b) / c }"},
		{"already wrapped",
			"func f(a, b, c float64) float64 { return float64(a*b) + c }",
			"func f(a, b, c float64) float64 { return float64(a*b) + c }"},
		{"integers and constants untouched",
			"const k = 2.0 * 3.0\n\nfunc f(i, j int) float64 { return float64(i*j) + k*k }",
			"const k = 2.0 * 3.0\n\nfunc f(i, j int) float64 { return float64(i*j) + k*k }"},
		{"multiply-assign",
			"func f(x, a, b float64) float64 { x *= a + b; x *= a; return x }",
			"func f(x, a, b float64) float64 { x = float64(x * (a + b)); x = float64(x * a); return x }"},
		{"quotient by a power of two is a product",
			"func f(x, a, b, c float64) float64 {\n\ty := x / 3\n\tx /= 4\n\treturn (x/2-a/2)/(b/0.5-c*a/16) + y\n}",
			"func f(x, a, b, c float64) float64 {\n\ty := x / 3\n\tx = float64(x / 4)\n\treturn (float64(x/2)-float64(a/2))/(float64(b/0.5)-float64(c*a/16)) + y\n}"},
		{"float32",
			"func f(a, b, c float32) float32 { return a*b - c }",
			"func f(a, b, c float32) float32 { return float32(a*b) - c }"},
		{"argument of a call",
			"func g(x float64) float64 { return x + 1 }\n\nfunc f(a, b float64) float64 { return g(a * b) }",
			"func g(x float64) float64 { return x + 1 }\n\nfunc f(a, b float64) float64 { return g(float64(a * b)) }"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, _ := guardSource(t, "package p\n\n"+c.in+"\n")
			if want := "package p\n\n" + c.want + "\n"; got != want {
				t.Errorf("got\n%s\nwant\n%s", got, want)
			}
			again, n := guardSource(t, got)
			if n != 0 || again != got {
				t.Errorf("second run made %d edits:\n%s", n, again)
			}
		})
	}
}

func TestRewriteMath(t *testing.T) {
	in := "package p\n\nimport (\n\t\"math\"\n)\n\nfunc f(x float64) float64 { return math.Exp(x) * math.Log(2*x) }\n"
	want := "package p\n\nimport (\n\t\"example.com/m/internal/fpmath\"\n)\n\nfunc f(x float64) float64 { return float64(fpmath.Exp(x) * fpmath.Log(float64(2*x))) }\n"
	got, _ := guardSource(t, in)
	if got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
	// A new math.Exp in a file that imports fpmath already (the usual case
	// after a merge): math goes when nothing else uses it.
	in = "package p\n\nimport (\n\t\"math\"\n\n\t\"github.com/vouchcalc/vouch/internal/fpmath\"\n)\n\nfunc f(x float64) float64 { return math.Exp(fpmath.Log(x)) }\n"
	want = "package p\n\nimport (\n\t\"github.com/vouchcalc/vouch/internal/fpmath\"\n)\n\nfunc f(x float64) float64 { return fpmath.Exp(fpmath.Log(x)) }\n"
	if got, _ = guardIn(t, "github.com/vouchcalc/vouch", in); got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
	in = "package p\n\nimport \"math\"\n\nfunc f(x float64) float64 { return math.Abs(math.Pow(x, 3)) }\n"
	got, _ = guardSource(t, in)
	if !strings.Contains(got, "\t\"math\"\n\n\t\"example.com/m/internal/fpmath\"\n") || !strings.Contains(got, "math.Abs(fpmath.Pow(x, 3))") {
		t.Errorf("math kept for Abs, fpmath added for Pow:\n%s", got)
	}
}

// TestModuleGuarded fails when a file of the module has an unguarded
// floating-point product or calls an inexact function of package math:
// run `go run ./internal/fpguard` from the module root to fix it.
func TestModuleGuarded(t *testing.T) {
	if testing.Short() {
		t.Skip("type-checks the whole module; skipped with -short")
	}
	res, err := Run([]string{filepath.Join("..", "..") + "/..."}, false)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range res.Changed {
		t.Errorf("%s needs %d edits: run `go run ./internal/fpguard` from the module root", f.Path, f.Edits)
	}
}
