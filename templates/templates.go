// Package templates holds the HTML template and the styles of the
// calculation package, and the built-in calc templates of `vouch new`
// (new/NAME.calc.md), embedded in the binary. Only calcdoc and its
// subpackages read it.
package templates

import (
	"embed"
	"html/template"
)

//go:embed package.html
var files embed.FS

// Package parses the package template with the given functions.
func Package(funcs template.FuncMap) (*template.Template, error) {
	return template.New("package.html").Funcs(funcs).ParseFS(files, "package.html")
}
