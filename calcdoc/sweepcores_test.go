package calcdoc

import (
	"fmt"
	"path/filepath"
	"reflect"
	"runtime"
	"strings"
	"testing"
)

// coreRun is what one evaluation of a calc gives that could depend on how
// the sweep points were spread over cores.
type coreRun struct {
	html     []byte
	errors   string
	progress []string
	files    []DataFile
	rows     []string
}

// runOnCores reads, evaluates and (without errors) renders the calc at
// path with GOMAXPROCS set to procs.
func runOnCores(t *testing.T, procs int, path, src string) coreRun {
	t.Helper()
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
	var out coreRun
	d := Read(path, []byte(src))
	d.Progress = func(name string, done, total int) {
		out.progress = append(out.progress, fmt.Sprintf("%s %d/%d", name, done, total))
	}
	d.Evaluate()
	out.errors = d.Errors.Format("c.calc.md", d.Src)
	out.files = d.DataFiles
	for _, sw := range d.Sweeps {
		out.rows = append(out.rows, fmt.Sprintf("%v %v", sw.Rows, sw.Failed))
	}
	if len(d.Errors) == 0 {
		pkg, err := d.Render(RenderOptions{})
		if err != nil {
			t.Fatal(err)
		}
		out.html = pkg.HTML
	}
	return out
}

// TestSweepSameOnAnyCoreCount: a sweep spread over four cores gives the
// same package bytes, failed checks, first error, progress calls and
// record of data files as on one core.
func TestSweepSameOnAnyCoreCount(t *testing.T) {
	files := map[string]string{}
	var names []string
	for i := range 40 {
		files[fmt.Sprintf("data/cw%d.csv", i)] = fmt.Sprintf("T [degC],p [kPa]\n10,%d\n30,%d\n", 4+i, 9+2*i)
		names = append(names, fmt.Sprintf("%q", fmt.Sprintf("data/cw%d.csv", i)))
	}
	good := sweepCalc + "```calc\nf = \"data/cw0.csv\"\np_c [kPa] = interp(csv(f), \"T\", 20 degC, \"p\")\ncheck p_c < 30 kPa\n```\n" +
		"```sweep\nvary p_1 from 2 MPa to 20 MPa in 499 steps\nshow w, x_2\nplot w\n```\n" +
		"```sweep\nvary f over [" + strings.Join(names, ", ") + "]\nshow p_c\n```\n"
	bad := sweepCalc + "```sweep\nvary p_1 from 2 MPa to 140 MPa in 999 steps\nshow w\n```\n" +
		"```sweep\nvary p_1 over [3 MPa, 4 MPa, 200 MPa, 5 MPa, 300 MPa]\nshow w\n```\n"
	for name, src := range map[string]string{"good": good, "bad": bad} {
		files["c.calc.md"] = src
		path := filepath.Join(writeTree(t, files), "c.calc.md")
		one := runOnCores(t, 1, path, src)
		for range 3 {
			four := runOnCores(t, 4, path, src)
			if !reflect.DeepEqual(one, four) {
				t.Fatalf("%s: one core and four differ:\nerrors %q\n   and %q\nprogress %d and %d calls\nfiles %v\n  and %v",
					name, one.errors, four.errors, len(one.progress), len(four.progress), one.files, four.files)
			}
		}
		if name == "good" {
			for i := range 500 {
				if want := fmt.Sprintf("p_1 %d/500", i+1); one.progress[i] != want {
					t.Fatalf("progress call %d: %q, want %q", i, one.progress[i], want)
				}
			}
			for i, f := range one.files {
				if want := fmt.Sprintf("data/cw%d.csv", i); f.Path != want {
					t.Fatalf("data file %d: %s, want %s (the order the points read them)", i, f.Path, want)
				}
			}
		}
		t.Logf("%s: %d progress calls, %d data files, %d bytes, errors: %.120s", name, len(one.progress), len(one.files), len(one.html), one.errors)
	}
}
