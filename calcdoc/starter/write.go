package starter

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
)

// ErrExists is returned by Write when the destination is already there.
var ErrExists = errors.New("file exists")

// CheckName reports whether dest is a calc file's name, NAME.calc.md.
func CheckName(dest string) error {
	base := filepath.Base(dest)
	if !strings.HasSuffix(base, Ext) || base == Ext {
		return fmt.Errorf("%s: a calc file's name must end in %s, such as HB-001%s", dest, Ext, Ext)
	}
	return nil
}

// Write creates dest with data, making its folder if needed. It never
// replaces a file: when dest exists it returns an error wrapping ErrExists.
// The file appears whole or not at all: data goes to a temporary file that
// is then linked to dest, which fails if dest exists.
func Write(dest string, data []byte) error {
	if _, err := os.Lstat(dest); err == nil {
		return fmt.Errorf("%s already exists; vouch new never replaces a file: %w", dest, ErrExists)
	}
	dir := filepath.Dir(dest)
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	tmp, err := os.CreateTemp(dir, ".vouch-new-*.tmp")
	if err != nil {
		return err
	}
	defer os.Remove(tmp.Name())
	if _, err := tmp.Write(data); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Chmod(0o644); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Close(); err != nil {
		return err
	}
	err = os.Link(tmp.Name(), dest)
	if errors.Is(err, fs.ErrExist) {
		return fmt.Errorf("%s already exists; vouch new never replaces a file: %w", dest, ErrExists)
	}
	return err
}
