package main

import (
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"
)

// allowed lists, per package of this module, the packages of this module
// and the third-party modules it may import (STYLE.md habit 9: imports run
// cmd → qualify → calcdoc → eval → props → units;
// internal/engine, the build's identity, imports nothing of ours). Standard-library imports are free,
// except for the numerics packages, which may import only math.
var allowed = map[string][]string{
	"cmd/vouch":          {"calcdoc", "calcdoc/audit", "calcdoc/diff", "calcdoc/provenance", "calcdoc/register", "calcdoc/preview", "calcdoc/settings", "calcdoc/starter", "calcdoc/review", "calcdoc/compare", "eval", "units", "props", "qualify", "internal/engine", "internal/safefile", "internal/gitroot"},
	"calcdoc/audit":      {"calcdoc", "calcdoc/provenance", "calcdoc/settings", "calcdoc/review", "internal/safefile"},
	"calcdoc/diff":       {"internal/safefile", "calcdoc", "calcdoc/provenance", "eval", "units", "templates", "internal/fpmath"},
	"internal/testkit":   {},
	"calcdoc":            {"calcdoc/provenance", "calcdoc/review", "calcdoc/settings", "internal/safefile", "internal/excerpt", "internal/gitroot", "eval", "props", "units", "templates", "svgplot", "internal/fpmath", "github.com/yuin/goldmark", "go.yaml.in/yaml/v3"},
	"qualify":            {"internal/safefile", "calcdoc", "calcdoc/provenance", "golang.org/x/crypto", "props/if97", "props/helmholtz", "units", "internal/engine", "internal/fpmath", "docs", "go.yaml.in/yaml/v3"},
	"internal/engine":    {},
	"docs":               {},
	"internal/safefile":  {},
	"internal/excerpt":   {},
	"internal/editdist":  {},
	"internal/gitroot":   {},
	"calcdoc/provenance": {"internal/safefile", "internal/editdist", "github.com/go-git/go-git/v5", "golang.org/x/crypto"},
	"calcdoc/settings":   {"internal/safefile", "internal/editdist", "go.yaml.in/yaml/v3"},
	"calcdoc/review":     {"go.yaml.in/yaml/v3"},
	"calcdoc/compare":    {"calcdoc", "calcdoc/provenance", "units", "templates", "internal/fpmath"},
	"calcdoc/starter":    {"calcdoc/settings", "templates", "go.yaml.in/yaml/v3"},
	"calcdoc/register":   {"internal/safefile", "calcdoc", "calcdoc/audit", "calcdoc/provenance", "templates"},
	"calcdoc/preview":    {"internal/safefile", "calcdoc", "calcdoc/audit", "calcdoc/settings"},
	"eval":               {"internal/excerpt", "props", "units", "internal/fpmath", "github.com/expr-lang/expr"},
	"props":              {"props/if97", "props/helmholtz", "units", "internal/fpmath"},
	"props/if97":         {"internal/fpmath"},
	"props/helmholtz":    {"internal/fpmath"},
	"internal/fpmath":    {},
	"internal/fpguard":   {},
	"internal/archtest":  {},
	"units":              {"internal/fpmath", "internal/editdist"},
	"templates":          {},
	"svgplot":            {"internal/fpmath"},
}

// mathOnly are the numerics packages: their non-test files import only math
// and internal/fpmath (guarded pure-Go copies of math's inexact functions,
// which itself imports only math).
var mathOnly = map[string]bool{"props/if97": true, "props/helmholtz": true, "internal/fpmath": true}

func TestImportLayout(t *testing.T) {
	root := filepath.Join("..", "..")
	imports := map[string]map[string]bool{}
	err := filepath.WalkDir(root, func(path string, d os.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && path != root && (strings.HasPrefix(d.Name(), ".") || d.Name() == "testdata" || d.Name() == "gen") {
			return filepath.SkipDir
		}
		if d.IsDir() || !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
			return nil
		}
		rel, _ := filepath.Rel(root, filepath.Dir(path))
		rel = filepath.ToSlash(rel)
		f, err := parser.ParseFile(token.NewFileSet(), path, nil, parser.ImportsOnly)
		if err != nil {
			return err
		}
		if imports[rel] == nil {
			imports[rel] = map[string]bool{}
		}
		for _, im := range f.Imports {
			p, _ := strconv.Unquote(im.Path.Value)
			imports[rel][p] = true
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	var pkgs []string
	for p := range imports {
		pkgs = append(pkgs, p)
	}
	sort.Strings(pkgs)
	for _, pkg := range pkgs {
		ok, known := allowed[pkg]
		if !known {
			t.Errorf("package %s is not in the layout table of layout_test.go; add it with its allowed imports", pkg)
			continue
		}
		for im := range imports[pkg] {
			if !permitted(pkg, im, ok) {
				t.Errorf("%s imports %s, which the layout does not allow", pkg, im)
			}
		}
	}
}

func permitted(pkg, im string, ok []string) bool {
	if mathOnly[pkg] {
		if pkg == "internal/fpmath" {
			return im == "math" || im == "math/bits"
		}
		return im == "math" || im == "github.com/vouchcalc/vouch/internal/fpmath"
	}
	own := strings.HasPrefix(im, "github.com/vouchcalc/vouch/")
	if !own && !strings.Contains(strings.SplitN(im, "/", 2)[0], ".") {
		return true // standard library
	}
	im = strings.TrimPrefix(im, "github.com/vouchcalc/vouch/")
	for _, a := range ok {
		if im == a || strings.HasPrefix(im, a+"/") && !own {
			return true
		}
	}
	return false
}

// TestCalcdocRunsNoGit holds calcdoc to reading, evaluating and rendering:
// it takes from calcdoc/provenance only the manifest's types and the blob
// hash, never a repository, and runs no program. Git and signatures are
// calcdoc/audit's and calcdoc/diff's.
func TestCalcdocRunsNoGit(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("..", "..", "calcdoc", "*.go"))
	if err != nil || len(files) == 0 {
		t.Fatalf("no calcdoc files: %v", err)
	}
	for _, f := range files {
		if strings.HasSuffix(f, "_test.go") {
			continue
		}
		src, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		for _, bad := range []string{"provenance.Open", "provenance.Repo", `"os/exec"`, "VerifySignature"} {
			if strings.Contains(string(src), bad) {
				t.Errorf("%s uses %s; git and signature checks belong in calcdoc/audit", filepath.Base(f), bad)
			}
		}
	}
}
