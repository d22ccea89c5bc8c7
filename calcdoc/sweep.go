package calcdoc

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	gast "github.com/yuin/goldmark/ast"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"

	"github.com/vouchcalc/vouch/internal/excerpt"
)

// Sweep is a `sweep` block: one input varied over a range, with chosen
// results shown at every point.
//
//	vary NAME from A to B in N steps     (N intervals, N+1 points)
//	vary NAME over [A, B, C]
//	show NAME [UNIT], NAME, ...
//	plot NAME, ... [limit NAME]
type Sweep struct {
	Line, Off int
	Var       string
	VarOff    int
	bounds    []*eval.Stmt // from, to; or the listed values
	steps     int          // intervals, for from/to
	Show      []SweepColumn
	plots     []sweepPlot

	X      []units.Quantity // the varied input at each point (a number or quantity)
	Texts  []string         // the varied input at each point (text)
	XUnit  units.Unit
	Rows   [][]units.Quantity // Show values at each point
	Failed [][]int            // lines of the checks that fail at each point
	SVGs   [][]byte           // the plots
	block  int
	vary   int // offset of the vary line; -1 until the block has one
}

// SweepColumn is one shown result.
type SweepColumn struct {
	Name    string
	U       bool // u(NAME): the combined standard uncertainty of NAME (uncertsweep.go)
	Unit    units.Unit
	HasUnit bool
	Off     int
}

// MaxSweepPoints bounds a sweep.
const MaxSweepPoints = 100000

// readSweep parses a sweep block's lines.
func (d *Doc) readSweep(b *gast.FencedCodeBlock) {
	d.checkClosed(b)
	sw := &Sweep{Off: b.Info.Segment.Start, Line: d.lines.pos(d.Src, b.Info.Segment.Start).Line, block: len(d.Sweeps), vary: -1}
	for _, l := range d.directives(b) {
		d.sweepLine(sw, l.text, l.off)
	}
	if sw.vary < 0 {
		d.errorf(sw.Off, "a sweep block needs a line: vary NAME from A to B in N steps, or vary NAME over [A, B]")
		return
	}
	if sw.Var == "" {
		return // the vary line has its error
	}
	if len(sw.Show) == 0 && len(sw.plots) == 0 {
		d.errorf(sw.Off, "a sweep block needs a line: show NAME, ... or plot NAME")
		return
	}
	d.Sweeps = append(d.Sweeps, sw)
}

func (d *Doc) sweepLine(sw *Sweep, code string, off int) {
	word, rest, spaced := strings.Cut(code, " ")
	restOff := off + len(word)
	if spaced {
		restOff++
	}
	switch word {
	case "vary":
		if sw.vary >= 0 {
			d.errorf(off, "a sweep varies one input, and this one has a vary line on line %d; write a second sweep block to vary another", d.lines.pos(d.Src, sw.vary).Line)
			return
		}
		sw.vary = off
		d.sweepVary(sw, rest, restOff)
	case "show":
		d.sweepShow(sw, rest, restOff)
	case "plot":
		pl, msg := readPlotLine(rest, restOff)
		if msg == "" && len(sw.plots) == MaxSweepPlots {
			msg = fmt.Sprintf("plot: a sweep draws at most %d plots; write a second sweep block for more", MaxSweepPlots)
		}
		if msg != "" {
			d.errorf(restOff, "%s", msg)
			return
		}
		sw.plots = append(sw.plots, pl)
	default:
		d.errorf(off, "unknown sweep line %s; a sweep has vary, show and plot lines", excerpt.Quote(word))
	}
}

// sweepVary reads "NAME from A to B in N steps" or "NAME over [A, B, C]".
func (d *Doc) sweepVary(sw *Sweep, s string, off int) {
	trimmed := strings.TrimLeft(s, " \t")
	s, off = trimmed, off+len(s)-len(trimmed)
	name, rest, _ := strings.Cut(s, " ")
	if name == "" {
		d.errorf(off, "write: vary NAME from A to B in N steps, or vary NAME over [A, B, C]")
		return
	}
	sw.Var, sw.VarOff = name, off
	rest = strings.TrimSpace(rest)
	restOff := off + strings.Index(s, rest)
	if strings.HasPrefix(rest, "over ") {
		d.sweepList(sw, rest, restOff)
		return
	}
	from, ok1 := cutWord2(rest, "from ")
	a, after, ok2 := strings.Cut(from, " to ")
	b, n, ok3 := strings.Cut(after, " in ")
	if !ok1 || !ok2 || !ok3 {
		d.errorf(restOff, "write: vary %s from A to B in N steps (N a whole number of intervals), or vary %s over [A, B, C]", name, name)
		return
	}
	nOff := restOff + len("from ") + len(a) + len(" to ") + len(b) + len(" in ")
	nOff += len(n) - len(strings.TrimLeft(n, " "))
	steps, ok := d.stepCount(name, n, nOff)
	if !ok {
		return
	}
	sw.steps = steps
	d.addBound(sw, a, restOff+len("from "))
	d.addBound(sw, b, restOff+len("from ")+len(a)+len(" to "))
}

// stepCount reads the N of "in N steps": a whole number from 1 to
// MaxSweepPoints-1, each other case an error at N.
func (d *Doc) stepCount(name, text string, off int) (int, bool) {
	n, unit, _ := strings.Cut(strings.TrimSpace(text), " ")
	if unit != "steps" && unit != "step" && unit != "" {
		d.errorf(off, "write: vary %s from A to B in N steps (N a whole number of intervals), or vary %s over [A, B, C]", name, name)
		return 0, false
	}
	steps, err := strconv.Atoi(n)
	switch {
	case err != nil && errors.Is(err, strconv.ErrRange) && !strings.HasPrefix(n, "-"),
		err == nil && steps > MaxSweepPoints-1:
		d.errorf(off, "vary %s: %s steps are more than the %d a sweep may have (%d points)", name, n, MaxSweepPoints-1, MaxSweepPoints)
	case err != nil:
		d.errorf(off, "vary %s: %q steps; N is a whole number of intervals, from 1 to %d", name, n, MaxSweepPoints-1)
	case steps < 1:
		d.errorf(off, "vary %s: %d steps; a sweep from A to B needs at least 1 step (N steps give N+1 points)", name, steps)
	default:
		return steps, true
	}
	return 0, false
}

// sweepList reads "over [A, B, C]"; it counts the values before it parses
// any, so a list longer than a sweep may be costs nothing.
func (d *Doc) sweepList(sw *Sweep, rest string, restOff int) {
	name := sw.Var
	list := strings.TrimSpace(rest[5:])
	lo := restOff + strings.Index(rest, list)
	if !strings.HasPrefix(list, "[") || !strings.HasSuffix(list, "]") {
		d.errorf(lo, "write the values in brackets: vary %s over [A, B, C]", name)
		return
	}
	values := splitList(list[1:len(list)-1], lo+1)
	if len(values) == 0 {
		d.errorf(lo, "vary %s over [...] needs at least one value", name)
		return
	}
	if len(values) > MaxSweepPoints {
		d.errorf(lo, "vary %s over [...]: %d values are more than the %d a sweep may have", name, len(values), MaxSweepPoints)
		return
	}
	for _, f := range values {
		d.addBound(sw, f.text, f.off)
	}
}

func cutWord2(s, w string) (string, bool) {
	if strings.HasPrefix(s, w) {
		return s[len(w):], true
	}
	return s, false
}

func (d *Doc) addBound(sw *Sweep, text string, off int) {
	st, errs := eval.ParseInline(text, off, d.lines.pos(d.Src, off).Line, d.Front.Ctx)
	d.addEvalErrors(errs)
	if len(errs) == 0 {
		sw.bounds = append(sw.bounds, st)
	}
}

func (d *Doc) sweepShow(sw *Sweep, s string, off int) {
	for _, f := range splitList(s, off) {
		name, unit, hasUnit := strings.Cut(f.text, "[")
		col := SweepColumn{Name: strings.TrimSpace(name), Off: f.off}
		if inner, ok := uColumn(col.Name); ok {
			col.Name, col.U = inner, true
		}
		if hasUnit {
			ut := strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(unit), "]"))
			u, err := units.Parse(ut)
			if err != nil {
				d.errorf(f.off+strings.Index(f.text, "[")+1, "%s", err.Error())
				continue
			}
			col.Unit, col.HasUnit = u, true
		}
		sw.Show = append(sw.Show, col)
	}
}

type field struct {
	text string
	off  int
}

// splitList splits a comma list outside brackets, keeping offsets.
func splitList(s string, off int) []field {
	var out []field
	depth, start := 0, 0
	flush := func(end int) {
		t := s[start:end]
		if tt := strings.TrimSpace(t); tt != "" {
			out = append(out, field{tt, off + start + strings.Index(t, tt)})
		}
	}
	for i, c := range s {
		switch c {
		case '(', '[':
			depth++
		case ')', ']':
			depth--
		case ',':
			if depth == 0 {
				flush(i)
				start = i + 1
			}
		}
	}
	flush(len(s))
	return out
}

// directives returns the lines of a sweep or diagram block without their
// // comments, trimmed, with the offset of their first character; blank
// lines are left out.
func (d *Doc) directives(b *gast.FencedCodeBlock) []field {
	var out []field
	lines := b.Lines()
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		code, _, _ := strings.Cut(strings.TrimRight(string(seg.Value(d.body)), "\r\n"), "//")
		if t := strings.TrimSpace(code); t != "" {
			out = append(out, field{t, seg.Start + len(code) - len(strings.TrimLeft(code, " \t"))})
		}
	}
	return out
}
