package main

import (
	"errors"
	"fmt"
	"github.com/vouchcalc/vouch/internal/safefile"
	"io"
	"io/fs"
	"path/filepath"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/review"
)

const reviewUsage = `usage: vouch review add CALC (--line N | --section HEADING) TEXT
       vouch review answer CALC ID TEXT
       vouch review close CALC ID
       vouch review list CALC`

// reviewSession is a calc and its review record, read for one edit.
type reviewSession struct {
	calc, path string // the calc file and its review record, as given
	lines      []string
	checker    review.Person
	rec        *review.File
	places     []review.Place
}

func cmdReview(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprintln(stderr, reviewUsage)
		return exitUsage
	}
	fs := newFlags("review "+args[0], stderr)
	line := fs.Int("line", 0, "the calc line the comment concerns (add)")
	section := fs.String("section", "", "the heading of the section the comment concerns (add)")
	pos, err := parseArgs(fs, args[1:])
	if err != nil {
		return exitUsage
	}
	want := map[string]int{"add": 2, "answer": 3, "close": 2, "list": 1}[args[0]]
	if want == 0 || len(pos) != want || (args[0] != "add" && (*line != 0 || *section != "")) {
		fmt.Fprintln(stderr, reviewUsage)
		return exitUsage
	}
	s, err := openReview(pos[0])
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	s.warnLost(stderr)
	if args[0] == "list" {
		s.list(stdout)
		return exitOK
	}
	msg, err := s.edit(args[0], pos[1:], review.Target{Line: *line, Section: *section})
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %s: %v\n", s.path, err)
		return exitErrors
	}
	if err := calcdoc.WriteFileAtomic(s.path, s.rec.Marshal(filepath.Base(s.calc))); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	fmt.Fprintf(stdout, "%s: %s\n", s.path, msg)
	return exitOK
}

// openReview reads the calc and its review record (an empty record when
// there is none yet) and finds each comment in the calc.
func openReview(calc string) (*reviewSession, error) {
	src, err := safefile.Read(calc, calcdoc.MaxFileBytes)
	if err != nil {
		return nil, err
	}
	d := calcdoc.Read(calc, src)
	s := &reviewSession{calc: calc, path: review.PathFor(calc), lines: review.Lines(src), rec: &review.File{}}
	c := d.Front.People.Checker
	s.checker = review.Person{Name: c.Name, Email: c.Email}
	raw, err := safefile.Read(s.path, review.MaxBytes)
	switch {
	case errors.Is(err, fs.ErrNotExist):
	case err != nil:
		return nil, err
	default:
		if s.rec, err = review.Parse(s.path, raw); err != nil {
			return nil, err
		}
	}
	return s, nil
}

// warnLost anchors the comments and says which ones moved or are lost.
// Lost comments stay as recorded: the package refuses them until they are
// closed or the calc holds their line again.
func (s *reviewSession) warnLost(w io.Writer) {
	places, err := s.rec.Anchor(filepath.Base(s.calc), s.lines)
	s.places = places
	var list review.ErrorList
	if errors.As(err, &list) {
		for _, e := range list {
			fmt.Fprintf(w, "vouch: warning: %v\n", e)
		}
	}
}

// edit applies one edit and says what it did.
func (s *reviewSession) edit(verb string, rest []string, at review.Target) (string, error) {
	me := gitUser(filepath.Dir(s.calc))
	by := review.Person{Name: me.Name, Email: me.Email}
	moved := s.moved()
	s.rec.Reanchor(s.places)
	var it *review.Item
	var err error
	switch verb {
	case "add":
		it, err = s.rec.Add(s.lines, at, by, rest[0])
	case "answer":
		it, err = s.rec.Answer(rest[0], by, rest[1])
	case "close":
		it, err = s.rec.Close(rest[0], by, s.checker)
	}
	if err != nil {
		return "", err
	}
	return fmt.Sprintf("comment %s %s (%s)%s", it.ID, it.Status, place(it), moved), nil
}

// moved says which comments follow their lines to a new line number.
func (s *reviewSession) moved() string {
	var out []string
	for i, p := range s.places {
		if it := s.rec.Items[i]; p.From != 0 && !p.Lost {
			out = append(out, fmt.Sprintf("%s moved from line %d to line %d", it.ID, p.From, p.Line))
		}
	}
	if len(out) == 0 {
		return ""
	}
	return "; " + strings.Join(out, ", ")
}

// place is where a comment is, for the terminal.
func place(it *review.Item) string {
	if it.Section != "" {
		return fmt.Sprintf("section %q", it.Section)
	}
	return fmt.Sprintf("line %d: %s", it.Line, it.Quote)
}

// list prints every comment with its status and response.
func (s *reviewSession) list(w io.Writer) {
	if len(s.rec.Items) == 0 {
		fmt.Fprintf(w, "%s: no comments\n", s.calc)
		return
	}
	for i, it := range s.rec.Items {
		where := place(it)
		if p := s.places[i]; p.Lost {
			where += ", no longer in the calc"
		} else if p.From != 0 {
			where = fmt.Sprintf("now line %d (recorded at %d)", p.Line, p.From)
		}
		fmt.Fprintf(w, "%s  %-8s  %s\n    %s: %s\n", it.ID, it.Status, where, it.Author, it.Text)
		if it.Response != "" {
			fmt.Fprintf(w, "    response, %s: %s\n", it.AnsweredBy, it.Response)
		}
		if it.ClosedBy != "" {
			fmt.Fprintf(w, "    closed by %s\n", it.ClosedBy)
		}
	}
	o, a, c := s.rec.Counts()
	fmt.Fprintf(w, "%d open, %d answered, %d closed\n", o, a, c)
}
