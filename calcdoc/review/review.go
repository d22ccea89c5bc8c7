// Package review reads and writes a calc's review record, NAME.review.yaml
// beside NAME.calc.md: the checker's comments, each on a line or a section
// of the calc, with the preparer's response and a status (open, answered,
// closed). The record is read as yaml.Nodes, so every mistake is reported
// at its line and column and names the comment; it is written by Marshal
// in one fixed layout, so the same record gives the same bytes. Anchoring
// (anchor.go) finds each comment's line again after the calc was edited;
// the edits of vouch review (edit.go) add, answer and close comments. The
// package reads no file and runs no git: callers hand it bytes and the
// identity of whoever edits.
package review

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"unicode/utf8"

	"go.yaml.in/yaml/v3"
)

// Status is a comment's state: open (raised by the checker), answered (the
// preparer responded) or closed (the checker accepted the resolution).
type Status string

// The statuses of a comment.
const (
	Open     Status = "open"
	Answered Status = "answered"
	Closed   Status = "closed"
)

// Item is one comment of the record.
type Item struct {
	ID string // C1, C2, …
	// Line is the calc file line the comment concerns (1-based), with
	// Quote the start of that line's text, by which the comment is found
	// again when lines are inserted or removed above it. Section is the
	// text of a heading instead; exactly one of Line and Section is set.
	Line       int
	Quote      string
	Section    string
	Author     string // Name <email> of whoever raised it
	Text       string
	Status     Status
	Response   string // the preparer's response
	AnsweredBy string // Name <email> of whoever responded
	ClosedBy   string // Name <email> of the checker who closed it

	pos int // line of the item in the record, for errors (0 when built)
}

// File is a review record: its comments in the order they were raised.
type File struct {
	Items []*Item
}

// Unresolved lists the comments that are not closed, in record order.
func (f *File) Unresolved() []*Item {
	var out []*Item
	for _, it := range f.Items {
		if it.Status != Closed {
			out = append(out, it)
		}
	}
	return out
}

// Counts returns the number of open, answered and closed comments.
func (f *File) Counts() (open, answered, closed int) {
	for _, it := range f.Items {
		switch it.Status {
		case Open:
			open++
		case Answered:
			answered++
		default:
			closed++
		}
	}
	return open, answered, closed
}

// MaxBytes is the largest review record read: 1 MiB, far more than any
// record of comments holds.
const MaxBytes = 1 << 20

// PathFor is the review record's path for a calc path: NAME.calc.md (or
// NAME.md) gives NAME.review.yaml beside it.
func PathFor(calc string) string {
	base := strings.TrimSuffix(calc, ".md")
	base = strings.TrimSuffix(base, ".calc")
	return base + ".review.yaml"
}

// Error is a mistake in a review record: its file, line and column, the
// comment it concerns ("" when none) and the message.
type Error struct {
	File      string
	Line, Col int
	Item      string
	Msg       string
}

// Error returns "file:line:col: comment ID: message".
func (e *Error) Error() string {
	s := fmt.Sprintf("%s:%d:%d: ", e.File, e.Line, e.Col)
	if e.Item != "" {
		s += "comment " + e.Item + ": "
	}
	return s + e.Msg
}

// ErrorList gathers every mistake of a record; it is an error itself.
type ErrorList []*Error

// Error returns the errors, one a line.
func (l ErrorList) Error() string {
	var b []string
	for _, e := range l {
		b = append(b, e.Error())
	}
	return strings.Join(b, "\n")
}

// Err returns the list as an error, or nil when it is empty.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}

// itemKeys are the keys of a comment, in the order Marshal writes them.
var itemKeys = []string{"id", "line", "quote", "section", "author", "text", "status", "response", "answered_by", "closed_by"}

var idPattern = regexp.MustCompile(`^C[1-9][0-9]{0,5}$`)

// Parse reads a review record. name is the record's path, for errors.
func Parse(name string, src []byte) (*File, error) {
	f := &File{}
	p := &parser{name: name}
	if !utf8.Valid(src) {
		p.errorf(1, 1, "", "the review record is not UTF-8 text")
		return nil, p.errs
	}
	var root yaml.Node
	if err := yaml.Unmarshal(src, &root); err != nil {
		p.errorf(1, 1, "", "the review record is not valid YAML: %s; write it with vouch review add|answer|close", strings.TrimPrefix(err.Error(), "yaml: "))
		return nil, p.errs
	}
	if len(root.Content) == 0 {
		return f, nil
	}
	f.Items = p.top(root.Content[0])
	p.checkIDs(f.Items)
	return f, p.errs.Err()
}

type parser struct {
	name string
	errs ErrorList
}

func (p *parser) errorf(line, col int, item, format string, args ...any) {
	p.errs = append(p.errs, &Error{File: p.name, Line: line, Col: col, Item: item, Msg: fmt.Sprintf(format, args...)})
}

func (p *parser) nodeErr(n *yaml.Node, item, format string, args ...any) {
	p.errorf(n.Line, n.Column, item, format, args...)
}

// top reads the record's one key, comments.
func (p *parser) top(m *yaml.Node) []*Item {
	if m.Kind != yaml.MappingNode {
		p.nodeErr(m, "", "a review record holds one key, comments, with a list of comments")
		return nil
	}
	var items []*Item
	for i := 0; i+1 < len(m.Content); i += 2 {
		k, v := m.Content[i], m.Content[i+1]
		if k.Value != "comments" {
			p.nodeErr(k, "", "unknown key %q; a review record holds one key, comments", k.Value)
			continue
		}
		if v.Kind != yaml.SequenceNode {
			p.nodeErr(v, "", "comments must be a list of comments, each starting with - id:")
			continue
		}
		for _, n := range v.Content {
			if it := p.item(n); it != nil {
				items = append(items, it)
			}
		}
	}
	return items
}

// item reads one comment and checks that its fields agree.
func (p *parser) item(n *yaml.Node) *Item {
	if n.Kind != yaml.MappingNode {
		p.nodeErr(n, "", "each comment is a set of keys: %s", strings.Join(itemKeys, ", "))
		return nil
	}
	it := &Item{pos: n.Line}
	label := fmt.Sprintf("at line %d", n.Line)
	for i := 0; i+1 < len(n.Content); i += 2 {
		if k := n.Content[i]; k.Value == "id" {
			label = n.Content[i+1].Value
		}
	}
	before := len(p.errs)
	for i := 0; i+1 < len(n.Content); i += 2 {
		p.field(it, label, n.Content[i], n.Content[i+1])
	}
	if len(p.errs) == before {
		if msg := it.inconsistency(); msg != "" {
			p.nodeErr(n, label, "%s", msg)
		}
	}
	return it
}

// field sets one key of a comment.
func (p *parser) field(it *Item, label string, k, v *yaml.Node) {
	if v.Kind != yaml.ScalarNode {
		p.nodeErr(v, label, "%s must be a single value", k.Value)
		return
	}
	s := v.Value
	switch k.Value {
	case "id":
		if !idPattern.MatchString(s) {
			p.nodeErr(v, label, "id %q must be C and a number, such as C1", s)
		}
		it.ID = s
	case "line":
		n, err := strconv.Atoi(s)
		if err != nil || n < 1 {
			p.nodeErr(v, label, "line %q must be a line number of the calc, 1 or more", s)
		}
		it.Line = n
	case "status":
		it.Status = Status(s)
		if it.Status != Open && it.Status != Answered && it.Status != Closed {
			p.nodeErr(v, label, "status %q must be open, answered or closed", s)
		}
	default:
		dst := map[string]*string{"quote": &it.Quote, "section": &it.Section, "author": &it.Author, "text": &it.Text,
			"response": &it.Response, "answered_by": &it.AnsweredBy, "closed_by": &it.ClosedBy}[k.Value]
		if dst == nil {
			p.nodeErr(k, label, "unknown key %q; the keys of a comment are %s", k.Value, strings.Join(itemKeys, ", "))
			return
		}
		*dst = s
	}
}

// inconsistency says what is wrong with a comment whose fields each read
// well, or "" when nothing is.
func (it *Item) inconsistency() string {
	switch {
	case it.ID == "":
		return "the comment has no id"
	case (it.Line == 0) == (it.Section == ""):
		return "give either line (with quote) or section, not both and not neither"
	case it.Line > 0 && it.Quote == "":
		return "line needs the quote of the line's text, by which the comment is found again after an edit"
	case it.Author == "" || it.Text == "":
		return "a comment needs its author and text"
	case it.Status == "":
		return "the comment has no status; give open, answered or closed"
	case it.Status == Answered && (it.Response == "" || it.AnsweredBy == ""):
		return "an answered comment needs the response and answered_by"
	case it.Status == Closed && it.ClosedBy == "":
		return "a closed comment needs closed_by, the checker who closed it"
	case it.Status == Open && it.ClosedBy != "":
		return "an open comment has no closed_by"
	}
	return ""
}

// checkIDs refuses an id given twice.
func (p *parser) checkIDs(items []*Item) {
	seen := map[string]int{}
	for _, it := range items {
		if first, ok := seen[it.ID]; ok && it.ID != "" {
			p.errorf(it.pos, 1, it.ID, "id %s is given twice (first at line %d); each comment has its own id", it.ID, first)
			continue
		}
		seen[it.ID] = it.pos
	}
}

// Marshal writes the record in its one layout: a header comment, then
// each comment's keys in a fixed order, every text double-quoted. Parse
// reads it back to the same record.
func (f *File) Marshal(calcName string) []byte {
	var b strings.Builder
	b.WriteString("# Review record of " + calcName + ": the checker's comments and their resolution.\n")
	b.WriteString("# Written by vouch review add, answer and close; edit it with those commands, not by hand.\n")
	if len(f.Items) == 0 {
		b.WriteString("comments: []\n")
		return []byte(b.String())
	}
	b.WriteString("comments:\n")
	for _, it := range f.Items {
		lead := "  - "
		put := func(k, v string) {
			if v != "" {
				b.WriteString(lead + k + ": " + v + "\n")
				lead = "    "
			}
		}
		put("id", it.ID)
		if it.Line > 0 {
			put("line", strconv.Itoa(it.Line))
		}
		put("quote", quote(it.Quote))
		put("section", quote(it.Section))
		put("author", quote(it.Author))
		put("text", quote(it.Text))
		put("status", string(it.Status))
		put("response", quote(it.Response))
		put("answered_by", quote(it.AnsweredBy))
		put("closed_by", quote(it.ClosedBy))
	}
	return []byte(b.String())
}

// quote writes s as a YAML double-quoted scalar ("" for an empty s, which
// Marshal leaves out). strconv.Quote's escapes are all YAML escapes.
func quote(s string) string {
	if s == "" {
		return ""
	}
	return strconv.Quote(s)
}
