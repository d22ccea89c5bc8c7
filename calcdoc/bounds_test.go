package calcdoc

import (
	"os"
	"path"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// readCalc writes files (and the calc c.calc.md, or sub/c.calc.md) and
// reads the calc, failing the test if reading takes longer than 20 s.
func readCalc(t *testing.T, dir, calc string) *Doc {
	t.Helper()
	done := make(chan *Doc, 1)
	go func() {
		d, err := ReadFile(filepath.Join(dir, filepath.FromSlash(calc)))
		if err != nil {
			t.Error(err)
		}
		done <- d
	}()
	select {
	case d := <-done:
		return d
	case <-time.After(20 * time.Second):
		t.Fatal("reading the calc hangs")
		return nil
	}
}

// TestDataFileSizeCapped is issue 11 item 9: a data file over MaxDataBytes
// is an error that states the cap (a sparse file, so the test writes
// nothing large), and a message quoting a 1 MB field carries an excerpt.
func TestDataFileSizeCapped(t *testing.T) {
	dir := writeTree(t, map[string]string{
		"c.calc.md": "```calc\nd = csv(\"big.csv\")\ne = csv(\"field.csv\")\nf = yaml(\"v.yaml\")\ng = csv(\"unit.csv\")\nh = yaml(\"u.yaml\")\ni = csv(\"name.csv\")\n```\n",
		"unit.csv":  "x [" + strings.Repeat("m", 1<<20) + "]\n1\n2\n",
		"u.yaml":    "a: 1 " + strings.Repeat("k", 1<<20) + "\n",
		"name.csv":  strings.Repeat("n", 1<<20) + " [m]\n1\n2\n",
		"field.csv": "x [m]\n" + strings.Repeat("z", 1<<20) + "\n",
		"v.yaml":    "a: " + strings.Repeat("w", 1<<20) + "\n",
	})
	big, err := os.Create(filepath.Join(dir, "big.csv"))
	if err != nil {
		t.Fatal(err)
	}
	big.Close()
	if err := os.Truncate(big.Name(), MaxDataBytes+1); err != nil {
		t.Fatal(err)
	}
	d := readCalc(t, dir, "c.calc.md")
	all := d.Errors.Format("c", d.Src)
	if !strings.Contains(all, "the limit is 33554432 bytes") {
		t.Errorf("no size cap in\n%s", all)
	}
	if len(d.Errors) != 6 || len(all) > 6000 {
		t.Errorf("%d errors, %d bytes of messages; want 6 short ones:\n%.6000s", len(d.Errors), len(all), all)
	}
	for _, e := range d.Errors[1:] {
		if !strings.Contains(e.Msg, "(1048576 bytes)") {
			t.Errorf("no excerpt in %q", e.Msg)
		}
	}
}

// TestDataFileNotRegular is issue 11 item 10 for data files: a named pipe
// as a data file is refused at once, never waited on.
func TestDataFileNotRegular(t *testing.T) {
	dir := writeTree(t, map[string]string{"c.calc.md": "```calc\nd = csv(\"pipe.csv\")\n```\n"})
	if err := syscall.Mkfifo(filepath.Join(dir, "pipe.csv"), 0o600); err != nil {
		t.Skip("no named pipes here:", err)
	}
	d := readCalc(t, dir, "c.calc.md")
	if len(d.Errors) != 1 || !strings.Contains(d.Errors[0].Msg, "not a regular file (a named pipe)") {
		t.Errorf("errors: %v", d.Errors)
	}
}

// TestDataPathElements is issue 11 item 15: .git is refused at any depth
// and in any case, a root file named ..data.csv is inside, and a symbolic
// link inside the repository is refused with a message saying to commit
// the file itself.
func TestDataPathElements(t *testing.T) {
	dir := writeTree(t, map[string]string{
		".git/HEAD":  "ref: refs/heads/main\n",
		"..data.csv": "x [m]\n1\n2\n",
		"real.csv":   "x [m]\n2\n3\n",
		"sub/c.calc.md": "```calc\n" +
			"a = yaml(\"../.git/HEAD\")\n" +
			"b = csv(\"../..data.csv\")\n" +
			"c = csv(\"../.GIT/HEAD\")\n" +
			"e = csv(\"../link.csv\")\n```\n",
	})
	if err := os.Symlink("real.csv", filepath.Join(dir, "link.csv")); err != nil {
		t.Skip("no symbolic links here:", err)
	}
	d := readCalc(t, dir, "sub/c.calc.md")
	want := map[int]string{
		2: "../.git/HEAD is inside .git",
		4: "../.GIT/HEAD is inside .git",
		5: "link.csv is a symbolic link; git records the link, not the file it leads to, so the package could never be verified: commit the file itself",
	}
	if len(d.Errors) != len(want) {
		t.Fatalf("errors:\n%s", d.Errors.Format("c", d.Src))
	}
	for _, e := range d.Errors {
		if !strings.Contains(e.Msg, want[e.Pos.Line]) || want[e.Pos.Line] == "" {
			t.Errorf("line %d: %s, want %q", e.Pos.Line, e.Msg, want[e.Pos.Line])
		}
	}
	if len(d.DataFiles) != 1 || d.DataFiles[0].Path != "..data.csv" {
		t.Errorf("data files: %+v", d.DataFiles)
	}
}

// FuzzDataRel holds the path rule as a property: an accepted path is
// clean, relative, inside the root, names no .git element, and is what
// joining the calc's folder and the name gives; a refused path fails one
// of those element tests.
func FuzzDataRel(f *testing.F) {
	for _, s := range []string{"data.csv", "../x", "..data.csv", "a/../../b", ".git/HEAD", "a/.Git/x", "/etc/passwd", "./a//b", ".", ""} {
		f.Add("sub/c.calc.md", s)
		f.Add("c.calc.md", s)
	}
	f.Fuzz(func(t *testing.T, calcRel, name string) {
		rel, err := dataRel(calcRel, name)
		joined := path.Clean(path.Join(path.Dir(calcRel), filepath.ToSlash(name)))
		inside := joined != "." && joined != ".." && !strings.HasPrefix(joined, "../") &&
			name != "" && !path.IsAbs(filepath.ToSlash(name)) && !filepath.IsAbs(name)
		for _, e := range strings.Split(joined, "/") {
			if strings.EqualFold(e, ".git") {
				inside = false
			}
		}
		if err != nil {
			if inside && !path.IsAbs(joined) {
				t.Fatalf("dataRel(%q, %q) refused %q: %v", calcRel, name, joined, err)
			}
			return
		}
		if !inside || rel != joined || path.Clean(rel) != rel || strings.Split(rel, "/")[0] == ".." {
			t.Fatalf("dataRel(%q, %q) = %q, joined %q", calcRel, name, rel, joined)
		}
	})
}
