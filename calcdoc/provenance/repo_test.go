package provenance

import (
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/go-git/go-git/v5/plumbing"
)

const calcFile = "calcs/hb-002.calc.md"

// sampleRepo has two commits of a calc file and one unrelated file.
func sampleRepo(t *testing.T) *testRepo {
	r := newTestRepo(t)
	r.write(calcFile, "# Unit 2 heat balance (fictional)\n")
	r.write("README.md", "Larchmoor Energy Park calcs (fictional)\n")
	r.commit("Add the heat balance")
	r.write(calcFile, "# Unit 2 heat balance (fictional)\nrevision B\n")
	r.commit("Revise the heat balance")
	return r
}

func TestOpenNotInRepo(t *testing.T) {
	_, err := Open(filepath.Join(t.TempDir(), "a.calc.md"))
	if !errors.Is(err, ErrNotInRepo) {
		t.Fatalf("Open outside a repository: got %v, want ErrNotInRepo", err)
	}
}

func TestOpenFromFileAndSubdir(t *testing.T) {
	r := sampleRepo(t)
	for _, p := range []string{calcFile, "calcs", ".", "calcs/not-yet.calc.md"} {
		if got := r.open(p).Root(); got != r.dir {
			t.Errorf("Open(%s).Root() = %s, want %s", p, got, r.dir)
		}
	}
}

func TestRel(t *testing.T) {
	r := sampleRepo(t)
	repo := r.open(".")
	outside := t.TempDir()
	if err := os.Symlink(outside, filepath.Join(r.dir, "escape")); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		path, want string
	}{
		{filepath.Join(r.dir, calcFile), calcFile},
		{filepath.Join(r.dir, "calcs", "new.csv"), "calcs/new.csv"},
		{filepath.Join(r.dir, "calcs", "..", "README.md"), "README.md"},
		{filepath.Join(r.dir, "..", "other.csv"), ""},
		{filepath.Join(outside, "data.csv"), ""},
		{filepath.Join(r.dir, "escape", "data.csv"), ""},
		{filepath.Join(r.dir, ".git", "config"), ""},
		{r.dir, ""},
	}
	for _, tt := range tests {
		got, err := repo.Rel(tt.path)
		if tt.want == "" {
			if !errors.Is(err, ErrOutsideRepo) {
				t.Errorf("Rel(%s) = %q, %v; want ErrOutsideRepo", tt.path, got, err)
			}
			continue
		}
		if err != nil || got != tt.want {
			t.Errorf("Rel(%s) = %q, %v; want %q", tt.path, got, err, tt.want)
		}
	}
}

func TestHead(t *testing.T) {
	r := newTestRepo(t)
	r.write("a.txt", "a\n")
	if _, err := r.open(".").Head(); !errors.Is(err, ErrNoCommits) {
		t.Fatalf("Head before the first commit: got %v, want ErrNoCommits", err)
	}
	want := r.commit("First")
	if got, err := r.open(".").Head(); err != nil || got != want {
		t.Fatalf("Head() = %s, %v; want %s", got, err, want)
	}
}

func TestBlobHashMatchesGit(t *testing.T) {
	r := newTestRepo(t)
	for _, content := range []string{"", "p_1 = 12.5 MPa\n", "no newline", "\x00binary\xff"} {
		r.write("f.bin", content)
		want := r.git("hash-object", "f.bin")
		if got := BlobHash([]byte(content)); got != want {
			t.Errorf("BlobHash(%q) = %s, git hash-object = %s", content, got, want)
		}
	}
}

func TestFileState(t *testing.T) {
	r := sampleRepo(t)
	repo := r.open(".")
	committed := r.git("rev-parse", "HEAD:"+calcFile)

	blob, head, dirty, err := repo.FileState(calcFile)
	if err != nil || blob != committed || head != committed || dirty {
		t.Fatalf("clean file: got %s %s %v %v; want %s twice, not dirty", blob, head, dirty, err, committed)
	}
	r.write(calcFile, "edited\n")
	blob, head, dirty, err = repo.FileState(calcFile)
	if err != nil || blob != BlobHash([]byte("edited\n")) || head != committed || !dirty {
		t.Fatalf("edited file: got %s %s %v %v", blob, head, dirty, err)
	}
	r.write("calcs/new.calc.md", "new\n")
	_, head, dirty, err = repo.FileState("calcs/new.calc.md")
	if err != nil || head != "" || !dirty {
		t.Fatalf("untracked file: got head %q dirty %v err %v; want \"\", dirty", head, dirty, err)
	}
	if _, _, _, err := repo.FileState("calcs/missing.calc.md"); !errors.Is(err, os.ErrNotExist) {
		t.Fatalf("missing file: got %v, want a not-exist error", err)
	}
	if _, _, _, err := repo.FileState("../x"); !errors.Is(err, ErrOutsideRepo) {
		t.Fatalf("escaping path: got %v, want ErrOutsideRepo", err)
	}
}

func TestClean(t *testing.T) {
	r := sampleRepo(t)
	repo := r.open(".")
	steps := []struct {
		name  string
		do    func()
		clean bool
	}{
		{"fresh", func() {}, true},
		{"untracked only", func() { r.write("out/hb-002.html", "<html>") }, true},
		{"modified", func() { r.write(calcFile, "edited\n") }, false},
		{"staged", func() { r.git("add", calcFile) }, false},
		{"committed", func() { r.commit("Edit") }, true},
		{"deleted", func() { os.Remove(filepath.Join(r.dir, "README.md")) }, false},
	}
	for _, s := range steps {
		s.do()
		for name, clean := range map[string]func() (bool, error){
			"git": repo.Clean, "go-git": repo.cleanGoGit,
			"StartClean, History meanwhile": func() (bool, error) {
				wait := repo.StartClean()
				if _, err := repo.History(calcFile); err != nil {
					return false, err
				}
				return wait()
			},
		} {
			got, err := clean()
			if err != nil || got != s.clean {
				t.Errorf("%s: %s Clean() = %v, %v; want %v", s.name, name, got, err, s.clean)
			}
		}
	}
}

func TestLinkedWorktree(t *testing.T) {
	r := sampleRepo(t)
	wt := filepath.Join(t.TempDir(), "wt")
	r.git("worktree", "add", "-q", "-b", "side", wt)
	wt, _ = filepath.EvalSymlinks(wt)
	repo, err := Open(filepath.Join(wt, calcFile))
	if err != nil {
		t.Fatal(err)
	}
	if repo.Root() != wt {
		t.Errorf("Root() = %s, want %s", repo.Root(), wt)
	}
	if head, err := repo.Head(); err != nil || head != r.git("rev-parse", "HEAD") {
		t.Errorf("Head() = %s, %v", head, err)
	}
	if clean, err := repo.cleanGoGit(); err != nil || !clean {
		t.Errorf("go-git Clean() = %v, %v; want true", clean, err)
	}
	if _, _, dirty, err := repo.FileState(calcFile); err != nil || dirty {
		t.Errorf("FileState: dirty %v, %v", dirty, err)
	}
}

func TestReadAt(t *testing.T) {
	r := sampleRepo(t)
	first := r.git("rev-parse", "HEAD~1")
	r.write("data/loads.csv", "load,MW\n100,250\n")
	r.commit("Add load data")
	repo := r.open(".")

	got, err := repo.ReadAt(first, calcFile)
	if err != nil || string(got) != "# Unit 2 heat balance (fictional)\n" {
		t.Fatalf("ReadAt(first) = %q, %v", got, err)
	}
	if got, err := repo.ReadAt("HEAD", "data/loads.csv"); err != nil || !strings.HasPrefix(string(got), "load,MW") {
		t.Fatalf("ReadAt(HEAD) = %q, %v", got, err)
	}
	_, err = repo.ReadAt(first, "data/loads.csv")
	if !errors.Is(err, ErrNotAtCommit) || !strings.Contains(err.Error(), "data/loads.csv") ||
		!strings.Contains(err.Error(), first[:12]) {
		t.Fatalf("ReadAt of a file added later: got %v, want ErrNotAtCommit naming file and commit", err)
	}
	if _, err := repo.ReadAt("HEAD", "calcs"); !errors.Is(err, ErrNotAtCommit) {
		t.Fatalf("ReadAt of a directory: got %v, want ErrNotAtCommit", err)
	}
	if _, err := repo.ReadAt("HEAD", "../etc/passwd"); !errors.Is(err, ErrOutsideRepo) {
		t.Fatalf("ReadAt of an escaping path: got %v, want ErrOutsideRepo", err)
	}
}

// TestReadAtReadsEachBlobOnce is the provenance side of issue 11 item 11:
// a committed file read again and again (or listed under several paths
// with the same content) is inflated from the object store once, and each
// caller still gets its own bytes.
func TestReadAtReadsEachBlobOnce(t *testing.T) {
	r := sampleRepo(t)
	big := strings.Repeat("load,MW\n100,250\n", 20000) // 320 kB (fictional)
	r.write("data/big.csv", big)
	r.write("data/copy.csv", big)
	r.write("data/other.csv", "x\n1\n")
	r.commit("Add data")
	repo := r.open(".")
	for i := 0; i < 300; i++ {
		for _, p := range []string{"data/big.csv", "data/copy.csv"} {
			got, err := repo.ReadAt("HEAD", p)
			if err != nil || string(got) != big {
				t.Fatalf("ReadAt(%s) #%d: %d bytes, %v", p, i, len(got), err)
			}
			got[0] = 'X' // the caller's copy: the next read must not see it
		}
	}
	if repo.blobs.reads != 1 {
		t.Fatalf("the blob was read from the object store %d times, want once", repo.blobs.reads)
	}
	if got, err := repo.ReadAt("HEAD", "data/other.csv"); err != nil || string(got) != "x\n1\n" || repo.blobs.reads != 2 {
		t.Fatalf("another blob: %q, %v, %d reads", got, err, repo.blobs.reads)
	}
}

// TestBlobHashAtHashesEachBlobOnce: verify checks a data file by hashing
// its content at the commit; one blob listed under many paths is read and
// hashed once, and the hash is git's.
func TestBlobHashAtHashesEachBlobOnce(t *testing.T) {
	r := sampleRepo(t)
	big := strings.Repeat("load,MW\n100,250\n", 20000) // fictional
	paths := []string{"data/a.csv", "data/b.csv", "data/c/d.csv"}
	for _, p := range paths {
		r.write(p, big)
	}
	r.commit("Add copies")
	repo := r.open(".")
	want := r.git("rev-parse", "HEAD:data/a.csv")
	for i := 0; i < 100; i++ {
		for _, p := range paths {
			if got, err := repo.BlobHashAt("HEAD", p); err != nil || got != want {
				t.Fatalf("BlobHashAt(%s) = %s, %v; want %s", p, got, err, want)
			}
		}
	}
	if repo.blobs.reads != 1 || len(repo.blobs.hashed) != 1 {
		t.Fatalf("%d reads, %d hashes; want one of each", repo.blobs.reads, len(repo.blobs.hashed))
	}
	if _, err := repo.BlobHashAt("HEAD", "data/none.csv"); !errors.Is(err, ErrNotAtCommit) {
		t.Fatalf("BlobHashAt of a missing file: %v", err)
	}
	if _, err := repo.BlobHashAt("HEAD", "../x"); !errors.Is(err, ErrOutsideRepo) {
		t.Fatalf("BlobHashAt of an escaping path: %v", err)
	}
}

// TestBlobCacheBound: the cache drops its oldest blobs to stay within
// BlobCacheBytes and never keeps a blob larger than that.
func TestBlobCacheBound(t *testing.T) {
	var c blobCache
	third := make([]byte, BlobCacheBytes/3+1)
	for i := byte(1); i <= 3; i++ {
		c.put(plumbing.Hash{i}, third)
	}
	if _, ok := c.get(plumbing.Hash{1}); ok || c.size > BlobCacheBytes {
		t.Fatalf("size %d: the oldest blob is kept or the bound is passed", c.size)
	}
	for _, h := range []plumbing.Hash{{2}, {3}} {
		if _, ok := c.get(h); !ok {
			t.Fatalf("blob %v dropped", h)
		}
	}
	c.put(plumbing.Hash{4}, make([]byte, BlobCacheBytes+1))
	if _, ok := c.get(plumbing.Hash{4}); ok || c.size > BlobCacheBytes {
		t.Fatal("a blob larger than the bound is kept")
	}
}

func TestResolve(t *testing.T) {
	r := sampleRepo(t)
	r.git("tag", "rev-A", "HEAD~1")
	r.git("tag", "-a", "-m", "Issued for review", "rev-B")
	head := r.git("rev-parse", "HEAD")
	parent := r.git("rev-parse", "HEAD~1")
	repo := r.open(".")
	tests := []struct{ rev, want string }{
		{"HEAD", head},
		{"main", head},
		{"rev-A", parent},
		{"rev-B", head}, // annotated: peeled to the commit
		{"HEAD~1", parent},
		{"HEAD^", parent},
		{"rev-B~1", parent},
		{head[:7], head},
		{parent, parent},
	}
	for _, tt := range tests {
		if got, err := repo.Resolve(tt.rev); err != nil || got != tt.want {
			t.Errorf("Resolve(%q) = %s, %v; want %s", tt.rev, got, err, tt.want)
		}
	}
}

func TestResolveUnknown(t *testing.T) {
	r := sampleRepo(t)
	r.git("tag", "rev-A", "HEAD~1")
	r.git("tag", "rev-B")
	r.git("tag", "issued-2024")
	repo := r.open(".")
	tests := []struct{ rev, mention string }{
		{"rev-C", `"rev-C": nearest names are rev-A, rev-B, main, issued-2024`},
		{"HEAD~5", "HEAD resolves, but not the ancestor asked for"},
		{"", "empty revision"},
		{"0123456789abcdef0123456789abcdef01234567", "nearest names are"},
	}
	for _, tt := range tests {
		_, err := repo.Resolve(tt.rev)
		if !errors.Is(err, ErrUnknownRevision) || !strings.Contains(err.Error(), tt.mention) {
			t.Errorf("Resolve(%q): got %v, want ErrUnknownRevision mentioning %q", tt.rev, err, tt.mention)
		}
	}
}

func TestCommitDate(t *testing.T) {
	r := sampleRepo(t)
	got, err := r.open(".").CommitDate("HEAD")
	want := time.Unix(1700000000+60*2, 0).UTC()
	if err != nil || !got.Equal(want) || got.Location() != time.UTC {
		t.Fatalf("CommitDate(HEAD) = %v, %v; want %v in UTC", got, err, want)
	}
}

func TestCleanWithoutGitExecutable(t *testing.T) {
	r := sampleRepo(t)
	repo := r.open(".")
	gitPath, _ := exec.LookPath("git")
	t.Setenv("PATH", t.TempDir())
	if _, err := exec.LookPath("git"); err == nil {
		t.Skip("git still on PATH")
	}
	r.write(calcFile, "edited\n")
	if clean, err := repo.Clean(); err != nil || clean {
		t.Fatalf("Clean() without git (was %s) = %v, %v; want false", gitPath, clean, err)
	}
}
