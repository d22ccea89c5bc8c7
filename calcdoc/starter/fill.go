package starter

import (
	"bytes"
	"fmt"
	"net/mail"
	"strings"

	"go.yaml.in/yaml/v3"

	"github.com/vouchcalc/vouch/calcdoc/settings"
)

// Person is the preparer of a new calc, as git knows them (user.name and
// user.email). Either may be empty when git does not know it.
type Person struct {
	Name  string
	Email string
}

// placeholder is written, commented out, where a person is not known.
const placeholder = "Name <name@example.com>"

// Fill returns the starter calc made from t: its front matter gains the
// preparer and the firm's extra keys (left empty, to fill), and keeps
// everything else of the template as written.
func Fill(t Template, s *settings.Settings, preparer Person) ([]byte, error) {
	fm, body, ok := splitFront(t.Text)
	if !ok && bytes.HasPrefix(t.Text, []byte("---\n")) {
		return nil, (&frontErr{0, 1, "front matter is not closed: add a line --- after it"}).in(t)
	}
	top, ferr := frontMap(fm)
	if ferr != nil {
		return nil, ferr.in(t)
	}
	lines := splitLines(fm)
	who, known := personText(preparer)
	if people := top["people"]; people != nil {
		lines, ferr = addPreparer(lines, people, who, known)
		if ferr != nil {
			return nil, ferr.in(t)
		}
	} else {
		lines = append(lines, peopleBlock(who, known)...)
	}
	for _, k := range s.FrontMatter {
		if top[k.Key] == nil {
			lines = append(lines, fmt.Sprintf("%s: \"\"  # %s: fill in", k.Key, oneLine(k.Label)))
		}
	}
	var b bytes.Buffer
	b.WriteString("---\n")
	for _, l := range lines {
		b.WriteString(l + "\n")
	}
	b.WriteString("---\n")
	b.Write(body)
	return b.Bytes(), nil
}

// splitFront splits a calc file into its front matter (without the ---
// lines) and the rest; ok is false when the file has no front matter.
func splitFront(src []byte) (fm, body []byte, ok bool) {
	rest, found := bytes.CutPrefix(src, []byte("---\n"))
	if !found {
		return nil, src, false
	}
	for i := 0; i < len(rest); {
		j := bytes.IndexByte(rest[i:], '\n')
		end := len(rest)
		if j >= 0 {
			end = i + j
		}
		line := strings.TrimRight(string(rest[i:end]), "\r")
		if line == "---" || line == "..." {
			return rest[:i], rest[min(end+1, len(rest)):], true
		}
		i = end + 1
	}
	return nil, src, false
}

func splitLines(fm []byte) []string {
	s := strings.TrimSuffix(string(fm), "\n")
	if s == "" {
		return nil
	}
	return strings.Split(s, "\n")
}

// frontMap decodes the template's front matter as a mapping and returns its
// top-level values by key; a key given twice is an error.
func frontMap(fm []byte) (map[string]*yaml.Node, *frontErr) {
	var root yaml.Node
	if err := yaml.Unmarshal(fm, &root); err != nil {
		return nil, &frontErr{1, 1, "front matter is not valid YAML (lines counted from the line after ---): " + strings.TrimPrefix(err.Error(), "yaml: ")}
	}
	top := map[string]*yaml.Node{}
	if len(root.Content) == 0 {
		return top, nil
	}
	m := root.Content[0]
	if m.Kind != yaml.MappingNode {
		return nil, nodeErr(m, "front matter must be key: value lines")
	}
	for i := 0; i+1 < len(m.Content); i += 2 {
		k := m.Content[i]
		if top[k.Value] != nil {
			return nil, nodeErr(k, k.Value+" is given twice; keep one")
		}
		top[k.Value] = m.Content[i+1]
	}
	return top, nil
}

// addPreparer puts the preparer first under the template's own people
// block (which may name a checker or an approver, never the preparer).
func addPreparer(lines []string, people *yaml.Node, who string, known bool) ([]string, *frontErr) {
	if people.Kind != yaml.MappingNode || people.Style&yaml.FlowStyle != 0 || len(people.Content) == 0 {
		return nil, nodeErr(people, "people must list its roles one a line below it, such as: approver: Name <email>")
	}
	for i := 0; i+1 < len(people.Content); i += 2 {
		if k := people.Content[i]; k.Value == settings.Preparer {
			return nil, nodeErr(k, "a template must not name the preparer; vouch new fills it in from git's user.name and user.email")
		}
	}
	first := people.Content[0]
	line := strings.Repeat(" ", first.Column-1) + "preparer: " + who
	if !known {
		line = strings.Repeat(" ", first.Column-1) + "# preparer: " + placeholder + "  (fill in: git's user.name and user.email are not set)"
	}
	at := first.Line - 1 // index of the first role's line
	out := append(append(append([]string(nil), lines[:at]...), line), lines[at:]...)
	return out, nil
}

// peopleBlock is the people key of a template that has none.
func peopleBlock(who string, known bool) []string {
	if !known {
		return []string{
			"# people:  (fill in and remove the # marks: git's user.name and user.email are not set)",
			"#   preparer: " + placeholder,
			"#   checker: " + placeholder,
			"#   approver: " + placeholder,
		}
	}
	return []string{
		"people:",
		"  preparer: " + who,
		"  # checker: " + placeholder,
		"  # approver: " + placeholder,
	}
}

// personText is the preparer as a front-matter value, Name <email>, and
// whether it is known and reads back as the same name and address.
func personText(p Person) (string, bool) {
	if strings.TrimSpace(p.Name) == "" || strings.TrimSpace(p.Email) == "" {
		return "", false
	}
	quoted := `"` + strings.NewReplacer(`\`, `\\`, `"`, `\"`).Replace(p.Name) + `"`
	for _, text := range []string{p.Name + " <" + p.Email + ">", quoted + " <" + p.Email + ">"} {
		a, err := mail.ParseAddress(text)
		if err != nil || a.Name != p.Name || a.Address != p.Email {
			continue
		}
		out, err := yaml.Marshal(text)
		if v := strings.TrimSuffix(string(out), "\n"); err == nil && !strings.Contains(v, "\n") {
			return v, true
		}
	}
	return "", false
}

// frontErr is a problem at a line and column of a template's front matter.
type frontErr struct {
	line, col int // in the front matter's text
	msg       string
}

func nodeErr(n *yaml.Node, msg string) *frontErr { return &frontErr{n.Line, n.Column, msg} }

// in places the error in the template's file: the front matter starts on
// the file's second line.
func (e *frontErr) in(t Template) error {
	file := t.Path
	if file == "" {
		file = "built-in template " + t.Name
	}
	return fmt.Errorf("%s:%d:%d: %s", file, e.line+1, e.col, e.msg)
}

// oneLine keeps a label on its comment line.
func oneLine(s string) string {
	return strings.Join(strings.Fields(s), " ")
}
