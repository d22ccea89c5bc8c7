package settings

import (
	"bytes"
	"errors"
	"io"
	"io/fs"
	"path/filepath"
	"strings"

	"go.yaml.in/yaml/v3"

	"github.com/vouchcalc/vouch/internal/safefile"
)

// MaxSize is the largest settings file read, in bytes.
const MaxSize = 1 << 20

// topKeys are the keys of the settings file, in the order of the reference.
var topKeys = []string{"firm", "paper", "caution", "display", "us_power", "front_matter", "signers", "roles", "compare", "templates"}

// Load reads FileName at the root of the repository fsys; root is the
// repository's path, used only to name the file in errors. A missing file
// gives Default. The file's bytes are returned with the settings so that a
// caller can hash or quote it.
func Load(fsys fs.FS, root string) (*Settings, []byte, error) {
	src, err := safefile.ReadFS(fsys, FileName, MaxSize)
	if errors.Is(err, fs.ErrNotExist) {
		return Default(), nil, nil
	}
	if err != nil {
		return nil, nil, err
	}
	s, err := Parse(filepath.Join(root, FileName), src)
	return s, src, err
}

// Parse decodes and checks a settings file; file names it in errors. Every
// problem is reported, as an ErrorList sorted by position; with any error
// the settings returned are nil.
func Parse(file string, src []byte) (*Settings, error) {
	d := &decoder{file: file, s: Default()}
	d.decode(src)
	if len(d.errs) > 0 {
		d.errs.sort()
		return nil, d.errs
	}
	return d.s, nil
}

// decoder gathers the settings and the errors of one file.
type decoder struct {
	file string
	s    *Settings
	errs ErrorList
}

func (d *decoder) at(line, col int, msg string) {
	d.errs = append(d.errs, &Error{File: d.file, Line: line, Col: col, Msg: msg})
}

func (d *decoder) errf(n *yaml.Node, format string, args ...any) {
	d.at(n.Line, n.Column, sprintf(format, args...))
}

func (d *decoder) decode(src []byte) {
	if len(src) > MaxSize {
		d.at(1, 1, sprintf("%s is larger than %d bytes; a settings file is a page of text", FileName, MaxSize))
		return
	}
	dec := yaml.NewDecoder(bytes.NewReader(src))
	var root yaml.Node
	if err := dec.Decode(&root); err != nil {
		if err != io.EOF {
			d.at(1, 1, sprintf("%s is not valid YAML: %s", FileName, strings.TrimPrefix(err.Error(), "yaml: ")))
		}
		return
	}
	var next yaml.Node
	if err := dec.Decode(&next); err != io.EOF {
		line := 1
		if err == nil {
			line = next.Line
		}
		d.at(line, 1, sprintf("%s must hold one YAML document; remove the --- line and what follows it", FileName))
		return
	}
	if len(root.Content) == 0 {
		return
	}
	top := root.Content[0]
	if top.Kind == yaml.ScalarNode && top.Tag == "!!null" {
		return
	}
	d.mapping(top, "", topKeys, d.setTop)
}

// mapping walks a mapping node: each key once, known keys only. where names
// the mapping in messages ("" for the top level, "firm", ...).
func (d *decoder) mapping(n *yaml.Node, where string, known []string, set func(k, v *yaml.Node)) {
	if n.Kind != yaml.MappingNode {
		if where == "" {
			d.errf(n, "%s must be a list of key: value lines, such as paper: A4", FileName)
		} else {
			d.errf(n, "%s must be a list of key: value lines (%s)", where, strings.Join(known, ", "))
		}
		return
	}
	seen := map[string]int{}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		if k.Kind != yaml.ScalarNode {
			d.errf(k, "a key must be a plain name")
			continue
		}
		if line, dup := seen[k.Value]; dup {
			d.errf(k, "%s is given twice (first at line %d); keep one", qualified(where, k.Value), line)
			continue
		}
		seen[k.Value] = k.Line
		if known != nil && !contains(known, k.Value) {
			d.unknown(k, where, known)
			continue
		}
		set(k, v)
	}
}

func (d *decoder) unknown(k *yaml.Node, where string, known []string) {
	msg := "unknown settings key %q"
	if where != "" {
		msg = "unknown key %q under " + where
	}
	msg = sprintf(msg, k.Value)
	if near := nearest(k.Value, known); near != "" {
		msg += sprintf("; did you mean %s?", near)
	}
	d.errf(k, "%s; the keys are %s", msg, strings.Join(known, ", "))
}

func (d *decoder) setTop(k, v *yaml.Node) {
	s := d.s
	switch k.Value {
	case "firm":
		d.mapping(v, "firm", []string{"name", "address", "logo"}, d.setFirm)
	case "paper":
		d.choice(v, "paper", &s.Paper, A4, Letter)
	case "caution":
		d.text(v, "caution", &s.Caution, false)
	case "display":
		d.choice(v, "display", &s.Display, SI, US)
	case "us_power":
		d.choice(v, "us_power", &s.USPower, PowerHP, PowerKW)
	case "front_matter":
		d.setFrontMatter(v)
	case "signers":
		d.path(v, "signers", &s.Signers, false)
	case "roles":
		d.mapping(v, "roles", []string{"attestation", "allow_same_signer"}, d.setRoles)
	case "compare":
		d.mapping(v, "compare", []string{"tolerance"}, func(_, v *yaml.Node) { d.setTolerance(v) })
	case "templates":
		d.path(v, "templates", &s.Templates, false)
	}
}

func (d *decoder) setFirm(k, v *yaml.Node) {
	switch k.Value {
	case "name":
		d.text(v, "firm name", &d.s.Firm.Name, true)
	case "address":
		d.setAddress(v)
	case "logo":
		d.path(v, "logo", &d.s.Firm.Logo, true)
	}
}

func (d *decoder) setAddress(v *yaml.Node) {
	if v.Kind != yaml.SequenceNode {
		d.errf(v, "firm address must be a list of lines, such as [1 Quay Street, Portlow PL1 2AB]")
		return
	}
	var lines []string
	for _, n := range v.Content {
		var s string
		if d.text(n, "an address line", &s, true) {
			lines = append(lines, s)
		}
	}
	d.s.Firm.Address = lines
}

func (d *decoder) setFrontMatter(v *yaml.Node) {
	d.mapping(v, "front_matter", nil, func(k, v *yaml.Node) {
		if !isKeyName(k.Value) {
			d.errf(k, "front-matter key %q must be a lowercase name of letters, digits and _, starting with a letter, such as client_document", k.Value)
			return
		}
		if contains(BuiltinFrontKeys, k.Value) {
			d.errf(k, "front-matter key %q is built in; a firm's key needs another name (the built-in keys are %s)", k.Value, strings.Join(BuiltinFrontKeys, ", "))
			return
		}
		var label string
		if d.text(v, "the label of "+k.Value, &label, true) {
			d.s.FrontMatter = append(d.s.FrontMatter, FrontKey{Key: k.Value, Label: label})
		}
	})
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

func qualified(where, key string) string {
	if where == "" {
		return key
	}
	return where + " " + key
}

func isKeyName(s string) bool {
	for i, r := range s {
		switch {
		case r >= 'a' && r <= 'z':
		case i > 0 && (r >= '0' && r <= '9' || r == '_'):
		default:
			return false
		}
	}
	return s != ""
}
