package register

import (
	"fmt"
	"os"
	"path/filepath"
	"sync"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/audit"
	"github.com/vouchcalc/vouch/calcdoc/provenance"

	"github.com/vouchcalc/vouch/internal/safefile"
)

// CalcError is an error in a calc file, at its line and column.
type CalcError struct {
	Line int    `json:"line"`
	Col  int    `json:"col"`
	Msg  string `json:"msg"`
}

// lazyWorkspace opens the repository once, when the first calc needs
// rendering: a run that renders nothing never runs git.
type lazyWorkspace struct {
	dir   string
	once  sync.Once
	space *audit.Workspace
	err   error
}

func (l *lazyWorkspace) get() (*audit.Workspace, error) {
	l.once.Do(func() { l.space, l.err = audit.OpenWorkspace(l.dir) })
	return l.space, l.err
}

// worker renders calcs one at a time, with its own handle on the
// repository.
type worker struct {
	run   *run
	space *audit.Workspace
}

// do brings one calc's entry up to date: from the cache when the engine,
// source and data files are unchanged, else by evaluating and rendering it.
func (w *worker) do(calc string) outcome {
	opt := w.run.opt
	path := filepath.Join(opt.Dir, filepath.FromSlash(calc))
	src, err := safefile.Read(path, calcdoc.MaxFileBytes)
	if err != nil {
		return outcome{entry: &Entry{Path: calc, Errors: []CalcError{{Msg: err.Error()}}}, rendered: true}
	}
	old := w.cached(calc, path, src)
	if old != nil {
		e := old.clone()
		w.signedStatus(e, path, src, old)
		return outcome{entry: e}
	}
	e, err := w.render(calc, path, src)
	if err == nil {
		w.signedStatus(e, path, src, w.previous(calc))
	}
	return outcome{entry: e, rendered: true, err: err}
}

// cached returns the cache entry that still holds for the calc, if any.
func (w *worker) cached(calc, path string, src []byte) *Entry {
	for _, e := range w.run.cache.lookup(calc) {
		if w.fresh(e, calc, path, src) {
			return e
		}
	}
	return nil
}

// previous returns a cached entry of the calc, fresh or not, whose
// verification of the signed package may still hold.
func (w *worker) previous(calc string) *Entry {
	if list := w.run.cache.lookup(calc); len(list) > 0 {
		return list[len(list)-1]
	}
	return nil
}

// fresh reports whether a cache entry still holds: same key, and the
// package it names still in the output folder.
func (w *worker) fresh(old *Entry, calc, path string, src []byte) bool {
	if old.Key != cacheKey(w.run.opt.cacheEngine(), calc, src, currentData(filepath.Dir(path), old.Data)) {
		return false
	}
	if old.Broken() {
		return true
	}
	_, err := os.Stat(filepath.Join(w.run.opt.Out, filepath.FromSlash(old.Package)))
	return err == nil
}

// render evaluates a calc and writes its package into the output folder. A calc with errors gets an entry that lists them and no
// package; the error is for a package that cannot be written.
func (w *worker) render(calc, path string, src []byte) (*Entry, error) {
	d := calcdoc.ReadWith(path, src, w.run.opt.Read)
	d.Evaluate()
	e := entryOf(calc, d)
	defer func() { e.Key = cacheKey(w.run.opt.cacheEngine(), calc, src, e.Data) }()
	if e.Broken() {
		return e, nil
	}
	html, err := w.renderDoc(d)
	if err != nil {
		e.Errors = []CalcError{{Msg: err.Error()}}
		return e, nil
	}
	e.Package = packagePath(calc)
	return e, calcdoc.WriteFileAtomic(filepath.Join(w.run.opt.Out, filepath.FromSlash(e.Package)), html)
}

// entryOf describes an evaluated calc: front matter, checks, data files and
// errors.
func entryOf(calc string, d *calcdoc.Doc) *Entry {
	f := d.Front
	e := &Entry{Path: calc, Number: f.Number, Title: f.Title, Revision: f.Revision, Project: f.Project, Data: dataRefs(d), Open: len(d.OpenAssumptions())}
	for _, c := range d.Checks() {
		if c.Outcome.Pass {
			e.Passed++
		} else {
			e.Failed++
		}
	}
	for _, x := range d.Errors {
		e.Errors = append(e.Errors, CalcError{Line: x.Pos.Line, Col: x.Pos.Col, Msg: x.Msg})
	}
	return e
}

// renderDoc renders the package with the provenance record from the
// worker's workspace. The register writes no manifest file beside it: the
// manifest is inside the package.
func (w *worker) renderDoc(d *calcdoc.Doc) ([]byte, error) {
	if w.space == nil {
		base, err := w.run.space.get()
		if err != nil {
			return nil, err
		}
		if w.space, err = base.Fork(); err != nil {
			return nil, err
		}
	}
	st, err := w.space.Stamp(d, w.run.opt.Engine)
	if err != nil {
		return nil, err
	}
	pkg, err := d.Render(calcdoc.RenderOptions{Engine: w.run.opt.Engine, Stamp: st, Build: w.run.opt.Build, Qualification: w.run.opt.Qualification})
	if err != nil {
		return nil, err
	}
	return pkg.HTML, nil
}

// clone copies an entry, so that a run never changes the cached one.
func (e *Entry) clone() *Entry {
	c := *e
	if e.Signed != nil {
		s := *e.Signed
		c.Signed = &s
	}
	return &c
}

// ErrorText formats the entry's errors as file:line:col: message, naming
// the file as given.
func (e *Entry) ErrorText(file string) []string {
	var out []string
	for _, x := range e.Errors {
		if x.Line == 0 {
			out = append(out, fmt.Sprintf("%s: %s", file, x.Msg))
			continue
		}
		out = append(out, fmt.Sprintf("%s:%d:%d: %s", file, x.Line, x.Col, x.Msg))
	}
	return out
}

// blobHash is the git blob hash of a file's bytes.
func blobHash(b []byte) string { return provenance.BlobHash(b) }
