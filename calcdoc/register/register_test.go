package register

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/audit"
)

// kinds of the generated calcs, by index: most are plain, a few fail a
// check, read a data file or are broken.
func kindOf(i int) string {
	switch {
	case i%17 == 5:
		return "broken"
	case i%11 == 3:
		return "failing"
	case i%7 == 2:
		return "data"
	}
	return ""
}

// fiftyCalcs builds a repository of 50 generated calcs in two folders and
// a data file; FP-000 has a current signed package, FP-001 a stale one.
func fiftyCalcs(t *testing.T) *tree {
	r := newTree(t)
	r.Write("data/pump-curve.csv", pumpCurve)
	for i := 0; i < 50; i++ {
		r.Write(calcName(i), genCalc(i, kindOf(i)))
	}
	r.Commit("Fifty feed pump calcs")
	for i := 0; i < 2; i++ {
		signAsPreparer(t, renderBeside(t, r.Path(calcName(i))))
	}
	r.Write(calcName(1), strings.Replace(genCalc(1, ""), "m_dot = 151 kg/s", "m_dot = 152 kg/s", 1))
	r.Commit("FP-001: more flow")
	return r
}

func calcName(i int) string { return fmt.Sprintf("unit%d/fp-%03d.calc.md", i%2+1, i) }

func registerTree(t testing.TB, dir, out string, mod func(*Options)) *Summary {
	t.Helper()
	opt := Options{Dir: dir, Out: out, Engine: engine}
	if mod != nil {
		mod(&opt)
	}
	sum, err := Run(opt)
	if err != nil {
		t.Fatal(err)
	}
	return sum
}

func TestRegisterFiftyCalcs(t *testing.T) {
	r := fiftyCalcs(t)
	out := t.TempDir()
	var progress []int
	sum := registerTree(t, r.Dir, out, func(o *Options) { o.Progress = func(done, _ int) { progress = append(progress, done) } })
	if len(sum.Entries) != 50 || sum.Rendered != 50 || len(progress) != 50 || progress[49] != 50 {
		t.Fatalf("%d entries, %d rendered, progress %v", len(sum.Entries), sum.Rendered, progress)
	}
	byPath := map[string]*Entry{}
	for _, e := range sum.Entries {
		byPath[e.Path] = e
	}
	for i := 0; i < 50; i++ {
		e := byPath[calcName(i)]
		if e.Broken() != (kindOf(i) == "broken") || (e.Failed > 0) != (kindOf(i) == "failing") {
			t.Errorf("%s: broken %v, failed %d; kind %q", e.Path, e.Broken(), e.Failed, kindOf(i))
		}
		if e.Broken() && !strings.Contains(e.ErrorText(e.Path)[0], e.Path+":21:16: cannot add power (MW) and mass (kg)") {
			t.Errorf("%s: errors %v", e.Path, e.ErrorText(e.Path))
		}
	}
	// No signers file is committed: the stamp says the keys are unchecked.
	checkSigned(t, byPath[calcName(0)], "PREPARED — keys unchecked", "")
	checkSigned(t, byPath[calcName(1)], "PREPARED — keys unchecked", "the source has changed since commit")
	if byPath[calcName(2)].Signed != nil {
		t.Errorf("FP-002 has no package beside it, but the register found one")
	}
	index := readFile(t, sum.Index)
	for _, want := range []string{"FP-000", "FP-049", `href="unit1/fp-000.html"`, "BROKEN", "STALE", ">PREPARED — keys unchecked<", "<b>3</b> broken", "Caution.", calcdoc.ContentPolicyTag} {
		if !bytes.Contains(index, []byte(want)) {
			t.Errorf("index.html lacks %q", want)
		}
	}
	if bytes.Contains(index, []byte(r.Dir)) || bytes.Contains(index, []byte(out)) {
		t.Error("index.html names an absolute path")
	}
	again := registerTree(t, r.Dir, out, nil)
	if again.Rendered != 0 || again.Cached != 50 {
		t.Errorf("second run rendered %d, cached %d; want 0 and 50", again.Rendered, again.Cached)
	}
	if !bytes.Equal(index, readFile(t, again.Index)) {
		t.Error("the second run wrote another index.html")
	}
}

func checkSigned(t *testing.T, e *Entry, status, stale string) {
	t.Helper()
	if e.Signed == nil {
		t.Fatalf("%s: no signed package found", e.Path)
	}
	if e.Signed.Status != status || !strings.Contains(e.Signed.Stale, stale) || (stale == "") != (e.Signed.Stale == "") {
		t.Errorf("%s: status %s, stale %q, problem %q; want %s, %q", e.Path, e.Signed.Status, e.Signed.Stale, e.Signed.Problem, status, stale)
	}
}

func readFile(t *testing.T, p string) []byte {
	t.Helper()
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// TestRegisterRendersWhatChanged changes one source, one data file and the
// engine in turn and counts what the next run renders.
func TestRegisterRendersWhatChanged(t *testing.T) {
	r := newTree(t)
	r.Write("data/pump-curve.csv", pumpCurve)
	for i := 0; i < 8; i++ {
		r.Write(calcName(i), genCalc(i, kindOf(i)))
	}
	r.Commit("Eight calcs")
	out := t.TempDir()
	registerTree(t, r.Dir, out, nil)
	cases := []struct {
		name   string
		change func(o *Options)
		want   int
	}{
		{"nothing", func(*Options) {}, 0},
		{"one source", func(*Options) { r.Write(calcName(4), genCalc(4, "failing")) }, 1},
		{"the data file", func(*Options) { r.Write("data/pump-curve.csv", pumpCurve+"400,0.75\n") }, 1},
		{"a package deleted", func(*Options) { os.Remove(filepath.Join(out, "unit1/fp-000.html")) }, 1},
		{"the engine", func(o *Options) { o.Engine = "0.2.0-test" }, 8},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			sum := registerTree(t, r.Dir, out, c.change)
			if sum.Rendered != c.want {
				t.Errorf("rendered %d, want %d", sum.Rendered, c.want)
			}
		})
	}
}

// TestRegisterPackageAsRendered holds that the register's package is the
// one vouch render makes from the same work tree.
func TestRegisterPackageAsRendered(t *testing.T) {
	r := newTree(t)
	r.Write("data/pump-curve.csv", pumpCurve)
	r.Write(calcName(2), genCalc(2, "data"))
	r.Commit("One calc")
	out := t.TempDir()
	registerTree(t, r.Dir, out, nil)
	d, err := calcdoc.ReadFile(r.Path(calcName(2)))
	if err != nil {
		t.Fatal(err)
	}
	st, err := audit.Provenance(d, engine)
	if err != nil {
		t.Fatal(err)
	}
	want, err := d.Render(calcdoc.RenderOptions{Engine: engine, Stamp: st})
	if err != nil {
		t.Fatal(err)
	}
	if got := readFile(t, filepath.Join(out, "unit1/fp-002.html")); !bytes.Equal(got, want.HTML) {
		t.Error("the register's package differs from vouch render's")
	}
}

func TestRegisterShards(t *testing.T) {
	r := newTree(t)
	for i := 0; i < 12; i++ {
		r.Write(calcName(i), genCalc(i, ""))
	}
	r.Commit("Twelve calcs")
	whole := registerTree(t, r.Dir, t.TempDir(), func(o *Options) { o.Workers = 1 })
	merged := t.TempDir()
	total := 0
	for i := 1; i <= 3; i++ {
		out := t.TempDir()
		sum := registerTree(t, r.Dir, out, func(o *Options) { o.Shard, o.Shards = i, 3 })
		if sum.Index != "" {
			t.Errorf("shard %d wrote an index", i)
		}
		total += sum.Rendered
		copyTree(t, out, merged)
	}
	if total != 12 {
		t.Errorf("the shards rendered %d calcs, want 12", total)
	}
	sum := registerTree(t, r.Dir, merged, func(o *Options) { o.Workers = 4 })
	if sum.Rendered != 0 {
		t.Errorf("the run over the merged shards rendered %d", sum.Rendered)
	}
	if !bytes.Equal(readFile(t, whole.Index), readFile(t, sum.Index)) {
		t.Error("the index of the merged shards differs from one run's")
	}
}

func copyTree(t *testing.T, from, to string) {
	t.Helper()
	err := filepath.WalkDir(from, func(p string, e os.DirEntry, err error) error {
		if err != nil || e.IsDir() {
			return err
		}
		rel, _ := filepath.Rel(from, p)
		dest := filepath.Join(to, rel)
		os.MkdirAll(filepath.Dir(dest), 0o755)
		return os.WriteFile(dest, readFile(t, p), 0o644)
	})
	if err != nil {
		t.Fatal(err)
	}
}

func TestRegisterPrunesRemovedCalcs(t *testing.T) {
	r := newTree(t)
	for i := 0; i < 3; i++ {
		r.Write(calcName(i), genCalc(i, ""))
	}
	out := t.TempDir()
	registerTree(t, r.Dir, out, nil)
	os.Remove(r.Path(calcName(1)))
	sum := registerTree(t, r.Dir, out, nil)
	if len(sum.Entries) != 2 {
		t.Errorf("%d entries after removing a calc", len(sum.Entries))
	}
	if _, err := os.Stat(filepath.Join(out, "unit2/fp-001.html")); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("the removed calc's package is still there: %v", err)
	}
}

func TestRegisterBadInput(t *testing.T) {
	empty := t.TempDir()
	os.WriteFile(filepath.Join(empty, "notes.md"), []byte("# not a calc\n"), 0o644)
	withCalc := t.TempDir()
	os.WriteFile(filepath.Join(withCalc, "a.calc.md"), []byte(genCalc(1, "")), 0o644)
	cases := []struct {
		name string
		opt  Options
		want string
	}{
		{"no calcs", Options{Dir: empty, Out: t.TempDir()}, "no calc files (*.calc.md)"},
		{"missing folder", Options{Dir: filepath.Join(empty, "nope"), Out: t.TempDir()}, "no such file"},
		{"output is the calc folder", Options{Dir: withCalc, Out: withCalc}, "would overwrite the packages beside them"},
		{"bad shard", Options{Dir: withCalc, Out: t.TempDir(), Shard: 3, Shards: 2}, "give --shard i/n"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Run(c.opt)
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("error %v, want %q", err, c.want)
			}
		})
	}
}

func TestNaturalLess(t *testing.T) {
	cases := []struct {
		a, b string
		want bool
	}{
		{"HB-2", "HB-10", true},
		{"HB-10", "HB-2", false},
		{"HB-002", "HB-2", false},
		{"A-1", "B-1", true},
		{"HB-1", "HB-1a", true},
	}
	for _, c := range cases {
		if got := naturalLess(c.a, c.b); got != c.want {
			t.Errorf("naturalLess(%q, %q) = %v", c.a, c.b, got)
		}
	}
}
