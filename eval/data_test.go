package eval

import (
	"math"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
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
		// Found by FuzzTable: a number that overflows when converted to SI, and a
		// control character in a column name.
		"t [d],p\n1,2\n1e308,3\n": "cw.csv:3: column t: 1e308 in its unit is beyond the range of numbers",
		"t\x16,p\n1,2\n2,3\n":     `cw.csv:1: column 1: column name "t\x16" holds a control character`,
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
	// Found by FuzzTable: columns that span nearly the whole float64 range
	// interpolate without overflow (midway between -1e308 and 1e308 is 0).
	tbl, _ = parseTable("big.csv", []byte("a,b\n-1e308,-1e308\n1e308,1e308\n"), units.StandardAtmosphere)
	y, err := callInterp([]any{tbl, "a", units.Num(0), "b"})
	if err != nil || y.(units.Quantity).V != 0 {
		t.Errorf("interp across the float64 range: %v %v", y, err)
	}
}

// FuzzTable reads arbitrary bytes as a data file and interpolates every
// column against every other at each row value and midway between rows:
// an error, or a finite value within the range of the y column's
// neighbours — never a panic, a NaN or an extrapolation.
func FuzzTable(f *testing.F) {
	f.Add([]byte("# fictional curve\nT_cw [degC],p [kPa]\n10,4.5\n20,6.5\n30,9.8\n"))
	f.Add([]byte("x [m],y [s]\n3,1\n2,5\n1,1e308\n"))
	f.Add([]byte("a,b\n-1e308,1\n1e308,2\n"))
	f.Add([]byte("q [kg/s],dp [kPag]\n0,0\n5,\"1.5\"\n"))
	f.Fuzz(func(t *testing.T, raw []byte) {
		tbl, err := parseTable("f.csv", raw, units.StandardAtmosphere)
		if err != nil {
			if !strings.HasPrefix(err.Error(), "f.csv") {
				t.Fatalf("the error does not name the file: %v", err)
			}
			return
		}
		if len(tbl.Names) > 4 || len(tbl.Cols[0]) > 50 {
			return // keep each run short
		}
		for xi, xn := range tbl.Names {
			xs := tbl.Cols[xi]
			var probes []units.Quantity
			for i := range xs {
				probes = append(probes, xs[i])
				if i > 0 {
					m := xs[i]
					m.V = xs[i-1].V/2 + xs[i].V/2
					probes = append(probes, m)
				}
			}
			for _, yn := range tbl.Names {
				for _, x := range probes {
					y, err := callInterp([]any{tbl, xn, x, yn})
					if err != nil {
						continue
					}
					v := y.(units.Quantity).V
					lo, hi := math.Inf(1), math.Inf(-1)
					for _, q := range tbl.Cols[tbl.index(yn)] {
						lo, hi = math.Min(lo, q.V), math.Max(hi, q.V)
					}
					tol := 1e-12 * math.Max(math.Abs(lo), math.Abs(hi))
					if math.IsNaN(v) || math.IsInf(v, 0) || v < lo-tol || v > hi+tol {
						t.Fatalf("interp(%s at %g, %s) = %g, outside the column's %g to %g", xn, x.V, yn, v, lo, hi)
					}
				}
			}
		}
	})
}
