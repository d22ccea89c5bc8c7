package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc/starter"
	"github.com/vouchcalc/vouch/internal/testkit"
)

// runAs runs vouch as a person git knows, returning the exit code and the
// output.
func runAs(t *testing.T, who starter.Person, args ...string) (int, string, string) {
	t.Helper()
	old := gitUser
	gitUser = func(string) starter.Person { return who }
	defer func() { gitUser = old }()
	var out, errb bytes.Buffer
	code := run(args, &out, &errb)
	return code, out.String(), errb.String()
}

// TestReviewCommand: the checker comments, lines are inserted above the
// comment, the preparer answers (the comment follows its line), the
// preparer cannot close it, the checker can; the package shows it, and a
// record naming a line beyond the calc stops the render.
func TestReviewCommand(t *testing.T) {
	dir := t.TempDir()
	calc := filepath.Join(dir, "fp.calc.md")
	if err := os.WriteFile(calc, []byte(testkit.SignCalc), 0o644); err != nil {
		t.Fatal(err)
	}
	checker := starter.Person{Name: "C. Reader", Email: testkit.CheckerEmail}
	preparer := starter.Person{Name: "P. Writer", Email: testkit.PreparerEmail}
	steps := []reviewStep{
		{checker, []string{"review", "add", calc, "--line", "16", "give the source of the discharge pressure"}, 0, "comment C1 open (line 16: p_out =)"},
		{checker, []string{"review", "add", calc, "--line", "99", "x"}, 1, "line 99 is not a line of the calc, which has 22 lines"},
		{checker, []string{"review", "frob", calc}, 2, "usage: vouch review add"},
	}
	runSteps(t, steps)
	src := strings.Replace(testkit.SignCalc, "# Feed pump\n", "# Feed pump\n\nThe pump of the fictional test plant.\n", 1)
	if err := os.WriteFile(calc, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	runSteps(t, []reviewStep{
		{preparer, []string{"review", "answer", calc, "C1", "HB-001 rev C (fictional)"}, 0, "comment C1 answered (line 18: p_out =); C1 moved from line 16 to line 18"},
		{preparer, []string{"review", "close", calc, "C1"}, 1, "only the checker closes a comment: you are P. Writer <preparer@example.com>, and the front matter names C. Reader <checker@example.com> as checker"},
		{checker, []string{"review", "close", calc, "C1"}, 0, "comment C1 closed"},
		{checker, []string{"review", "list", calc}, 0, "0 open, 0 answered, 1 closed"},
	})
	rec, err := os.ReadFile(filepath.Join(dir, "fp.review.yaml"))
	if err != nil || !strings.Contains(string(rec), "line: 18\n") {
		t.Fatalf("record: %v\n%s", err, rec)
	}
	if code, _, errs := runAs(t, checker, "render", calc, "-o", dir); code != 0 {
		t.Fatalf("render: exit %d\n%s", code, errs)
	}
	html, _ := os.ReadFile(filepath.Join(dir, "fp.html"))
	if !strings.Contains(string(html), "review comments and their resolution") || !strings.Contains(string(html), "HB-001 rev C (fictional)") {
		t.Error("the package lacks the comment-and-resolution appendix")
	}
	bad := strings.Replace(string(rec), "line: 18", "line: 40", 1)
	bad = strings.Replace(bad, "status: closed", "status: answered", 1)
	bad = strings.Replace(bad, "    closed_by: \"C. Reader <checker@example.com>\"\n", "", 1)
	if err := os.WriteFile(filepath.Join(dir, "fp.review.yaml"), []byte(bad), 0o644); err != nil {
		t.Fatal(err)
	}
	// line 40 is beyond the file, but the quote is found: the comment follows it.
	if code, _, errs := runAs(t, checker, "render", calc, "-o", dir); code != 0 {
		t.Fatalf("render with a moved comment: exit %d\n%s", code, errs)
	}
	bad = strings.Replace(bad, `quote: "p_out ="`, `quote: "p_max ="`, 1)
	if err := os.WriteFile(filepath.Join(dir, "fp.review.yaml"), []byte(bad), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, errs := runAs(t, checker, "render", calc, "-o", t.TempDir())
	if code != exitErrors || !strings.Contains(errs, "fp.review.yaml:4:1: comment C1: it names line 40, but fp.calc.md has 24 lines") {
		t.Fatalf("render with a lost comment: exit %d\n%s", code, errs)
	}
}

// reviewStep is one command of a review, who runs it and what it must give.
type reviewStep struct {
	who  starter.Person
	args []string
	code int
	want string
}

func runSteps(t *testing.T, steps []reviewStep) {
	t.Helper()
	for _, s := range steps {
		code, out, errs := runAs(t, s.who, s.args...)
		if code != s.code || !strings.Contains(out+errs, s.want) {
			t.Fatalf("%v: exit %d, %s%s; want exit %d and %q", s.args[1:3], code, out, errs, s.code, s.want)
		}
	}
}
