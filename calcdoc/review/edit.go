package review

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
)

// ErrNotChecker is returned by Close when the person closing a comment is
// not the checker the calc's front matter names.
var ErrNotChecker = errors.New("only the checker closes a comment")

// Person is whoever edits the record, as git knows them (user.name and
// user.email), or the checker the front matter names.
type Person struct {
	Name, Email string
}

// String is "Name <email>".
func (p Person) String() string { return p.Name + " <" + p.Email + ">" }

// Target is what a new comment concerns: a line of the calc (1-based) or
// the text of a heading.
type Target struct {
	Line    int
	Section string
}

// Add raises a comment by author on a line or section of the calc whose
// lines are given, and returns it. The line must exist and hold text; a
// section must be a heading of the calc.
func (f *File) Add(lines []string, at Target, author Person, text string) (*Item, error) {
	if err := who(author); err != nil {
		return nil, err
	}
	if err := oneLine("text", text); err != nil {
		return nil, err
	}
	it := &Item{ID: f.nextID(), Author: author.String(), Text: text, Status: Open}
	switch {
	case at.Section != "" && at.Line != 0, at.Section == "" && at.Line == 0:
		return nil, errors.New("give either a line or a section")
	case at.Section != "":
		it.Section = strings.TrimSpace(at.Section)
		if p, _ := it.place(lines, ""); p.Lost {
			return nil, fmt.Errorf("the calc has no heading %q; give a heading's text as it is written, without the # marks", at.Section)
		}
	case at.Line < 1 || at.Line > len(lines):
		return nil, fmt.Errorf("line %d is not a line of the calc, which has %d lines", at.Line, len(lines))
	default:
		it.Line, it.Quote = at.Line, QuoteOf(lines[at.Line-1])
		if it.Quote == "" {
			return nil, fmt.Errorf("line %d is blank; comment on the line the remark concerns", at.Line)
		}
	}
	f.Items = append(f.Items, it)
	return it, nil
}

// nextID is one more than the largest id in the record.
func (f *File) nextID() string {
	n := 0
	for _, it := range f.Items {
		if k, err := strconv.Atoi(strings.TrimPrefix(it.ID, "C")); err == nil && k > n {
			n = k
		}
	}
	return "C" + strconv.Itoa(n+1)
}

// Find returns the comment with the id.
func (f *File) Find(id string) (*Item, error) {
	var ids []string
	for _, it := range f.Items {
		if strings.EqualFold(it.ID, id) {
			return it, nil
		}
		ids = append(ids, it.ID)
	}
	if len(ids) == 0 {
		return nil, fmt.Errorf("no comment %s: the record has no comments", id)
	}
	return nil, fmt.Errorf("no comment %s; the comments are %s", id, strings.Join(ids, ", "))
}

// Answer records the preparer's response to an open or answered comment
// (a second answer replaces the first) and marks it answered.
func (f *File) Answer(id string, by Person, text string) (*Item, error) {
	it, err := f.Find(id)
	if err != nil {
		return nil, err
	}
	if err := who(by); err != nil {
		return nil, err
	}
	if err := oneLine("response", text); err != nil {
		return nil, err
	}
	if it.Status == Closed {
		return nil, fmt.Errorf("comment %s is closed by %s; the checker raises a new comment if more is needed", it.ID, it.ClosedBy)
	}
	it.Response, it.AnsweredBy, it.Status = text, by.String(), Answered
	return it, nil
}

// Close marks a comment closed. Only the checker the front matter names
// may close one (compared by e-mail address, as signatures are): by is
// whoever runs the command, checker the front matter's checker.
func (f *File) Close(id string, by, checker Person) (*Item, error) {
	it, err := f.Find(id)
	if err != nil {
		return nil, err
	}
	if err := who(by); err != nil {
		return nil, err
	}
	switch {
	case checker.Email == "":
		return nil, fmt.Errorf("%w, and the front matter names no checker under people:; add one and commit", ErrNotChecker)
	case !strings.EqualFold(by.Email, checker.Email):
		return nil, fmt.Errorf("%w: you are %s, and the front matter names %s as checker", ErrNotChecker, by, checker)
	case it.Status == Closed:
		return nil, fmt.Errorf("comment %s is already closed", it.ID)
	}
	it.Status, it.ClosedBy = Closed, by.String()
	return it, nil
}

// who refuses an editor git does not know.
func who(p Person) error {
	if p.Email == "" || p.Name == "" || strings.ContainsAny(p.Name+p.Email, "<>\n") {
		return errors.New("git does not know who you are: set git config user.name and user.email")
	}
	return nil
}

// oneLine refuses an empty text.
func oneLine(what, s string) error {
	if strings.TrimSpace(s) == "" {
		return fmt.Errorf("the %s is empty; write what the comment says", what)
	}
	return nil
}
