package calcdoc

import (
	"errors"
	"fmt"
	"path"
	"path/filepath"
	"strings"

	"go.yaml.in/yaml/v3"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/internal/excerpt"
	"github.com/vouchcalc/vouch/internal/safefile"
)

// DataFile is a data file a calc read, with its git blob hash.
type DataFile struct {
	Path string // relative to the repository (or to the calc's folder outside one)
	Hash string // git blob hash of the bytes read
	// Review marks the calc's review record (reviewrec.go), listed with
	// the data files so the manifest covers it; the calc reads no value
	// from it.
	Review bool
}

// dataReader returns the reader csv() uses: paths are relative to the calc
// file, must stay inside Files (its repository, or outside one its
// folder), and every file read is recorded with its hash.
func (d *Doc) dataReader() func(string) ([]byte, error) {
	return func(name string) ([]byte, error) { return d.readData(name, MaxDataBytes) }
}

// readData reads a data file or image of at most limit bytes through Files
// (regular files only) and records it with its hash.
func (d *Doc) readData(name string, limit int64) ([]byte, error) {
	rel, err := dataRel(d.Rel, name)
	if err != nil {
		if errors.Is(err, errLeaves) {
			return nil, fmt.Errorf("%w %s; a calc reads only files inside its repository", err, d.Root)
		}
		return nil, err
	}
	raw, err := safefile.ReadFS(d.Files, rel, limit)
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

// errLeaves is the error of a data path that leaves the repository.
var errLeaves = errors.New("leaves the repository")

// dataRel is the path rule of data files and images: name, a slash path
// relative to the calc at calcRel, is joined to the calc's folder and
// cleaned, then decided on its elements (never on string prefixes): it may
// not be absolute, its first element may not be "..", and no element may be
// .git in any case (git's own files are not data). It returns the slash
// path from the root.
func dataRel(calcRel, name string) (string, error) {
	slash := filepath.ToSlash(name)
	if name == "" {
		return "", fmt.Errorf("give the path of a file, relative to the calc file")
	}
	if path.IsAbs(slash) || filepath.IsAbs(name) || filepath.VolumeName(name) != "" {
		return "", fmt.Errorf("%s: give a path relative to the calc file, inside its repository", excerpt.Cut(name))
	}
	rel := path.Clean(path.Join(path.Dir(calcRel), slash))
	elems := strings.Split(rel, "/")
	if elems[0] == ".." {
		return "", fmt.Errorf("%s %w", excerpt.Cut(name), errLeaves)
	}
	for _, e := range elems {
		if strings.EqualFold(e, ".git") {
			return "", fmt.Errorf("%s is inside .git; a calc reads files of the work tree, not git's own files", excerpt.Cut(name))
		}
	}
	if rel == "." {
		return "", fmt.Errorf("%s is the repository's folder; give the path of a file", excerpt.Cut(name))
	}
	return rel, nil
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
			return nil, fmt.Errorf("line %d: %s: a value must be a number, a quantity such as 12.5 MPa, or text in quotes", k.Line, excerpt.Cut(k.Value))
		}
		if first, dup := seen[k.Value]; dup {
			return nil, fmt.Errorf("line %d: %s is already given on line %d", k.Line, excerpt.Cut(k.Value), first)
		}
		seen[k.Value] = k.Line
		quoted := v.Style&(yaml.DoubleQuotedStyle|yaml.SingleQuotedStyle) != 0
		comment := strings.TrimSpace(strings.TrimPrefix(strings.TrimSpace(v.LineComment+k.LineComment), "#"))
		out = append(out, eval.KeyValue{Key: k.Value, Value: v.Value, Quoted: quoted, Line: v.Line, Comment: comment})
	}
	return out, nil
}

// ReadData returns the bytes of a data file the calc read, from Files (the
// tree the calc was evaluated in), for a comparison of two revisions.
func (d *Doc) ReadData(f DataFile) ([]byte, error) {
	if d.Files == nil {
		return nil, fmt.Errorf("%s: the calc has not been evaluated", f.Path)
	}
	return safefile.ReadFS(d.Files, f.Path, MaxDataBytes)
}

// DataValues decodes a YAML data file's key: value pairs as yaml() reads
// them, each as written, with its line.
func DataValues(raw []byte) ([]eval.KeyValue, error) { return keyValues(raw) }
