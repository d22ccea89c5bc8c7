package eval

import (
	"math"
	"strings"
	"testing"

	"vouch/units"
)

func TestInterp(t *testing.T) {
	tbl, err := parseTable("cw.csv", []byte("# fictional curve\nT_cw [degC],p [kPa]\n10,4.5\n20,6.5\n30,9.8\n"), units.StandardAtmosphere)
	if err != nil {
		t.Fatal(err)
	}
	x := units.MustParse("degC").Q(24, units.StandardAtmosphere)
	y, err := callInterp([]any{tbl, "T_cw", x, "p"})
	if err != nil {
		t.Fatal(err)
	}
	want := 6500 + 0.4*3300.0 // linear between 6.5 kPa and 9.8 kPa at 40 % of the interval: exact arithmetic
	if got := y.(units.Quantity).V; math.Abs(got-want) > 1e-9 {
		t.Errorf("interp = %g Pa, want %g", got, want)
	}
	for _, c := range []struct {
		x    float64
		want string
	}{
		{40, "interp: T_cw = 40.00 degC is outside the table's range 10.00 degC to 30.00 degC (cw.csv); a table is never extrapolated"},
		{9.99, "outside the table's range"},
	} {
		_, err := callInterp([]any{tbl, "T_cw", units.MustParse("degC").Q(c.x, units.StandardAtmosphere), "p"})
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("x = %g: %v", c.x, err)
		}
	}
}

func TestTableErrors(t *testing.T) {
	cases := map[string]string{
		"T [degC]\n1\n":          "cw.csv: a table needs at least two rows of data",
		"T [degCC],p\n1,2\n":     "cw.csv:1: column 1: unknown unit degCC; did you mean degC?",
		"T [degC],p\n1,2\n2,x\n": `cw.csv:3: column p: "x" is not a number`,
		"T [degC],p\n1,2\n2\n":   "wrong number of fields",
	}
	for src, want := range cases {
		_, err := parseTable("cw.csv", []byte(src), units.StandardAtmosphere)
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("%q: %v, want %q", src, err, want)
		}
	}
	tbl, _ := parseTable("cw.csv", []byte("T [degC],p\n1,2\n1,3\n"), units.StandardAtmosphere)
	if _, err := callInterp([]any{tbl, "T", units.MustParse("degC").Q(1, units.StandardAtmosphere), "p"}); err == nil || !strings.Contains(err.Error(), "not strictly increasing") {
		t.Errorf("non-monotonic: %v", err)
	}
}
