package compare

import (
	"bytes"
	"fmt"
	"html/template"
	"regexp"

	"github.com/vouchcalc/vouch/templates"
)

var reportTemplate = template.Must(templates.Compare(nil))

// reportView is what the report template shows.
type reportView struct {
	*Result
	Verdict, FailText, Default string
}

// Report renders the comparison as a self-contained HTML page. The page
// names its verdict in <meta name="vouch-compare-verdict">, which
// ReadReport reads back. It holds no clock time: the same calcs give
// the same bytes.
func (r *Result) Report() ([]byte, error) {
	v := reportView{Result: r, Verdict: "PASS", Default: percent(r.Default)}
	if !r.OK() {
		v.Verdict = "FAIL"
		v.FailText = fmt.Sprintf("%d of %d pairs outside their tolerance", r.Failed, len(r.Pairs))
		if len(r.Errors) > 0 {
			v.FailText = fmt.Sprintf("%d errors; %s", len(r.Errors), v.FailText)
		}
	}
	var b bytes.Buffer
	if err := reportTemplate.Execute(&b, v); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// MaxReportBytes is the largest comparison report read back: 16 MiB.
const MaxReportBytes = 16 << 20

// Record is what a comparison report records for a checker's signature.
type Record struct {
	Pass                bool   // every pair within tolerance, no errors
	Original, Alternate string // the git blob hashes of the two sources
}

var recordTag = regexp.MustCompile(`<meta name="vouch-compare-(verdict|original|alternate)" content="([0-9a-zA-Z]*)">`)

// ReadReport reads back what a report of Report records. A page that is
// not such a report is an error.
func ReadReport(html []byte) (Record, error) {
	var r Record
	got := map[string]string{}
	for _, m := range recordTag.FindAllSubmatch(html, -1) {
		if _, twice := got[string(m[1])]; twice {
			return r, fmt.Errorf("not a report of vouch compare: it records its %s twice", m[1])
		}
		got[string(m[1])] = string(m[2])
	}
	v := got["verdict"]
	if (v != "PASS" && v != "FAIL") || got["original"] == "" || got["alternate"] == "" {
		return r, fmt.Errorf("not a report of vouch compare: it records no verdict and sources")
	}
	return Record{Pass: v == "PASS", Original: got["original"], Alternate: got["alternate"]}, nil
}
