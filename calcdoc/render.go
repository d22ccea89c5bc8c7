package calcdoc

import (
	"bytes"
	"errors"
	"html"
	"html/template"
	"sort"
	"strings"

	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/templates"
)

// Caution is vouch's own notice on every cover (PRODUCT.md §3), unless the
// firm's settings give their own.
const Caution = settings.DefaultCaution

// RenderOptions are what the package records beyond the calc itself.
type RenderOptions struct {
	Engine string // engine version
	// Stamp is the calc's provenance and the verdicts on its signatures,
	// built by the caller (audit.Provenance for a calc in git). When nil,
	// the package is unversioned (Doc.Unversioned).
	Stamp *Stamp
	// Build is the engine build rendering a new package, and Qualification
	// the digest of the qualification report that build produces (vouch
	// qualify); the caller computes both (qualify sits above calcdoc).
	// When Build is set, the manifest records both. A package rendered
	// again from its record (verify, sign) leaves Build nil and keeps the
	// recorded ones.
	Build         *provenance.EngineBuild
	Qualification string
	// Draft marks a package rendered with --draft: the cover says DRAFT
	// and the manifest records it, so that it can never be signed.
	Draft bool
}

// Package is a rendered calculation package: the HTML file and the
// manifest it embeds, for the manifest file written beside it.
type Package struct {
	HTML     []byte
	Manifest *provenance.Manifest
}

type view struct {
	Title, Number, Project, Revision, Status string
	Roles                                    []roleView
	History                                  []revView
	Revisions                                []revisionRow
	RevisionNote                             string
	Draft                                    bool
	HistoryNote                              string
	Caution                                  string
	Failed                                   int
	Summary                                  []rowView
	Checks                                   []checkView
	Inputs                                   []rowView
	Unsourced                                []rowView // inputs without a source, for the checker
	References                               []refView
	Assumptions, OpenAssumptions             []assumptionView
	Tables                                   []tableView // the CSV tables the calc read, as written
	Preliminary                              bool        // the stamp reads PRELIMINARY: open assumptions
	Atmosphere                               string
	Body                                     string
	Engine, SourcePath, SourceHash           string
	ResultsDigest                            string
	Formulations                             []string
	Digits                                   int
	// Review is the comment-and-resolution appendix (reviewrec.go); nil
	// when the calc has no review record, and ReviewCounts its summary.
	Review       []reviewView
	HasReview    bool
	ReviewCounts string
	House        houseView

	// Provenance and signatures (cover.go).
	Signatures                   []sigView
	HistoryMore                  int
	Manifest                     *provenance.Manifest
	ManifestDigest, ManifestJSON string
	Versioned, Committed         bool
	CommitDate, VerifyCommand    string
	// Exceptions are the firm's permissions, in words, for one person to
	// hold two roles; KeysNote says whose file checked the keys.
	Exceptions []string
	KeysNote   string
}

type roleView struct {
	Role, Name, Email, Date, Fingerprint, State string
	Valid                                       bool
	Checked                                     bool   // the key was checked against a signers file
	Signed, Attestation                         string // signing time and meaning
	Method                                      string // the checker's method of checking, as recorded
}
type sigView struct {
	Role, Name, Principal, Fingerprint, Date, State string
	Valid                                           bool
	Checked                                         bool
	Signed, Withdrawn                               string
}
type revView struct{ Date, Commit, Author, Subject string }
type rowView struct {
	Name, Value string // trusted HTML built by this package
	Desc        string
	Source      string // trusted HTML (sourceHTML); "" when none
	Line        int
}
type checkView struct {
	Pass   bool
	Expr   string // trusted MathML
	Margin string // trusted HTML text: the margin of each comparison
	Desc   string
	Line   int
}

// ContentPolicyTag is the Content-Security-Policy of every page vouch
// writes (package, diff report, register): the browser may fetch nothing
// and run no script; styles are inline and images are data URIs. The
// templates carry it verbatim (a test holds them to it); the live preview
// takes it out, as its page runs a script.
const ContentPolicyTag = `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src data:; style-src 'unsafe-inline'">`

// trusted is the one door for markup into the package template. It is
// given only HTML that this package builds: goldmark's output (raw HTML
// off, so every text from the calc file is escaped), the MathML and value
// texts of mathml.go and typeset.go and the tables of body.go, which escape
// every text they take from the calc file, and the SVG of svgplot, which
// escapes its labels.
func trusted(s string) template.HTML { return template.HTML(s) }

var packageTemplate = template.Must(templates.Package(template.FuncMap{"trusted": trusted}))

// Render renders the package of an evaluated calc without errors. It
// reads nothing and runs no git: the stamp comes with the options.
func (d *Doc) Render(opt RenderOptions) (*Package, error) {
	if d.mdTree == nil { // the file was refused before it was parsed
		if err := d.Errors.Err(); err != nil {
			return nil, err
		}
		return nil, errors.New("calcdoc: Render of a calc that was not read")
	}
	body, err := d.renderBody()
	if err != nil {
		return nil, err
	}
	st := opt.Stamp
	if st == nil {
		if st, err = d.Unversioned(opt.Engine); err != nil {
			return nil, err
		}
	}
	if opt.Build != nil {
		b := *opt.Build
		st.Manifest.Build, st.Manifest.Qualification = &b, opt.Qualification
	}
	if opt.Draft {
		st.Manifest.Draft = true
	}
	v := d.view(opt)
	if err := v.setStamp(d, st); err != nil {
		return nil, err
	}
	v.Body = body
	v.House = d.house(v.Status)
	var out bytes.Buffer
	out.Grow(len(body) + len(body)/4 + 64<<10) // the body, its summary tables and manifest
	if err := packageTemplate.Execute(&out, v); err != nil {
		return nil, err
	}
	return &Package{HTML: out.Bytes(), Manifest: st.Manifest}, nil
}

// renderBody renders the Markdown body, calc blocks as MathML.
func (d *Doc) renderBody() (string, error) {
	if !d.prepared {
		d.replaceCalcNodes()
		demoteHeadings(d.mdTree)
		d.md.Renderer().AddOptions(renderer.WithNodeRenderers(util.Prioritized(&bodyRenderer{d: d}, 100)))
		d.prepared = true
	}
	var body strings.Builder    // String() without a copy
	body.Grow(16 * len(d.body)) // MathML is many times the size of its source
	if err := d.md.Renderer().Render(&body, d.body, d.mdTree); err != nil {
		return "", err
	}
	return body.String(), nil
}

func (d *Doc) view(opt RenderOptions) *view {
	f := d.Front
	v := &view{
		Title: f.Title, Number: f.Number, Project: f.Project, Revision: f.Revision,
		Caution: d.Settings.Caution, Engine: opt.Engine, Digits: f.Digits, Atmosphere: f.Atmosphere,
	}
	v.Summary = d.summaryRows()
	v.Checks, v.Failed = d.checkRows()
	v.Inputs = d.inputRows()
	for _, r := range v.Inputs {
		if r.Source == "" {
			v.Unsourced = append(v.Unsourced, r)
		}
	}
	v.References = d.referenceRows()
	v.Tables = d.tableViews()
	v.Assumptions, v.OpenAssumptions = d.assumptionRows(false), d.assumptionRows(true)
	v.Formulations = d.formulations()
	v.setReview(d)
	return v
}

func (d *Doc) summaryRows() []rowView {
	var rows []rowView
	for _, name := range d.Front.Summary {
		it := d.itemOf(name)
		if it == nil {
			continue
		}
		rows = append(rows, rowView{Name: nameText(name), Value: d.valueHTML(it.Outcome), Desc: it.Stmt.Desc, Line: it.Stmt.Line})
	}
	return rows
}

// checkRows lists the checks, failures first.
func (d *Doc) checkRows() ([]checkView, int) {
	var rows []checkView
	failed := 0
	for _, it := range d.Checks() {
		expr := "<math><mrow>" + d.formula(it.Stmt, false) + "</mrow></math>"
		margin := d.marginHTML(d.Comparisons(it), true)
		rows = append(rows, checkView{Pass: it.Outcome.Pass, Expr: expr, Margin: margin, Desc: it.Stmt.Desc, Line: it.Stmt.Line})
		if !it.Outcome.Pass {
			failed++
		}
	}
	sort.SliceStable(rows, func(i, j int) bool { return !rows[i].Pass && rows[j].Pass })
	return rows, failed
}

// inputRows lists every definition whose expression reads no names, and
// every value the calc read from a YAML data file.
func (d *Doc) inputRows() []rowView {
	var rows []rowView
	for _, it := range d.Items {
		if it.Outcome != nil && !it.Inline && it.Stmt.Kind == eval.Def {
			if vs, ok := it.Outcome.Value.(*eval.Values); ok {
				rows = append(rows, d.dataInputRows(it, vs)...)
				continue
			}
		}
		if !isInputItem(it) {
			continue
		}
		rows = append(rows, rowView{Name: nameText(it.Stmt.Name), Value: d.valueHTML(it.Outcome) + uncHTML(it.Stmt), Desc: it.Stmt.Desc, Source: d.inputSource(it), Line: it.Stmt.Line})
	}
	return rows
}

// inputSource is the source of an input as HTML: the | source written on
// its line; for a CSV table without one, its file, linked to the appendix
// that prints it; else "" (no source).
func (d *Doc) inputSource(it *Item) string {
	t, isTable := it.Outcome.Value.(*eval.Table)
	switch {
	case it.Stmt.Source != "":
		return d.sourceHTML(it.Stmt.Source)
	case isTable:
		return `<a href="#` + tableAnchor(t.Path) + `">` + html.EscapeString(t.Path) + `</a>`
	}
	return ""
}

// isInputItem reports whether an evaluated item is an input: a calc line
// defining a value from no names (a state or a data file's record is not
// one: it has fields, not a value).
func isInputItem(it *Item) bool {
	if it.Inline || it.Outcome == nil || it.Stmt.Kind != eval.Def || len(it.Stmt.Deps()) > 0 {
		return false
	}
	_, isRecord := it.Outcome.Value.(eval.Record)
	return !isRecord
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
		out[i] = props.Describe(s)
	}
	return out
}
