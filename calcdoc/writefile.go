package calcdoc

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
)

// writeHook, when set (by tests), is called before each step of a write
// and fails the write at that step when it returns an error: fault
// injection for a full disk or a kill between two steps.
var writeHook func(step string) error

func step(name string) error {
	if writeHook != nil {
		return writeHook(name)
	}
	return nil
}

// WriteFileAtomic writes data to a temporary file in dest's folder and
// renames it into place, so a reader never sees a partial file and a failed
// write leaves the last good one untouched.
func WriteFileAtomic(dest string, data []byte) error {
	if err := refuseFolder(dest); err != nil {
		return err
	}
	tmp, err := writeTemp(dest, data)
	if err != nil {
		return err
	}
	if err := os.Rename(tmp, dest); err != nil {
		os.Remove(tmp)
		return err
	}
	return nil
}

// WritePairAtomic writes a file and a sidecar derived from it (a package
// and its manifest file). The file is the source of truth: the sidecar
// only repeats what the file holds, and a missing sidecar can be written
// again from the file. Both are written in full to temporary files first;
// then, holding a lock on the folder, the old sidecar is removed, the file
// renamed into place and the sidecar after it. So at every instant the
// folder holds a consistent pair, or a file without its sidecar, never a
// file beside a sidecar of another version; a failure at any step removes
// the temporary files. Two writers into one folder take turns: the second
// waits for the first to finish its renames, and the last pair written
// stands whole.
func WritePairAtomic(dest string, data []byte, side string, sideData []byte) (err error) {
	for _, p := range []string{dest, side} {
		if err := refuseFolder(p); err != nil {
			return err
		}
	}
	tmp, err := writeTemp(dest, data)
	if err != nil {
		return err
	}
	defer removeOnError(&err, tmp)
	sideTmp, err := writeTemp(side, sideData)
	if err != nil {
		return err
	}
	defer removeOnError(&err, sideTmp)
	unlock, err := lockFolder(filepath.Dir(dest))
	if err != nil {
		return fmt.Errorf("cannot lock %s: %w", filepath.Dir(dest), err)
	}
	defer unlock()
	if err := step("remove old sidecar"); err != nil {
		return err
	}
	if err := os.Remove(side); err != nil && !errors.Is(err, os.ErrNotExist) {
		return err
	}
	if err := step("rename file"); err != nil {
		return err
	}
	if err := os.Rename(tmp, dest); err != nil {
		return err
	}
	if err := step("rename sidecar"); err != nil {
		return err
	}
	if err := os.Rename(sideTmp, side); err != nil {
		return fmt.Errorf("%s is written; its sidecar %s is not (%w): write it again", filepath.Base(dest), filepath.Base(side), err)
	}
	return nil
}

// removeOnError removes a temporary file when the write failed; after a
// rename there is nothing left to remove.
func removeOnError(err *error, tmp string) {
	if *err != nil {
		os.Remove(tmp)
	}
}

// refuseFolder refuses a destination that is a folder (or anything else
// but a regular file), before anything is written.
func refuseFolder(dest string) error {
	fi, err := os.Lstat(dest)
	switch {
	case errors.Is(err, os.ErrNotExist):
		return nil
	case err != nil:
		return err
	case !fi.Mode().IsRegular():
		return fmt.Errorf("%s exists and is not a regular file (%s); nothing was written", dest, fileKind(fi.Mode()))
	}
	return nil
}

func fileKind(m os.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&os.ModeSymlink != 0:
		return "a symbolic link"
	}
	return "a special file"
}

// writeTemp writes data in full, synced to disk, to a new temporary file
// in dest's folder and returns its name; on any failure it removes it.
func writeTemp(dest string, data []byte) (name string, err error) {
	if err := os.MkdirAll(filepath.Dir(dest), 0o755); err != nil {
		return "", err
	}
	if err := step("create " + filepath.Base(dest)); err != nil {
		return "", err
	}
	tmp, err := os.CreateTemp(filepath.Dir(dest), ".vouch-*.tmp")
	if err != nil {
		return "", err
	}
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	if err := step("write " + filepath.Base(dest)); err != nil {
		return "", err
	}
	if _, err := tmp.Write(data); err != nil {
		return "", err
	}
	if err := tmp.Chmod(0o644); err != nil {
		return "", err
	}
	if err := step("sync " + filepath.Base(dest)); err != nil {
		return "", err
	}
	if err := tmp.Sync(); err != nil {
		return "", err
	}
	return tmp.Name(), tmp.Close()
}
