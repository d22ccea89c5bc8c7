// Package safefile reads files the user names without trusting them: only
// regular files are read (never a device, a FIFO or a folder, so /dev/zero
// cannot exhaust memory and a FIFO cannot hang a command), and never more
// than a stated number of bytes. Every command of vouch reads the files it
// is given through Read, and the calc's data files and images come through
// ReadFS.
package safefile

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
)

// ErrNotRegular is returned for a path that is not a regular file.
var ErrNotRegular = errors.New("not a regular file")

// ErrTooLarge is returned for a file larger than the limit.
var ErrTooLarge = errors.New("file too large")

// Read reads the regular file at path, at most limit bytes. The mode is
// checked before the file is opened and again on the opened file, and the
// bytes are read through an io.LimitReader, so a file that grows while it
// is read is still refused.
func Read(path string, limit int64) ([]byte, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if err := check(path, st, limit); err != nil {
		return nil, err
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return readOpened(path, f, limit)
}

// ReadFS reads the regular file name of fsys, at most limit bytes, with the
// same checks as Read.
func ReadFS(fsys fs.FS, name string, limit int64) ([]byte, error) {
	st, err := fs.Stat(fsys, name)
	if err != nil {
		return nil, err
	}
	if err := check(name, st, limit); err != nil {
		return nil, err
	}
	f, err := fsys.Open(name)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return readOpened(name, f, limit)
}

// readOpened checks the opened file's mode again and reads it through a
// limit.
func readOpened(name string, f fs.File, limit int64) ([]byte, error) {
	st, err := f.Stat()
	if err != nil {
		return nil, err
	}
	if err := check(name, st, limit); err != nil {
		return nil, err
	}
	b, err := io.ReadAll(io.LimitReader(f, limit+1))
	if err != nil {
		return nil, err
	}
	if int64(len(b)) > limit {
		return nil, tooLarge(name, -1, limit)
	}
	return b, nil
}

// check refuses what is not a regular file, or is larger than limit.
func check(name string, st fs.FileInfo, limit int64) error {
	if !st.Mode().IsRegular() {
		return &fs.PathError{Op: "read", Path: name, Err: fmt.Errorf("%w (%s); give the path of a file", ErrNotRegular, kind(st.Mode()))}
	}
	if st.Size() > limit {
		return tooLarge(name, st.Size(), limit)
	}
	return nil
}

func tooLarge(name string, size, limit int64) error {
	if size < 0 {
		return &fs.PathError{Op: "read", Path: name, Err: fmt.Errorf("%w: more than %d bytes; the limit is %d bytes", ErrTooLarge, limit, limit)}
	}
	return &fs.PathError{Op: "read", Path: name, Err: fmt.Errorf("%w: %d bytes; the limit is %d bytes", ErrTooLarge, size, limit)}
}

// kind names a file mode that is not a regular file.
func kind(m fs.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeDevice != 0:
		return "a device"
	case m&fs.ModeSymlink != 0:
		return "a symbolic link"
	}
	return "not a plain file"
}
