package diff

import (
	"bytes"
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"html/template"
	"io"
	"sort"
	"strings"
	"text/tabwriter"

	"github.com/vouchcalc/vouch/templates"
)

// diffView is what the terminal and the HTML report show of a diff.
type diffView struct {
	Title, Number             string
	From, To                  string // labels of the two revisions
	FromRevision, ToRevision  string // the calc's own revision letters
	FromPath, ToPath          string
	Renamed, All, Unchanged   bool
	Front                     []FieldChange
	Inputs, Results           []ValueChange
	InputsTotal, ResultsTotal int
	Checks                    []CheckChange
	ChecksTotal               int
	Added, Removed, Rewritten []LineChange
	Files                     []FileChange
	Prose                     []Hunk
	Errors                    string
	Caution                   string
}

// view selects what a diff shows: changed values and flipped checks, or
// with all every value and check found at both revisions.
func (df *Diff) view(all bool) *diffView {
	f := df.To.Doc.Front
	v := &diffView{
		Title: f.Title, Number: f.Number, From: df.From.Label, To: df.To.Label,
		FromRevision: df.From.Doc.Front.Revision, ToRevision: f.Revision,
		FromPath: df.From.Path, ToPath: df.To.Path, Renamed: df.Renamed(),
		All: all, Unchanged: df.Unchanged(), Front: df.Front, Files: df.Files, Prose: df.Prose,
		Errors: df.ErrorText(), Caution: calcdoc.Caution,
	}
	for _, vc := range df.Values {
		list, total := &v.Results, &v.ResultsTotal
		if vc.Input {
			list, total = &v.Inputs, &v.InputsTotal
		}
		*total++
		if all || !vc.Same {
			*list = append(*list, vc)
		}
	}
	for _, c := range df.Checks {
		v.ChecksTotal++
		if all || c.Flipped() {
			v.Checks = append(v.Checks, c)
		}
	}
	v.splitLines(df.Lines)
	return v
}

// splitLines sorts the changed calc lines by kind and line.
func (v *diffView) splitLines(lines []LineChange) {
	for _, l := range lines {
		switch l.Kind {
		case "added":
			v.Added = append(v.Added, l)
		case "removed":
			v.Removed = append(v.Removed, l)
		default:
			v.Rewritten = append(v.Rewritten, l)
		}
	}
	sort.SliceStable(v.Added, func(i, j int) bool { return v.Added[i].NewLine < v.Added[j].NewLine })
	sort.SliceStable(v.Removed, func(i, j int) bool { return v.Removed[i].OldLine < v.Removed[j].OldLine })
	sort.SliceStable(v.Rewritten, func(i, j int) bool { return v.Rewritten[i].NewLine < v.Rewritten[j].NewLine })
}

// Text formats the diff for a terminal. Unchanged values and checks are
// listed only with all.
func (df *Diff) Text(all bool) string {
	v := df.view(all)
	var b strings.Builder
	v.header(&b)
	if v.Unchanged {
		b.WriteString("\nno changes: inputs, results, checks, calc lines, data files and prose are the same\n")
	}
	v.frontText(&b)
	v.valuesText(&b, "inputs", v.Inputs, v.InputsTotal)
	v.valuesText(&b, "results", v.Results, v.ResultsTotal)
	v.checksText(&b)
	v.linesText(&b)
	v.filesText(&b)
	v.proseText(&b)
	return b.String()
}

// filesText lists the data files and images that changed.
func (v *diffView) filesText(b *strings.Builder) {
	if len(v.Files) == 0 {
		return
	}
	fmt.Fprintf(b, "\ndata files and images changed (%d)\n", len(v.Files))
	tw := tabwriter.NewWriter(b, 0, 0, 2, ' ', 0)
	for _, f := range v.Files {
		fmt.Fprintf(tw, "  %s\t%s\t%s\t->\t%s\n", f.Kind, f.Path, blobText(f.OldHash), blobText(f.NewHash))
	}
	tw.Flush()
	for _, f := range v.Files {
		if len(f.Values) == 0 && f.Note == "" {
			continue
		}
		fmt.Fprintf(b, "  %s:\n", f.Path)
		if f.Note != "" {
			fmt.Fprintf(b, "    %s\n", f.Note)
		}
		tw := tabwriter.NewWriter(b, 0, 0, 2, ' ', 0)
		for _, c := range f.Values {
			fmt.Fprintf(tw, "    %s\t%s\t->\t%s\t%s\n", c.Where, orDash(c.Old), orDash(c.New), cellLines(c))
		}
		tw.Flush()
		if f.More > 0 {
			fmt.Fprintf(b, "    and %d more values changed\n", f.More)
		}
	}
}

// cellLines says where a changed value sits in the two files.
func cellLines(c CellChange) string {
	switch {
	case c.OldLine == 0:
		return fmt.Sprintf("(line %d)", c.NewLine)
	case c.NewLine == 0:
		return fmt.Sprintf("(was line %d)", c.OldLine)
	case c.OldLine == c.NewLine:
		return fmt.Sprintf("(line %d)", c.NewLine)
	}
	return fmt.Sprintf("(line %d -> %d)", c.OldLine, c.NewLine)
}

// blobText is the first 12 digits of a blob hash, or "-".
func blobText(h string) string { return orDash(shortHash(h)) }

func (v *diffView) header(b *strings.Builder) {
	fmt.Fprintln(b, strings.TrimSpace(v.Number+" "+v.Title))
	fmt.Fprintf(b, "from: %s, %s, revision %s\n", v.From, v.FromPath, orDash(v.FromRevision))
	fmt.Fprintf(b, "to:   %s, %s, revision %s\n", v.To, v.ToPath, orDash(v.ToRevision))
	if v.Renamed {
		fmt.Fprintf(b, "renamed: %s -> %s\n", v.FromPath, v.ToPath)
	}
}

func orDash(s string) string {
	if s == "" {
		return "-"
	}
	return s
}

func (v *diffView) frontText(b *strings.Builder) {
	if len(v.Front) == 0 {
		return
	}
	b.WriteString("\nfront matter\n")
	tw := tabwriter.NewWriter(b, 0, 0, 2, ' ', 0)
	for _, f := range v.Front {
		fmt.Fprintf(tw, "  %s\t%s\t->\t%s\n", f.Field, orDash(f.Old), orDash(f.New))
	}
	tw.Flush()
}

// valuesText lists values: changed ones, or all of them.
func (v *diffView) valuesText(b *strings.Builder, what string, list []ValueChange, total int) {
	if len(list) == 0 {
		return
	}
	if v.All {
		fmt.Fprintf(b, "\n%s (%d)\n", what, total)
	} else {
		fmt.Fprintf(b, "\n%s changed (%d of %d)\n", what, len(list), total)
	}
	tw := tabwriter.NewWriter(b, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  \tline\tname\told\tnew\tchange\trelative")
	for _, c := range list {
		mark := "~"
		if c.Same {
			mark, c.Change, c.Rel = "=", "", ""
		}
		fmt.Fprintf(tw, "  %s\t%d\t%s\t%s\t%s\t%s\t%s\n", mark, c.NewLine, c.Name, c.Old, c.New, c.Change, c.Rel)
	}
	tw.Flush()
}

func (v *diffView) checksText(b *strings.Builder) {
	if len(v.Checks) == 0 {
		return
	}
	if v.All {
		fmt.Fprintf(b, "\nchecks (%d)\n", v.ChecksTotal)
	} else {
		fmt.Fprintf(b, "\nchecks flipped (%d of %d)\n", len(v.Checks), v.ChecksTotal)
	}
	tw := tabwriter.NewWriter(b, 0, 0, 2, ' ', 0)
	for _, c := range v.Checks {
		fmt.Fprintf(tw, "  line %d\tcheck %s\t%s\t%s\n", c.NewLine, c.New, checkVerdicts(c), c.Desc)
	}
	tw.Flush()
}

// checkVerdicts is "PASS -> FAIL", "PASS" when unchanged, or what stopped
// the check.
func checkVerdicts(c CheckChange) string {
	switch {
	case !c.Evaluated:
		return "(not evaluated)"
	case c.Flipped():
		return verdictText(c.OldPass) + " -> " + verdictText(c.NewPass)
	}
	return verdictText(c.NewPass)
}

func (v *diffView) linesText(b *strings.Builder) {
	for _, g := range []struct {
		what  string
		lines []LineChange
	}{{"calc lines added", v.Added}, {"calc lines removed", v.Removed}, {"calc lines rewritten", v.Rewritten}} {
		if len(g.lines) == 0 {
			continue
		}
		fmt.Fprintf(b, "\n%s (%d)\n", g.what, len(g.lines))
		for _, l := range g.lines {
			writeLineChange(b, l)
		}
	}
}

func writeLineChange(b io.Writer, l LineChange) {
	switch l.Kind {
	case "added":
		fmt.Fprintf(b, "  + %4d  %s\n", l.NewLine, l.New)
		if l.Value != "" {
			fmt.Fprintf(b, "          = %s\n", l.Value)
		}
	case "removed":
		fmt.Fprintf(b, "  - %4d  %s\n", l.OldLine, l.Old)
	default:
		fmt.Fprintf(b, "  - %4d  %s\n  + %4d  %s\n", l.OldLine, l.Old, l.NewLine, l.New)
	}
}

func (v *diffView) proseText(b *strings.Builder) {
	if len(v.Prose) == 0 {
		return
	}
	fmt.Fprintf(b, "\nprose (%d %s)\n", len(v.Prose), changes(len(v.Prose)))
	for _, h := range v.Prose {
		fmt.Fprintf(b, "  @@ line %d -> line %d @@\n", h.OldStart(), h.NewStart())
		for _, l := range h.Lines {
			fmt.Fprintf(b, "  %c %s\n", l.Op, l.Text)
		}
	}
}

// OldStart is the first old line of the hunk (for an added-only hunk, the
// old line it follows or precedes).
func (h Hunk) OldStart() int { return h.start(func(l ProseLine) int { return l.OldLine }) }

// NewStart is the first new line of the hunk.
func (h Hunk) NewStart() int { return h.start(func(l ProseLine) int { return l.NewLine }) }

func (h Hunk) start(line func(ProseLine) int) int {
	for _, l := range h.Lines {
		if n := line(l); n > 0 {
			return n
		}
	}
	return 0
}

// diffTemplate is the HTML report of a diff.
var diffTemplate = template.Must(templates.Diff(template.FuncMap{
	"verdicts": checkVerdicts,
	"op":       func(b byte) string { return string(b) },
	"dict":     dict,
	"short":    blobText,
	"name":     calcdoc.TypesetName,
	"value":    calcdoc.TypesetValue,
}))

// dict builds a map from key and value pairs, for calling a sub-template
// with several arguments.
func dict(kv ...any) map[string]any {
	m := map[string]any{}
	for i := 0; i+1 < len(kv); i += 2 {
		m[kv[i].(string)] = kv[i+1]
	}
	return m
}

// HTML formats the diff as a self-contained HTML report: no scripts, no
// fetches, styles inline. The same diff gives the same bytes.
func (df *Diff) HTML(all bool) ([]byte, error) {
	var out bytes.Buffer
	if err := diffTemplate.Execute(&out, df.view(all)); err != nil {
		return nil, err
	}
	return out.Bytes(), nil
}

// changes is "change" or "changes" for n changes.
func changes(n int) string {
	if n == 1 {
		return "change"
	}
	return "changes"
}
