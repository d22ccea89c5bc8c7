package starter

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"testing/fstest"

	"github.com/vouchcalc/vouch/calcdoc/settings"
)

func names(list []Template) string {
	var s []string
	for _, t := range list {
		s = append(s, t.Name+"="+t.Origin())
	}
	return strings.Join(s, " ")
}

func TestListBuiltin(t *testing.T) {
	list, err := List(fstest.MapFS{}, settings.Default())
	if err != nil {
		t.Fatal(err)
	}
	want := "blank=built-in condenser=built-in cycle=built-in pump=built-in"
	if got := names(list); got != want {
		t.Errorf("List = %s, want %s", got, want)
	}
	for _, tm := range list {
		if tm.Title() == "" {
			t.Errorf("built-in template %s has no title", tm.Name)
		}
		if tm.Name != "blank" && !strings.Contains(string(tm.Text), "fictional") {
			t.Errorf("built-in template %s does not say that its plant is fictional", tm.Name)
		}
	}
}

func TestListFirmReplacesBuiltin(t *testing.T) {
	repo := fstest.MapFS{
		".vouch/templates/cycle.calc.md":  {Data: []byte("---\ntitle: Our cycle\n---\n")},
		".vouch/templates/boiler.calc.md": {Data: []byte("# no front matter\n")},
		".vouch/templates/README.md":      {Data: []byte("not a template\n")},
		".vouch/templates/old/x.calc.md":  {Data: []byte("in a subfolder: not listed\n")},
		"other/templates/ignored.calc.md": {Data: []byte("\n")},
	}
	list, err := List(repo, settings.Default())
	if err != nil {
		t.Fatal(err)
	}
	want := "blank=built-in boiler=.vouch/templates/boiler.calc.md condenser=built-in " +
		"cycle=.vouch/templates/cycle.calc.md (replaces the built-in) pump=built-in"
	if got := names(list); got != want {
		t.Errorf("List = %s\nwant   %s", got, want)
	}
	cycle, err := Find(list, "cycle")
	if err != nil || cycle.Title() != "Our cycle" {
		t.Errorf("Find(cycle) = %q, %v; want the firm's template", cycle.Title(), err)
	}
	if _, err := Find(list, "turbine"); err == nil || err.Error() != `no template called "turbine"; the templates are blank, boiler, condenser, cycle, pump` {
		t.Errorf("Find(turbine): %v", err)
	}
}

func TestListErrors(t *testing.T) {
	s := settings.Default()
	s.Templates = "calc-templates"
	_, err := List(fstest.MapFS{}, s)
	if err == nil || err.Error() != `vouch.yaml names the templates folder "calc-templates", which does not exist` {
		t.Errorf("missing folder of the settings: %v", err)
	}
	repo := fstest.MapFS{".vouch/templates/heat balance.calc.md": {Data: []byte("\n")}}
	_, err = List(repo, settings.Default())
	if err == nil || err.Error() != ".vouch/templates/heat balance.calc.md: a template's name must be letters, digits, - and _, such as heat-balance.calc.md" {
		t.Errorf("bad name: %v", err)
	}
	big := fstest.MapFS{".vouch/templates/big.calc.md": {Data: make([]byte, MaxTemplateSize+1)}}
	_, err = List(big, settings.Default())
	if err == nil || err.Error() != ".vouch/templates/big.calc.md: a template may hold at most 1048576 bytes" {
		t.Errorf("big template: %v", err)
	}
}

func firmSettings() *settings.Settings {
	s := settings.Default()
	s.FrontMatter = []settings.FrontKey{{Key: "client", Label: "Client"}, {Key: "client_document", Label: "Client document no."}}
	return s
}

func TestFill(t *testing.T) {
	writer := Person{Name: "P. Writer", Email: "p.writer@example.com"}
	cases := []struct {
		name, text string
		s          *settings.Settings
		who        Person
		want       string
	}{
		{"defaults", "---\ntitle: T\nrevision: A\n---\n# Body\n", settings.Default(), writer,
			"---\ntitle: T\nrevision: A\npeople:\n  preparer: P. Writer <p.writer@example.com>\n  # checker: Name <name@example.com>\n  # approver: Name <name@example.com>\n---\n# Body\n"},
		{"no git user", "---\ntitle: T\n---\nBody\n", settings.Default(), Person{Name: "P. Writer"},
			"---\ntitle: T\n# people:  (fill in and remove the # marks: git's user.name and user.email are not set)\n#   preparer: Name <name@example.com>\n#   checker: Name <name@example.com>\n#   approver: Name <name@example.com>\n---\nBody\n"},
		{"firm keys, one given", "---\ntitle: T\nclient: Ferrisburn Paper Mill (fictional)\npeople:\n  approver: E. Record <e.record@example.com>\n---\n", firmSettings(), writer,
			"---\ntitle: T\nclient: Ferrisburn Paper Mill (fictional)\npeople:\n  preparer: P. Writer <p.writer@example.com>\n  approver: E. Record <e.record@example.com>\nclient_document: \"\"  # Client document no.: fill in\n---\n"},
		{"no front matter", "# Body\n", firmSettings(), writer,
			"---\npeople:\n  preparer: P. Writer <p.writer@example.com>\n  # checker: Name <name@example.com>\n  # approver: Name <name@example.com>\nclient: \"\"  # Client: fill in\nclient_document: \"\"  # Client document no.: fill in\n---\n# Body\n"},
		{"people, no git user", "---\npeople:\n    checker: C. Reader <c@example.com>\n---\n", settings.Default(), Person{},
			"---\npeople:\n    # preparer: Name <name@example.com>  (fill in: git's user.name and user.email are not set)\n    checker: C. Reader <c@example.com>\n---\n"},
		{"name that needs quotes", "---\n---\n", settings.Default(), Person{Name: "Writer, P.", Email: "p@example.com"},
			"---\npeople:\n  preparer: '\"Writer, P.\" <p@example.com>'\n  # checker: Name <name@example.com>\n  # approver: Name <name@example.com>\n---\n"},
		{"name with a hash", "---\n---\n", settings.Default(), Person{Name: "Team #2", Email: "t2@example.com"},
			"---\npeople:\n  preparer: 'Team #2 <t2@example.com>'\n  # checker: Name <name@example.com>\n  # approver: Name <name@example.com>\n---\n"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, err := Fill(Template{Name: "x", Text: []byte(c.text)}, c.s, c.who)
			if err != nil {
				t.Fatal(err)
			}
			if string(got) != c.want {
				t.Errorf("got\n%s\nwant\n%s", got, c.want)
			}
		})
	}
}

func TestFillErrors(t *testing.T) {
	cases := []struct{ text, want string }{
		{"---\ntitle: [\n---\n", ".vouch/templates/x.calc.md:2:1: front matter is not valid YAML (lines counted from the line after ---): line 1: did not find expected node content"},
		{"---\ntitle: A\n", ".vouch/templates/x.calc.md:1:1: front matter is not closed: add a line --- after it"},
		{"---\n- a\n---\n", ".vouch/templates/x.calc.md:2:1: front matter must be key: value lines"},
		{"---\ntitle: A\ntitle: B\n---\n", ".vouch/templates/x.calc.md:3:1: title is given twice; keep one"},
		{"---\npeople:\n  preparer: A <a@example.com>\n---\n", ".vouch/templates/x.calc.md:3:3: a template must not name the preparer; vouch new fills it in from git's user.name and user.email"},
		{"---\npeople: {checker: A <a@example.com>}\n---\n", ".vouch/templates/x.calc.md:2:9: people must list its roles one a line below it, such as: approver: Name <email>"},
	}
	for _, c := range cases {
		_, err := Fill(Template{Name: "x", Path: ".vouch/templates/x.calc.md", Text: []byte(c.text)}, settings.Default(), Person{Name: "A", Email: "a@example.com"})
		if err == nil || err.Error() != c.want {
			t.Errorf("%q:\ngot  %v\nwant %s", c.text, err, c.want)
		}
	}
}

func TestWrite(t *testing.T) {
	dir := t.TempDir()
	dest := filepath.Join(dir, "calcs", "HB-001.calc.md")
	if err := Write(dest, []byte("first\n")); err != nil {
		t.Fatal(err)
	}
	err := Write(dest, []byte("second\n"))
	if !errors.Is(err, ErrExists) {
		t.Errorf("second Write: %v, want ErrExists", err)
	}
	if b, _ := os.ReadFile(dest); string(b) != "first\n" {
		t.Errorf("the existing file was changed: %q", b)
	}
	left, _ := os.ReadDir(filepath.Dir(dest))
	if len(left) != 1 {
		t.Errorf("files left in the folder: %v", left)
	}
}

func TestCheckName(t *testing.T) {
	for name, ok := range map[string]bool{"a.calc.md": true, "x/HB-001.calc.md": true, "a.md": false, ".calc.md": false, "a.calc.md.txt": false} {
		if err := CheckName(name); (err == nil) != ok {
			t.Errorf("CheckName(%q) = %v", name, err)
		}
	}
}
