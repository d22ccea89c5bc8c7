package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/calcdoc/starter"
)

// repoSettings reads vouch.yaml of the repository that holds path (a file
// or a folder; the folder itself outside a repository). It returns the
// settings, the root they were read from, and exitOK; a settings file with
// errors prints them at their lines and returns exitErrors.
func repoSettings(path string, stderr io.Writer) (*settings.Settings, string, int) {
	dir := path
	if st, err := os.Stat(path); err != nil || !st.IsDir() {
		dir = filepath.Dir(path)
	}
	root, ok := starter.RepoRoot(dir)
	if !ok {
		root = dir
	}
	s, src, err := settings.Load(os.DirFS(root), root)
	var list settings.ErrorList
	if errors.As(err, &list) {
		fmt.Fprint(stderr, list.Format(src))
		return nil, root, exitErrors
	}
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return nil, root, exitErrors
	}
	return s, root, exitOK
}
