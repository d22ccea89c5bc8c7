package if97

// Shared test machinery for the supplementary backward equations (SR2-01, SR3-03, SR4-04,
// SR5-05): the check-value row type, the "half a unit of the last printed digit" rule, a test
// that every supplementary check value in testdata/sr_check-values.csv is in one of the Go
// tables (with the same inputs), and a test that the generated coefficient tables equal the
// CSV files in testdata/sr_coefficients.

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// srCheck is one computer-program verification value of a release. Inputs and the value are in
// the release's units (MPa, K, kJ/kg, kJ/(kg·K), m³/kg), in the order the release prints them.
type srCheck struct {
	src    string  // document and table, as in testdata/sr_check-values.csv
	fn     string  // the function checked (a key of the test's dispatch map)
	in1    float64 // first input
	in2    float64 // second input (0 for one-input equations)
	want   string  // the value exactly as printed
	sub    byte    // SR5-05 only: the subregion the release assigns the point to
	relTol float64 // if set, replaces the last-digit rule (one documented exception)
}

// srTol returns half a unit of the last printed digit of v, e.g. 0.5e-13 for "9.800980612e-4".
func srTol(t *testing.T, v string) float64 {
	mant, exp := v, 0
	if i := strings.IndexAny(v, "eE"); i >= 0 {
		mant = v[:i]
		e, err := strconv.Atoi(v[i+1:])
		if err != nil {
			t.Fatalf("bad exponent in %q", v)
		}
		exp = e
	}
	dec := 0
	if i := strings.IndexByte(mant, '.'); i >= 0 {
		dec = len(mant) - i - 1
	}
	return 0.5 * math.Pow10(exp-dec)
}

// srExpect checks got against the printed value of c to ±0.5 unit of its last digit (or c.relTol).
func srExpect(t *testing.T, c srCheck, got float64) {
	t.Helper()
	want, err := strconv.ParseFloat(c.want, 64)
	if err != nil {
		t.Fatalf("%s: bad value %q", c.src, c.want)
	}
	tol := srTol(t, c.want)
	if c.relTol != 0 {
		tol = c.relTol * math.Abs(want)
	}
	// A few ulps of slack for the unit conversions at the API (Pa ↔ MPa, J ↔ kJ).
	tol += 8 * 0x1p-52 * math.Abs(want)
	if d := got - want; !(math.Abs(d) <= tol) {
		t.Errorf("%s: %s(%v, %v) = %.12g, want %s (diff %.3g, tol %.3g)", c.src, c.fn, c.in1, c.in2, got, c.want, d, tol)
	}
}

// srRun checks every row of checks with the function named in its fn field.
func srRun(t *testing.T, checks []srCheck, fns map[string]func(a, b float64) float64) {
	t.Helper()
	for _, c := range checks {
		f, ok := fns[c.fn]
		if !ok {
			t.Fatalf("%s: no function %q", c.src, c.fn)
		}
		srExpect(t, c, f(c.in1, c.in2))
	}
}

// TestSRCheckValuesCovered makes sure that every supplementary-release row of
// testdata/sr_check-values.csv appears in the Go check tables with the same source, inputs and
// printed value, and that the Go tables hold nothing else.
func TestSRCheckValuesCovered(t *testing.T) {
	f, err := os.Open(filepath.Join("testdata", "sr_check-values.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	all := append(append(append(append([]srCheck{}, sr2Checks...), sr3Checks...), sr4Checks...), sr5Checks...)
	type key struct{ src, want string }
	inGo := map[key]srCheck{}
	for _, c := range all {
		k := key{c.src, c.want}
		if _, dup := inGo[k]; dup {
			t.Errorf("%s %s appears twice in the Go tables", c.src, c.want)
		}
		inGo[k] = c
	}
	n := 0
	for _, row := range rows[1:] { // columns: formulation,table,function,inputs,output,value,...
		n++
		k := key{row[1], row[5]}
		c, ok := inGo[k]
		if !ok {
			t.Errorf("check value %s %s (%s) is not tested", row[1], row[5], row[3])
			continue
		}
		delete(inGo, k)
		ins := srParseInputs(t, row[3])
		want := []float64{c.in1, c.in2}[:len(ins)]
		for i := range ins {
			if ins[i] != want[i] {
				t.Errorf("%s %s: input %d is %v in the CSV, %v in the Go table", row[1], row[5], i+1, ins[i], want[i])
			}
		}
		if len(ins) == 1 && c.in2 != 0 {
			t.Errorf("%s %s: one input in the CSV, two in the Go table", row[1], row[5])
		}
		if strings.Contains(row[2], "subregion 3") && c.sub == 0 {
			t.Errorf("%s %s: no subregion given", row[1], row[5])
		}
		if i := strings.Index(row[2], "subregion 3"); i >= 0 && c.sub != row[2][i+len("subregion 3")] {
			t.Errorf("%s %s: subregion %q in the Go table, CSV says %q", row[1], row[5], c.sub, row[2])
		}
	}
	for k := range inGo {
		t.Errorf("Go table row %s %s is not in testdata/sr_check-values.csv", k.src, k.want)
	}
	if n != 135 {
		t.Errorf("read %d supplementary check values, want 135", n)
	}
}

// srParseInputs reads "h=0.001 kJ/kg; s=0 kJ/(kg K)" as [0.001 0].
func srParseInputs(t *testing.T, s string) []float64 {
	var out []float64
	for _, part := range strings.Split(s, ";") {
		_, v, ok := strings.Cut(part, "=")
		if !ok {
			t.Fatalf("bad inputs %q", s)
		}
		num, _, _ := strings.Cut(strings.TrimSpace(v), " ")
		x, err := strconv.ParseFloat(num, 64)
		if err != nil {
			t.Fatalf("bad inputs %q: %v", s, err)
		}
		out = append(out, x)
	}
	return out
}

// TestSRTablesMatchCSV compares every generated coefficient table with its CSV file in
// testdata/sr_coefficients: same number of terms, same exponents, bit-identical coefficients.
func TestSRTablesMatchCSV(t *testing.T) {
	for name, tab := range srTableIndex {
		file, eq, _ := strings.Cut(name, "#")
		data, err := os.ReadFile(filepath.Join("testdata", "sr_coefficients", file))
		if err != nil {
			t.Fatal(err)
		}
		r := csv.NewReader(strings.NewReader(string(data)))
		r.Comment = '#'
		r.FieldsPerRecord = -1
		rows, err := r.ReadAll()
		if err != nil {
			t.Fatalf("%s: %v", file, err)
		}
		var want []srTerm
		for _, row := range rows[1:] {
			switch {
			case eq != "": // equation,form,i,I,n
				if row[0] == eq {
					want = append(want, srTerm{int8(srAtoi(t, row[3])), 0, srAtof(t, row[4])})
				}
			case len(row) == 2: // i,n
				want = append(want, srTerm{int8(srAtoi(t, row[0]) - 1), 0, srAtof(t, row[1])})
			default: // i,I,J,n
				want = append(want, srTerm{int8(srAtoi(t, row[1])), int8(srAtoi(t, row[2])), srAtof(t, row[3])})
			}
		}
		if len(want) != len(tab.terms) {
			t.Errorf("%s: %d terms in Go, %d in CSV", name, len(tab.terms), len(want))
			continue
		}
		for i, w := range want {
			if tab.terms[i] != w {
				t.Errorf("%s term %d: Go %v, CSV %v", name, i+1, tab.terms[i], w)
			}
			if int(w.i) < tab.iMin || int(w.i) > tab.iMax || int(w.j) < tab.jMin || int(w.j) > tab.jMax {
				t.Errorf("%s term %d: exponent outside the table's range", name, i+1)
			}
		}
		if tab.iMax-tab.iMin >= srPowLen || tab.jMax-tab.jMin >= srPowLen {
			t.Errorf("%s: exponent range exceeds srPowLen", name)
		}
	}
	if len(srTableIndex) != 26+26+11 {
		t.Errorf("%d tables indexed, want 63", len(srTableIndex))
	}
}

func srAtoi(t *testing.T, s string) int {
	n, err := strconv.Atoi(s)
	if err != nil {
		t.Fatal(err)
	}
	return n
}

func srAtof(t *testing.T, s string) float64 {
	x, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return x
}

// TestSRPowers compares the power tables with math.Pow for every kind of exponent range.
func TestSRPowers(t *testing.T) {
	for _, r := range [][2]int{{0, 36}, {1, 36}, {3, 9}, {-12, 14}, {-12, -1}, {-8, -3}, {-2, 2}, {0, 0}} {
		for _, x := range []float64{0.37, -1.3, 2.5} {
			var p [srPowLen]float64
			srPowers(&p, x, r[0], r[1])
			for k := r[0]; k <= r[1]; k++ {
				want := math.Pow(x, float64(k))
				if got := p[k-r[0]]; math.Abs(got-want) > 1e-14*math.Abs(want) {
					t.Errorf("range %v: %v^%d = %v, want %v", r, x, k, got, want)
				}
			}
		}
	}
}
