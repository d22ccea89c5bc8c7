package calcdoc

import (
	"strings"
	"testing"
)

// TestNameDefinedLater is issue 11 item 21: a name used above its defining
// line is reported as defined later, with that line; a name defined
// nowhere is still undefined.
func TestNameDefinedLater(t *testing.T) {
	src := "# Heater\n\nThe duty is `=Q`.\n\n```calc\nQ = m * 2 kJ/kg\nc = zz + 1\nm = 3 kg\n```\n"
	d := Read("x.calc.md", []byte(src))
	d.Evaluate()
	want := []string{
		"3:15: Q is defined later, on line 6; a line can use only names defined above it",
		"6:5: m is defined later, on line 8; a line can use only names defined above it",
		"7:5: undefined name zz",
	}
	if len(d.Errors) != len(want) {
		t.Fatalf("errors:\n%s", d.Errors.Format("x", d.Src))
	}
	for i, w := range want {
		if got := d.Errors[i].Error(); !strings.HasSuffix(got, w) {
			t.Errorf("error %d: %s, want %s", i, got, w)
		}
	}
}

// TestNestingAndSizeBounded is issue 11 item 8: 100,000 nested block
// quotes (300 KB), lists nested on one line, deep square brackets, a
// paragraph of too many brackets and a file over MaxFileBytes are each
// refused with an error at their line before the Markdown parser runs
// (BenchmarkReadRender measures that the cost of what is read is linear).
func TestNestingAndSizeBounded(t *testing.T) {
	cases := []struct{ name, src, want string }{
		{"nested quotes", strings.Repeat("> ", 100_000) + "x\n", "1:1: this line nests 100000 block quotes and lists; at most 32 are read"},
		{"quotes deepening line by line", func() string {
			var b strings.Builder
			for i := 1; i <= 40; i++ {
				b.WriteString(strings.Repeat(">", i) + " x\n")
			}
			return b.String()
		}(), "33:1: this line nests 33 block quotes and lists"},
		{"lists on one line", "text\n\n" + strings.Repeat("- ", 50) + "x\n", "3:1: this line nests 50 block quotes and lists"},
		{"ordered lists", strings.Repeat("1. ", 40) + "x\n", "1:1: this line nests 40 block quotes and lists"},
		{"deep brackets", "a " + strings.Repeat("[", 40) + "\n", "1:35: square brackets nest more than 32 deep"},
		{"brackets in one paragraph", strings.Repeat("[a] ", 1100) + "\n", "1:4097: this paragraph holds more than 1024 square brackets"},
		{"too large", strings.Repeat("x\n", MaxFileBytes/2+1), "1:1: file is 1048578 bytes; a calc file may be at most 1048576 bytes"},
	}
	for _, c := range cases {
		d := Read("x.calc.md", []byte(c.src))
		if len(d.Errors) != 1 || !strings.Contains(d.Errors[0].Error(), c.want) || d.mdTree != nil {
			t.Errorf("%s: %v, want %q", c.name, d.Errors, c.want)
		}
		if _, err := d.Render(RenderOptions{}); err == nil {
			t.Errorf("%s: rendered", c.name)
		}
	}
	ok := strings.Repeat(strings.Repeat("> ", MaxNesting)+"x\n", 10) + "\n" + strings.Repeat("[a] ", MaxBrackets)
	if d := Read("x.calc.md", []byte(ok)); len(d.Errors) != 0 {
		t.Errorf("at the limits: %v", d.Errors)
	}
}
