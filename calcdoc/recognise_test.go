package calcdoc

import (
	"strings"
	"testing"
)

// TestByteOrderMarkFrontMatter is issue 11 item 5: a byte-order mark before
// the front matter no longer hides it, and positions on line 1 do not
// count the mark as a column.
func TestByteOrderMarkFrontMatter(t *testing.T) {
	src := bom + "---\ntitle: Feed pump sizing (fictional)\npeople:\n  preparer: P. Writer <p@example.com>\n---\n```calc\na = 1 m\n```\n"
	d := Read("x.calc.md", []byte(src))
	if len(d.Errors) > 0 || d.Front.Title != "Feed pump sizing (fictional)" || d.Front.People.Preparer.Name != "P. Writer" {
		t.Fatalf("front %+v, errors %v", d.Front, d.Errors)
	}
	if len(d.Items) != 1 {
		t.Errorf("%d calc lines read", len(d.Items))
	}
	d = Read("x.calc.md", []byte(bom+"```calc\na = 1 m +\n```\n"))
	if len(d.Errors) == 0 {
		t.Fatal("no error")
	}
	if p := d.lines.pos(d.Src, len(bom)); p.Line != 1 || p.Col != 1 || d.lines.text(d.Src, 1) != "```calc" {
		t.Errorf("line 1 starts at %+v, reads %q", p, d.lines.text(d.Src, 1))
	}
}

// TestBareCRLineEnds is issue 11 item 5: a file with bare carriage
// returns is refused with a clear error instead of having its calc fences
// run into one line and dropped.
func TestBareCRLineEnds(t *testing.T) {
	d := Read("x.calc.md", []byte("# Pump\r\r```calc\rcheck 1 m > 2 m\r```\r"))
	if len(d.Errors) != 1 || !strings.Contains(d.Errors[0].Msg, "bare carriage return") || d.Errors[0].Pos.Col != 7 {
		t.Errorf("errors %v", d.Errors)
	}
	d = Read("x.calc.md", []byte("---\r\ntitle: T\r\n---\r\n```calc\r\na = 1 m\r\n```\r\n"))
	if len(d.Errors) != 0 || d.Front.Title != "T" || len(d.Items) != 1 {
		t.Errorf("CRLF: title %q, %d items, errors %v", d.Front.Title, len(d.Items), d.Errors)
	}
}

// TestFrontAndFenceVariants closes the class of item 5: every way front
// matter or a fence could be silently not recognised is either read or an
// error at its line.
func TestFrontAndFenceVariants(t *testing.T) {
	cases := []struct {
		name, src string
		items     int
		err       string // "" when read without error
	}{
		{"--- with trailing space", "--- \ntitle: T\n---  \n```calc\na = 1 m\n```\n", 1, ""},
		{"front matter after a blank line", "\n---\ntitle: T\n---\n", 0, "2:1: front matter must start on the first line"},
		{"language in capitals", "```Calc\na = 1 m\n```\n", 0, "1:1: this line looks like a calc fence"},
		{"language in braces", "~~~{sweep}\nvary a\n~~~\n", 0, "1:1: this line looks like a sweep fence"},
		{"indented four spaces", "text\n\n    ```calc\n    a = 1 m\n    ```\n", 0, "3:1: this line looks like a calc fence"},
		{"inside raw HTML", "<div>\n```calc\na = 1 m\n```\n</div>\n", 0, "2:1: this line looks like a calc fence"},
		{"spaces around the language", "```  calc  \na = 1 m\n```\n", 1, ""},
		{"a tab before the language", "```\tcalc\na = 1 m\n```\n", 1, ""},
		{"in a list item", "- step\n\n  ```calc\n  a = 1 m\n  ```\n", 1, ""},
		{"in a block quote", "> ```calc\n> a = 1 m\n> ```\n", 1, ""},
		{"an example inside a longer fence", "````markdown\n```calc\na = 1 m\n```\n````\n", 0, ""},
		{"a code span, not a fence", "```calc a = 1```\n", 0, ""},
		{"commented out", "<!--\n```calc\na = 1 m\n```\n-->\n", 0, ""},
	}
	for _, c := range cases {
		d := Read("x.calc.md", []byte(c.src))
		got := ""
		if len(d.Errors) > 0 {
			got = d.Errors[0].Error()
		}
		if len(d.Items) != c.items || (c.err == "") != (got == "") || !strings.Contains(got, c.err) {
			t.Errorf("%s: %d items, error %q; want %d, %q", c.name, len(d.Items), got, c.items, c.err)
		}
	}
}

// TestDuplicateFrontMatterKey is issue 11 item 6: a key given twice, at
// the top or under people, is an error at the line of its second use, and
// the first value is kept (nothing silently overridden).
func TestDuplicateFrontMatterKey(t *testing.T) {
	src := "---\ntitle: Deaerator (fictional)\npeople:\n  preparer: P. Writer <p@example.com>\n  preparer: Q. Other <q@example.com>\ntitle: Other\n\"a%d\\x00\": 1\n\"a%d\\x00\": 2\n---\n"
	d := Read("x.calc.md", []byte(src))
	want := []string{
		"5:3: preparer is already given on line 4; give each key once",
		"6:1: title is already given on line 2; give each key once",
		`8:1: "a%d\x00" is already given on line 7; give each key once`,
	}
	if len(d.Errors) != len(want)+1 { // and the unknown key a%d\x00, once
		t.Fatalf("errors %v", d.Errors.Format("x", d.Src))
	}
	for i, w := range want {
		if !strings.HasPrefix(d.Errors[i].Error(), "x.calc.md:"+w) && !strings.HasPrefix(d.Errors[i].Error(), w) {
			t.Errorf("error %d: %s, want %s", i, d.Errors[i], w)
		}
	}
	if d.Front.Title != "Deaerator (fictional)" || d.Front.People.Preparer.Name != "P. Writer" {
		t.Errorf("front %+v", d.Front)
	}
}
