package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/units"
)

// newFlags returns a flag set that reports to stderr without exiting.
func newFlags(name string, stderr io.Writer) *flag.FlagSet {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(stderr)
	return fs
}

// parseArgs parses flags that may come before, between or after the
// positional arguments, and returns the positional ones.
func parseArgs(fs *flag.FlagSet, args []string) ([]string, error) {
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			return nil, err
		}
		rest := fs.Args()
		if len(rest) == 0 {
			return pos, nil
		}
		pos = append(pos, rest[0])
		args = rest[1:]
	}
}

func cmdRun(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("run", stderr)
	asJSON := fs.Bool("json", false, "print results as JSON")
	files, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(files) != 1 {
		fmt.Fprintln(stderr, "usage: vouch run [--json] FILE")
		return exitUsage
	}
	d, err := loadCalc(files[0], stderr)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	if *asJSON {
		if err := writeJSON(stdout, d); err != nil {
			fmt.Fprintf(stderr, "vouch: %v\n", err)
			return exitErrors
		}
	} else if len(d.Errors) == 0 {
		writeTable(stdout, d)
	}
	if len(d.Errors) > 0 {
		fmt.Fprint(stderr, d.Errors.Format(d.Path, d.Src))
		return exitErrors
	}
	if d.Failed() {
		return exitFailed
	}
	return exitOK
}

type jsonResult struct {
	Name   string  `json:"name"`
	Line   int     `json:"line"`
	Value  float64 `json:"value"`
	Unit   string  `json:"unit"`
	SI     float64 `json:"si"`
	SIUnit string  `json:"si_unit"`
	Text   string  `json:"text"`
	Source string  `json:"source,omitempty"` // where an input comes from (inputSource)
	// U and USI are the standard uncertainty (stated or propagated), in the
	// difference unit of the display unit and in SI units; absent when none.
	U   *float64 `json:"u,omitempty"`
	USI *float64 `json:"u_si,omitempty"`
}

type jsonCheck struct {
	Line        int    `json:"line"`
	Expr        string `json:"expr"`
	Pass        bool   `json:"pass"`
	Description string `json:"description"`
	// Margin, MarginUnit and RelativeMargin repeat the one comparison of
	// a check that has exactly one; Comparisons lists every comparison.
	Margin         *float64         `json:"margin,omitempty"`
	MarginUnit     string           `json:"margin_unit,omitempty"`
	RelativeMargin *float64         `json:"relative_margin,omitempty"`
	Comparisons    []jsonComparison `json:"comparisons"`
}

// jsonComparison is one comparison of a check, both sides in one unit.
type jsonComparison struct {
	Op             string   `json:"op"`
	Left           float64  `json:"left"`
	Right          float64  `json:"right"`
	Unit           string   `json:"unit"`
	Text           string   `json:"text"`
	Holds          bool     `json:"holds"`
	Margin         float64  `json:"margin"`
	MarginUnit     string   `json:"margin_unit"`
	RelativeMargin *float64 `json:"relative_margin"`
}

type jsonError struct {
	Line    int    `json:"line"`
	Col     int    `json:"col"`
	Message string `json:"message"`
}

type jsonRun struct {
	File    string       `json:"file"`
	Results []jsonResult `json:"results"`
	Checks  []jsonCheck  `json:"checks"`
	Errors  []jsonError  `json:"errors"`
}

// inputSource is where an input comes from: the | source of its line, or
// the data file and line of a value read from a YAML file.
func inputSource(it *calcdoc.Item) string {
	if it.Stmt.Source != "" {
		return it.Stmt.Source
	}
	return it.Outcome.WrittenIn
}

// writeJSON prints the results, checks and errors of a calc as JSON; it
// writes nothing when they cannot be encoded.
func writeJSON(w io.Writer, d *calcdoc.Doc) error {
	out := jsonRun{File: d.Path, Results: []jsonResult{}, Checks: []jsonCheck{}, Errors: []jsonError{}}
	for _, it := range d.Results() {
		q := it.Outcome.Value.(units.Quantity)
		v, _ := q.In(it.Outcome.Display, d.Front.Ctx)
		r := jsonResult{
			Name: it.Stmt.Name, Line: it.Stmt.Line, Value: v, Unit: unitText(it.Outcome.Display),
			SI: q.V, SIUnit: units.SIUnitText(q.D), Text: d.ValueText(it.Outcome), Source: inputSource(it),
		}
		if si, shown, _, ok := d.StdUnc(it); ok {
			r.U, r.USI = &shown, &si
		}
		out.Results = append(out.Results, r)
	}
	for _, it := range d.Checks() {
		out.Checks = append(out.Checks, checkJSON(d, it))
	}
	for _, e := range d.Errors {
		out.Errors = append(out.Errors, jsonError{Line: e.Pos.Line, Col: e.Pos.Col, Message: e.Msg})
	}
	b, err := json.MarshalIndent(out, "", "  ")
	if err != nil {
		return fmt.Errorf("cannot write the results as JSON: %v", err)
	}
	_, err = w.Write(append(b, '\n'))
	return err
}

// checkJSON is a check with its comparisons and margins.
func checkJSON(d *calcdoc.Doc, it *calcdoc.Item) jsonCheck {
	c := jsonCheck{Line: it.Stmt.Line, Expr: it.Stmt.Expr, Pass: it.Outcome.Pass, Description: it.Stmt.Desc, Comparisons: []jsonComparison{}}
	for _, cmp := range d.Comparisons(it) {
		l, _ := cmp.Left.In(cmp.Unit, d.Front.Ctx)
		r, _ := cmp.Right.In(cmp.Unit, d.Front.Ctx)
		m, _ := cmp.Margin.In(cmp.MarginUnit, d.Front.Ctx)
		j := jsonComparison{Op: cmp.Op, Left: l, Right: r, Unit: unitText(cmp.Unit), Holds: cmp.Holds,
			Text: d.ComparisonText(cmp), Margin: m, MarginUnit: unitText(cmp.MarginUnit)}
		if cmp.HasRelative {
			rel := cmp.Relative
			j.RelativeMargin = &rel
		}
		c.Comparisons = append(c.Comparisons, j)
	}
	if len(c.Comparisons) == 1 {
		j := c.Comparisons[0]
		c.Margin, c.MarginUnit, c.RelativeMargin = &j.Margin, j.MarginUnit, j.RelativeMargin
	}
	return c
}

// unitText is a unit's text, "" for a pure number.
func unitText(u units.Unit) string {
	if s := u.String(); s != "1" {
		return s
	}
	return ""
}

func writeTable(w io.Writer, d *calcdoc.Doc) {
	title := d.Front.Title
	if title == "" {
		title = d.Path
	}
	fmt.Fprintf(w, "%s\n", title)
	if d.Front.Number != "" || d.Front.Revision != "" {
		fmt.Fprintf(w, "%s revision %s\n", d.Front.Number, d.Front.Revision)
	}
	fmt.Fprintln(w)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "line\tname\tvalue\tdescription")
	for _, it := range d.Shown() {
		fmt.Fprintf(tw, "%d\t%s\t%s\t%s\n", it.Stmt.Line, it.Stmt.Name, d.ValueText(it.Outcome), it.Stmt.Desc)
	}
	tw.Flush()
	for _, sw := range d.Sweeps {
		writeSweep(w, d, sw)
	}
	checks := d.Checks()
	if len(checks) == 0 {
		return
	}
	fmt.Fprintln(w, "\nchecks")
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	failed := 0
	for _, it := range checks {
		verdict := "PASS"
		if !it.Outcome.Pass {
			verdict, failed = "FAIL", failed+1
		}
		fmt.Fprintf(tw, "%s\t%d\t%s\t%s\t%s\n", verdict, it.Stmt.Line, it.Stmt.Expr, d.CheckText(it), it.Stmt.Desc)
	}
	tw.Flush()
	fmt.Fprintf(w, "\n%s\n", checkTally(len(checks), failed))
}

// checkTally counts checks: "1 check, 1 passed, 0 failed".
func checkTally(n, failed int) string {
	return fmt.Sprintf("%d %s, %d passed, %d failed", n, pluralWord(n, "check"), n-failed, failed)
}

func cmdUnits(args []string, stdout, stderr io.Writer) int {
	if len(args) > 0 {
		fmt.Fprintln(stderr, "usage: vouch units (it takes no arguments)")
		return exitUsage
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "symbol\tSI value\tSI unit\tname\tnote")
	for _, a := range units.Table() {
		note := ""
		switch {
		case a.Kind == units.AbsTemp:
			note = fmt.Sprintf("absolute alone (0 = %s K); an interval inside a compound unit", trimFloat(a.Offset))
		case a.Kind == units.Gauge:
			note = "gauge: adds the calc's atmosphere; alone only"
		case a.Prefix:
			note = "takes SI prefixes"
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", a.Symbol, trimFloat(a.Factor), units.SIUnitText(a.Dim), a.Name, note)
	}
	tw.Flush()
	fmt.Fprintf(stdout, "\nSI prefixes: %s\n", strings.Join(units.Prefixes(), " "))
	return exitOK
}

func trimFloat(v float64) string {
	if v == math.Trunc(v) && math.Abs(v) < 1e15 {
		return fmt.Sprintf("%.0f", v)
	}
	return fmt.Sprintf("%.15g", v)
}

// writeSweep prints a sweep as a table, failed checks marked per point.
func writeSweep(w io.Writer, d *calcdoc.Doc, sw *calcdoc.Sweep) {
	fmt.Fprintf(w, "\nsweep of %s (line %d)\n", sw.Var, sw.Line)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	head := []string{sw.Var}
	for _, c := range sw.Show {
		head = append(head, c.Name)
	}
	fmt.Fprintln(tw, strings.Join(head, "\t")+"\tchecks\t")
	for i := 0; i < sw.Len(); i++ {
		cells := []string{d.SweepX(sw, i)}
		for j, c := range sw.Show {
			cells = append(cells, sweepText(d, sw.Rows[i][j], d.ColumnUnit(c, sw.Rows[i][j])))
		}
		verdict := "PASS"
		if len(sw.Failed[i]) > 0 {
			verdict = "FAIL line " + strings.Trim(strings.Join(strings.Fields(fmt.Sprint(sw.Failed[i])), ", "), "[]")
		}
		fmt.Fprintln(tw, strings.Join(cells, "\t")+"\t"+verdict+"\t")
	}
	tw.Flush()
}

func sweepText(d *calcdoc.Doc, q units.Quantity, u units.Unit) string {
	s, err := q.Text(u, d.Front.Digits, d.Front.Ctx)
	if err != nil {
		return err.Error()
	}
	return s
}
