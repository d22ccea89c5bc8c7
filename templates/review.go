package templates

import (
	"embed"
	"html/template"
)

// reviewFiles are the templates of the review commands: the report of
// vouch diff and the index of vouch register.
//
//go:embed diff.html register.html report-style.html
var reviewFiles embed.FS

// Diff parses the template of the HTML report of vouch diff.
func Diff(funcs template.FuncMap) (*template.Template, error) {
	return template.New("diff.html").Funcs(funcs).ParseFS(reviewFiles, "diff.html", "report-style.html")
}

// Register parses the template of the register's index.html.
func Register(funcs template.FuncMap) (*template.Template, error) {
	return template.New("register.html").Funcs(funcs).ParseFS(reviewFiles, "register.html")
}
