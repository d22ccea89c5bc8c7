package qualify

import (
	"bytes"
	_ "embed"
	"html/template"
	"strconv"

	"github.com/vouchcalc/vouch/calcdoc"
)

//go:embed report.html
var reportHTML string

var reportTmpl = template.Must(template.New("report").Funcs(template.FuncMap{
	"computed": func(c Check) string {
		if c.Computed == nil {
			return "—"
		}
		return strconv.FormatFloat(*c.Computed, 'g', 12, 64)
	},
	"verdict": func(v Verdict) template.HTML {
		class := map[Verdict]string{Pass: "pass", Fail: "fail", NotRun: "notrun"}[v]
		return template.HTML(`<span class="verdict ` + class + `">` + template.HTMLEscapeString(string(v)) + `</span>`)
	},
}).Parse(reportHTML))

type groupView struct {
	Name   string
	Count  int
	Checks []Check
}

// HTML renders the report as one self-contained page: no script, nothing
// fetched (the package's content policy), failures first. The same report
// gives the same bytes.
func (r *Report) HTML() ([]byte, error) {
	var fails []Check
	by := map[string][]Check{}
	for _, c := range r.Checks {
		if c.Verdict == Fail {
			fails = append(fails, c)
			continue
		}
		by[c.Group] = append(by[c.Group], c)
	}
	var groups []groupView
	for _, g := range r.Groups {
		if len(by[g]) > 0 {
			groups = append(groups, groupView{g, len(by[g]), by[g]})
		}
	}
	var b bytes.Buffer
	err := reportTmpl.Execute(&b, map[string]any{
		"Policy":   template.HTML(calcdoc.ContentPolicyTag),
		"R":        r,
		"Claimed":  r.Summary.Total - r.Summary.NotRun,
		"Failures": fails,
		"Groups":   groups,
	})
	return b.Bytes(), err
}
