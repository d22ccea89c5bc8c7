package provenance

import (
	"container/heap"
	"errors"
	"fmt"
	"strings"
	"time"

	"github.com/go-git/go-git/v5/plumbing"
	"github.com/go-git/go-git/v5/plumbing/filemode"
	"github.com/go-git/go-git/v5/plumbing/object"
	"github.com/go-git/go-git/v5/plumbing/storer"
)

// Revision is one commit in a file's history.
type Revision struct {
	Commit  string // full commit hash
	Date    string // author date, RFC 3339 in UTC
	Author  string // author name
	Email   string // author email
	Subject string // first paragraph of the message, joined into one line
}

// History returns the commits reachable from HEAD that changed the file rel,
// newest first: the same list, in the same order, as
// git log --format=%H -- rel. Renames are not followed.
//
// It follows git's default history simplification. A commit with one parent
// is listed when the file's blob differs from the parent's (a root commit
// when it holds the file). A merge that is TREESAME to a parent (holds the
// same blob for the file, or lacks it as the parent does) is not listed, and
// only the first such parent is followed; a merge that differs from every
// parent is listed and all its parents are followed. Commits are visited
// newest committer date first. In a shallow clone the boundary commits count
// as roots.
//
// Rather than go-git's path-filtered Log, which diffs whole trees, it looks
// up the file's tree entry in each commit and caches subtrees by hash.
func (r *Repo) History(rel string) ([]Revision, error) {
	head, err := r.Head()
	if errors.Is(err, ErrNoCommits) {
		return nil, nil
	}
	if err != nil {
		return nil, err
	}
	return r.HistoryAt(head, rel)
}

// HistoryAt is History starting from another revision than HEAD, such as
// the commit a manifest records.
func (r *Repo) HistoryAt(rev, rel string) ([]Revision, error) {
	if err := checkRel(rel); err != nil {
		return nil, fmt.Errorf("file %s and repository %s: %w", rel, r.root, err)
	}
	start, err := r.Resolve(rev)
	if err != nil {
		return nil, err
	}
	defer r.lock()()
	w, err := newHistoryWalk(r, rel)
	if err != nil {
		return nil, err
	}
	return w.run(plumbing.NewHash(start))
}

// historyWalk holds the state of one History call.
type historyWalk struct {
	s       storer.EncodedObjectStorer
	look    *pathLookup
	shallow map[plumbing.Hash]bool
	entries map[plumbing.Hash]entryID // commit -> the file's entry
	seen    map[plumbing.Hash]bool
	queue   commitQueue
}

func newHistoryWalk(r *Repo, rel string) (*historyWalk, error) {
	shallow, err := r.git.Storer.Shallow()
	if err != nil {
		return nil, fmt.Errorf("shallow commits of %s: %w", r.root, err)
	}
	w := &historyWalk{
		s:       r.git.Storer,
		look:    newPathLookup(r.git.Storer, rel),
		shallow: map[plumbing.Hash]bool{},
		entries: map[plumbing.Hash]entryID{},
		seen:    map[plumbing.Hash]bool{},
	}
	for _, h := range shallow {
		w.shallow[h] = true
	}
	return w, nil
}

// run walks from start and returns the listed commits in visiting order.
func (w *historyWalk) run(start plumbing.Hash) ([]Revision, error) {
	if err := w.push(start); err != nil {
		return nil, err
	}
	var revs []Revision
	for w.queue.Len() > 0 {
		c := heap.Pop(&w.queue).(*queued).c
		listed, follow, err := w.step(c)
		if err != nil {
			return nil, err
		}
		if listed {
			revs = append(revs, revisionOf(c))
		}
		for _, p := range follow {
			if err := w.push(p); err != nil {
				return nil, err
			}
		}
	}
	return revs, nil
}

// step applies the simplification rule to one commit: whether it is listed
// and which parents to follow.
func (w *historyWalk) step(c *object.Commit) (listed bool, follow []plumbing.Hash, err error) {
	mine, err := w.entryOf(c)
	if err != nil {
		return false, nil, err
	}
	parents := c.ParentHashes
	if w.shallow[c.Hash] {
		parents = nil
	}
	if len(parents) == 0 {
		return mine != entryID{}, nil, nil
	}
	var differs []plumbing.Hash
	for _, p := range parents {
		theirs, err := w.entryOfHash(p)
		if err != nil {
			return false, nil, err
		}
		if theirs == mine {
			return false, []plumbing.Hash{p}, nil
		}
		differs = append(differs, p)
	}
	return true, differs, nil
}

func (w *historyWalk) push(h plumbing.Hash) error {
	if w.seen[h] {
		return nil
	}
	w.seen[h] = true
	c, err := object.GetCommit(w.s, h)
	if err != nil {
		return fmt.Errorf("commit %s: %w", h, err)
	}
	heap.Push(&w.queue, &queued{c: c, seq: len(w.seen)})
	return nil
}

func (w *historyWalk) entryOfHash(h plumbing.Hash) (entryID, error) {
	if e, ok := w.entries[h]; ok {
		return e, nil
	}
	c, err := object.GetCommit(w.s, h)
	if err != nil {
		return entryID{}, fmt.Errorf("commit %s: %w", h, err)
	}
	return w.entryOf(c)
}

func (w *historyWalk) entryOf(c *object.Commit) (entryID, error) {
	if e, ok := w.entries[c.Hash]; ok {
		return e, nil
	}
	e, err := w.look.entry(c.TreeHash)
	if err != nil {
		return entryID{}, err
	}
	w.entries[c.Hash] = e
	return e, nil
}

// revisionOf describes a listed commit.
func revisionOf(c *object.Commit) Revision {
	return Revision{
		Commit:  c.Hash.String(),
		Date:    c.Author.When.UTC().Format(time.RFC3339),
		Author:  c.Author.Name,
		Email:   c.Author.Email,
		Subject: subject(c.Message),
	}
}

// subject is git's %s: the message's first paragraph with its lines joined
// by single spaces.
func subject(msg string) string {
	msg = strings.TrimLeft(msg, "\n")
	para, _, _ := strings.Cut(msg, "\n\n")
	lines := strings.Split(strings.TrimRight(para, "\n"), "\n")
	for i, l := range lines {
		lines[i] = strings.TrimSpace(l)
	}
	return strings.Join(lines, " ")
}

// queued is a commit waiting in the walk; seq breaks date ties first in,
// first out, as git's own queue does.
type queued struct {
	c   *object.Commit
	seq int
}

// commitQueue is a heap of commits, newest committer date first.
type commitQueue []*queued

func (q commitQueue) Len() int { return len(q) }
func (q commitQueue) Less(i, j int) bool {
	ti, tj := q[i].c.Committer.When, q[j].c.Committer.When
	if !ti.Equal(tj) {
		return ti.After(tj)
	}
	return q[i].seq < q[j].seq
}
func (q commitQueue) Swap(i, j int) { q[i], q[j] = q[j], q[i] }
func (q *commitQueue) Push(x any)   { *q = append(*q, x.(*queued)) }
func (q *commitQueue) Pop() any {
	old := *q
	x := old[len(old)-1]
	*q = old[:len(old)-1]
	return x
}

// entryID identifies a tree entry's content: git counts a change of mode
// (such as the executable bit) as a change. The zero value means absent.
type entryID struct {
	hash plumbing.Hash
	mode filemode.FileMode
}

// pathLookup finds one path's tree entry in many trees. Each directory level
// caches results by tree hash, so a subtree shared between commits is read
// once.
type pathLookup struct {
	s     storer.EncodedObjectStorer
	parts []string
	cache []map[plumbing.Hash]entryID
}

func newPathLookup(s storer.EncodedObjectStorer, rel string) *pathLookup {
	parts := strings.Split(rel, "/")
	cache := make([]map[plumbing.Hash]entryID, len(parts))
	for i := range cache {
		cache[i] = map[plumbing.Hash]entryID{}
	}
	return &pathLookup{s: s, parts: parts, cache: cache}
}

// entry returns the path's entry under the root tree, or the zero entryID
// when the tree lacks it.
func (l *pathLookup) entry(root plumbing.Hash) (entryID, error) {
	return l.entryAt(root, 0)
}

func (l *pathLookup) entryAt(tree plumbing.Hash, level int) (entryID, error) {
	if h, ok := l.cache[level][tree]; ok {
		return h, nil
	}
	t, err := object.GetTree(l.s, tree)
	if err != nil {
		return entryID{}, fmt.Errorf("tree %s: %w", tree, err)
	}
	var h entryID
	if e := findEntry(t, l.parts[level]); e != nil {
		switch {
		case level == len(l.parts)-1:
			h = entryID{e.Hash, e.Mode}
		case e.Mode == filemode.Dir:
			h, err = l.entryAt(e.Hash, level+1)
		}
	}
	if err != nil {
		return entryID{}, err
	}
	l.cache[level][tree] = h
	return h, nil
}

// findEntry scans a tree's entries for a name. Tree.FindEntry would build a
// map of the whole tree for a single look-up.
func findEntry(t *object.Tree, name string) *object.TreeEntry {
	for i := range t.Entries {
		if t.Entries[i].Name == name {
			return &t.Entries[i]
		}
	}
	return nil
}
