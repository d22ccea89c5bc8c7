package calcdoc

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"html/template"
	"math"
	"sort"
	"strconv"

	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"vouch/eval"
	"vouch/props"
	"vouch/templates"
	"vouch/units"
)

// Caution is the notice on every cover (PRODUCT.md §3).
const Caution = "This package records calculations. It is no substitute for the review of a licensed professional engineer under the codes and rules that apply where the plant is built, and a signature made with this tool is not a professional seal unless those rules say so."

// RenderOptions are what the package records beyond the calc itself.
type RenderOptions struct {
	Engine string // engine version
}

type view struct {
	Title, Number, Project, Revision, Status string
	Roles                                    []roleView
	History                                  []revView
	HistoryNote                              string
	Caution                                  string
	Failed                                   int
	Summary                                  []rowView
	Checks                                   []checkView
	Inputs                                   []rowView
	Atmosphere                               string
	Body                                     string
	Engine, SourcePath, SourceHash           string
	ResultsDigest                            string
	Formulations                             []string
	Digits                                   int
}

type roleView struct{ Role, Name, Email, Date, Fingerprint, State string }
type revView struct{ Date, Commit, Author, Subject string }
type rowView struct {
	Name, Value string // trusted HTML built by this package
	Desc        string
	Line        int
}
type checkView struct {
	Pass bool
	Expr string // trusted MathML
	Desc string
	Line int
}

// trusted is the one door for markup into the package template. It is
// given only HTML that this package builds: goldmark's output (raw HTML
// off, so every text from the calc file is escaped), the MathML and value
// texts of mathml.go and typeset.go and the tables of body.go, which escape
// every text they take from the calc file, and the SVG of svgplot, which
// escapes its labels.
func trusted(s string) template.HTML { return template.HTML(s) }

var packageTemplate = template.Must(templates.Package(template.FuncMap{"trusted": trusted}))

// Render writes the package of an evaluated calc without errors.
func (d *Doc) Render(opt RenderOptions) ([]byte, error) {
	d.replaceCalcNodes()
	demoteHeadings(d.MD)
	var body bytes.Buffer
	md := d.md
	md.Renderer().AddOptions(renderer.WithNodeRenderers(util.Prioritized(&bodyRenderer{d: d}, 100)))
	if err := md.Renderer().Render(&body, d.body, d.MD); err != nil {
		return nil, err
	}
	v := d.view(opt)
	v.Body = body.String()
	var out bytes.Buffer
	if err := packageTemplate.Execute(&out, v); err != nil {
		return nil, err
	}
	return out.Bytes(), nil
}

func (d *Doc) view(opt RenderOptions) *view {
	f := d.Front
	sum := sha256.Sum256(d.Src)
	v := &view{
		Title: f.Title, Number: f.Number, Project: f.Project, Revision: f.Revision, Status: "DRAFT",
		Caution: Caution, Engine: opt.Engine, SourcePath: d.Path, SourceHash: hex.EncodeToString(sum[:]),
		ResultsDigest: d.ResultsDigest(), Digits: f.Digits,
		HistoryNote: "The calc is not under version control; it has no recorded revisions and cannot be signed.",
	}
	if f.Atmosphere != "" {
		v.Atmosphere = f.Atmosphere
	}
	for _, r := range []struct {
		role string
		p    Person
	}{{"Preparer", f.People.Preparer}, {"Checker", f.People.Checker}, {"Approver", f.People.Approver}} {
		v.Roles = append(v.Roles, roleView{Role: r.role, Name: r.p.Name, Email: r.p.Email, State: "not signed"})
	}
	v.Summary = d.summaryRows()
	v.Checks, v.Failed = d.checkRows()
	v.Inputs = d.inputRows()
	v.Formulations = d.formulations()
	return v
}

func (d *Doc) summaryRows() []rowView {
	var rows []rowView
	for _, name := range d.Front.Summary {
		it := d.itemOf(name)
		if it == nil {
			continue
		}
		rows = append(rows, rowView{Name: NameText(name), Value: d.valueHTML(it.Outcome), Desc: it.Stmt.Desc, Line: it.Stmt.Line})
	}
	return rows
}

// checkRows lists the checks, failures first.
func (d *Doc) checkRows() ([]checkView, int) {
	var rows []checkView
	failed := 0
	for _, it := range d.Checks() {
		expr := "<math><mrow>" + d.formula(it.Stmt, false) + "</mrow></math>"
		rows = append(rows, checkView{Pass: it.Outcome.Pass, Expr: expr, Desc: it.Stmt.Desc, Line: it.Stmt.Line})
		if !it.Outcome.Pass {
			failed++
		}
	}
	sort.SliceStable(rows, func(i, j int) bool { return !rows[i].Pass && rows[j].Pass })
	return rows, failed
}

// inputRows lists every definition whose expression reads no names.
func (d *Doc) inputRows() []rowView {
	var rows []rowView
	for _, it := range d.Items {
		if it.Outcome == nil || it.Stmt.Kind != eval.Def || len(it.Stmt.Deps()) > 0 {
			continue
		}
		if _, ok := it.Outcome.Value.(eval.Record); ok {
			continue
		}
		rows = append(rows, rowView{Name: NameText(it.Stmt.Name), Value: d.valueHTML(it.Outcome), Desc: it.Stmt.Desc, Line: it.Stmt.Line})
	}
	return rows
}

// formulations lists the property formulations the calc used.
func (d *Doc) formulations() []string {
	seen := map[string]bool{}
	var out []string
	for _, it := range d.Items {
		if it.Outcome == nil {
			continue
		}
		for _, s := range it.Outcome.Sources {
			if !seen[s] {
				seen[s] = true
				out = append(out, s)
			}
		}
	}
	for i, s := range out {
		if s == props.IF97 {
			out[i] = props.IF97 + " (" + props.IF97Version + "); " + props.IF97Reference
		}
	}
	return out
}

// itemOf returns the evaluated definition of a name.
func (d *Doc) itemOf(name string) *Item {
	for _, it := range d.Items {
		if it.Outcome != nil && it.Stmt.Kind == eval.Def && it.Stmt.Name == name {
			return it
		}
	}
	return nil
}

// outcomeOf returns the outcome of a defined name, for substitution.
func (d *Doc) outcomeOf(name string) (*eval.Outcome, bool) {
	it := d.itemOf(name)
	if it == nil {
		return nil, false
	}
	return it.Outcome, true
}

// ResultsDigest is the SHA-256 of every result's name, SI value (shortest
// text that reads back to the same bits) and SI unit, one per line.
func (d *Doc) ResultsDigest() string {
	h := sha256.New()
	for _, it := range d.Results() {
		q := it.Outcome.Value.(units.Quantity)
		h.Write([]byte(it.Stmt.Name + " " + strconv.FormatFloat(q.V, 'g', -1, 64) + " " + units.SIUnitText(q.D) + "\n"))
	}
	for _, it := range d.Checks() {
		h.Write([]byte("check " + strconv.Itoa(it.Stmt.Line) + " " + strconv.FormatBool(it.Outcome.Pass) + "\n"))
	}
	return hex.EncodeToString(h.Sum(nil))
}

var _ = math.Inf
