package calcdoc

import (
	"strings"
	"testing"
)

// Each case is a calc body (put inside one calc block after a blank front
// matter) and the exact first error, as line:col: message. Line 1 is the
// first calc line.
var errorCases = []struct {
	name, body, want string
}{
	{"unknown unit", "a = 3 MPax", "1:7: unknown unit MPax; did you mean MPa?"},
	{"unknown display unit", "a [kJ/kgg] = 1 kJ/kg", "1:7: unknown unit kgg; did you mean kg?"},
	{"dimension mismatch", "a = 2 MPa + 3 kJ/kg", "1:11: cannot add pressure (MPa) and specific enthalpy (kJ/kg)"},
	{"display unit mismatch", "a [kJ/kg] = 2 MPa", "1:4: a: cannot show pressure (MPa) in kJ/kg, which is specific enthalpy"},
	{"two absolute temperatures", "a = 20 degC + 30 degC", "1:13: cannot add two absolute temperatures; subtract them for a difference, or write the one that is a difference in K or Cdeg"},
	{"difference in degC", "a [degC] = 30 degC - 20 degC", "1:4: a: a temperature difference cannot be shown in degC; use K or Cdeg"},
	{"undefined name", "h_1 = 1 kJ/kg\nb = h_2 * 2", "2:5: undefined name h_2; did you mean h_1?"},
	{"redefinition", "a = 1\nb = 2\na = 3", "3:1: a is already defined on line 5; a name is defined once"},
	{"check not boolean", "check 3 m", "1:7: a check must be true or false, but this is a quantity of length (m)"},
	{"division by zero", "a = 1 m\nb = a / (a - a)", "2:7: division by zero: a - a is 0"},
	{"non-finite", "a = exp(800)", "1:5: exp gives no finite result here"},
	{"deep nesting", "a = " + strings.Repeat("(", 100000) + "1" + strings.Repeat(")", 100000), "1:1: line is 200005 bytes long; a calc line may be at most 4096 bytes"},
	{"nesting under the line limit", "a = " + strings.Repeat("(", 100) + "1" + strings.Repeat(")", 100), "1:69: brackets are nested more than 64 deep"},
	{"half-MB line", "a = 1" + strings.Repeat(" ", 1<<19), "1:1: line is 524293 bytes long; a calc line may be at most 4096 bytes"},
	{"incomplete", "a = 1 +", "1:7: the expression is incomplete"},
	{"no equals", "a 1 m", "1:3: expected = after a"},
	{"reserved name", "in = 2", "1:1: in is a reserved word and cannot be a name"},
	{"function as name", "sqrt = 2", "1:1: sqrt is a function and cannot be a name"},
	{"unknown function", "a = sqr(4)", "1:5: unknown function sqr; did you mean sqrt?"},
	{"wrong arity", "a = sqrt(4, 5)", "1:5: sqrt(x) takes 1 argument, not 2"},
	{"exponent with unit", "a = 2 ^ (3 m)", "1:7: an exponent must be dimensionless, not length (m)"},
	{"gauge in compound", "a = 3 barg/s", "1:7: gauge unit barg cannot be part of the compound unit barg/s; convert to an absolute pressure unit"},
	{"compare mismatch", "check 1 m > 1 s", "1:11: cannot compare length (m) with time (s)"},
	{"list not supported", "a = [1, 2]", "1:5: a list is not supported in a calc expression"},
	{"disabled builtin", "a = now()", "1:5: unknown function now"},
	{"field of a number", "a = 1 m\nb = a.h", "2:7: a quantity of length (m) has no fields; .h needs a state"},
	{"number too large", "a = 2 * 1e400", "1:9: the number 1e400 is beyond the range of numbers (about ±1.8e308)"},
	{"integer too large", "a = 99999999999999999999 + 1", "1:5: the whole number 99999999999999999999 is beyond the range of whole numbers (about ±9.2e18); write it with an exponent, such as 9e19"},
	{"unterminated text", "a = \"abc", "1:9: literal not terminated"},
	{"open bracket", "a = (1 + 2", "1:10: the expression is incomplete"},
	{"open condition", "a = 1 > 0 ? 2", "1:13: the expression is incomplete"},
	{"stray bracket", "a = 1 )", "1:7: unexpected token Bracket(\")\")"},
	{"more parts than the limit", "a = " + strings.Repeat("1+", 1100) + "1", "1:2006: expression has more than 2000 parts"},
	{"literal too large", "a = 1e400 m", "1:5: the number 1e400 is beyond the range of numbers (about ±1.8e308)"},
	{"literal too large in SI", "a = 1e308 MPa", "1:5: 1e308 MPa is beyond the range of numbers in SI units"},
	{"power of a base unit", "a = 2 m^12\nb = a * 1 m", "2:7: the result would hold m^13; the power of a base unit is at most 12"},
	{"power of a base unit in a power", "a = (3 m^2)^7", "1:12: the result would hold m^14; the power of a base unit is at most 12"},
}

func TestErrorMessages(t *testing.T) {
	for _, c := range errorCases {
		t.Run(c.name, func(t *testing.T) {
			src := "---\ntitle: t\n---\n```calc\n" + c.body + "\n```\n"
			d := Read("t.calc.md", []byte(src))
			d.Evaluate()
			if len(d.Errors) == 0 {
				t.Fatalf("no error; want %q", c.want)
			}
			e := d.Errors[0]
			got := sprintf("%d:%d: %s", e.Pos.Line-4, e.Pos.Col, e.Msg)
			if got != c.want {
				t.Errorf("got  %s\nwant %s", got, c.want)
			}
		})
	}
}

// TestErrorListIsError holds the go/scanner idiom: the list is an error,
// Err is nil for an empty list, and each error prints its position.
func TestErrorListIsError(t *testing.T) {
	var none ErrorList
	if none.Err() != nil {
		t.Fatal("empty list: Err is not nil")
	}
	d := Read("t.calc.md", []byte("---\ntitle: t\n---\n```calc\na = 1 +\nb = sqr(4)\n```\n"))
	d.Evaluate()
	err := d.Errors.Err()
	if err == nil {
		t.Fatal("no error")
	}
	if want := "5:7: the expression is incomplete (and 1 more errors)"; err.Error() != want {
		t.Errorf("got %q, want %q", err, want)
	}
}

func TestDocumentErrors(t *testing.T) {
	cases := []struct{ name, src, want string }{
		{"unknown front-matter key", "---\ntitle: x\ncolour: blue\n---\n", "3:1: unknown front-matter key \"colour\"; known keys are atmosphere, compare, digits, display, number, paper, people, project, references, revision, revisions, summary, title, us_power (a firm declares its own keys under front_matter in vouch.yaml)"},
		{"malformed front matter", "---\ntitle: [x\n---\n", "2:1: front matter is not valid YAML: line 1: did not find expected ',' or ']'"},
		{"unclosed front matter", "---\ntitle: x\n", "1:1: front matter is not closed: add a line --- after it"},
		{"bad digits", "---\ndigits: 40\n---\n", "2:9: digits must be a whole number from 2 to 15, not \"40\""},
		{"bad person", "---\npeople:\n  checker: nobody\n---\n", "3:12: checker must be written Name <email>, not \"nobody\""},
		{"unclosed fence", "# x\n\n```calc\na = 1\n", "3:1: calc block is not closed: add a closing fence line"},
		{"not UTF-8", "---\ntitle: x\n---\n```calc\na = 1 \xff m\n```\n", "5:7: file is not valid UTF-8 text"},
		{"summary undefined", "---\nsummary: [W_nett]\n---\n```calc\nW_net = 1 W\n```\n", "2:1: summary names W_nett, which the calc does not define; did you mean W_net?"},
		{"revisions not a list", "---\nrevisions: A\n---\n", "2:12: revisions must be a list of entries such as - {letter: A, date: 2026-11-02, description: First issue}"},
		{"revision without date", "---\nrevisions:\n  - {letter: A, description: First issue}\n---\n", "3:5: the revision lacks date"},
		{"revision bad date", "---\nrevisions:\n  - {letter: A, date: 2026-13-01, description: x}\n---\n", "3:5: revision A: date \"2026-13-01\" must be a date such as 2026-11-02"},
		{"revision unknown key", "---\nrevisions:\n  - {letter: A, dat: 2026-11-01}\n---\n", "3:17: unknown key \"dat\" in a revision; the keys are letter, date and description"},
		{"revision listed twice", "---\nrevisions:\n  - {letter: A, date: 2026-11-01, description: x}\n  - {letter: A, date: 2026-11-02, description: y}\n---\n", "4:5: revision A is listed twice; list each revision once"},
		{"revision description too long", "---\nrevisions:\n  - {letter: A, date: 2026-11-01, description: " + strings.Repeat("x", 121) + "}\n---\n", "3:5: revision A: the description is 121 characters; keep it to 120 (the commits in the appendix hold the detail)"},
		{"summary of a state", "---\nsummary: [st]\n---\n```calc\nst = water(1 bar, 400 K)\n```\n", "2:1: summary names st, which has fields (a state, a saturation point or a data file); name a value defined from one of them, such as h_1 = st.h"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			d := Read("t.calc.md", []byte(c.src))
			d.Evaluate()
			if len(d.Errors) == 0 {
				t.Fatalf("no error; want %q", c.want)
			}
			e := d.Errors[0]
			if got := sprintf("%d:%d: %s", e.Pos.Line, e.Pos.Col, e.Msg); got != c.want {
				t.Errorf("got  %s\nwant %s", got, c.want)
			}
		})
	}
}

// TestGathersEveryError: one bad line does not hide the next.
func TestGathersEveryError(t *testing.T) {
	d := Read("t.calc.md", []byte("```calc\na = 1 xx\nb = 2 yy\nc = a + 1\nd = 3 zz\n```\n"))
	d.Evaluate()
	if len(d.Errors) != 3 {
		t.Fatalf("got %d errors, want 3 (c is skipped because a failed):\n%s", len(d.Errors), d.Errors.Format("t", d.Src))
	}
}

func TestErrorFormatCaret(t *testing.T) {
	d := Read("t.calc.md", []byte("```calc\nT = 540 degCC\n```\n"))
	d.Evaluate()
	want := "t.calc.md:2:9: unknown unit degCC; did you mean degC?\n    T = 540 degCC\n            ^\n"
	if got := d.Errors.Format("t.calc.md", d.Src); got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
}

// TestInlineRecord: an inline value of a state asks for one of its fields
// (it showed "(state)").
func TestInlineRecord(t *testing.T) {
	src := "---\ntitle: t\n---\n```calc\nst = water(1 bar, 400 K)\nsat = water_sat(1 bar)\n```\nState `=st`, saturation `=sat`, enthalpy `=st.h [kJ/kg]`.\n"
	d := Read("t.calc.md", []byte(src))
	d.Evaluate()
	want := []string{
		"8:9: an inline value shows a number, a quantity, a truth value or a text, and st has fields; show one of them, such as `=st.h`",
		"8:27: an inline value shows a number, a quantity, a truth value or a text, and sat has fields; show one of them, such as `=sat.p`",
	}
	var got []string
	for _, e := range d.Errors {
		got = append(got, sprintf("%d:%d: %s", e.Pos.Line, e.Pos.Col, e.Msg))
	}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("got\n%s\nwant\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
}
