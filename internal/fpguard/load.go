package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"go/ast"
	"go/importer"
	"go/parser"
	"go/token"
	"go/types"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
)

// listed is one package as go list -json reports it.
type listed struct {
	ImportPath string
	Dir        string
	GoFiles    []string
	Export     string
	DepOnly    bool
	Module     *struct{ Path string }
}

// pkg is one package to guard: its files parsed and type-checked.
type pkg struct {
	path   string
	module string // module path, for the fpmath import
	fset   *token.FileSet
	files  []*ast.File
	names  []string // file paths, parallel to files
	srcs   [][]byte
	info   *types.Info
	types  *types.Package
}

// load lists the packages of patterns (directories or ./...) with their
// dependencies' export data, then parses and type-checks each listed
// package's non-test files from source.
func load(patterns []string) ([]*pkg, error) {
	args := append([]string{"list", "-e", "-export", "-deps", "-json=ImportPath,Dir,GoFiles,Export,DepOnly,Module"}, patterns...)
	cmd := exec.Command("go", args...)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		return nil, fmt.Errorf("go list: %v\n%s", err, stderr.String())
	}
	exports := map[string]string{}
	var targets []listed
	dec := json.NewDecoder(bytes.NewReader(out))
	for dec.More() {
		var l listed
		if err := dec.Decode(&l); err != nil {
			return nil, fmt.Errorf("go list output: %v", err)
		}
		exports[l.ImportPath] = l.Export
		if !l.DepOnly {
			targets = append(targets, l)
		}
	}
	var pkgs []*pkg
	for _, l := range targets {
		p, err := check(l, exports)
		if err != nil {
			return nil, err
		}
		pkgs = append(pkgs, p)
	}
	return pkgs, nil
}

// check parses and type-checks one package, importing its dependencies
// from their export data.
func check(l listed, exports map[string]string) (*pkg, error) {
	p := &pkg{path: l.ImportPath, fset: token.NewFileSet()}
	if l.Module != nil {
		p.module = l.Module.Path
	}
	for _, name := range l.GoFiles {
		path := filepath.Join(l.Dir, name)
		src, err := os.ReadFile(path)
		if err != nil {
			return nil, err
		}
		f, err := parser.ParseFile(p.fset, path, src, parser.ParseComments)
		if err != nil {
			return nil, err
		}
		p.files, p.names, p.srcs = append(p.files, f), append(p.names, path), append(p.srcs, src)
	}
	lookup := func(path string) (io.ReadCloser, error) {
		e, ok := exports[path]
		if !ok || e == "" {
			return nil, fmt.Errorf("no export data for %s", path)
		}
		return os.Open(e)
	}
	conf := types.Config{Importer: importer.ForCompiler(p.fset, "gc", lookup)}
	p.info = &types.Info{
		Types: map[ast.Expr]types.TypeAndValue{},
		Uses:  map[*ast.Ident]types.Object{},
	}
	var err error
	p.types, err = conf.Check(l.ImportPath, p.fset, p.files, p.info)
	if err != nil {
		return nil, fmt.Errorf("type-checking %s: %v", l.ImportPath, err)
	}
	return p, nil
}

// patternsOf turns the command-line directories into go list patterns.
func patternsOf(dirs []string) []string {
	if len(dirs) == 0 {
		return []string{"./..."}
	}
	var out []string
	for _, d := range dirs {
		if !filepath.IsAbs(d) && !strings.HasPrefix(d, ".") {
			d = "./" + d
		}
		out = append(out, d)
	}
	return out
}
