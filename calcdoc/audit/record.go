package audit

import (
	"errors"
	"os"
	"path/filepath"
	"sync"
	"time"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// Provenance builds the stamp of an evaluated calc from git: the
// repository that holds the file at d.Path, its HEAD commit, whether the
// file, its data files and the tracked work tree match that commit, and
// the file's history. Outside a repository (or in one without commits)
// the stamp is unversioned and names the file by its base name. engine is
// the engine's version. It is Workspace.Stamp with a workspace opened for
// this one calc.
func Provenance(d *calcdoc.Doc, engine string) (*calcdoc.Stamp, error) {
	w, err := OpenWorkspace(d.Path)
	if err != nil {
		return nil, err
	}
	return w.stamp(d, engine)
}

// Workspace is the git repository that holds many calcs, opened once for
// rendering all of them: HEAD and whether the tracked work tree is clean
// are read once, not once per calc. A Workspace is for one goroutine; Fork
// gives another goroutine its own handle on the repository.
type Workspace struct {
	repo  *provenance.Repo // nil outside a repository or before the first commit
	head  string
	clean *cleanState
	trust *trust // HEAD's signers and settings, read on first use
}

// cleanState is whether the tracked work tree is clean: git status starts
// when the workspace opens and runs while a stamp reads the calc, its data
// files and its history; the first stamp to need the answer waits for it.
// A workspace and its forks share one, from any goroutine.
type cleanState struct {
	once  sync.Once
	wait  func() (bool, error)
	clean bool
	err   error
}

// get waits for git status once and returns its answer every time.
func (c *cleanState) get() (bool, error) {
	c.once.Do(func() { c.clean, c.err = c.wait() })
	return c.clean, c.err
}

// OpenWorkspace opens the repository that holds dir (a folder or a file)
// and starts asking git whether its tracked work tree is clean; a failure
// of that question is the error of the first stamp. Outside a repository
// (or in one without commits) every stamp is unversioned.
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
	return &Workspace{repo: repo, head: head, clean: &cleanState{wait: repo.StartClean()}}, nil
}

// Fork returns a handle on the same repository, HEAD and clean state for
// another goroutine; the clean state, perhaps still being asked of git, is
// shared.
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

// Stamp builds the stamp of an evaluated calc from the workspace, as
// Provenance does from scratch. A calc outside the workspace's repository
// gets its stamp from Provenance.
func (w *Workspace) Stamp(d *calcdoc.Doc, engine string) (*calcdoc.Stamp, error) {
	if w == nil || w.repo == nil || !w.holds(d.Path) {
		return Provenance(d, engine)
	}
	return w.stamp(d, engine)
}

// stamp builds the stamp of a calc the workspace holds, or the unversioned
// stamp when there is no repository.
func (w *Workspace) stamp(d *calcdoc.Doc, engine string) (*calcdoc.Stamp, error) {
	st, err := d.Unversioned(engine)
	if err != nil || w.repo == nil {
		return st, err
	}
	rel, err := w.repo.Rel(d.Path)
	if err != nil {
		return nil, err
	}
	_, committed, _, err := w.repo.FileState(rel)
	if err != nil {
		return nil, err
	}
	dataClean, err := dataCommitted(w.repo, d)
	if err != nil {
		return nil, err
	}
	m := st.Manifest
	m.Source, m.Commit = rel, w.head
	st.Committed = committed == m.SourceHash
	if err := addHistory(w.repo, st); err != nil {
		return nil, err
	}
	if w.trust == nil {
		if w.trust, err = loadTrust(w.repo, w.head); err != nil {
			return nil, err
		}
	}
	w.trust.record(m)
	clean, err := w.clean.get() // git status has run beside the reads above
	if err != nil {
		return nil, err
	}
	m.Clean = clean && st.Committed && dataClean
	check(d, st, w.trust)
	return st, nil
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

// dataCommitted reports whether every data file the calc read is the blob
// HEAD holds for it.
func dataCommitted(repo *provenance.Repo, d *calcdoc.Doc) (bool, error) {
	for _, f := range d.DataFiles {
		_, committed, _, err := repo.FileState(f.Path)
		if err != nil {
			return false, err
		}
		if committed != f.Hash {
			return false, nil
		}
	}
	return true, nil
}

// addHistory sets the versioned stamp's history and date from git.
func addHistory(repo *provenance.Repo, st *calcdoc.Stamp) error {
	m := st.Manifest
	hist, err := repo.HistoryAt(m.Commit, m.Source)
	if err != nil {
		return err
	}
	date, err := repo.CommitDate(m.Commit)
	if err != nil {
		return err
	}
	st.Versioned, st.History, st.Date = true, hist, date.Format(time.RFC3339)
	st.SignedRevisions, err = signedRevisions(repo, m)
	return err
}
