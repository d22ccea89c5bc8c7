package provenance

import (
	"go/parser"
	"go/token"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestImportsNoVouchPackage holds the one-way import rule: calcdoc imports
// this package, and this package imports nothing of vouch but the leaf
// helper internal/safefile (which imports nothing of vouch itself; the
// layout test in cmd/vouch holds that).
func TestImportsNoVouchPackage(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	fset := token.NewFileSet()
	for _, f := range files {
		ast, err := parser.ParseFile(fset, f, nil, parser.ImportsOnly)
		if err != nil {
			t.Fatal(err)
		}
		for _, imp := range ast.Imports {
			path, _ := strconv.Unquote(imp.Path.Value)
			if path == "github.com/vouchcalc/vouch/internal/safefile" {
				continue
			}
			if path == "vouch" || strings.HasPrefix(path, "github.com/vouchcalc/vouch/") {
				t.Errorf("%s imports %s: provenance must import no vouch package", f, path)
			}
		}
	}
}
