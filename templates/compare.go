package templates

import (
	"embed"
	"html/template"
)

//go:embed compare.html report-style.html
var compareFiles embed.FS

// Compare parses the template of the report of vouch compare.
func Compare(funcs template.FuncMap) (*template.Template, error) {
	return template.New("compare.html").Funcs(funcs).ParseFS(compareFiles, "compare.html", "report-style.html")
}
