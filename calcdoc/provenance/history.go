package provenance

import (
	"bytes"
	"container/heap"
	"encoding/binary"
	"errors"
	"fmt"
	"io"
	"path"
	"strings"
	"time"

	"github.com/go-git/go-git/v5/plumbing"
	"github.com/go-git/go-git/v5/plumbing/filemode"
	commitgraph "github.com/go-git/go-git/v5/plumbing/format/commitgraph/v2"
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
	defer w.close()
	revs, err := w.run(plumbing.NewHash(start))
	r.graphReads += w.graphReads
	return revs, err
}

// historyWalk holds the state of one History call.
type historyWalk struct {
	s          storer.EncodedObjectStorer
	graph      commitgraph.Index // the repository's commit-graph file, or nil
	graphReads int               // commits read from the graph, for tests
	look       *pathLookup
	shallow    map[plumbing.Hash]bool
	entries    map[plumbing.Hash]entryID // commit -> the file's entry
	seen       map[plumbing.Hash]bool
	queue      commitQueue
}

// commitNode is what the walk needs of a commit: read from the
// commit-graph file when the repository has one that lists the commit
// (no object to inflate), else from the commit object.
type commitNode struct {
	hash, tree plumbing.Hash
	parents    []plumbing.Hash
	when       time.Time // committer date
}

// openCommitGraph opens the repository's single commit-graph file
// (objects/info/commit-graph, written by git gc), or returns nil. Split
// commit-graph chains are not read.
func openCommitGraph(r *Repo) commitgraph.Index {
	if r.store == nil {
		return nil
	}
	f, err := r.store.Filesystem().Open(path.Join("objects", "info", "commit-graph"))
	if err != nil {
		return nil
	}
	data, err := io.ReadAll(io.LimitReader(f, maxCommitGraph+1))
	_ = f.Close()
	if err != nil || len(data) > maxCommitGraph {
		return nil
	}
	if !graphFileSane(data) {
		return nil
	}
	idx, err := openGraphFile(memFile{bytes.NewReader(data)})
	if err != nil {
		return nil
	}
	return idx
}

// graphFileSane checks a commit-graph file's layout (git's
// Documentation/gitformat-commit-graph.txt) before go-git reads it, as
// go-git trusts the offsets and counts it finds there: signature CGPH,
// version 1, SHA-1; a chunk table whose offsets rise within the file and
// ends with a zero id; a fanout table that never decreases; and OID
// lookup and commit data chunks of exactly the sizes the fanout's count
// of N commits implies (20 and 36 bytes a commit).
func graphFileSane(data []byte) bool {
	const header, entry = 8, 12
	if len(data) < header || string(data[:4]) != "CGPH" || data[4] != 1 || data[5] != 1 {
		return false
	}
	chunks := int(data[6])
	if len(data) < header+(chunks+1)*entry {
		return false
	}
	start := map[string]uint64{}
	size := map[string]uint64{}
	for i := 0; i <= chunks; i++ {
		e := data[header+i*entry:]
		id, off := string(e[:4]), binary.BigEndian.Uint64(e[4:12])
		if off > uint64(len(data)) || off < uint64(header+(chunks+1)*entry) {
			return false
		}
		if i == chunks {
			if id != "\x00\x00\x00\x00" {
				return false
			}
			break
		}
		next := binary.BigEndian.Uint64(data[header+(i+1)*entry+4:])
		if next < off || id == "\x00\x00\x00\x00" || start[id] != 0 {
			return false
		}
		start[id], size[id] = off, next-off
	}
	if size["OIDF"] != 1024 || start["OIDL"] == 0 || start["CDAT"] == 0 {
		return false
	}
	fanout := data[start["OIDF"]:]
	prev := uint32(0)
	for i := 0; i < 256; i++ {
		v := binary.BigEndian.Uint32(fanout[4*i:])
		if v < prev {
			return false
		}
		prev = v
	}
	n := uint64(prev)
	return size["OIDL"] == 20*n && size["CDAT"] == 36*n
}

// maxCommitGraph bounds the commit-graph file read into memory (about a
// million commits); a larger one is not used.
const maxCommitGraph = 64 << 20

// memFile is a commit-graph file read into memory: go-git's look-ups then
// cost no system calls.
type memFile struct{ *bytes.Reader }

// Close does nothing.
func (memFile) Close() error { return nil }

// openGraphFile opens a commit-graph file; a file that makes go-git panic
// counts as unreadable.
func openGraphFile(f commitgraph.ReaderAtCloser) (idx commitgraph.Index, err error) {
	defer func() {
		if recover() != nil {
			idx, err = nil, errors.New("unreadable commit-graph")
		}
	}()
	return commitgraph.OpenFileIndex(f)
}

// graphNode reads a commit from the commit-graph file. A commit the file
// does not list, or a file go-git cannot read (it then is not used again),
// gives ok false.
func (w *historyWalk) graphNode(h plumbing.Hash) (n *commitNode, ok bool) {
	if w.graph == nil {
		return nil, false
	}
	defer func() {
		if recover() != nil {
			_ = w.graph.Close()
			w.graph, n, ok = nil, nil, false
		}
	}()
	i, err := w.graph.GetIndexByHash(h)
	if err != nil {
		return nil, false
	}
	d, err := w.graph.GetCommitDataByIndex(i)
	if err != nil || len(d.ParentHashes) != len(d.ParentIndexes) {
		return nil, false
	}
	w.graphReads++
	return &commitNode{hash: h, tree: d.TreeHash, parents: d.ParentHashes, when: d.When}, true
}

// node returns what the walk needs of commit h.
func (w *historyWalk) node(h plumbing.Hash) (*commitNode, error) {
	if n, ok := w.graphNode(h); ok {
		return n, nil
	}
	c, err := object.GetCommit(w.s, h)
	if err != nil {
		return nil, fmt.Errorf("commit %s: %w", h, err)
	}
	return &commitNode{hash: h, tree: c.TreeHash, parents: c.ParentHashes, when: c.Committer.When}, nil
}

// close releases the commit-graph file.
func (w *historyWalk) close() {
	if w.graph != nil {
		_ = w.graph.Close()
	}
}

func newHistoryWalk(r *Repo, rel string) (*historyWalk, error) {
	shallow, err := r.git.Storer.Shallow()
	if err != nil {
		return nil, fmt.Errorf("shallow commits of %s: %w", r.root, err)
	}
	w := &historyWalk{
		s:       r.git.Storer,
		graph:   openCommitGraph(r),
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
		n := heap.Pop(&w.queue).(*queued).c
		listed, follow, err := w.step(n)
		if err != nil {
			return nil, err
		}
		if listed {
			c, err := object.GetCommit(w.s, n.hash)
			if err != nil {
				return nil, fmt.Errorf("commit %s: %w", n.hash, err)
			}
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
func (w *historyWalk) step(c *commitNode) (listed bool, follow []plumbing.Hash, err error) {
	mine, err := w.entryOf(c)
	if err != nil {
		return false, nil, err
	}
	parents := c.parents
	if w.shallow[c.hash] {
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
	n, err := w.node(h)
	if err != nil {
		return err
	}
	heap.Push(&w.queue, &queued{c: n, seq: len(w.seen)})
	return nil
}

func (w *historyWalk) entryOfHash(h plumbing.Hash) (entryID, error) {
	if e, ok := w.entries[h]; ok {
		return e, nil
	}
	n, err := w.node(h)
	if err != nil {
		return entryID{}, err
	}
	return w.entryOf(n)
}

func (w *historyWalk) entryOf(c *commitNode) (entryID, error) {
	if e, ok := w.entries[c.hash]; ok {
		return e, nil
	}
	e, err := w.look.entry(c.tree)
	if err != nil {
		return entryID{}, err
	}
	w.entries[c.hash] = e
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
	c   *commitNode
	seq int
}

// commitQueue is a heap of commits, newest committer date first.
type commitQueue []*queued

func (q commitQueue) Len() int { return len(q) }
func (q commitQueue) Less(i, j int) bool {
	ti, tj := q[i].c.when, q[j].c.when
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
