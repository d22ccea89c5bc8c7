package editdist

import "testing"

func TestDistances(t *testing.T) {
	cases := []struct {
		a, b         string
		bytes, runes int
	}{
		{"", "", 0, 0},
		{"kitten", "sitting", 3, 3},
		{"bar", "barg", 1, 1},
		{"flaw", "lawn", 2, 2},
		{"°C", "C", 2, 1},
		{"abc", "", 3, 3},
	}
	for _, c := range cases {
		if got := Bytes(c.a, c.b); got != c.bytes {
			t.Errorf("Bytes(%q, %q) = %d, want %d", c.a, c.b, got, c.bytes)
		}
		if got := Runes(c.a, c.b); got != c.runes {
			t.Errorf("Runes(%q, %q) = %d, want %d", c.a, c.b, got, c.runes)
		}
		if Bytes(c.a, c.b) != Bytes(c.b, c.a) {
			t.Errorf("Bytes(%q, %q) is not symmetric", c.a, c.b)
		}
	}
}
