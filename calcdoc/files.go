package calcdoc

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
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
	for dir := filepath.Dir(real); ; dir = filepath.Dir(dir) {
		if _, err := os.Lstat(filepath.Join(dir, ".git")); err == nil {
			r, err := filepath.Rel(dir, real)
			if err == nil {
				return dir, filepath.ToSlash(r)
			}
			break
		}
		if filepath.Dir(dir) == dir {
			break
		}
	}
	return filepath.Dir(abs), filepath.Base(abs)
}

// newWorkTree is the folder root on disk as an fs.FS for Doc.Files: it reads
// files and refuses a symbolic link that leads outside root.
func newWorkTree(root string) fs.FS { return workTree(root) }

type workTree string

// ReadFile reads a root-relative slash path.
func (w workTree) ReadFile(name string) ([]byte, error) {
	real, err := w.resolve(name)
	if err != nil {
		return nil, err
	}
	return os.ReadFile(real)
}

// Open opens a root-relative slash path.
func (w workTree) Open(name string) (fs.File, error) {
	real, err := w.resolve(name)
	if err != nil {
		return nil, &fs.PathError{Op: "open", Path: name, Err: err}
	}
	return os.Open(real)
}

// resolve follows symbolic links and refuses a path that leaves the root.
func (w workTree) resolve(name string) (string, error) {
	root := string(w)
	real, err := filepath.EvalSymlinks(filepath.Join(root, filepath.FromSlash(name)))
	if err != nil {
		if errors.Is(err, os.ErrNotExist) {
			return "", fmt.Errorf("%s does not exist", name)
		}
		return "", err
	}
	realRoot, _ := filepath.EvalSymlinks(root)
	if r, err := filepath.Rel(realRoot, real); err != nil || strings.HasPrefix(r, "..") {
		return "", fmt.Errorf("%s leads outside the repository", name)
	}
	return real, nil
}
