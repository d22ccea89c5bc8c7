package templates

import (
	"embed"
	"html/template"
)

// reviewFiles are the templates of the review commands.
//
//go:embed diff.html
var reviewFiles embed.FS

// Diff parses the template of the HTML report of vouch diff.
func Diff(funcs template.FuncMap) (*template.Template, error) {
	return template.New("diff.html").Funcs(funcs).ParseFS(reviewFiles, "diff.html")
}
