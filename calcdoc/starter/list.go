// Package starter makes the starter calc of `vouch new`: it lists the
// built-in templates (embedded by package templates) and the firm's own
// (in the repository's templates folder, see settings), and fills a
// template's front matter from the repository's settings and the preparer's
// name. It writes the new file without ever replacing an existing one.
package starter

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"path"
	"sort"
	"strings"

	"go.yaml.in/yaml/v3"

	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/templates"
)

// Ext is the ending of a calc file's name, and so of a template's.
const Ext = ".calc.md"

// MaxTemplateSize is the largest template read, in bytes.
const MaxTemplateSize = 1 << 20

// Template is one calc template.
type Template struct {
	Name string // the file name without .calc.md: cycle
	// Path is the template's file from the repository root for a firm
	// template, "" for a built-in one.
	Path string
	// Replaces is true for a firm template that takes the place of the
	// built-in template of the same name.
	Replaces bool
	Text     []byte
}

// Title is the template's front-matter title, or "" when it has none.
func (t Template) Title() string {
	fm, _, ok := splitFront(t.Text)
	if !ok {
		return ""
	}
	top, err := frontMap(fm)
	if err != nil || top["title"] == nil || top["title"].Kind != yaml.ScalarNode {
		return ""
	}
	return oneLine(top["title"].Value)
}

// Origin says where the template comes from, for a listing.
func (t Template) Origin() string {
	switch {
	case t.Path == "":
		return "built-in"
	case t.Replaces:
		return t.Path + " (replaces the built-in)"
	}
	return t.Path
}

// List returns every template by name: the built-in ones, and those of the
// firm's templates folder in repo (the repository root), a firm template
// taking the place of a built-in one of the same name. A missing folder
// means no firm templates, unless the settings name a folder of their own.
func List(repo fs.FS, s *settings.Settings) ([]Template, error) {
	byName := map[string]Template{}
	if err := addTemplates(byName, templates.Starters(), ".", ""); err != nil {
		return nil, err
	}
	err := addTemplates(byName, repo, s.Templates, s.Templates)
	if errors.Is(err, fs.ErrNotExist) && s.Templates == settings.DefaultTemplates {
		err = nil
	} else if errors.Is(err, fs.ErrNotExist) {
		err = fmt.Errorf("%s names the templates folder %q, which does not exist", settings.FileName, s.Templates)
	}
	if err != nil {
		return nil, err
	}
	out := make([]Template, 0, len(byName))
	for _, t := range byName {
		out = append(out, t)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out, nil
}

// Find returns the template called name.
func Find(list []Template, name string) (Template, error) {
	var names []string
	for _, t := range list {
		if t.Name == name {
			return t, nil
		}
		names = append(names, t.Name)
	}
	return Template{}, fmt.Errorf("no template called %q; the templates are %s", name, strings.Join(names, ", "))
}

// addTemplates reads the NAME.calc.md files of dir in fsys; folder is the
// path shown for them ("" for the built-in ones).
func addTemplates(byName map[string]Template, fsys fs.FS, dir, folder string) error {
	entries, err := fs.ReadDir(fsys, dir)
	if err != nil {
		return err
	}
	for _, e := range entries {
		name, ok := strings.CutSuffix(e.Name(), Ext)
		if !ok || e.IsDir() {
			continue
		}
		p := path.Join(folder, e.Name())
		if !e.Type().IsRegular() {
			return fmt.Errorf("%s: a template must be a plain file in the repository, not a link or a device", p)
		}
		if !validName(name) {
			return fmt.Errorf("%s: a template's name must be letters, digits, - and _, such as heat-balance%s", p, Ext)
		}
		text, err := readTemplate(fsys, path.Join(dir, e.Name()), p)
		if err != nil {
			return err
		}
		_, builtin := byName[name]
		t := Template{Name: name, Text: text}
		if folder != "" {
			t.Path, t.Replaces = p, builtin
		}
		byName[name] = t
	}
	return nil
}

func readTemplate(fsys fs.FS, name, shown string) ([]byte, error) {
	f, err := fsys.Open(name)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	var b bytes.Buffer
	if _, err := b.ReadFrom(io.LimitReader(f, MaxTemplateSize+1)); err != nil {
		return nil, fmt.Errorf("%s: %v", shown, err)
	}
	if b.Len() > MaxTemplateSize {
		return nil, fmt.Errorf("%s: a template may hold at most %d bytes", shown, MaxTemplateSize)
	}
	return b.Bytes(), nil
}

func validName(s string) bool {
	for _, r := range s {
		if !(r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9' || r == '-' || r == '_') {
			return false
		}
	}
	return s != ""
}
