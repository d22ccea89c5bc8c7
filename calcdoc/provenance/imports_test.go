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
// helpers internal/safefile and internal/editdist (which import nothing of
// vouch themselves; the layout test in cmd/vouch holds that).
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
			if path == "github.com/vouchcalc/vouch/internal/safefile" || path == "github.com/vouchcalc/vouch/internal/editdist" {
				continue
			}
			if path == "vouch" || strings.HasPrefix(path, "github.com/vouchcalc/vouch/") {
				t.Errorf("%s imports %s: provenance must import no vouch package", f, path)
			}
		}
	}
}
