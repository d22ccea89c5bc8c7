package provenance

import (
	"bytes"
	"io/fs"
	"path"
	"time"
)

// CommitFS returns the tree of a commit as an fs.FS, so that a calc
// evaluated for verify or diff reads its data files and images as the
// commit holds them. ReadFile reads a blob as ReadAt does, with the same
// errors; Open gives the same bytes as a file. Like the Repo, it is for
// one goroutine at a time.
func (r *Repo) CommitFS(commit string) fs.FS { return commitFS{r: r, commit: commit} }

type commitFS struct {
	r      *Repo
	commit string
}

// ReadFile reads the blob at name (a slash path from the root).
func (c commitFS) ReadFile(name string) ([]byte, error) { return c.r.ReadAt(c.commit, name) }

// Stat describes the blob at name from its size in the object store,
// without reading its content.
func (c commitFS) Stat(name string) (fs.FileInfo, error) {
	n, err := c.r.SizeAt(c.commit, name)
	if err != nil {
		return nil, &fs.PathError{Op: "stat", Path: name, Err: err}
	}
	return blobInfo{name: path.Base(name), size: n}, nil
}

// Open opens the blob at name; directories are not listed.
func (c commitFS) Open(name string) (fs.File, error) {
	b, err := c.ReadFile(name)
	if err != nil {
		return nil, &fs.PathError{Op: "open", Path: name, Err: err}
	}
	return &blobFile{Reader: bytes.NewReader(b), info: blobInfo{name: path.Base(name), size: int64(len(b))}}, nil
}

// blobFile is an opened blob.
type blobFile struct {
	*bytes.Reader
	info blobInfo
}

func (f *blobFile) Stat() (fs.FileInfo, error) { return f.info, nil }
func (f *blobFile) Close() error               { return nil }

// blobInfo describes a blob: a regular, read-only file with no time.
type blobInfo struct {
	name string
	size int64
}

func (i blobInfo) Name() string       { return i.name }
func (i blobInfo) Size() int64        { return i.size }
func (i blobInfo) Mode() fs.FileMode  { return 0o444 }
func (i blobInfo) ModTime() time.Time { return time.Time{} }
func (i blobInfo) IsDir() bool        { return false }
func (i blobInfo) Sys() any           { return nil }
