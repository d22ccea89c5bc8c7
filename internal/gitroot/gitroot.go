// Package gitroot finds the work tree that holds a path: the nearest folder
// with a .git entry. It reads no git objects and imports nothing of vouch.
package gitroot

import (
	"os"
	"path/filepath"
)

// Find is the nearest folder at or above dir that holds .git (a folder, or a
// file in a linked work tree), and false when there is none. dir need not
// exist.
func Find(dir string) (string, bool) {
	dir, err := filepath.Abs(dir)
	if err != nil {
		return "", false
	}
	for {
		if _, err := os.Lstat(filepath.Join(dir, ".git")); err == nil {
			return dir, true
		}
		up := filepath.Dir(dir)
		if up == dir {
			return "", false
		}
		dir = up
	}
}
