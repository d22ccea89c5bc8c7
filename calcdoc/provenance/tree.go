package provenance

import (
	"errors"
	"fmt"
	"io"
	"sort"
	"strings"

	"github.com/go-git/go-git/v5/plumbing/filemode"
	"github.com/go-git/go-git/v5/plumbing/object"
)

// FilesAt lists the regular files at a commit (any revision Resolve
// accepts) whose names end with suffix, as sorted slash paths relative to
// the root. A diff uses it to find the earlier name of a renamed calc.
func (r *Repo) FilesAt(rev, suffix string) ([]string, error) {
	c, err := r.commitAt(rev)
	if err != nil {
		return nil, err
	}
	defer r.lock()()
	tree, err := c.Tree()
	if err != nil {
		return nil, fmt.Errorf("tree of commit %s: %w", short(c.Hash), err)
	}
	walker := object.NewTreeWalker(tree, true, nil)
	defer walker.Close()
	var out []string
	for {
		name, e, err := walker.Next()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return nil, fmt.Errorf("files of commit %s: %w", short(c.Hash), err)
		}
		if (e.Mode == filemode.Regular || e.Mode == filemode.Executable) && strings.HasSuffix(name, suffix) {
			out = append(out, name)
		}
	}
	sort.Strings(out)
	return out, nil
}
