package compare

import (
	"bytes"
	"strings"
	"testing"
	"testing/fstest"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// original is a small calc of a fictional plant.
const original = "---\ntitle: Feed pump (fictional)\nnumber: FP-001\n---\n```calc\n" +
	"P_shaft = 1000 kW // shaft power\n" +
	"eta_p = 80 %\n" +
	"T_out = 150 degC\n" +
	"```\n"

func doc(t *testing.T, name, src string) *calcdoc.Doc {
	t.Helper()
	d := calcdoc.ReadIn(fstest.MapFS{}, "", name, []byte(src))
	if len(d.Errors) > 0 {
		t.Fatalf("%s: %v", name, d.Errors)
	}
	return d
}

// alternate is a checker's calc: its front matter, then its lines.
func alternate(front string, lines ...string) string {
	return "---\ntitle: Feed pump, alternate (fictional)\n" + front + "---\n```calc\n" + strings.Join(lines, "\n") + "\n```\n"
}

func run(t *testing.T, alt string) *Result {
	t.Helper()
	return Compare(doc(t, "a.calc.md", original), doc(t, "b.calc.md", alt), Options{APath: "a.calc.md", BPath: "b.calc.md", Tolerance: 0.005})
}

func TestWithinAndOutside(t *testing.T) {
	for _, tc := range []struct {
		alt    string
		failed int
		want   string
	}{
		{alternate("", "P_shaft = 1004 kW"), 0, "PASS  P_shaft: 1004 kW against 1000 kW; difference 4.000 kW (0.400 %, tolerance 0.500 % (default))"},
		{alternate("", "P_shaft = 1006 kW"), 1, "FAIL  P_shaft: 1006 kW against 1000 kW; difference 6.000 kW (0.600 %, tolerance 0.500 % (default))"},
		{alternate("compare: {tolerances: {P_shaft: 1 %}}\n", "P_shaft = 1.006 MW"), 0, "PASS  P_shaft: 1.006 MW against 1000 kW; difference 6.000 kW (0.600 %, tolerance 1.00 %)"},
		{alternate("compare: {maps: {W: P_shaft}}\n", "W = 994 kW"), 1, "FAIL  P_shaft = W: 994 kW against 1000 kW; difference -6.000 kW"},
		{alternate("", "T_out = 151 degC"), 0, "PASS  T_out: 151 degC against 150 degC; difference 1.000 K (0.236 %"},
	} {
		r := run(t, tc.alt)
		if len(r.Errors) > 0 || r.Failed != tc.failed || !strings.Contains(r.Text(), tc.want) || r.OK() != (tc.failed == 0) {
			t.Errorf("%s:\nerrors %v, failed %d\n%s\nwant %q", tc.alt, r.Errors, r.Failed, r.Text(), tc.want)
		}
	}
}

func TestErrors(t *testing.T) {
	for _, tc := range []struct{ alt, want string }{
		{alternate("compare: {maps: {W: P_pump}}\n", "W = 1 MW"), "b.calc.md:3: compare maps W onto P_pump, which a.calc.md does not define"},
		{alternate("compare: {maps: {Q: P_shaft}}\n", "W = 1 MW"), "b.calc.md:3: compare maps Q, which b.calc.md does not define"},
		{alternate("compare: {tolerances: {Q: 2 %}}\n", "P_shaft = 1 MW"), "b.calc.md:3: compare sets a tolerance for Q"},
		{alternate("", "P_shaft = 1 MPa"), "P_shaft in the original and P_shaft in the alternate have different dimensions"},
		{alternate("", "Q = 1 MW"), "share no result"},
	} {
		r := run(t, tc.alt)
		if !strings.Contains(strings.Join(r.Errors, "\n"), tc.want) || r.OK() {
			t.Errorf("%s: errors %q, want %q", tc.alt, r.Errors, tc.want)
		}
	}
	d := calcdoc.ReadIn(fstest.MapFS{}, "", "b.calc.md", []byte(alternate("compare: {tolerances: {P_shaft: 1 MW}, weights: {}}\n", "P_shaft = 1 MW")))
	got := d.Errors.Error()
	if !strings.Contains(got, "tolerance of P_shaft must be a percentage") || len(d.Errors) != 2 || !strings.Contains(d.Errors[1].Msg, `unknown key "weights" under compare`) {
		t.Errorf("front-matter errors: %v", d.Errors)
	}
}

// TestReportDeterministic: the same calcs give the same report, byte for
// byte, and the report records its verdict.
func TestReportDeterministic(t *testing.T) {
	alt := alternate("compare: {maps: {W: P_shaft}}\n", "W = 1003 kW", "eta_p = 0.8")
	first, err := run(t, alt).Report()
	if err != nil {
		t.Fatal(err)
	}
	second, _ := run(t, alt).Report()
	if !bytes.Equal(first, second) {
		t.Error("two runs give different reports")
	}
	for _, want := range []string{"1003 kW", "0.300 %", calcdoc.ContentPolicyTag, "<code>W</code>"} {
		if !bytes.Contains(first, []byte(want)) {
			t.Errorf("report lacks %q", want)
		}
	}
	rec, err := ReadReport(first)
	a := calcdoc.Read("a.calc.md", []byte(original))
	if err != nil || !rec.Pass || rec.Original != provenance.BlobHash(a.Src) || rec.Alternate != provenance.BlobHash([]byte(alt)) {
		t.Errorf("record %+v, %v; want PASS and the two blobs", rec, err)
	}
	failing, _ := run(t, alternate("", "P_shaft = 2 MW")).Report()
	if rec, err := ReadReport(failing); rec.Pass || err != nil {
		t.Errorf("record of a failing report %+v, %v", rec, err)
	}
	if _, err := ReadReport([]byte("<html></html>")); err == nil {
		t.Error("a page that is no report gave a verdict")
	}
}
