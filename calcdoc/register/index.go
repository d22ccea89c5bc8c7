package register

import (
	"bytes"
	"fmt"
	"html/template"
	"path/filepath"
	"sort"
	"strings"
	"unicode"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/templates"
)

// indexTemplate is the template of index.html; the register owns it.
var indexTemplate = template.Must(templates.Register(nil))

// maxErrors is the number of errors the index shows for a broken calc.
const maxErrors = 3

// indexView is what index.html shows. It holds nothing that varies between
// machines or runs: no clock, no absolute path.
type indexView struct {
	Folder, Engine string
	Rows           []rowView
	Broken         int
	Failing        int
	Stale          int
	Statuses       []statusCount
	Caution        string
}

type statusCount struct {
	Status string
	Count  int
}

type rowView struct {
	Number, Title, Revision, Project, Path, Package, Status string
	Passed, Failed, Open                                    int
	Errors                                                  []string
	MoreErrors                                              int
	Signed, Stale, Problem                                  string
	// Superseded describes a signed package of an earlier revision than
	// the calc's current one; its status is not the current revision's.
	Superseded string
	// Errata are the known engine errors that touch the signed package.
	Errata []string
}

// writeIndex writes index.html for the whole register.
func (r *run) writeIndex() (string, error) {
	var page bytes.Buffer
	if err := indexTemplate.Execute(&page, r.view()); err != nil {
		return "", err
	}
	dest := filepath.Join(r.opt.Out, "index.html")
	return dest, calcdoc.WriteFileAtomic(dest, page.Bytes())
}

// view builds the index from the entries, in register order.
func (r *run) view() *indexView {
	abs, _ := filepath.Abs(r.opt.Dir)
	v := &indexView{Folder: filepath.Base(abs), Engine: r.opt.Engine, Caution: calcdoc.Caution}
	entries := append([]*Entry(nil), r.entries...)
	sortEntries(entries)
	counts := map[string]int{}
	for _, e := range entries {
		row := rowOf(e)
		v.Rows = append(v.Rows, row)
		counts[row.Status]++
		if e.Broken() {
			v.Broken++
		}
		if e.Failed > 0 {
			v.Failing++
		}
		if row.Stale != "" {
			v.Stale++
		}
	}
	for _, s := range []string{"APPROVED", "CHECKED", "PREPARED", "PRELIMINARY", "DRAFT"} {
		v.Statuses = append(v.Statuses, statusCount{s, counts[s]})
	}
	return v
}

// rowOf is one calc's row of the index.
func rowOf(e *Entry) rowView {
	row := rowView{Number: e.Number, Title: e.Title, Revision: e.Revision, Project: e.Project, Path: e.Path,
		Package: e.Package, Status: "DRAFT", Passed: e.Passed, Failed: e.Failed, Open: e.Open, Signed: "none"}
	errs := e.ErrorText(e.Path)
	if len(errs) > maxErrors {
		row.MoreErrors = len(errs) - maxErrors
		errs = errs[:maxErrors]
	}
	row.Errors = errs
	if s := e.Signed; s != nil {
		row.Status, row.Signed, row.Stale, row.Problem = s.Status, s.Package, s.Stale, s.Problem
		row.Errata = s.Errata
		if s.Revision != "" && s.Revision != e.Revision {
			// The signed package is of another revision: the current
			// revision has no signed package, so it is a draft.
			row.Status, row.Stale = "DRAFT", ""
			row.Superseded = fmt.Sprintf("revision %s, %s, superseded by revision %s", s.Revision, s.Status, or(e.Revision, "(none)"))
		}
	}
	return row
}

// sortEntries orders the register by calc number, in natural order
// (HB-2 before HB-10), then by path; calcs without a number come last.
func sortEntries(entries []*Entry) {
	sort.SliceStable(entries, func(i, j int) bool {
		a, b := entries[i], entries[j]
		if (a.Number == "") != (b.Number == "") {
			return a.Number != ""
		}
		if a.Number != b.Number {
			return naturalLess(a.Number, b.Number)
		}
		return a.Path < b.Path
	})
}

// naturalLess compares texts with runs of digits compared as numbers.
func naturalLess(a, b string) bool {
	for a != "" && b != "" {
		da, ra := leadingDigits(a)
		db, rb := leadingDigits(b)
		switch {
		case da != "" && db != "":
			if x, y := strings.TrimLeft(da, "0"), strings.TrimLeft(db, "0"); x != y {
				if len(x) != len(y) {
					return len(x) < len(y)
				}
				return x < y
			}
			a, b = ra, rb
		case a[0] != b[0]:
			return a[0] < b[0]
		default:
			a, b = a[1:], b[1:]
		}
	}
	return len(a) < len(b)
}

func leadingDigits(s string) (digits, rest string) {
	i := strings.IndexFunc(s, func(r rune) bool { return !unicode.IsDigit(r) })
	if i < 0 {
		i = len(s)
	}
	return s[:i], s[i:]
}

func or(a, b string) string {
	if a != "" {
		return a
	}
	return b
}
