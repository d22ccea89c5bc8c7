package calcdoc

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"vouch/calcdoc/provenance"
)

// DataFile is a data file a calc read, with its git blob hash.
type DataFile struct {
	Path string // relative to the repository (or to the calc's folder outside one)
	Hash string // git blob hash of the bytes read
}

// dataReader returns the reader csv() uses: paths are relative to the calc
// file, must stay inside its repository (or, outside one, inside its
// folder), and every file read is recorded with its hash.
func (d *Doc) dataReader() func(string) ([]byte, error) {
	return func(name string) ([]byte, error) {
		if d.ReadData != nil {
			return d.recordData(name, d.ReadData)
		}
		return d.recordData(name, d.readDataFromDisk)
	}
}

// recordData reads through read and records the file's path and hash.
func (d *Doc) recordData(name string, read func(rel string) ([]byte, error)) ([]byte, error) {
	rel, err := d.dataPath(name)
	if err != nil {
		return nil, err
	}
	raw, err := read(rel)
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

// dataPath resolves a data-file name to a slash path relative to the root
// (the repository, or the calc's folder outside one) and refuses paths that
// leave it.
func (d *Doc) dataPath(name string) (string, error) {
	if filepath.IsAbs(name) {
		return "", fmt.Errorf("%s: give a path relative to the calc file, inside its repository", name)
	}
	root, calcRel := d.dataRoot()
	rel := filepath.Clean(filepath.Join(filepath.Dir(calcRel), filepath.FromSlash(name)))
	if rel == ".." || strings.HasPrefix(rel, ".."+string(filepath.Separator)) {
		return "", fmt.Errorf("%s leaves the repository %s; a calc reads only files inside its repository", name, root)
	}
	return filepath.ToSlash(rel), nil
}

// dataRoot returns the root data paths are relative to and the calc file's
// path relative to it.
func (d *Doc) dataRoot() (root, calcRel string) {
	abs, err := filepath.Abs(d.Path)
	if err != nil {
		return filepath.Dir(d.Path), filepath.Base(d.Path)
	}
	if repo, err := provenance.Open(abs); err == nil {
		if rel, err := repo.Rel(abs); err == nil {
			return repo.Root(), filepath.FromSlash(rel)
		}
	}
	return filepath.Dir(abs), filepath.Base(abs)
}

// readDataFromDisk reads a root-relative data file from the working tree,
// refusing symbolic links that leave the root.
func (d *Doc) readDataFromDisk(rel string) ([]byte, error) {
	root, _ := d.dataRoot()
	full := filepath.Join(root, filepath.FromSlash(rel))
	real, err := filepath.EvalSymlinks(full)
	if err != nil {
		if errors.Is(err, os.ErrNotExist) {
			return nil, fmt.Errorf("%s does not exist", rel)
		}
		return nil, err
	}
	realRoot, _ := filepath.EvalSymlinks(root)
	if r, err := filepath.Rel(realRoot, real); err != nil || strings.HasPrefix(r, "..") {
		return nil, fmt.Errorf("%s leads outside the repository", rel)
	}
	return os.ReadFile(real)
}
