package calcdoc

import (
	"fmt"
	"github.com/vouchcalc/vouch/eval"
	"go.yaml.in/yaml/v3"
	"io/fs"
	"path/filepath"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// DataFile is a data file a calc read, with its git blob hash.
type DataFile struct {
	Path string // relative to the repository (or to the calc's folder outside one)
	Hash string // git blob hash of the bytes read
}

// dataReader returns the reader csv() uses: paths are relative to the calc
// file, must stay inside Files (its repository, or outside one its
// folder), and every file read is recorded with its hash.
func (d *Doc) dataReader() func(string) ([]byte, error) {
	return func(name string) ([]byte, error) {
		rel, err := d.dataPath(name)
		if err != nil {
			return nil, err
		}
		raw, err := fs.ReadFile(d.Files, rel)
		if err != nil {
			return nil, err
		}
		for _, f := range d.DataFiles {
			if f.Path == rel {
				return raw, nil
			}
		}
		d.DataFiles = append(d.DataFiles, DataFile{Path: rel, Hash: provenance.BlobHash(raw)})
		return raw, nil
	}
}

// dataPath resolves a data-file name to a slash path relative to the root
// of Files and refuses paths that leave it.
func (d *Doc) dataPath(name string) (string, error) {
	if filepath.IsAbs(name) {
		return "", fmt.Errorf("%s: give a path relative to the calc file, inside its repository", name)
	}
	rel := filepath.Clean(filepath.Join(filepath.Dir(filepath.FromSlash(d.Rel)), filepath.FromSlash(name)))
	if rel == ".." || strings.HasPrefix(rel, ".."+string(filepath.Separator)) {
		return "", fmt.Errorf("%s leaves the repository %s; a calc reads only files inside its repository", name, d.Root)
	}
	return filepath.ToSlash(rel), nil
}

// useWorkTree sets Files to the work tree that holds the calc, unless the
// caller set a tree.
func (d *Doc) useWorkTree() {
	if d.Files == nil {
		d.Root, d.Rel = locate(d.Path)
		d.Files = newWorkTree(d.Root)
	}
}

// DataPath is the path on disk of a data file the calc read.
func (d *Doc) DataPath(f DataFile) string {
	return filepath.Join(d.Root, filepath.FromSlash(f.Path))
}

// valuesReader returns the reader yaml() uses: the same path rules and
// hashes as csv(), then the file's key: value pairs in order.
func (d *Doc) valuesReader() func(string) ([]eval.KeyValue, error) {
	read := d.dataReader()
	return func(name string) ([]eval.KeyValue, error) {
		raw, err := read(name)
		if err != nil {
			return nil, err
		}
		return keyValues(raw)
	}
}

// keyValues decodes a YAML mapping of scalars.
func keyValues(raw []byte) ([]eval.KeyValue, error) {
	var root yaml.Node
	if err := yaml.Unmarshal(raw, &root); err != nil {
		return nil, fmt.Errorf("not valid YAML: %v", strings.TrimPrefix(err.Error(), "yaml: "))
	}
	if len(root.Content) == 0 || root.Content[0].Kind != yaml.MappingNode {
		return nil, fmt.Errorf("a data file holds key: value lines")
	}
	m := root.Content[0]
	var out []eval.KeyValue
	seen := map[string]int{}
	for i := 0; i+1 < len(m.Content); i += 2 {
		k, v := m.Content[i], m.Content[i+1]
		if v.Kind != yaml.ScalarNode || k.Kind != yaml.ScalarNode {
			return nil, fmt.Errorf("line %d: %s: a value must be a number, a quantity such as 12.5 MPa, or text in quotes", k.Line, k.Value)
		}
		if first, dup := seen[k.Value]; dup {
			return nil, fmt.Errorf("line %d: %s is already given on line %d", k.Line, k.Value, first)
		}
		seen[k.Value] = k.Line
		quoted := v.Style&(yaml.DoubleQuotedStyle|yaml.SingleQuotedStyle) != 0
		out = append(out, eval.KeyValue{Key: k.Value, Value: v.Value, Quoted: quoted, Line: v.Line})
	}
	return out, nil
}
