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
