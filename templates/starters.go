package templates

import (
	"embed"
	"io/fs"
)

//go:embed new/*.calc.md
var starterFiles embed.FS

// Starters returns the built-in `vouch new` templates: one working calc
// file per template, NAME.calc.md, at the root of the returned file system.
func Starters() fs.FS {
	sub, err := fs.Sub(starterFiles, "new")
	if err != nil {
		return starterFiles // unreachable: "new" is a valid path
	}
	return sub
}
