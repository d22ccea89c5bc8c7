package register

import (
	"crypto/sha256"
	"encoding/hex"
	"path/filepath"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"

	"github.com/vouchcalc/vouch/internal/safefile"
)

// cacheFormat names the layout of a cache entry; a new layout renders
// everything again.
const cacheFormat = "vouch-register/2"

// Entry is one calc of the register, as the cache keeps it.
type Entry struct {
	Path     string `json:"path"` // slash path relative to the registered folder
	Key      string `json:"key"`  // hash of the engine, the source and the data files
	Number   string `json:"number,omitempty"`
	Title    string `json:"title,omitempty"`
	Revision string `json:"revision,omitempty"`
	Project  string `json:"project,omitempty"`
	Package  string `json:"package,omitempty"` // the rendered package, relative to the output folder
	Passed   int    `json:"passed"`
	Failed   int    `json:"failed"`
	// Open is the number of open assumptions: while any is open the calc
	// cannot be approved.
	Open   int         `json:"open_assumptions"`
	Errors []CalcError `json:"errors,omitempty"` // the calc is broken when it has any
	Data   []DataRef   `json:"data,omitempty"`   // data files read, relative to the calc's folder
	Signed *Signed     `json:"signed,omitempty"` // the signed package beside the calc, if any
}

// DataRef is a data file a calc read and its git blob hash.
type DataRef struct {
	Path string `json:"path"`
	Hash string `json:"hash"`
}

// Broken reports a calc with errors: it has no package.
func (e *Entry) Broken() bool { return len(e.Errors) > 0 }

// cacheKey hashes what a package depends on besides git: the engine, the
// calc's path and source, and each data file it read.
func cacheKey(engine, calc string, src []byte, data []DataRef) string {
	h := sha256.New()
	for _, s := range []string{cacheFormat, engine, calc, provenance.BlobHash(src)} {
		h.Write([]byte(s + "\n"))
	}
	for _, d := range data {
		h.Write([]byte(d.Path + " " + d.Hash + "\n"))
	}
	return hex.EncodeToString(h.Sum(nil))
}

// currentData hashes the data files an entry lists as they are now; a
// file that is gone gets no hash, which changes the key.
func currentData(calcDir string, refs []DataRef) []DataRef {
	out := make([]DataRef, len(refs))
	for i, r := range refs {
		out[i] = DataRef{Path: r.Path}
		if b, err := safefile.Read(filepath.Join(calcDir, filepath.FromSlash(r.Path)), calcdoc.MaxDataBytes); err == nil {
			out[i].Hash = provenance.BlobHash(b)
		}
	}
	return out
}

// dataRefs lists the data files an evaluated calc read, relative to its
// folder.
func dataRefs(d *calcdoc.Doc) []DataRef {
	var out []DataRef
	dir, _ := filepath.Abs(filepath.Dir(d.Path))
	for _, f := range d.DataFiles {
		rel, err := filepath.Rel(dir, d.DataPath(f))
		if err != nil {
			rel = f.Path
		}
		out = append(out, DataRef{Path: filepath.ToSlash(rel), Hash: f.Hash})
	}
	return out
}
