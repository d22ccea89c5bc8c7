package provenance

import (
	"os"
	"os/exec"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"
)

// checkLikeGit compares History with git log -- rel.
func checkLikeGit(t *testing.T, r *testRepo, rel string, wantLen int) []Revision {
	t.Helper()
	revs, err := r.open(".").History(rel)
	if err != nil {
		t.Fatalf("History(%s): %v", rel, err)
	}
	want := r.gitLog(r.dir, rel)
	if got := hashes(revs); !reflect.DeepEqual(got, want) {
		t.Fatalf("History(%s) =\n%v\ngit log =\n%v", rel, got, want)
	}
	if len(revs) != wantLen {
		t.Fatalf("History(%s) has %d commits, want %d", rel, len(revs), wantLen)
	}
	// Again with a commit-graph file listing every commit: the walk reads
	// commits from it. It stays behind, stale once the test commits again,
	// so the next check walks partly from the graph, partly from objects.
	r.git("commit-graph", "write", "--reachable")
	repo := r.open(".")
	withGraph, err := repo.History(rel)
	if err != nil {
		t.Fatalf("History(%s) with a commit-graph: %v", rel, err)
	}
	if !reflect.DeepEqual(withGraph, revs) || repo.graphReads == 0 {
		t.Fatalf("History(%s) with a commit-graph (%d commits read from it) =\n%v\nwithout =\n%v",
			rel, repo.graphReads, hashes(withGraph), hashes(revs))
	}
	return revs
}

// TestHistoryCorruptCommitGraph: a commit-graph file go-git cannot read
// is not used; the history is read from the commit objects.
func TestHistoryCorruptCommitGraph(t *testing.T) {
	r := sampleRepo(t)
	want := checkLikeGit(t, r, calcFile, 2)
	graph := filepath.Join(r.dir, ".git", "objects", "info", "commit-graph")
	good, err := os.ReadFile(graph)
	if err != nil {
		t.Fatal(err)
	}
	for name, bad := range map[string][]byte{
		"empty":     {},
		"header":    good[:8],
		"truncated": good[:len(good)/2],
		"garbled":   append(append([]byte{}, good[:64]...), make([]byte, len(good)-64)...),
	} {
		if err := os.WriteFile(graph, bad, 0o644); err != nil {
			t.Fatal(err)
		}
		got, err := r.open(".").History(calcFile)
		if err != nil || !reflect.DeepEqual(got, want) {
			t.Errorf("%s commit-graph: History = %v, %v; want %v", name, hashes(got), err, hashes(want))
		}
	}
}

func TestHistoryTreesame(t *testing.T) {
	r := newTestRepo(t)
	r.write(calcFile, "A\n")
	first := r.commit("Add the heat balance\n\nFirst cut for the\nfictional Unit 2.")
	r.write("README.md", "other\n")
	r.commit("Touch another file")
	r.write("calcs/other.calc.md", "x\n")
	r.commit("Add a neighbour in the same directory")
	r.write(calcFile, "B\n")
	second := r.commit("Revise the\nheat balance\n\nBody text.")
	r.write(calcFile, "A\n")
	third := r.commit("Back to the first content")
	r.commit("Empty commit")

	revs := checkLikeGit(t, r, calcFile, 3)
	if revs[0].Commit != third || revs[1].Commit != second || revs[2].Commit != first {
		t.Fatalf("order: %v", hashes(revs))
	}
	want := Revision{
		Commit:  second,
		Date:    time.Unix(1700000000+60*4, 0).UTC().Format(time.RFC3339),
		Author:  "P. Writer (fictional)",
		Email:   "preparer@example.com",
		Subject: "Revise the heat balance",
	}
	if revs[1] != want {
		t.Fatalf("revision =\n%+v\nwant\n%+v", revs[1], want)
	}
	if got := r.git("log", "-1", "--format=%s", second); got != want.Subject {
		t.Fatalf("git's subject %q differs from %q", got, want.Subject)
	}
}

func TestHistoryMerges(t *testing.T) {
	r := newTestRepo(t)
	r.write(calcFile, "A\n")
	r.write("README.md", "0\n")
	r.commit("Base")

	// A side branch changes the file; main changes another file; the merge
	// takes the side's version, so it is TREESAME to the side parent.
	r.git("checkout", "-q", "-b", "side")
	r.write(calcFile, "B\n")
	r.commit("Side: revise")
	r.git("checkout", "-q", "main")
	r.write("README.md", "1\n")
	r.commit("Main: other file")
	r.merge("side")

	// A second side change is discarded by an ours-merge: the merge is
	// TREESAME to main, so the side commit drops out of the history.
	r.git("checkout", "-q", "side")
	r.write(calcFile, "C\n")
	r.commit("Side: discarded revision")
	r.git("checkout", "-q", "main")
	r.merge("-s", "ours", "side")

	// Both sides change the file; the merge resolves to new content and
	// differs from both parents, so it is listed.
	r.git("checkout", "-q", "side")
	r.write(calcFile, "D\n")
	r.commit("Side: D")
	r.git("checkout", "-q", "main")
	r.write(calcFile, "E\n")
	r.commit("Main: E")
	r.tick++
	conflict := exec.Command("git", "merge", "-q", "--no-commit", "side")
	conflict.Dir, conflict.Env = r.dir, r.env()
	if out, err := conflict.CombinedOutput(); err == nil {
		t.Fatalf("merge was expected to conflict:\n%s", out)
	}
	r.write(calcFile, "F\n")
	r.commit("Merge side, resolving to F")

	checkLikeGit(t, r, calcFile, 6)
	checkLikeGit(t, r, "README.md", 2)
}

func TestHistoryRenameNotFollowed(t *testing.T) {
	r := newTestRepo(t)
	r.write("calcs/old.calc.md", "A\n")
	r.commit("Add")
	r.write("calcs/old.calc.md", "B\n")
	r.commit("Edit")
	r.git("mv", "calcs/old.calc.md", "calcs/new.calc.md")
	r.commit("Rename")
	r.write("calcs/new.calc.md", "C\n")
	r.commit("Edit after the rename")

	checkLikeGit(t, r, "calcs/new.calc.md", 2)
	checkLikeGit(t, r, "calcs/old.calc.md", 3) // add, edit, delete
}

func TestHistoryModeChange(t *testing.T) {
	r := newTestRepo(t)
	r.write("tools/run.sh", "echo\n")
	r.commit("Add")
	if err := os.Chmod(filepath.Join(r.dir, "tools", "run.sh"), 0o755); err != nil {
		t.Fatal(err)
	}
	r.commit("Make executable")
	checkLikeGit(t, r, "tools/run.sh", 2)
}

func TestHistoryShallowClone(t *testing.T) {
	r := newTestRepo(t)
	for _, c := range []string{"A", "B", "C", "D"} {
		r.write(calcFile, c+"\n")
		r.commit("Set " + c)
	}
	r.write("README.md", "x\n")
	r.commit("Other")
	clone := filepath.Join(t.TempDir(), "clone")
	r.git("clone", "-q", "--depth", "2", "file://"+r.dir, clone)

	repo, err := Open(clone)
	if err != nil {
		t.Fatal(err)
	}
	revs, err := repo.History(calcFile)
	if err != nil {
		t.Fatal(err)
	}
	want := r.gitLog(clone, calcFile)
	if got := hashes(revs); !reflect.DeepEqual(got, want) || len(got) != 1 {
		t.Fatalf("shallow History = %v, git log = %v; want one commit", got, want)
	}
}

func TestHistoryAtAndEmpty(t *testing.T) {
	r := newTestRepo(t)
	if revs, err := r.open(".").History(calcFile); err != nil || revs != nil {
		t.Fatalf("History with no commits = %v, %v", revs, err)
	}
	r.write(calcFile, "A\n")
	first := r.commit("A")
	r.write(calcFile, "B\n")
	r.commit("B")
	repo := r.open(".")
	revs, err := repo.HistoryAt(first, calcFile)
	if err != nil || len(revs) != 1 || revs[0].Commit != first {
		t.Fatalf("HistoryAt(first) = %v, %v", hashes(revs), err)
	}
	if revs, err := repo.History("calcs/never.calc.md"); err != nil || len(revs) != 0 {
		t.Fatalf("History of a file never committed = %v, %v", revs, err)
	}
}

func TestSubject(t *testing.T) {
	tests := []struct{ msg, want string }{
		{"One line\n", "One line"},
		{"\n\nLeading blank lines\n", "Leading blank lines"},
		{"Two\nlines\n\nbody", "Two lines"},
		{"", ""},
	}
	for _, tt := range tests {
		if got := subject(tt.msg); got != tt.want {
			t.Errorf("subject(%q) = %q, want %q", tt.msg, got, tt.want)
		}
	}
}

// TestNoPackDescriptorOutlivesACall: the pack files go-git keeps open
// during a history walk (issue 16 item 5: reopening them for every object
// was most of the walk's time) are closed when the call returns.
func TestNoPackDescriptorOutlivesACall(t *testing.T) {
	if _, err := os.ReadDir("/proc/self/fd"); err != nil {
		t.Skip("no /proc/self/fd to count descriptors")
	}
	r := sampleRepo(t)
	r.git("gc", "-q") // pack the objects
	repo := r.open(".")
	if !strings.Contains(r.git("count-objects", "-v"), "packs: 1") || repo.store == nil {
		t.Fatal("the objects are not packed, or the repository is not opened with kept descriptors")
	}
	for i := 0; i < 3; i++ {
		if revs, err := repo.History(calcFile); err != nil || len(revs) != 2 {
			t.Fatalf("History = %d revisions, %v", len(revs), err)
		}
		if _, err := repo.ReadAt("HEAD", calcFile); err != nil {
			t.Fatal(err)
		}
		if n := openPacks(t); n != 0 {
			t.Fatalf("%d pack files still open after the calls", n)
		}
	}
}

// openPacks counts this process's descriptors open on .pack files.
func openPacks(t *testing.T) int {
	t.Helper()
	fds, err := os.ReadDir("/proc/self/fd")
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, fd := range fds {
		if target, err := os.Readlink("/proc/self/fd/" + fd.Name()); err == nil && strings.HasSuffix(target, ".pack") {
			n++
		}
	}
	return n
}
