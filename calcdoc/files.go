package calcdoc

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strings"

	"github.com/vouchcalc/vouch/internal/excerpt"
	"github.com/vouchcalc/vouch/internal/gitroot"
	"github.com/vouchcalc/vouch/internal/safefile"
)

// locate returns the folder a calc's data-file paths are relative to, the
// root of the work tree that holds path (the nearest folder above it with
// a .git entry), or outside one the calc's own folder, and the calc's
// slash path inside it. It reads no git objects: the root is enough for
// the path rules.
func locate(path string) (root, rel string) {
	abs, err := filepath.Abs(path)
	if err != nil {
		return filepath.Dir(path), filepath.Base(path)
	}
	real := abs
	if r, err := filepath.EvalSymlinks(abs); err == nil {
		real = r
	}
	if dir, ok := gitroot.Find(filepath.Dir(real)); ok {
		if r, err := filepath.Rel(dir, real); err == nil {
			return dir, filepath.ToSlash(r)
		}
	}
	return filepath.Dir(abs), filepath.Base(abs)
}

// newWorkTree is the folder root on disk as an fs.FS for Doc.Files. It
// reads only regular files and refuses a symbolic link anywhere on the
// path below root: git commits a link, not the file it leads to, so a
// data file read through a link could never be verified from the commit.
func newWorkTree(root string) fs.FS { return workTree(root) }

type workTree string

// Stat describes a root-relative slash path without opening it.
func (w workTree) Stat(name string) (fs.FileInfo, error) {
	real, err := w.resolve(name)
	if err != nil {
		return nil, err // it names the path
	}
	return os.Stat(real)
}

// Open opens a root-relative slash path; only a regular file is opened, so
// a named pipe cannot hang the read.
func (w workTree) Open(name string) (fs.File, error) {
	st, err := w.Stat(name)
	if err != nil {
		return nil, err
	}
	if !st.Mode().IsRegular() {
		return nil, &fs.PathError{Op: "open", Path: name, Err: safefile.ErrNotRegular}
	}
	return os.Open(filepath.Join(string(w), filepath.FromSlash(name)))
}

// errSymlink is the error of a data path through a symbolic link.
var errSymlink = errors.New("is a symbolic link; git records the link, not the file it leads to, so the package could never be verified: commit the file itself")

// resolve checks a root-relative slash path element by element: each must
// exist and none may be a symbolic link. It returns the path on disk.
func (w workTree) resolve(name string) (string, error) {
	if !fs.ValidPath(name) {
		return "", fmt.Errorf("%s is not a path inside the repository", excerpt.Cut(name))
	}
	at := string(w)
	for _, e := range strings.Split(name, "/") {
		at = filepath.Join(at, e)
		st, err := os.Lstat(at)
		if errors.Is(err, os.ErrNotExist) {
			return "", notExist(excerpt.Cut(name))
		}
		if err != nil {
			return "", err
		}
		if st.Mode()&fs.ModeSymlink != 0 {
			return "", fmt.Errorf("%s %w", excerpt.Cut(name), errSymlink)
		}
	}
	return at, nil
}

// notExist is the error for a path the work tree does not hold: its
// message names the path, and errors.Is finds fs.ErrNotExist in it.
type notExist string

func (e notExist) Error() string { return string(e) + " does not exist" }
func (e notExist) Unwrap() error { return fs.ErrNotExist }
