// Package templates holds the HTML template and the styles of the
// calculation package, embedded in the binary. Only calcdoc reads it.
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
