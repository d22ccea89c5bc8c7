package provenance

import (
	"fmt"
	"sort"
	"strings"

	"github.com/go-git/go-git/v5/plumbing"

	"github.com/vouchcalc/vouch/internal/editdist"
)

// maxSuggestions caps the tag and branch names an unknown-revision error
// lists.
const maxSuggestions = 5

// Resolve returns the full commit hash that rev names: a full or abbreviated
// hash, a tag (lightweight or annotated, peeled to its commit), a branch,
// HEAD, or any of these followed by ~N or ^N. An unknown name gives an error
// wrapping ErrUnknownRevision that lists the nearest tag and branch names.
func (r *Repo) Resolve(rev string) (string, error) {
	defer r.lock()()
	if strings.TrimSpace(rev) == "" {
		return "", fmt.Errorf("empty revision in %s: %w", r.root, ErrUnknownRevision)
	}
	h, err := r.git.ResolveRevision(plumbing.Revision(rev))
	if err == nil && !h.IsZero() {
		return h.String(), nil
	}
	return "", r.unknown(rev)
}

// unknown builds the error for a revision that did not resolve.
func (r *Repo) unknown(rev string) error {
	if base := baseName(rev); base != rev {
		if h, err := r.git.ResolveRevision(plumbing.Revision(base)); err == nil && !h.IsZero() {
			return fmt.Errorf("%w %q: %s resolves, but not the ancestor asked for", ErrUnknownRevision, rev, base)
		}
	}
	names := r.refNames()
	if len(names) == 0 {
		return fmt.Errorf("%w %q: the repository has no tags or branches", ErrUnknownRevision, rev)
	}
	near := nearest(baseName(rev), names, maxSuggestions)
	return fmt.Errorf("%w %q: nearest names are %s", ErrUnknownRevision, rev, strings.Join(near, ", "))
}

// baseName strips ~N and ^N suffixes, which name ancestors of a base name.
func baseName(rev string) string {
	if i := strings.IndexAny(rev, "~^"); i > 0 {
		return rev[:i]
	}
	return rev
}

// refNames lists the short names of all tags and branches, sorted.
func (r *Repo) refNames() []string {
	refs, err := r.git.References()
	if err != nil {
		return nil
	}
	var names []string
	_ = refs.ForEach(func(ref *plumbing.Reference) error {
		if n := ref.Name(); n.IsTag() || n.IsBranch() {
			names = append(names, n.Short())
		}
		return nil
	})
	sort.Strings(names)
	return names
}

// nearest returns up to n of names, closest to target by edit distance
// first, ties by name.
func nearest(target string, names []string, n int) []string {
	type scored struct {
		name string
		d    int
	}
	s := make([]scored, len(names))
	for i, name := range names {
		s[i] = scored{name, editdist.Bytes(target, name)}
	}
	sort.SliceStable(s, func(i, j int) bool { return s[i].d < s[j].d })
	out := make([]string, 0, n)
	for i := 0; i < len(s) && i < n; i++ {
		out = append(out, s[i].name)
	}
	return out
}
