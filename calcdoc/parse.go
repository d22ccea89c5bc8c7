package calcdoc

import (
	"bytes"
	"errors"
	"io/fs"
	"sort"
	"strings"
	"unicode/utf8"

	"github.com/yuin/goldmark"
	gast "github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/extension"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
	"github.com/yuin/goldmark/util"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/calcdoc/review"
	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/eval"
)

// MaxFileBytes is the largest calc file read: 1 MiB, some twenty times the
// largest calc of the examples, so that reading, evaluating and rendering
// stay within a few hundred megabytes.
const MaxFileBytes = 1 << 20

// Item is one evaluated element of the calc, in file order: a calc line or
// an inline value.
type Item struct {
	Stmt    *eval.Stmt
	Inline  bool // an inline `=expr` span
	Block   int  // index of the calc block (calc lines)
	Outcome *eval.Outcome
	Err     bool // the line has an error
}

// Doc is a read calc file.
type Doc struct {
	Path   string
	Src    []byte
	Front  Front
	Items  []*Item
	Errors ErrorList
	Sweeps []*Sweep
	// Assumptions are the lines of the assumptions blocks, in file order.
	Assumptions []Assumption
	// Unc is the propagation of the inputs' uncertainties (uncert.go); nil
	// when no input has one.
	Unc *Propagation
	// Budgets are the budget blocks (budget.go).
	Budgets []*Budget
	// DataFiles are the data files the calc read, in order of first use.
	DataFiles []DataFile
	// Files is the tree data files and images are read from: the work tree
	// (the work tree) or a commit's tree (verify, diff). Root is its folder on
	// disk and Rel the calc's slash path inside it. When Files is nil,
	// Evaluate reads from the work tree that holds Path (locate).
	Files fs.FS
	Root  string
	Rel   string
	// Review is the checker's review record beside the calc
	// (NAME.review.yaml, read through Files; nil when there is none), and
	// ReviewPlaces where each of its comments stands in the calc now.
	Review       *review.File
	ReviewPlaces []review.Place
	// Settings are the repository's settings (vouch.yaml) the calc was
	// read with; never nil after Read.
	Settings *settings.Settings

	settingsSrc []byte               // the settings file as read, for the manifest
	logoURI     string               // the firm's logo as a data URI, once read
	logoData    *provenance.DataFile // the logo's entry in the manifest

	diagramBlocks []*diagramBlock
	stateTables   []*stateTable    // the states blocks, in file order
	images        []*image         // the images of the prose, embedded when rendered
	byName        map[string]*Item // evaluated definitions, built on first use
	engine        *eval.Engine     // the engine after evaluation, for substitution
	prepared      bool             // the Markdown tree is ready to render
	typeset       typesetCache     // names and unit texts already typeset
	// SweepLimit, when set, lowers the number of points a sweep may have
	// below MaxSweepPoints.
	SweepLimit int
	// Progress, when set, is told how far a sweep has come.
	Progress func(name string, done, total int)
	mdTree   gast.Node // the Markdown tree, for rendering
	md       goldmark.Markdown
	lines    lineIndex
	body     []byte // Src with the front matter blanked, as goldmark parsed it
	fences   fences // the nodes vouch reads, found while parsing
}

// newMarkdown returns the Markdown reader: CommonMark with GitHub tables
// and strikethrough; raw HTML stays off.
// Its transformer records the nodes vouch reads in f.
func newMarkdown(f *fences) goldmark.Markdown {
	return goldmark.New(
		goldmark.WithExtensions(extension.Table, extension.Strikethrough),
		goldmark.WithParserOptions(parser.WithAutoHeadingID(),
			parser.WithASTTransformers(util.Prioritized(fenceFinder{f}, 1000))),
	)
}

// Read parses a calc file's bytes. It never fails: problems are gathered in
// Doc.Errors.
func Read(path string, src []byte) *Doc { return read(path, src, ReadOptions{}) }

func read(path string, src []byte, opt ReadOptions) *Doc {
	d := &Doc{Path: path, Src: src, lines: newLineIndex(src), Settings: opt.Settings, settingsSrc: opt.SettingsSource}
	if d.Settings == nil {
		d.Settings = settings.Default()
	}
	d.md = newMarkdown(&d.fences)
	if len(src) > MaxFileBytes {
		d.errorf(0, "file is %d bytes; a calc file may be at most %d bytes", len(src), MaxFileBytes)
		return d
	}
	if !utf8.Valid(src) {
		d.errorf(firstInvalid(src), "file is not valid UTF-8 text")
		return d
	}
	if off, msg, ok := checkNesting(src); !ok {
		d.errorf(off, "%s", msg)
		return d
	}
	if at := bareCR(src); at >= 0 {
		d.errorf(at, "a line ends with a bare carriage return (CR): vouch reads LF or CRLF line ends; save the file with LF line ends")
		return d
	}
	d.readFront()
	d.mdTree = d.md.Parser().Parse(text.NewReader(d.body))
	d.collect()
	d.checkLookalikes()
	return d
}

func firstInvalid(src []byte) int {
	for i := 0; i < len(src); {
		r, w := utf8.DecodeRune(src[i:])
		if r == utf8.RuneError && w <= 1 {
			return i
		}
		i += w
	}
	return 0
}

func (d *Doc) errorf(off int, format string, args ...any) {
	d.Errors = append(d.Errors, &Error{Pos: d.lines.pos(d.Src, off), Msg: sprintf(format, args...)})
}

// readFront parses the front matter and blanks it for goldmark, keeping
// every byte offset.
func (d *Doc) readFront() {
	d.Front = Front{Digits: DefaultDigits}
	d.Front.Ctx.Atmosphere = 101325
	yml, start, end, ferr := splitFront(d.Src)
	d.body = d.Src
	if ferr != nil {
		d.errorf(ferr.off, "%s", ferr.msg)
		return
	}
	if end == 0 {
		d.checkLateFront()
		if n := bomLen(d.Src); n > 0 { // blanked: the same offsets, no mark in the text
			d.body = append(bytes.Repeat([]byte(" "), n), d.Src[n:]...)
		}
		return
	}
	d.body = append([]byte(nil), d.Src...)
	for i := 0; i < end; i++ {
		if d.body[i] != '\n' {
			d.body[i] = ' '
		}
	}
	f, errs := parseFront(yml, d.Settings)
	d.Front = f
	firstLine := d.lines.pos(d.Src, start).Line
	if f.SummaryLine > 0 {
		d.Front.SummaryLine += firstLine - 1
	}
	for _, e := range errs {
		if e.refLine > 0 {
			e.msg = strings.Replace(e.msg, "\x00", sprintf("%d", firstLine+e.refLine-1), 1)
		}
		d.Errors = append(d.Errors, &Error{Pos: Pos{Off: start, Line: firstLine + e.line - 1, Col: e.col}, Msg: e.msg})
	}
}

// collect reads the calc blocks, inline values, sweeps, diagrams and
// images the parser's transformer found.
func (d *Doc) collect() {
	f := &d.fences
	for _, im := range f.images {
		d.readImage(im)
	}
	for i, b := range f.calcs {
		d.readBlock(i, b)
	}
	for _, s := range f.spans {
		d.readInline(s)
	}
	for _, s := range f.sweeps {
		d.readSweep(s)
	}
	for _, b := range f.budgets {
		d.readBudget(b)
	}
	for _, s := range f.diagrams {
		d.readDiagram(s)
	}
	seen := map[string]int{}
	for i, b := range f.assumptions {
		d.readAssumptions(i, b, seen)
	}
	for _, s := range f.states {
		d.readStates(s)
	}
	d.resolveStateRefs()
	sortItems(d.Items)
	d.checkSources()
}

// readBlock parses the lines of one calc fence.
func (d *Doc) readBlock(index int, b *gast.FencedCodeBlock) {
	d.checkClosed(b)
	lines := b.Lines()
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		raw := strings.TrimRight(string(seg.Value(d.body)), "\r\n")
		st, errs := eval.ParseLine(raw, seg.Start, d.lines.pos(d.Src, seg.Start).Line, d.Front.Ctx)
		d.addEvalErrors(errs)
		switch {
		case len(errs) > 0 && st != nil:
			d.Items = append(d.Items, &Item{Stmt: st, Block: index, Err: true})
		case len(errs) > 0:
			d.Items = append(d.Items, &Item{Block: index, Err: true, Stmt: &eval.Stmt{Off: seg.Start}})
		case st != nil:
			d.Items = append(d.Items, &Item{Stmt: st, Block: index})
		}
	}
}

// checkClosed reports a calc fence that runs to the end of the file: the
// line after its content must be a closing fence. It reports whether the
// fence is closed.
func (d *Doc) checkClosed(b *gast.FencedCodeBlock) bool {
	var rest []byte
	if n := b.Lines().Len(); n > 0 {
		rest = d.body[b.Lines().At(n-1).Stop:]
	} else if _, after, ok := bytes.Cut(d.body[b.Info.Segment.Stop:], []byte("\n")); ok {
		rest = after
	}
	line, _, _ := bytes.Cut(rest, []byte("\n"))
	t := strings.TrimLeft(strings.TrimRight(string(line), "\r"), " >\t")
	if !strings.HasPrefix(t, "```") && !strings.HasPrefix(t, "~~~") {
		p := d.lines.pos(d.Src, b.Info.Segment.Start)
		d.errorf(p.Off-(p.Col-1), "calc block is not closed: add a closing fence line")
		return false
	}
	return true
}

// readInline parses an inline `=expr` or `=expr [UNIT]` span.
func (d *Doc) readInline(s *gast.CodeSpan) {
	var start, stop int = -1, 0
	for c := s.FirstChild(); c != nil; c = c.NextSibling() {
		if t, ok := c.(*gast.Text); ok {
			if start < 0 {
				start = t.Segment.Start
			}
			stop = t.Segment.Stop
		}
	}
	if start < 0 {
		return
	}
	raw := string(d.body[start:stop])
	if !strings.HasPrefix(raw, "=") || strings.Contains(raw, "\n") {
		return
	}
	st, errs := eval.ParseInline(raw[1:], start+1, d.lines.pos(d.Src, start).Line, d.Front.Ctx)
	d.addEvalErrors(errs)
	if st != nil && len(errs) == 0 {
		d.Items = append(d.Items, &Item{Stmt: st, Inline: true})
	}
}

// evalError adds an error of the evaluator at its own offset, or at off
// when it carries none.
func (d *Doc) evalError(err error, off int) {
	var e *eval.Error
	if errors.As(err, &e) {
		off = e.Off
	}
	d.errorf(off, "%s", evalMsg(err))
}

// evalMsg is the message of an evaluator error, without a position.
func evalMsg(err error) string {
	var e *eval.Error
	if errors.As(err, &e) {
		return e.Msg
	}
	return err.Error()
}

func (d *Doc) addEvalErrors(errs []*eval.Error) {
	for _, e := range errs {
		d.errorf(e.Off, "%s", e.Msg)
	}
}

// sortItems puts calc lines and inline values in file order.
func sortItems(items []*Item) {
	sort.SliceStable(items, func(i, j int) bool { return items[i].Stmt.Off < items[j].Stmt.Off })
}
