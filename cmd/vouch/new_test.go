package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc/starter"
)

// newRepo makes an empty repository folder (a .git folder is all vouch new
// looks for) and fixes git's user for the test.
func newRepo(t *testing.T, who starter.Person) string {
	t.Helper()
	dir := t.TempDir()
	if err := os.Mkdir(filepath.Join(dir, ".git"), 0o755); err != nil {
		t.Fatal(err)
	}
	old := gitUser
	gitUser = func(string) starter.Person { return who }
	t.Cleanup(func() { gitUser = old })
	return dir
}

// TestNewTemplatesRun: every built-in template gives a calc that vouch run
// evaluates with exit 0, all checks passing.
func TestNewTemplatesRun(t *testing.T) {
	dir := newRepo(t, starter.Person{Name: "P. Writer", Email: "p.writer@example.com"})
	for _, name := range []string{"blank", "cycle", "condenser", "pump"} {
		t.Run(name, func(t *testing.T) {
			dest := filepath.Join(dir, "calcs", name+".calc.md")
			var out, errs bytes.Buffer
			if code := run([]string{"new", "--template", name, dest}, &out, &errs); code != exitOK {
				t.Fatalf("vouch new: exit %d\n%s", code, errs.String())
			}
			src, _ := os.ReadFile(dest)
			if !strings.Contains(string(src), "  preparer: P. Writer <p.writer@example.com>\n") {
				t.Errorf("no preparer from git's user in\n%s", src)
			}
			out.Reset()
			errs.Reset()
			if code := run([]string{"run", dest}, &out, &errs); code != exitOK {
				t.Errorf("vouch run on the %s starter: exit %d\n%s%s", name, code, out.String(), errs.String())
			}
			if strings.Contains(out.String(), "FAIL") {
				t.Errorf("a check fails in the %s starter:\n%s", name, out.String())
			}
		})
	}
}

func TestNewRefusesToOverwrite(t *testing.T) {
	dir := newRepo(t, starter.Person{})
	dest := filepath.Join(dir, "HB-001.calc.md")
	if err := os.WriteFile(dest, []byte("my work\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errs bytes.Buffer
	if code := run([]string{"new", "--template", "cycle", dest}, &out, &errs); code != exitUsage {
		t.Errorf("exit %d, want %d", code, exitUsage)
	}
	if want := "vouch: " + dest + " already exists; vouch new never replaces a file: choose another name\n"; errs.String() != want {
		t.Errorf("stderr %q, want %q", errs.String(), want)
	}
	if b, _ := os.ReadFile(dest); string(b) != "my work\n" {
		t.Errorf("the file was changed: %q", b)
	}
}

func TestNewUsage(t *testing.T) {
	dir := newRepo(t, starter.Person{})
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"new"}, exitUsage, "usage: vouch new [--template NAME] FILE.calc.md, or vouch new --list\n"},
		{[]string{"new", filepath.Join(dir, "a.md")}, exitUsage, "vouch: " + filepath.Join(dir, "a.md") + ": a calc file's name must end in .calc.md, such as HB-001.calc.md\n"},
		{[]string{"new", "--template", "turbine", filepath.Join(dir, "a.calc.md")}, exitUsage, "vouch: no template called \"turbine\"; the templates are blank, condenser, cycle, pump\n"},
	} {
		var out, errs bytes.Buffer
		if code := run(c.args, &out, &errs); code != c.code || errs.String() != c.want {
			t.Errorf("%v: exit %d, stderr %q; want %d, %q", c.args, code, errs.String(), c.code, c.want)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "a.calc.md")); err == nil {
		t.Error("a file was written for an unknown template")
	}
}

// TestNewFirmSettings: the firm's template replaces the built-in one of the
// same name, the firm's keys are left to fill, and bad settings are errors
// at their line with nothing written.
func TestNewFirmSettings(t *testing.T) {
	dir := newRepo(t, starter.Person{})
	os.MkdirAll(filepath.Join(dir, ".vouch", "templates"), 0o755)
	os.WriteFile(filepath.Join(dir, "vouch.yaml"), []byte("front_matter:\n  client: Client\n"), 0o644)
	os.WriteFile(filepath.Join(dir, ".vouch", "templates", "cycle.calc.md"), []byte("---\ntitle: Firm cycle\n---\n# Firm\n"), 0o644)

	// --list looks in the repository of the current folder.
	t.Chdir(dir)
	var out, errs bytes.Buffer
	code := run([]string{"new", "--list"}, &out, &errs)
	if code != exitOK || !strings.Contains(strings.Join(strings.Fields(out.String()), " "), "cycle Firm cycle .vouch/templates/cycle.calc.md (replaces the built-in) pump") {
		t.Errorf("--list in the repository: exit %d\n%s%s", code, out.String(), errs.String())
	}

	dest := filepath.Join(dir, "a.calc.md")
	if code := run([]string{"new", "--template", "cycle", dest}, &out, &errs); code != exitOK {
		t.Fatalf("exit %d: %s", code, errs.String())
	}
	src, _ := os.ReadFile(dest)
	want := "---\ntitle: Firm cycle\n# people:  (fill in and remove the # marks: git's user.name and user.email are not set)\n" +
		"#   preparer: Name <name@example.com>\n#   checker: Name <name@example.com>\n#   approver: Name <name@example.com>\n" +
		"client: \"\"  # Client: fill in\n---\n# Firm\n"
	if string(src) != want {
		t.Errorf("got\n%s\nwant\n%s", src, want)
	}

	os.WriteFile(filepath.Join(dir, "vouch.yaml"), []byte("paper: B5\n"), 0o644)
	errs.Reset()
	dest = filepath.Join(dir, "b.calc.md")
	if code := run([]string{"new", dest}, &out, &errs); code != exitErrors {
		t.Errorf("bad settings: exit %d, want %d", code, exitErrors)
	}
	if want := filepath.Join(dir, "vouch.yaml") + ":1:8: paper must be A4 or Letter, not \"B5\"\n    paper: B5\n           ^\n"; errs.String() != want {
		t.Errorf("stderr %q, want %q", errs.String(), want)
	}
	if _, err := os.Stat(dest); err == nil {
		t.Error("a file was written despite bad settings")
	}
}
