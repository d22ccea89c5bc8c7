package review

import (
	"bytes"
	"errors"
	"strings"
	"testing"
)

// calc is a small calc of a fictional plant, one string per line.
var calc = []string{
	"---",
	"title: Feed pump (fictional)",
	"---",
	"# Feed pump",
	"",
	"```calc",
	"p_out = 12.5 MPa // discharge",
	"m_dot = 213.2 kg/s // feedwater flow",
	"```",
}

var (
	checker  = Person{Name: "C. Reader", Email: "checker@example.com"}
	preparer = Person{Name: "P. Writer", Email: "preparer@example.com"}
)

func TestWorkflow(t *testing.T) {
	f := &File{}
	c1, err := f.Add(calc, Target{Line: 7}, checker, "give the source of the discharge pressure")
	if err != nil || c1.ID != "C1" || c1.Quote != "p_out =" || c1.Status != Open {
		t.Fatalf("add: %+v, %v", c1, err)
	}
	c2, err := f.Add(calc, Target{Section: "Feed pump"}, checker, "state the pump curve used")
	if err != nil || c2.ID != "C2" {
		t.Fatalf("add section: %+v, %v", c2, err)
	}
	if _, err := f.Answer("C1", preparer, "HB-001 rev C (fictional)"); err != nil {
		t.Fatal(err)
	}
	if _, err := f.Close("C1", preparer, checker); !errors.Is(err, ErrNotChecker) {
		t.Fatalf("close by the preparer: %v, want ErrNotChecker", err)
	}
	if _, err := f.Close("C1", Person{Name: "C. Reader", Email: "CHECKER@example.com"}, checker); err != nil {
		t.Fatalf("close by the checker: %v", err)
	}
	if _, err := f.Answer("C1", preparer, "again"); err == nil {
		t.Error("answering a closed comment passed")
	}
	if _, err := f.Close("C9", checker, checker); err == nil || !strings.Contains(err.Error(), "the comments are C1, C2") {
		t.Errorf("close of an unknown id: %v", err)
	}
	if o, a, c := f.Counts(); o != 1 || a != 0 || c != 1 || len(f.Unresolved()) != 1 {
		t.Errorf("counts %d %d %d", o, a, c)
	}
	out := f.Marshal("fp.calc.md")
	back, err := Parse("fp.review.yaml", out)
	if err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	if again := back.Marshal("fp.calc.md"); !bytes.Equal(again, out) {
		t.Errorf("marshal does not round-trip:\n%s\n---\n%s", out, again)
	}
}

func TestAddRefuses(t *testing.T) {
	for _, tc := range []struct {
		at   Target
		by   Person
		want string
	}{
		{Target{Line: 10}, checker, "line 10 is not a line of the calc, which has 9 lines"},
		{Target{Line: 5}, checker, "line 5 is blank"},
		{Target{Section: "Turbine"}, checker, `no heading "Turbine"`},
		{Target{}, checker, "either a line or a section"},
		{Target{Line: 7}, Person{}, "git config user.name and user.email"},
	} {
		if _, err := (&File{}).Add(calc, tc.at, tc.by, "text"); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%+v: %v, want %q", tc.at, err, tc.want)
		}
	}
}

func TestReanchor(t *testing.T) {
	f := &File{}
	if _, err := f.Add(calc, Target{Line: 8}, checker, "flow at which load?"); err != nil {
		t.Fatal(err)
	}
	edited := append(append([]string{}, calc[:6]...), "p_in = 8 kPa // suction", "eta_p = 80 %")
	edited = append(edited, calc[6:]...)
	edited[9] = "m_dot = 215 kg/s // feedwater flow, corrected" // the value changes, the name stays
	places, err := f.Anchor("fp.calc.md", edited)
	if err != nil || places[0] != (Place{Line: 10, From: 8}) {
		t.Fatalf("places %+v, %v", places, err)
	}
	f.Reanchor(places)
	if f.Items[0].Line != 10 {
		t.Errorf("line %d after reanchor, want 10", f.Items[0].Line)
	}
	// The line is gone: an error naming the comment, until it is closed.
	gone := append(append([]string{}, edited[:9]...), edited[10:]...)
	_, err = f.Anchor("fp.calc.md", gone)
	if err == nil || !strings.Contains(err.Error(), `fp.review.yaml:1:1: comment C1: line 10 no longer reads "m_dot ="`) {
		t.Fatalf("lost line: %v", err)
	}
	short := gone[:5]
	if _, err = f.Anchor("fp.calc.md", short); err == nil || !strings.Contains(err.Error(), "it names line 10, but fp.calc.md has 5 lines") {
		t.Fatalf("line beyond the file: %v", err)
	}
	f.Items[0].Status, f.Items[0].ClosedBy = Closed, checker.String()
	places, err = f.Anchor("fp.calc.md", gone)
	if err != nil || !places[0].Lost {
		t.Fatalf("closed comment on a lost line: %+v, %v", places, err)
	}
}

func TestParseErrors(t *testing.T) {
	for _, tc := range []struct{ src, want string }{
		{"comments: [", "not valid YAML"},
		{"items: []", `1:1: unknown key "items"`},
		{"comments:\n  - id: C1\n    line: 7\n    quote: \"p_out =\"\n    author: a\n    text: t\n    status: done\n", `7:13: comment C1: status "done" must be open, answered or closed`},
		{"comments:\n  - id: C1\n    line: 7\n    quote: q\n    colour: red\n", `5:5: comment C1: unknown key "colour"`},
		{"comments:\n  - id: C1\n    line: 7\n    author: a\n    text: t\n    status: open\n", "comment C1: line needs the quote"},
		{"comments:\n  - id: C1\n    section: S\n    author: a\n    text: t\n    status: answered\n", "comment C1: an answered comment needs the response"},
		{"comments:\n  - {id: C1, section: S, author: a, text: t, status: open}\n  - {id: C1, section: S, author: a, text: t, status: open}\n", "3:1: comment C1: id C1 is given twice (first at line 2)"},
		{"comments:\n  - id: X\n", `comment X: id "X" must be C and a number`},
		{"comments:\n  - id: C2\n    line: -3\n", `line "-3" must be a line number`},
	} {
		_, err := Parse("fp.review.yaml", []byte(tc.src))
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%q: %v, want %q", tc.src, err, tc.want)
		}
	}
}

func TestQuoteAndPath(t *testing.T) {
	for in, want := range map[string]string{
		"  h_2 [kJ/kg] = h_1 - x // exhaust": "h_2 [kJ/kg] =",
		"check x_2 >= 0.88":                  "check x_2 >= 0.88",
		"Heat balance of the fictional Larchmoor Unit 1 steam cycle at full load": "Heat balance of the fictional Larchmoor Unit 1 s",
	} {
		if got := QuoteOf(in); got != want {
			t.Errorf("QuoteOf(%q) = %q, want %q", in, got, want)
		}
	}
	if got := PathFor("calcs/fp.calc.md"); got != "calcs/fp.review.yaml" {
		t.Errorf("PathFor = %q", got)
	}
}
