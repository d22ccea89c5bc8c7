package calcdoc

import (
	"errors"
	"os"
	"path/filepath"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// Workspace is the git repository that holds many calcs, opened once for
// rendering all of them: HEAD and whether the tracked work tree is clean
// are read once, not once per calc. Doc.RecordIn gives the same record as
// Doc.Provenance would. A Workspace is for one goroutine; Fork gives
// another goroutine its own handle on the repository.
type Workspace struct {
	repo  *provenance.Repo // nil outside a repository or before the first commit
	head  string
	clean bool
}

// OpenWorkspace opens the repository that holds dir. Outside a repository
// (or in one without commits) every record is unversioned.
func OpenWorkspace(dir string) (*Workspace, error) {
	repo, err := provenance.Open(dir)
	if errors.Is(err, provenance.ErrNotInRepo) {
		return &Workspace{}, nil
	}
	if err != nil {
		return nil, err
	}
	head, err := repo.Head()
	if errors.Is(err, provenance.ErrNoCommits) {
		return &Workspace{}, nil
	}
	if err != nil {
		return nil, err
	}
	clean, err := repo.Clean()
	if err != nil {
		return nil, err
	}
	return &Workspace{repo: repo, head: head, clean: clean}, nil
}

// Fork returns a handle on the same repository, HEAD and clean state for
// another goroutine.
func (w *Workspace) Fork() (*Workspace, error) {
	if w.repo == nil {
		return &Workspace{}, nil
	}
	repo, err := provenance.Open(w.repo.Root())
	if err != nil {
		return nil, err
	}
	return &Workspace{repo: repo, head: w.head, clean: w.clean}, nil
}

// RecordIn builds the provenance record of an evaluated calc from the
// workspace, as Provenance does from scratch. A calc outside the
// workspace's repository gets its record from Provenance.
func (d *Doc) RecordIn(w *Workspace, engine string) (*Record, error) {
	if w == nil || w.repo == nil || !w.holds(d.Path) {
		return d.Provenance(engine)
	}
	m, err := d.baseManifest(engine)
	if err != nil {
		return nil, err
	}
	m.SourceHash = provenance.BlobHash(d.Src)
	rec := &Record{Manifest: m}
	rel, err := w.repo.Rel(d.Path)
	if err != nil {
		return nil, err
	}
	_, committed, _, err := w.repo.FileState(rel)
	if err != nil {
		return nil, err
	}
	dataClean, err := d.dataCommitted(w.repo)
	if err != nil {
		return nil, err
	}
	m.Source, m.Commit = rel, w.head
	rec.Committed = committed == m.SourceHash
	m.Clean = w.clean && rec.Committed && dataClean
	return rec, rec.addHistory(w.repo)
}

// holds reports whether path lies in the workspace's repository and in no
// other repository nested in it (a folder with its own .git).
func (w *Workspace) holds(path string) bool {
	rel, err := w.repo.Rel(path)
	if err != nil {
		return false
	}
	for dir := filepath.Dir(filepath.FromSlash(rel)); dir != "."; dir = filepath.Dir(dir) {
		if _, err := os.Lstat(filepath.Join(w.repo.Root(), dir, ".git")); err == nil {
			return false
		}
	}
	return true
}
