package diff

import (
	"bytes"
	"errors"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/internal/testkit"
)

// diffRepo builds a repository whose history exercises vouch diff:
//
//	v1  calcs/fp.calc.md as first issued
//	v2  an input changed (discharge pressure 12.5 -> 14 MPa), revision B
//	v3  a line added (motor power) and the check tightened so it fails
//	v4  the calc renamed to pumps/fp-001.calc.md, with a prose edit
func diffRepo(t *testing.T) *testkit.Repo {
	r := testkit.NewRepo(t)
	r.Write("calcs/fp.calc.md", testkit.SignCalc)
	r.Commit("Feed pump power, first issue")
	r.Git("tag", "v1")
	src := strings.Replace(testkit.SignCalc, "p_out = 12.5 MPa", "p_out = 14 MPa", 1)
	src = strings.Replace(src, "revision: A", "revision: B", 1)
	r.Write("calcs/fp.calc.md", src)
	r.Commit("Raise the discharge pressure")
	r.Git("tag", "v2")
	src = strings.Replace(src, "check P_pump < 5 MW", "P_motor [MW] = P_pump / 95 %    // motor input\ncheck P_pump < 3 MW", 1)
	r.Write("calcs/fp.calc.md", src)
	r.Commit("Motor power; tighter frame limit")
	r.Git("tag", "v3")
	r.Git("mv", "calcs/fp.calc.md", "calcs/fp-001.calc.md")
	src = strings.Replace(src, "# Feed pump\n", "# Boiler feed pump\n", 1)
	r.Write("calcs/fp-001.calc.md", src)
	r.Commit("Rename by calc number")
	r.Git("tag", "v4")
	return r
}

func TestDiffRevisions(t *testing.T) {
	r := diffRepo(t)
	cases := []struct {
		name, file, from, to string
		changed              []string // names of values that changed
		flipped              int
		lines                []string // kind:name of the calc lines changed
		renamed              bool
		text                 []string // in the terminal text
	}{
		{name: "changed input", file: "calcs/fp-001.calc.md", from: "v1", to: "v2",
			changed: []string{"p_out", "w_p", "P_pump"}, lines: []string{"changed:p_out"},
			text: []string{"revision  A  ->  B", "p_out", "12.5 MPa", "14 MPa", "+1.500 MPa", "+12.0 %", "inputs changed (1 of 3)"}},
		{name: "added line and flipped check", file: "calcs/fp-001.calc.md", from: "v2", to: "v3",
			flipped: 1, lines: []string{"added:P_motor", "changed:check"},
			text: []string{"to:   v3 (", "calcs/fp.calc.md", "checks flipped (1 of 1)", "PASS -> FAIL", "+   21  P_motor [MW] = P_pump / 95 %", "= 3.958 MW", "motor frame limit"}},
		{name: "renamed file", file: "calcs/fp-001.calc.md", from: "v3", to: "v4",
			renamed: true, text: []string{"renamed: calcs/fp.calc.md -> calcs/fp-001.calc.md", "- # Feed pump", "+ # Boiler feed pump"}},
		{name: "work tree against HEAD~1", file: "calcs/fp-001.calc.md", from: "HEAD~1",
			renamed: true, text: []string{"from: HEAD~1 (", "to:   work tree"}},
		{name: "unchanged", file: "calcs/fp-001.calc.md", from: "HEAD",
			text: []string{"no changes"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			df, err := Revisions(r.Path(c.file), Options{From: c.from, To: c.to})
			if err != nil {
				t.Fatal(err)
			}
			if df.HasErrors() {
				t.Fatalf("errors: %s", df.ErrorText())
			}
			if got := changedNames(df); strings.Join(got, ",") != strings.Join(c.changed, ",") {
				t.Errorf("changed values %v, want %v", got, c.changed)
			}
			if got := flips(df); got != c.flipped {
				t.Errorf("%d checks flipped, want %d", got, c.flipped)
			}
			if got := lineKinds(df); strings.Join(got, ",") != strings.Join(c.lines, ",") {
				t.Errorf("lines %v, want %v", got, c.lines)
			}
			if df.Renamed() != c.renamed {
				t.Errorf("renamed %v, want %v (%s -> %s)", df.Renamed(), c.renamed, df.From.Path, df.To.Path)
			}
			text := df.Text(false)
			for _, want := range c.text {
				if !strings.Contains(text, want) {
					t.Errorf("text lacks %q:\n%s", want, text)
				}
			}
		})
	}
}

func changedNames(df *Diff) []string {
	var out []string
	for _, v := range df.Values {
		if !v.Same {
			out = append(out, v.Name)
		}
	}
	return out
}

func flips(df *Diff) int {
	n := 0
	for _, c := range df.Checks {
		if c.Flipped() {
			n++
		}
	}
	return n
}

func lineKinds(df *Diff) []string {
	var out []string
	for _, l := range df.Lines {
		out = append(out, l.Kind+":"+l.Name)
	}
	return out
}

func TestDiffBadInput(t *testing.T) {
	r := diffRepo(t)
	r.Write("calcs/new.calc.md", "---\ntitle: Condenser duty (fictional)\nnumber: CD-001\n---\n# Duty\n\n```calc\nQ = 400 MW // duty\n```\n")
	r.Commit("A second calc")
	cases := []struct {
		name, file, from, to string
		want                 []string
	}{
		{"unknown revision", "calcs/fp-001.calc.md", "v5", "", []string{`unknown revision "v5"`, "v1", "v4"}},
		{"unknown later revision", "calcs/fp-001.calc.md", "v1", "release-9", []string{`unknown revision "release-9"`}},
		{"past the root", "calcs/fp-001.calc.md", "HEAD~40", "", []string{`"HEAD~40"`, "HEAD resolves, but not the ancestor"}},
		{"file not at revision", "calcs/new.calc.md", "v1", "", []string{"calcs/new.calc.md did not exist at v1 (commit ", "no calc file there looks like its earlier name"}},
		{"file not at later revision", "calcs/new.calc.md", "v1", "v3", []string{"calcs/new.calc.md did not exist at v3"}},
		{"file missing from the work tree", "calcs/gone.calc.md", "v1", "", []string{"calcs/gone.calc.md", "no such file"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Revisions(r.Path(c.file), Options{From: c.from, To: c.to})
			var usage *calcdoc.UsageError
			if !errors.As(err, &usage) {
				t.Fatalf("error %v, want a usage error", err)
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q lacks %q", err, w)
				}
			}
		})
	}
	t.Run("outside a repository", func(t *testing.T) {
		_, err := Revisions(writeTemp(t, testkit.SignCalc), Options{})
		if err == nil || !strings.Contains(err.Error(), "not in a git repository") {
			t.Errorf("error %v, want not in a git repository", err)
		}
	})
}

// writeTemp writes a calc to a fresh directory outside any repository.
func writeTemp(t *testing.T, src string) string {
	r := testkit.Folder(t)
	r.Write("c.calc.md", src)
	return r.Path("c.calc.md")
}

// TestDiffErrorsInRevision keeps going when one revision has errors: the
// errors name the revision and the line.
func TestDiffErrorsInRevision(t *testing.T) {
	r := diffRepo(t)
	src := string(r.Read("calcs/fp-001.calc.md"))
	r.Write("calcs/fp-001.calc.md", strings.Replace(src, "p_out = 14 MPa", "p_out = 14 MPa + 3 kg", 1))
	df, err := Revisions(r.Path("calcs/fp-001.calc.md"), Options{From: "v4"})
	if err != nil {
		t.Fatal(err)
	}
	if !df.HasErrors() {
		t.Fatal("no errors")
	}
	if got := df.ErrorText(); !strings.Contains(got, "fp-001.calc.md:16:") || !strings.Contains(got, "cannot add") {
		t.Errorf("errors: %s", got)
	}
	if text := df.Text(false); !strings.Contains(text, "(not evaluated)") {
		t.Errorf("the failed value is not shown:\n%s", text)
	}
}

func TestDiffReportDeterministic(t *testing.T) {
	r := diffRepo(t)
	var first []byte
	for i := 0; i < 2; i++ {
		df, err := Revisions(r.Path("calcs/fp-001.calc.md"), Options{From: "v1", To: "v4"})
		if err != nil {
			t.Fatal(err)
		}
		html, err := df.HTML(i == 0)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Contains(html, []byte(calcdoc.ContentPolicyTag)) {
			t.Error("the report lacks the content policy")
		}
		for _, bad := range []string{"<script", "http://", "https://"} {
			if bytes.Contains(html, []byte(bad)) {
				t.Errorf("the report holds %q", bad)
			}
		}
		if i == 0 {
			for _, want := range []string{"Inputs (3)", "Checks (1)", "Renamed", "PASS</span> &rarr;"} {
				if !bytes.Contains(html, []byte(want)) {
					t.Errorf("report with --all lacks %q", want)
				}
			}
			first, _ = df.HTML(false)
			continue
		}
		if !bytes.Equal(first, html) {
			t.Error("the same diff gave different reports")
		}
	}
}

func TestCompareValues(t *testing.T) {
	calc := func(body string) *calcdoc.Doc {
		d := calcdoc.Read("t.calc.md", []byte("---\ntitle: Test (fictional)\n---\n```calc\n"+body+"\n```\n"))
		d.Evaluate()
		if len(d.Errors) > 0 {
			t.Fatalf("%s", d.Errors.Format("t", d.Src))
		}
		return d
	}
	cases := []struct {
		name, old, new string
		change, rel    string
		same           bool
	}{
		{"pressure", "p = 10 MPa", "p = 11 MPa", "+1.000 MPa", "+10.0 %", false},
		{"temperature in K", "T [degC] = 540 degC", "T [degC] = 545 degC", "+5.000 K", "", false},
		{"temperature in Fdeg", "T [degF] = 1000 degF", "T [degF] = 990 degF", "-10.00 Fdeg", "", false},
		{"gauge pressure", "p [barg] = 10 barg", "p [barg] = 12 barg", "+200.0 kPa", "", false},
		{"from zero", "q = 0 kW", "q = 3 kW", "+3.000 kW", "", false},
		{"unchanged", "m = 2 kg", "m = 2 kg", "", "", true},
		{"rewritten, same value", "m = 2 kg", "m = 2000 g", "", "", true},
		{"dimension changed", "m = 2 kg", "m = 2 m", "dimension changed", "", false},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			df := Compare(calc(c.old), calc(c.new))
			if len(df.Values) != 1 {
				t.Fatalf("values %+v", df.Values)
			}
			v := df.Values[0]
			if v.Same != c.same || v.Change != c.change || v.Rel != c.rel {
				t.Errorf("got same=%v change=%q rel=%q, want %v %q %q", v.Same, v.Change, v.Rel, c.same, c.change, c.rel)
			}
		})
	}
}

func TestDiffLines(t *testing.T) {
	cases := []struct {
		a, b  string // lines as letters
		edits int    // lines removed and added by a shortest script
	}{
		{"", "", 0},
		{"abc", "abc", 0},
		{"abc", "", 3},
		{"", "ab", 2},
		{"abcabba", "cbabac", 5}, // Myers (1986), figure 1
		{"axc", "ayc", 2},
	}
	for _, c := range cases {
		a, b := strings.Split(c.a, ""), strings.Split(c.b, "")
		ops := diffLines(a, b)
		edits := 0
		for _, op := range ops {
			if op.Op != ' ' {
				edits++
			}
		}
		if edits != c.edits {
			t.Errorf("diff(%q, %q) makes %d edits, want %d", c.a, c.b, edits, c.edits)
		}
		if got := apply(a, b, ops); got != c.b {
			t.Errorf("diff(%q, %q) rebuilds %q", c.a, c.b, got)
		}
	}
}

// apply rebuilds the new text from the old one and an edit script.
func apply(a, b []string, ops []editOp) string {
	var out strings.Builder
	for _, op := range ops {
		switch op.Op {
		case ' ':
			out.WriteString(a[op.A])
		case '+':
			out.WriteString(b[op.B])
		}
	}
	return out.String()
}

// TestDiffDataFiles: a data file whose contents changed, an image added and
// a data file no longer read are listed, with their blob hashes, in the
// terminal text and the HTML report.
func TestDiffDataFiles(t *testing.T) {
	r := testkit.NewRepo(t)
	r.Write("c/cw.csv", "T [degC],p [kPa]\n10,1.2\n30,4.2\n")
	r.Write("c/old.yaml", "a: 1 m\n")
	r.Write("c/x.calc.md", "```calc\ncw = csv(\"cw.csv\")\np = interp(cw, \"T\", 20 degC, \"p\")\nd = yaml(\"old.yaml\")\n```\n")
	r.Commit("first")
	r.Git("tag", "v1")
	r.Write("c/cw.csv", "T [degC],p [kPa]\n10,1.2\n30,4.3\n")
	r.Write("c/fig.png", string(testkit.TinyPNG))
	r.Write("c/x.calc.md", "![sketch](fig.png)\n\n```calc\ncw = csv(\"cw.csv\")\np = interp(cw, \"T\", 20 degC, \"p\")\n```\n")
	r.Commit("second")
	df, err := Revisions(r.Path("c/x.calc.md"), Options{From: "v1", To: "HEAD"})
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, f := range df.Files {
		got = append(got, f.Kind+" "+f.Path)
		if (f.Kind != "added") != (f.OldHash != "") || (f.Kind != "removed") != (f.NewHash != "") {
			t.Errorf("%s %s: hashes %q -> %q", f.Kind, f.Path, f.OldHash, f.NewHash)
		}
	}
	if want := "changed c/cw.csv,added c/fig.png,removed c/old.yaml"; strings.Join(got, ",") != want {
		t.Errorf("files %v, want %s", got, want)
	}
	text := df.Text(false)
	if !strings.Contains(text, "data files and images changed (3)") || !strings.Contains(text, "added    c/fig.png") {
		t.Errorf("the text lacks the files:\n%s", text)
	}
	html, err := df.HTML(false)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(html), "Data files and images changed (3)") || !strings.Contains(string(html), "<code>c/fig.png</code>") {
		t.Error("the report lacks the files")
	}
}

// FuzzDiffLines: the edit script of any two texts keeps and removes every
// line of the old text in order, keeps and adds every line of the new one
// in order, and never keeps two different lines.
func FuzzDiffLines(f *testing.F) {
	f.Add("a\nb\nc\n", "a\nx\nc\nd\n")
	f.Add("", "one\n")
	f.Add("same\nsame\nsame\n", "same\n")
	f.Fuzz(func(t *testing.T, x, y string) {
		a, b := strings.Split(x, "\n"), strings.Split(y, "\n")
		if len(a)+len(b) > 4000 {
			return
		}
		ops := diffLines(a, b)
		ia, ib := 0, 0
		for _, op := range ops {
			switch op.Op {
			case ' ':
				if op.A != ia || op.B != ib || a[op.A] != b[op.B] {
					t.Fatalf("keep %d/%d at %d/%d: %q vs %q", op.A, op.B, ia, ib, a[op.A], b[op.B])
				}
				ia++
				ib++
			case '-':
				if op.A != ia {
					t.Fatalf("remove %d at %d", op.A, ia)
				}
				ia++
			case '+':
				if op.B != ib {
					t.Fatalf("add %d at %d", op.B, ib)
				}
				ib++
			default:
				t.Fatalf("op %q", op.Op)
			}
		}
		if ia != len(a) || ib != len(b) {
			t.Fatalf("the script covers %d of %d old and %d of %d new lines", ia, len(a), ib, len(b))
		}
	})
}

// FuzzCompare compares two fuzzed calcs as vouch diff does and formats the
// result for the terminal and as HTML: no panic, and the report is whole.
func FuzzCompare(f *testing.F) {
	f.Add([]byte("```calc\na = 1 m\nb = a * 2\ncheck b > 1 m\n```\nText.\n"), []byte("```calc\na = 2 m\nb = a * 2\nc = b + a\ncheck b > 5 m\n```\nNew text.\n"))
	f.Add([]byte("---\ntitle: A\nrevision: A\n---\n# T\n"), []byte("---\ntitle: B\nrevision: B\n---\n# T\n```calc\nx = water(1 bar, 300 K).h\n```\n"))
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, x, y []byte) {
		a := calcdoc.Read(filepath.Join(dir, "a.calc.md"), x)
		a.SweepLimit = 20
		a.Evaluate()
		b := calcdoc.Read(filepath.Join(dir, "b.calc.md"), y)
		b.SweepLimit = 20
		b.Evaluate()
		df := Compare(a, b)
		df.From.Label, df.To.Label = "v1", "v2"
		_ = df.Text(true)
		html, err := df.HTML(false)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.HasSuffix(bytes.TrimSpace(html), []byte("</html>")) {
			t.Fatal("the report is cut short")
		}
	})
}

// TestDiffPercentagePointsAndIntervals: issue 11 item 24. A change of a
// value in % read "-0.15 %" (points or per cent?), and a temperature's
// relative change was taken on kelvin. A change of a % value is now in
// percentage points, and values on offset scales (temperatures other than
// differences, gauge pressures) get no relative change.
func TestDiffPercentagePointsAndIntervals(t *testing.T) {
	calc := func(body string) *calcdoc.Doc {
		d := calcdoc.Read("t.calc.md", []byte("---\ntitle: Test (fictional)\n---\n```calc\n"+body+"\n```\n"))
		d.Evaluate()
		if len(d.Errors) > 0 {
			t.Fatalf("%s", d.Errors.Format("t", d.Src))
		}
		return d
	}
	cases := []struct{ old, new, change, rel string }{
		{"eta = 36.5 %", "eta = 36.35 %", "-0.1500 percentage points", "-0.411 %"},
		{"eta [%] = 0.365", "eta [%] = 0.37", "+0.5000 percentage points", "+1.37 %"},
		{"T = 800 K", "T = 810 K", "+10.00 K", ""},
		{"T = 500 degC", "T = 510 degC", "+10.00 K", ""},
		{"T [K] = 500 degC", "T [K] = 510 degC", "+10.00 K", ""},
		{"dT = 5 Cdeg", "dT = 6 Cdeg", "+1.000 Cdeg", "+20.0 %"},
		{"p = 3 psig", "p = 4 psig", "+6.895 kPa", ""},
		{"p [bar] = 3 barg", "p [bar] = 4 barg", "+1.000 bar", ""},
		{"p = 3 bar", "p = 4 bar", "+1.000 bar", "+33.3 %"},
	}
	for _, c := range cases {
		df := Compare(calc(c.old), calc(c.new))
		if len(df.Values) != 1 {
			t.Fatalf("values %+v", df.Values)
		}
		if v := df.Values[0]; v.Change != c.change || v.Rel != c.rel {
			t.Errorf("%s → %s: change %q, relative %q; want %q, %q", c.old, c.new, v.Change, v.Rel, c.change, c.rel)
		}
	}
}

// TestDiffDataValues: a changed YAML file shows its values key by key and
// a changed CSV cell by cell with its row key, in the text and the report.
func TestDiffDataValues(t *testing.T) {
	r := testkit.NewRepo(t)
	r.Write("c/pipe.yaml", "# line list (fictional)\nDN: 150\neps: 0.045 mm\nm_out: 14 t/h\nold_key: 1\n")
	r.Write("c/cw.csv", "T [degC],p [kPa],note\n10,1.2,a\n20,2.3,b\n30,4.2,c\n")
	src := "```calc\npipe = yaml(\"pipe.yaml\")\nD = pipe.DN\ncw = csv(\"cw.csv\")\np = interp(cw, \"T\", 25 degC, \"p\")\n```\n"
	r.Write("c/x.calc.md", src)
	r.Commit("first")
	r.Git("tag", "v1")
	r.Write("c/pipe.yaml", "# line list (fictional)\nDN: 200\neps: 0.045 mm\nm_out: 14 t/h\nnew_key: \"x\"\n")
	r.Write("c/cw.csv", "T [degC],p [kPa],note\n10,1.2,a\n20,2.35,b\n30,4.2,c\n40,7.4,d\n")
	r.Commit("second")
	df, err := Revisions(r.Path("c/x.calc.md"), Options{From: "v1", To: "HEAD"})
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, f := range df.Files {
		for _, c := range f.Values {
			got = append(got, sprintfCell(f.Path, c))
		}
	}
	want := []string{
		"c/pipe.yaml DN: 150 -> 200 (2,2)",
		"c/pipe.yaml new_key:  -> x (0,5)",
		"c/pipe.yaml old_key: 1 ->  (5,0)",
		"c/cw.csv row T [degC] = 20: p [kPa]: 2.3 -> 2.35 (3,3)",
		"c/cw.csv row T [degC] = 40: row added:  -> 40, 7.4, d (0,5)",
	}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("value changes\n%s\nwant\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
	text := df.Text(false)
	for _, w := range []string{"  c/pipe.yaml:\n    DN       150  ->  200  (line 2)", "row T [degC] = 20: p [kPa]    2.3  ->  2.35"} {
		if !strings.Contains(text, w) {
			t.Errorf("the text lacks %q:\n%s", w, text)
		}
	}
	html, err := df.HTML(false)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(html), `<tr><td>DN</td><td class="num">150</td><td class="num">200</td>`) {
		t.Error("the report lacks the YAML value change")
	}
}

func sprintfCell(path string, c CellChange) string {
	return path + " " + c.Where + ": " + c.Old + " -> " + c.New + " (" + strconv.Itoa(c.OldLine) + "," + strconv.Itoa(c.NewLine) + ")"
}

// TestReferenceChanges: a reference whose revision changed, one added and
// one removed are front-matter changes, by id.
func TestReferenceChanges(t *testing.T) {
	read := func(refs string) *calcdoc.Doc {
		d := calcdoc.Read("t.calc.md", []byte("---\nreferences:\n"+refs+"---\n```calc\na = 1 m\n```\n"))
		d.Evaluate()
		if len(d.Errors) > 0 {
			t.Fatalf("%s", d.Errors.Format("t", d.Src))
		}
		return d
	}
	old := read("  - {id: HB-001, title: Heat balance, revision: C}\n  - {id: DS-1, title: Datasheet, revision: A}\n")
	new := read("  - {id: HB-001, title: Heat balance, revision: D, date: 2026-04-01}\n  - {id: DS-2, title: Datasheet, edition: 2nd}\n")
	var got []string
	for _, f := range Compare(old, new).Front {
		got = append(got, f.Field+": "+f.Old+" -> "+f.New)
	}
	want := "reference HB-001: Heat balance, C -> Heat balance, D, 2026-04-01|reference DS-2:  -> Datasheet, 2nd|reference DS-1: Datasheet, A -> "
	if strings.Join(got, "|") != want {
		t.Errorf("got  %s\nwant %s", strings.Join(got, "|"), want)
	}
}
