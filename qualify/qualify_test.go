package qualify

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/internal/engine"
)

// fixedIdent keeps the reports of the tests independent of the build.
var fixedIdent = &engine.Identity{Version: "test", GoVersion: "go", OS: "os", Arch: "arch"}

func run(t *testing.T, opt Options) *Report {
	t.Helper()
	opt.Ident = fixedIdent
	r, err := Run(opt)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// TestRefdataMatchesTestdata keeps the embedded copies equal to the check
// values the test suite reads, so the report cannot drift from the tests.
func TestRefdataMatchesTestdata(t *testing.T) {
	same := map[string]string{
		"r7_check-values.csv":        "../props/if97/testdata/r7_check-values.csv",
		"sr_check-values.csv":        "../props/if97/testdata/sr_check-values.csv",
		"helmholtz_check-values.csv": "../props/helmholtz/testdata/check-values.csv",
	}
	orig, err := filepath.Glob("../calcdoc/testdata/textbook/*.calc.md")
	if err != nil || len(orig) == 0 {
		t.Fatalf("no textbook calcs: %v", err)
	}
	for _, f := range orig {
		same["textbook/"+filepath.Base(f)] = f
	}
	copies, _ := filepath.Glob("refdata/textbook/*.calc.md")
	if len(copies) != len(orig) {
		t.Errorf("refdata/textbook has %d calcs, calcdoc/testdata/textbook %d", len(copies), len(orig))
	}
	for name, src := range same {
		want, err := os.ReadFile(src)
		if err != nil {
			t.Fatal(err)
		}
		got, err := refdata.ReadFile("refdata/" + name)
		if err != nil || !bytes.Equal(got, want) {
			t.Errorf("refdata/%s differs from %s: copy it again (refdata/README.md)", name, src)
		}
	}
}

// goRows returns the rows a regular expression finds in a Go test file,
// each joined with "|".
func goRows(t *testing.T, file string, re *regexp.Regexp) map[string]bool {
	t.Helper()
	src, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]bool{}
	for _, m := range re.FindAllStringSubmatch(string(src), -1) {
		out[strings.Join(m[1:], "|")] = true
	}
	return out
}

// TestTablesMatchGoTests compares the unit factors and the textbook answers
// with the tables of the Go tests that check them.
func TestTablesMatchGoTests(t *testing.T) {
	cases := []struct {
		csv, goFile string
		re          *regexp.Regexp
		row         func([]string) string
	}{
		{"unit-factors.csv", "../units/units_test.go",
			regexp.MustCompile(`\{"([^"]+)",\s*([0-9.eE+-]+),\s*(true|false)\},\s*//\s*(NIST.*|SI prefix.*)`),
			func(r []string) string { return strings.Join(r, "|") }},
		{"textbook-answers.csv", "../calcdoc/textbook_test.go",
			regexp.MustCompile(`\{"([^"]+)",\s*"([^"]+)",\s*([^,]+),\s*([^}]+)\},\s*//\s*(.*)`),
			func(r []string) string {
				tol := r[3]
				if tol == "0.003" {
					tol = "tb"
				}
				return strings.Join([]string{r[0], r[1], r[2], tol, r[4]}, "|")
			}},
	}
	for _, c := range cases {
		want := goRows(t, c.goFile, c.re)
		rows, err := readCSV(c.csv)
		if err != nil {
			t.Fatal(err)
		}
		if len(want) == 0 || len(rows) != len(want) {
			t.Errorf("%s has %d rows, %s %d", c.csv, len(rows), c.goFile, len(want))
		}
		for _, r := range rows {
			if k := c.row(r); !want[k] {
				t.Errorf("%s row %q is not in %s", c.csv, k, c.goFile)
			}
		}
	}
}

// TestReportCoversGoTables checks that every value of the Go check tables
// of props/if97 (R7-97 and the supplementary releases) is reproduced in the
// report, from the same source table.
func TestReportCoversGoTables(t *testing.T) {
	r := run(t, Options{})
	passed := map[string]bool{}
	for _, c := range r.Checks {
		if c.Verdict == Pass {
			passed[c.Expected] = true
		}
	}
	r7 := goRows(t, "../props/if97/verify_test.go", regexp.MustCompile(`\{"\w+", [^,]+, [^,]+, "\w+", "([0-9.eE+-]+)", [^}]+\}`))
	if len(r7) < 150 {
		t.Fatalf("found %d R7-97 values in verify_test.go", len(r7))
	}
	n := 0
	for _, f := range []string{"sr2_test.go", "sr3_test.go", "sr4_test.go", "sr5_test.go"} {
		rows := goRows(t, "../props/if97/"+f, regexp.MustCompile(`want: "([^"]+)"`))
		n += len(rows)
		for v := range rows {
			r7[v] = true
		}
	}
	if n < 130 {
		t.Fatalf("found %d supplementary values in sr*_test.go", n)
	}
	for v := range r7 {
		if !passed[v] {
			t.Errorf("check value %s of the if97 tests is not reproduced in the report", v)
		}
	}
	// The command's end-to-end tests quote published values too (some
	// rounded, within their tolerance): each must be a reproduced value.
	row := regexp.MustCompile(`\{"\w+",\s*([0-9.eE+-]+),\s*([0-9.eE+-]+)\},\s*//.*(Table|NIST)`)
	for _, f := range []string{"../cmd/vouch/water_test.go", "../cmd/vouch/fluid_test.go"} {
		rows := goRows(t, f, row)
		if len(rows) < 5 {
			t.Fatalf("found %d published values in %s", len(rows), f)
		}
		for k := range rows {
			parts := strings.Split(k, "|")
			v, _ := strconv.ParseFloat(parts[0], 64)
			tol, _ := strconv.ParseFloat(parts[1], 64)
			found := false
			for _, c := range r.Checks {
				found = found || c.Verdict == Pass && math.Abs(c.ExpectedV-v) <= max(tol, tol*math.Abs(v))
			}
			if !found {
				t.Errorf("%s: published value %s is not reproduced in the report", f, parts[0])
			}
		}
	}
}

// TestDefaultPasses: the engine reproduces every claimed value; the only
// unclaimed ones are the 14 scientific-form transport values the package
// tests skip too.
func TestDefaultPasses(t *testing.T) {
	r := run(t, Options{})
	if r.Summary.Failed != 0 {
		for _, c := range r.Checks[:r.Summary.Failed] {
			t.Errorf("%s %s: expected %s, note %s", c.ID, c.What, c.Expected, c.Note)
		}
	}
	if r.Summary.NotRun != 14 {
		t.Errorf("%d values not claimed, want 14", r.Summary.NotRun)
	}
	if r.Summary.Total != 179+135+325+27+44 {
		t.Errorf("%d values, want %d", r.Summary.Total, 179+135+325+27+44)
	}
	for _, c := range r.Checks {
		if c.Verdict == NotRun && !strings.Contains(c.What, "IAPWS-95 derivatives") {
			t.Errorf("%s not claimed: %s", c.ID, c.What)
		}
	}
}

// TestBrokenFunction perturbs one function by 1e-7 (as a wrong coefficient
// would): the report fails, lists those values first and names them.
func TestBrokenFunction(t *testing.T) {
	w := DefaultWater()
	good := w["psat"]
	w["psat"] = func(x WaterInput) (float64, error) {
		v, err := good(x)
		return v * (1 + 1e-7), err
	}
	r := run(t, Options{Water: w})
	if r.Passed() || r.Summary.Failed != 3 {
		t.Fatalf("%d failures, want the 3 values of R7-97 Table 35", r.Summary.Failed)
	}
	for _, c := range r.Checks[:3] {
		if c.Verdict != Fail || !strings.Contains(c.Source, "Table 35") || c.Computed == nil {
			t.Errorf("first checks should be the failed Table 35 values, got %+v", c)
		}
	}
	page, err := r.HTML()
	if err != nil {
		t.Fatal(err)
	}
	s := string(page)
	fail, group := strings.Index(s, "Values not reproduced"), strings.Index(s, "<h1>"+GroupIF97)
	if fail < 0 || group < 0 || fail > group || !strings.Contains(s[fail:group], "0.353658941e-2") {
		t.Error("the HTML does not list the failed value before the groups")
	}
}

// TestDeterministic: two runs give the same bytes; the digest is that of
// the canonical JSON and changes with the content.
func TestDeterministic(t *testing.T) {
	a, b := run(t, Options{}), run(t, Options{})
	ja, jb := a.CanonicalJSON(), b.CanonicalJSON()
	ha, _ := a.HTML()
	hb, _ := b.HTML()
	if !bytes.Equal(ja, jb) || !bytes.Equal(ha, hb) {
		t.Fatal("two runs differ")
	}
	if len(a.Digest) != 64 || a.Digest != a.ComputeDigest() || !bytes.Contains(ha, []byte(a.Digest)) {
		t.Errorf("digest %q is not that of the report", a.Digest)
	}
	a.Checks[0].Expected += "0"
	if a.ComputeDigest() == b.Digest {
		t.Error("the digest does not change with the content")
	}
	if !bytes.Contains(ha, []byte(`http-equiv="Content-Security-Policy"`)) || bytes.Contains(ha, []byte("<script")) {
		t.Error("the page lacks the content policy or carries a script")
	}
}
