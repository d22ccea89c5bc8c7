package helmholtz

import (
	"fmt"
	"slices"
	"testing"
)

func TestLookup(t *testing.T) {
	cases := map[string]string{
		"isopentane": "isopentane", "R-601a": "isopentane", "r601a": "isopentane", "ISOPENTANE": "isopentane",
		"n-pentane": "n-pentane", "R-601": "n-pentane", "npentane": "n-pentane",
		"R-245fa": "R-245fa", "r245fa": "R-245fa", "R245FA": "R-245fa",
		"R-1233zd(E)": "R-1233zd(E)", "r1233zde": "R-1233zd(E)", "R-1233ZD(E)": "R-1233zd(E)",
		"toluene": "toluene", "MM": "MM", "mm": "MM", "hexamethyldisiloxane": "MM",
		"cyclopentane": "cyclopentane", "isobutane": "isobutane", "R-600a": "isobutane",
		"n-butane": "n-butane", "R-600": "n-butane", "R-134a": "R-134a", "r134a": "R-134a",
	}
	for in, want := range cases {
		f, ok := Lookup(in)
		if !ok || f.Name != want || !f.IsDefault {
			t.Errorf("Lookup(%q) = %v, %v; want %s", in, f, ok, want)
		}
	}
	if _, ok := Lookup("water"); ok {
		t.Error(`Lookup("water") found a fluid; water is IAPWS-IF97, not this package`)
	}
}

// TestDefaults checks the default equations named in the reference README
// (section 0).
func TestDefaults(t *testing.T) {
	want := map[string]string{
		"isopentane": "lemmon-span-2006", "n-pentane": "span-wagner-2003", "R-245fa": "akasaka-2015",
		"R-1233zd(E)": "akasaka-lemmon-2022", "toluene": "lemmon-span-2006", "MM": "thol-2016",
		"cyclopentane": "gedanitz-2015", "isobutane": "span-wagner-2003", "n-butane": "span-wagner-2003",
		"R-134a": "tillner-roth-baehr-1994",
	}
	names := Names()
	if len(names) != len(want) || !slices.IsSortedFunc(names, func(a, b string) int { return cmpFold(a, b) }) {
		t.Errorf("Names() = %v", names)
	}
	for _, n := range names {
		f, _ := Lookup(n)
		if f.Key != want[n] {
			t.Errorf("%s: default %s, want %s", n, f.Key, want[n])
		}
	}
	if got := Equations("r245fa"); !slices.Equal(got, []string{"akasaka-2015", "lemmon-span-2006"}) {
		t.Errorf("Equations(r245fa) = %v", got)
	}
	if f, ok := LookupEquation("R-134a", "span-wagner-2003"); !ok || f.IsDefault {
		t.Errorf("LookupEquation(R-134a, span-wagner-2003) = %v, %v", f, ok)
	}
}

func cmpFold(a, b string) int {
	fa, fb := fold(a), fold(b)
	switch {
	case fa < fb:
		return -1
	case fa > fb:
		return 1
	}
	return 0
}

func TestNearest(t *testing.T) {
	cases := map[string]string{
		"isopentan": "isopentane", "R245": "R-245fa", "R-1233zd": "R-1233zd(E)", "toulene": "toluene",
		"R-134": "R-134a", "R600": "R-600", "cyclopentan": "cyclopentane", "MMM": "MM",
	}
	for in, want := range cases {
		if got := Nearest(in); got != want {
			t.Errorf("Nearest(%q) = %q, want %q", in, got, want)
		}
	}
}

// Example shows the saturated vapour of isopentane at 0.5 MPa and the
// superheated state at 400 K and the same pressure. The printed values are
// this package's own results (a regression check, not published values;
// NBP reference state).
func Example() {
	f, _ := Lookup("R-601a")
	sat, _ := f.SatP(0.5e6)
	st, _ := f.StatePT(0.5e6, 400)
	fmt.Printf("%s, %s\n", f.Name, f.Equation)
	fmt.Printf("Tsat = %.3f K, hg = %.2f kJ/kg\n", sat.T, sat.Hg/1e3)
	fmt.Printf("400 K: h = %.2f kJ/kg, s = %.4f kJ/(kg K), %v\n", st.H/1e3, st.S/1e3, st.Phase)
	// Output:
	// isopentane, Lemmon & Span (2006)
	// Tsat = 356.864 K, hg = 430.26 kJ/kg
	// 400 K: h = 522.77 kJ/kg, s = 1.4810 kJ/(kg K), vapour
}
