package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/internal/gitroot"
)

// repoSettings reads vouch.yaml of the repository that holds path (a file
// or a folder; the folder itself outside a repository). It returns the
// settings, the root they were read from, and exitOK; a settings file with
// errors prints them at their lines and returns exitErrors.
func repoSettings(path string, stderr io.Writer) (*settings.Settings, string, int) {
	root := settingsRoot(path)
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

// settingsRoot is the folder whose vouch.yaml applies to path: the root of
// the repository that holds it, or outside one its folder.
func settingsRoot(path string) string {
	dir := path
	if st, err := os.Stat(path); err != nil || !st.IsDir() {
		dir = filepath.Dir(path)
	}
	if root, ok := gitroot.Find(dir); ok {
		return root
	}
	return dir
}

// readOptions reads the settings a calc at path is read with. A settings
// file with errors prints them at their lines and gives an error.
func readOptions(path string, stderr io.Writer) (calcdoc.ReadOptions, error) {
	root := settingsRoot(path)
	opt, src, err := calcdoc.SettingsIn(os.DirFS(root), root)
	var list settings.ErrorList
	if errors.As(err, &list) {
		fmt.Fprint(stderr, list.Format(src))
		return opt, fmt.Errorf("%s has errors; nothing written", filepath.Join(root, settings.FileName))
	}
	return opt, err
}
