package qualify

import (
	"errors"
	"fmt"
	"regexp"
	"time"

	"go.yaml.in/yaml/v3"
)

// ErrataFormat names the format of docs/errata.yaml and its version.
const ErrataFormat = "vouch-errata/1"

// Erratum is one known engine error (docs/errata.yaml describes the fields).
type Erratum struct {
	ID, Date, Title, Kind          string
	AffectedVersions               []string
	AffectedUpTo                   string // a commit of main: every engine built from it or an earlier one
	FixedVersion, FixedRevision    string // "" until the fix is released / merged
	FixedNote                      string
	Functions, Fluids              []string
	Inputs, Effect, Fix, Reference string
	Line                           int // the entry's line in the file
}

var (
	errataID  = regexp.MustCompile(`^VE-[0-9]{4}-[0-9]{3}$`)
	errataRev = regexp.MustCompile(`^[0-9a-f]{7,40}$`)
	errataVer = regexp.MustCompile(`^[0-9]+\.[0-9]+\.[0-9]+$`)
)

// errataNode wraps a YAML node with the file name for messages.
type errataNode struct {
	file string
}

func (e errataNode) errf(n *yaml.Node, format string, a ...any) error {
	return posError{e.file, n.Line, n.Column, fmt.Sprintf(format, a...)}
}

// fields reads a mapping whose keys must all be in keys, and checks that
// the required ones are there.
func (e errataNode) fields(n *yaml.Node, what string, keys []string, required int) (map[string]*yaml.Node, error) {
	if n.Kind != yaml.MappingNode {
		return nil, e.errf(n, "%s must be a mapping with the keys %v", what, keys)
	}
	out := map[string]*yaml.Node{}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k := n.Content[i]
		known := false
		for _, want := range keys {
			known = known || k.Value == want
		}
		if !known {
			return nil, e.errf(k, "unknown key %q in %s; the keys are %v", k.Value, what, keys)
		}
		if out[k.Value] != nil {
			return nil, e.errf(k, "%s is given twice in %s", k.Value, what)
		}
		out[k.Value] = n.Content[i+1]
	}
	for _, k := range keys[:required] {
		if out[k] == nil {
			return nil, e.errf(n, "%s lacks %s", what, k)
		}
	}
	return out, nil
}

func (e errataNode) str(n *yaml.Node, key string, empty bool) (string, error) {
	if n.Kind != yaml.ScalarNode || n.Tag == "!!null" || (!empty && n.Value == "") {
		return "", e.errf(n, "%s must be a text%s", key, map[bool]string{true: " (\"\" when not known yet)", false: ""}[empty])
	}
	return n.Value, nil
}

func (e errataNode) list(n *yaml.Node, key string, pattern *regexp.Regexp) ([]string, error) {
	if n.Kind != yaml.SequenceNode {
		return nil, e.errf(n, "%s must be a list, e.g. [a, b] ([] when none)", key)
	}
	var out []string
	for _, item := range n.Content {
		s, err := e.str(item, key, false)
		if err != nil {
			return nil, err
		}
		if pattern != nil && !pattern.MatchString(s) {
			return nil, e.errf(item, "%s: %q is not a release number like 0.1.0", key, s)
		}
		out = append(out, s)
	}
	return out, nil
}

// ParseErrata reads an errata file (docs/errata.yaml). Every mistake is an
// error at its line and column.
func ParseErrata(file string, src []byte) ([]Erratum, error) {
	var doc yaml.Node
	if err := yaml.Unmarshal(src, &doc); err != nil {
		return nil, fmt.Errorf("%s: %v", file, err)
	}
	e := errataNode{file: file}
	if len(doc.Content) == 0 {
		return nil, posError{file, 1, 1, "empty errata file: it needs format: " + ErrataFormat + " and errata: [...]"}
	}
	top, err := e.fields(doc.Content[0], "the errata file", []string{"format", "errata"}, 2)
	if err != nil {
		return nil, err
	}
	if top["format"].Value != ErrataFormat {
		return nil, e.errf(top["format"], "format is %q; this engine reads %s", top["format"].Value, ErrataFormat)
	}
	if top["errata"].Kind != yaml.SequenceNode {
		return nil, e.errf(top["errata"], "errata must be a list of entries, each starting with \"- id:\"")
	}
	var out []Erratum
	var errs []error
	seen := map[string]bool{}
	for _, n := range top["errata"].Content {
		x, err := e.entry(n)
		if err == nil && seen[x.ID] {
			err = e.errf(n, "id %s is used twice", x.ID)
		}
		if err != nil {
			errs = append(errs, err)
			continue
		}
		seen[x.ID] = true
		out = append(out, x)
	}
	return out, errors.Join(errs...)
}

var entryKeys = []string{"id", "date", "title", "kind", "affected", "fixed", "functions", "fluids", "inputs", "effect", "fix", "reference"}

// entry reads one erratum.
func (e errataNode) entry(n *yaml.Node) (Erratum, error) {
	f, err := e.fields(n, "an erratum", entryKeys, len(entryKeys))
	if err != nil {
		return Erratum{}, err
	}
	x := Erratum{Line: n.Line}
	for _, kv := range []struct {
		key string
		dst *string
	}{{"id", &x.ID}, {"date", &x.Date}, {"title", &x.Title}, {"kind", &x.Kind},
		{"inputs", &x.Inputs}, {"effect", &x.Effect}, {"fix", &x.Fix}, {"reference", &x.Reference}} {
		if *kv.dst, err = e.str(f[kv.key], kv.key, false); err != nil {
			return x, err
		}
	}
	switch {
	case !errataID.MatchString(x.ID):
		return x, e.errf(f["id"], "id %q must look like VE-2026-001", x.ID)
	case x.Kind != "wrong-result" && x.Kind != "error":
		return x, e.errf(f["kind"], "kind %q must be wrong-result (a wrong number shown) or error (the calc stopped)", x.Kind)
	}
	if _, err := time.Parse("2006-01-02", x.Date); err != nil {
		return x, e.errf(f["date"], "date %q must be a date like 2026-12-03", x.Date)
	}
	if x.Functions, err = e.list(f["functions"], "functions", nil); err != nil {
		return x, err
	}
	if len(x.Functions) == 0 {
		return x, e.errf(f["functions"], "functions must name at least one function or feature")
	}
	if x.Fluids, err = e.list(f["fluids"], "fluids", nil); err != nil {
		return x, err
	}
	return x, e.versions(f, &x)
}

// versions reads the affected and fixed mappings.
func (e errataNode) versions(f map[string]*yaml.Node, x *Erratum) error {
	a, err := e.fields(f["affected"], "affected", []string{"versions", "up_to_revision"}, 2)
	if err != nil {
		return err
	}
	if x.AffectedVersions, err = e.list(a["versions"], "versions", errataVer); err != nil {
		return err
	}
	if x.AffectedUpTo, err = e.str(a["up_to_revision"], "up_to_revision", false); err != nil {
		return err
	}
	if !errataRev.MatchString(x.AffectedUpTo) {
		return e.errf(a["up_to_revision"], "up_to_revision %q must be a commit id (7 to 40 hex digits)", x.AffectedUpTo)
	}
	fx, err := e.fields(f["fixed"], "fixed", []string{"version", "revision", "note"}, 3)
	if err != nil {
		return err
	}
	for _, kv := range []struct {
		key string
		dst *string
	}{{"version", &x.FixedVersion}, {"revision", &x.FixedRevision}, {"note", &x.FixedNote}} {
		if *kv.dst, err = e.str(fx[kv.key], kv.key, true); err != nil {
			return err
		}
	}
	if x.FixedVersion != "" && !errataVer.MatchString(x.FixedVersion) {
		return e.errf(fx["version"], "fixed version %q must be a release number like 0.2.0, or \"\"", x.FixedVersion)
	}
	if x.FixedRevision != "" && !errataRev.MatchString(x.FixedRevision) {
		return e.errf(fx["revision"], "fixed revision %q must be a commit id, or \"\"", x.FixedRevision)
	}
	return nil
}
