package provenance

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path"
	"path/filepath"
	"strings"
	"sync"
	"time"

	"github.com/go-git/go-git/v5"
	"github.com/go-git/go-git/v5/plumbing"
	"github.com/go-git/go-git/v5/plumbing/cache"
	"github.com/go-git/go-git/v5/plumbing/filemode"
	"github.com/go-git/go-git/v5/plumbing/object"
	"github.com/go-git/go-git/v5/storage/filesystem"

	"github.com/vouchcalc/vouch/internal/safefile"
)

// Repo is a git repository opened from a path inside its work tree.
//
// A Repo is safe for concurrent use: its methods take a lock around go-git,
// whose object storage is not meant to be shared between goroutines.
type Repo struct {
	mu    sync.Mutex
	git   *git.Repository
	store *filesystem.Storage // git's storage, pack files kept open during a call; nil if not on disk
	root  string              // absolute work-tree root, symbolic links resolved
	blobs blobCache           // contents ReadAt has read, by blob hash

	graphReads int // commits history walks read from the commit-graph file, for tests
}

// lock takes the Repo's mutex and returns the function that gives it back.
// Within one call go-git keeps the pack files open (a history walk reads
// hundreds of objects, and reopening the pack for each was most of its
// time); unlocking closes them, so no descriptor outlives the call.
func (r *Repo) lock() (unlock func()) {
	r.mu.Lock()
	return r.unlock
}

// unlock closes the pack files the call opened and releases the mutex.
func (r *Repo) unlock() {
	if r.store != nil {
		_ = r.store.Close() // only closes read-only descriptors
	}
	r.mu.Unlock()
}

// keepPacksOpen reopens r on the same storage with go-git's KeepDescriptors
// option, which PlainOpen does not offer. On any trouble it keeps r as it is.
func keepPacksOpen(r *git.Repository, wt *git.Worktree) (*git.Repository, *filesystem.Storage) {
	st, ok := r.Storer.(*filesystem.Storage)
	if !ok {
		return r, nil
	}
	kept := filesystem.NewStorageWithOptions(st.Filesystem(), cache.NewObjectLRUDefault(),
		filesystem.Options{KeepDescriptors: true})
	r2, err := git.Open(kept, wt.Filesystem)
	if err != nil {
		return r, nil
	}
	return r2, kept
}

// Open finds the repository whose work tree holds path (a file or a
// directory), searching the parent directories as git does. Linked work trees
// made by git worktree add are supported. Outside any repository it returns
// an error wrapping ErrNotInRepo.
func Open(path string) (*Repo, error) {
	abs, err := filepath.Abs(path)
	if err != nil {
		return nil, fmt.Errorf("open repository for %s: %w", path, err)
	}
	r, err := git.PlainOpenWithOptions(abs, &git.PlainOpenOptions{
		DetectDotGit:          true,
		EnableDotGitCommonDir: true,
	})
	if errors.Is(err, git.ErrRepositoryNotExists) {
		return nil, fmt.Errorf("%s: %w", path, ErrNotInRepo)
	}
	if err != nil {
		return nil, fmt.Errorf("open repository for %s: %w", path, err)
	}
	wt, err := r.Worktree()
	if err != nil {
		return nil, fmt.Errorf("open work tree for %s: %w", path, err)
	}
	root, err := realPath(wt.Filesystem.Root())
	if err != nil {
		return nil, fmt.Errorf("open work tree for %s: %w", path, err)
	}
	r, store := keepPacksOpen(r, wt)
	return &Repo{git: r, store: store, root: root}, nil
}

// Root returns the absolute path of the work tree's top directory, with
// symbolic links resolved.
func (r *Repo) Root() string { return r.root }

// Rel returns the slash-separated path of p relative to the work-tree root.
// A relative p is taken from the current directory. Symbolic links are
// resolved first, so a link that points out of the repository is refused
// like a path that climbs out of it with "..": both give an error wrapping
// ErrOutsideRepo, as does a path into the .git directory.
func (r *Repo) Rel(p string) (string, error) {
	abs, err := filepath.Abs(p)
	if err != nil {
		return "", fmt.Errorf("path %s: %w", p, err)
	}
	real, err := realPath(abs)
	if err != nil {
		return "", fmt.Errorf("path %s: %w", p, err)
	}
	rel, err := filepath.Rel(r.root, real)
	if err != nil {
		return "", fmt.Errorf("path %s and repository %s: %w", p, r.root, ErrOutsideRepo)
	}
	rel = filepath.ToSlash(rel)
	if err := checkRel(rel); err != nil {
		return "", fmt.Errorf("path %s and repository %s: %w", p, r.root, ErrOutsideRepo)
	}
	return rel, nil
}

// checkRel refuses a slash path that is absolute, climbs with "..", is not
// clean, or enters the .git directory. "." (the root itself) is refused too:
// it names no file.
func checkRel(rel string) error {
	switch {
	case rel == "" || rel == "." || path.IsAbs(rel) || path.Clean(rel) != rel:
		return ErrOutsideRepo
	case rel == ".." || strings.HasPrefix(rel, "../"):
		return ErrOutsideRepo
	}
	for _, e := range strings.Split(rel, "/") {
		if strings.EqualFold(e, ".git") {
			return ErrOutsideRepo
		}
	}
	return nil
}

// realPath resolves symbolic links in p. When p does not exist it resolves
// the nearest existing parent and appends the rest, so that a file about to
// be written can still be placed.
func realPath(p string) (string, error) {
	real, err := filepath.EvalSymlinks(p)
	if err == nil {
		return real, nil
	}
	if !errors.Is(err, os.ErrNotExist) {
		return "", err
	}
	dir, base := filepath.Split(filepath.Clean(p))
	if dir == "" || filepath.Clean(dir) == filepath.Clean(p) {
		return p, nil
	}
	parent, err := realPath(filepath.Clean(dir))
	if err != nil {
		return "", err
	}
	return filepath.Join(parent, base), nil
}

// Head returns the full hash of the commit HEAD points at, or an error
// wrapping ErrNoCommits when there is none yet.
func (r *Repo) Head() (string, error) {
	defer r.lock()()
	h, err := r.headHash()
	if err != nil {
		return "", err
	}
	return h.String(), nil
}

func (r *Repo) headHash() (plumbing.Hash, error) {
	ref, err := r.git.Head()
	if errors.Is(err, plumbing.ErrReferenceNotFound) {
		return plumbing.ZeroHash, fmt.Errorf("head of %s: %w", r.root, ErrNoCommits)
	}
	if err != nil {
		return plumbing.ZeroHash, fmt.Errorf("head of %s: %w", r.root, err)
	}
	return ref.Hash(), nil
}

// BlobHash returns the git blob hash of data, the same hex string that
// git hash-object prints for a file holding data.
func BlobHash(data []byte) string {
	return plumbing.ComputeHash(plumbing.BlobObject, data).String()
}

// MaxWorkFileBytes is the largest work-tree file FileState hashes: the
// largest file a calc reads (a data file) is smaller.
const MaxWorkFileBytes = 64 << 20

// FileState compares the work-tree file rel (slash-separated, relative to the
// root) with its committed version at HEAD. It returns the blob hash of the
// bytes on disk, the blob hash at HEAD ("" when HEAD does not hold the file,
// or there is no commit yet) and whether the two differ.
//
// The bytes are hashed as they are on disk: a checkout that rewrites line
// endings (core.autocrlf, eol attributes) or runs clean filters can report a
// file as dirty although git status does not.
func (r *Repo) FileState(rel string) (blobHash, committedHash string, dirty bool, err error) {
	if err := checkRel(rel); err != nil {
		return "", "", false, fmt.Errorf("file %s and repository %s: %w", rel, r.root, err)
	}
	data, err := safefile.Read(filepath.Join(r.root, filepath.FromSlash(rel)), MaxWorkFileBytes)
	if err != nil {
		return "", "", false, fmt.Errorf("file state of %s: %w", rel, err)
	}
	blobHash = BlobHash(data)
	committed, err := r.committedHash(rel)
	if err != nil {
		return "", "", false, err
	}
	return blobHash, committed, committed != blobHash, nil
}

// committedHash returns the blob hash of rel at HEAD, or "" when HEAD does
// not hold it or does not exist yet.
func (r *Repo) committedHash(rel string) (string, error) {
	defer r.lock()()
	head, err := r.headHash()
	if errors.Is(err, ErrNoCommits) {
		return "", nil
	}
	if err != nil {
		return "", err
	}
	c, err := r.git.CommitObject(head)
	if err != nil {
		return "", fmt.Errorf("commit %s: %w", head, err)
	}
	e, err := newPathLookup(r.git.Storer, rel).entry(c.TreeHash)
	if err != nil || e.mode != filemode.Regular && e.mode != filemode.Executable {
		return "", err
	}
	return e.hash.String(), nil
}

// ReadAt returns the content of rel at a commit. The commit may be any
// revision Resolve accepts. When the file did not exist there the error
// wraps ErrNotAtCommit and names both the file and the commit. Each blob
// is read from the object store once while it stays in the Repo's cache
// (BlobCacheBytes); every call returns its own copy.
func (r *Repo) ReadAt(commit, rel string) ([]byte, error) {
	_, b, err := r.blobAt(commit, rel)
	if err != nil {
		return nil, err
	}
	return bytes.Clone(b), nil
}

// BlobHashAt returns the git blob hash (BlobHash) of rel's content at a
// commit, as ReadAt would read it: the content is hashed, not taken from
// the tree, so objects altered in the store show. Each blob's content is
// hashed once per Repo, so a manifest that lists one large blob under
// many paths is checked at the cost of one. Errors are ReadAt's.
func (r *Repo) BlobHashAt(commit, rel string) (string, error) {
	h, b, err := r.blobAt(commit, rel)
	if err != nil {
		return "", err
	}
	defer r.lock()()
	if sum, ok := r.blobs.hashed[h]; ok {
		return sum, nil
	}
	sum := BlobHash(b)
	r.blobs.hashed[h] = sum
	return sum, nil
}

// blobAt finds rel's blob at a commit and its content, shared with the
// cache: callers copy it before handing it out, and never change it.
func (r *Repo) blobAt(commit, rel string) (plumbing.Hash, []byte, error) {
	c, err := r.commitOf(commit, rel)
	if err != nil {
		return plumbing.ZeroHash, nil, err
	}
	defer r.lock()()
	f, err := fileIn(c, rel)
	if err != nil {
		return plumbing.ZeroHash, nil, err
	}
	if b, ok := r.blobs.get(f.Hash); ok {
		return f.Hash, b, nil
	}
	s, err := f.Contents()
	if err != nil {
		return plumbing.ZeroHash, nil, fmt.Errorf("file %s at commit %s: %w", rel, short(c.Hash), err)
	}
	b := []byte(s)
	r.blobs.put(f.Hash, b)
	return f.Hash, b, nil
}

// SizeAt returns the size of rel's blob at a commit without reading its
// content, so that a reader can refuse a blob over its cap before loading
// it. Errors are ReadAt's.
func (r *Repo) SizeAt(commit, rel string) (int64, error) {
	c, err := r.commitOf(commit, rel)
	if err != nil {
		return 0, err
	}
	defer r.lock()()
	f, err := fileIn(c, rel)
	if err != nil {
		return 0, err
	}
	return f.Size, nil
}

// commitOf checks rel and finds the commit.
func (r *Repo) commitOf(commit, rel string) (*object.Commit, error) {
	if err := checkRel(rel); err != nil {
		return nil, fmt.Errorf("file %s and repository %s: %w", rel, r.root, err)
	}
	return r.commitAt(commit)
}

// fileIn finds rel in commit c's tree; a symbolic link is refused. The
// caller holds the lock.
func fileIn(c *object.Commit, rel string) (*object.File, error) {
	f, err := c.File(rel)
	if errors.Is(err, object.ErrFileNotFound) || errors.Is(err, object.ErrDirectoryNotFound) {
		return nil, fmt.Errorf("file %s at commit %s: %w", rel, short(c.Hash), ErrNotAtCommit)
	}
	if err != nil {
		return nil, fmt.Errorf("file %s at commit %s: %w", rel, short(c.Hash), err)
	}
	if f.Mode == filemode.Symlink {
		return nil, fmt.Errorf("file %s at commit %s: %w", rel, short(c.Hash), ErrSymlink)
	}
	return f, nil
}

// CommitDate returns the committer date of a commit (any revision Resolve
// accepts), in UTC. Packages take their dates from here, never the clock.
func (r *Repo) CommitDate(rev string) (time.Time, error) {
	c, err := r.commitAt(rev)
	if err != nil {
		return time.Time{}, err
	}
	return c.Committer.When.UTC(), nil
}

// commitAt resolves rev and loads its commit object.
func (r *Repo) commitAt(rev string) (*object.Commit, error) {
	h, err := r.Resolve(rev)
	if err != nil {
		return nil, err
	}
	defer r.lock()()
	c, err := r.git.CommitObject(plumbing.NewHash(h))
	if err != nil {
		return nil, fmt.Errorf("commit %s: %w", h, err)
	}
	return c, nil
}

// short abbreviates a hash to 12 hex digits for messages.
func short(h plumbing.Hash) string { return h.String()[:12] }
