package provenance

import (
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// Size of the generated repository: a plant-sized calc repository with
// many data files and a long history.
const (
	benchFiles   = 5000
	benchCommits = 300
	benchTouch   = 27 // every 27th commit edits the calc file
)

// buildBenchRepo writes the repository with git fast-import and checks it
// out. Commit 1 adds every file; each later commit edits three data files,
// and every benchTouch-th commit the calc file too.
func buildBenchRepo(b *testing.B) *testRepo {
	r := newTestRepo(b)
	var s bytes.Buffer
	for c := 1; c <= benchCommits; c++ {
		writeBenchCommit(&s, c)
	}
	cmd := exec.Command("git", "fast-import", "--quiet")
	cmd.Dir, cmd.Env, cmd.Stdin = r.dir, r.env(), &s
	if out, err := cmd.CombinedOutput(); err != nil {
		b.Fatalf("git fast-import: %v\n%s", err, out)
	}
	r.git("reset", "-q", "--hard", "main")
	r.git("tag", "rev-A", "main~100")
	return r
}

func writeBenchCommit(s *bytes.Buffer, c int) {
	msg := fmt.Sprintf("Commit %d", c)
	fmt.Fprintf(s, "commit refs/heads/main\nmark :%d\n", c)
	fmt.Fprintf(s, "author P. Writer (fictional) <preparer@example.com> %d +0000\n", 1700000000+60*c)
	fmt.Fprintf(s, "committer P. Writer (fictional) <preparer@example.com> %d +0000\n", 1700000000+60*c)
	fmt.Fprintf(s, "data %d\n%s\n", len(msg), msg)
	if c > 1 {
		fmt.Fprintf(s, "from :%d\n", c-1)
	}
	for _, f := range benchFilesOf(c) {
		body := fmt.Sprintf("%s at commit %d\n", f, c)
		fmt.Fprintf(s, "M 100644 inline %s\ndata %d\n%s\n", f, len(body), body)
	}
}

// benchFilesOf lists the files commit c writes.
func benchFilesOf(c int) []string {
	name := func(i int) string { return fmt.Sprintf("data/d%02d/f%03d.csv", i/100, i%100) }
	if c == 1 {
		files := []string{calcFile}
		for i := 0; i < benchFiles; i++ {
			files = append(files, name(i))
		}
		return files
	}
	files := []string{name(c * 7 % benchFiles), name(c * 13 % benchFiles), name(c * 31 % benchFiles)}
	if c%benchTouch == 0 {
		files = append(files, calcFile)
	}
	return files
}

// BenchmarkProvenance times what rendering a package asks of git: Open,
// Head, Rel, FileState, History and Clean, on 5,000 files and 300 commits.
func BenchmarkProvenance(b *testing.B) {
	r := buildBenchRepo(b)
	path := filepath.Join(r.dir, filepath.FromSlash(calcFile))
	repo := r.open(".")
	revs, err := repo.History(calcFile)
	if err != nil {
		b.Fatal(err)
	}
	if want := r.gitLog(r.dir, calcFile); !reflect.DeepEqual(hashes(revs), want) || len(want) != 12 {
		b.Fatalf("History = %d commits, git log = %d; want the same 12", len(revs), len(want))
	}
	b.Run("all", func(b *testing.B) {
		for b.Loop() {
			provenanceOnce(b, path)
		}
	})
	b.Run("History", func(b *testing.B) {
		for b.Loop() {
			if _, err := repo.History(calcFile); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("Open", func(b *testing.B) {
		for b.Loop() {
			if _, err := Open(path); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("History-fresh", func(b *testing.B) {
		for b.Loop() {
			fresh, err := Open(path)
			if err != nil {
				b.Fatal(err)
			}
			if _, err := fresh.History(calcFile); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("FileState", func(b *testing.B) {
		for b.Loop() {
			if _, _, _, err := repo.FileState(calcFile); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("Clean-git", func(b *testing.B) {
		for b.Loop() {
			if _, err := repo.Clean(); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("Clean-go-git", func(b *testing.B) {
		for b.Loop() {
			if _, err := repo.cleanGoGit(); err != nil {
				b.Fatal(err)
			}
		}
	})
	// With the commit-graph file git gc writes: commits are read from it.
	r.git("commit-graph", "write", "--reachable")
	defer os.Remove(filepath.Join(r.dir, ".git", "objects", "info", "commit-graph"))
	b.Run("History-graph", func(b *testing.B) {
		for b.Loop() {
			if _, err := repo.History(calcFile); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("History-fresh-graph", func(b *testing.B) {
		for b.Loop() {
			fresh, err := Open(path)
			if err != nil {
				b.Fatal(err)
			}
			if _, err := fresh.History(calcFile); err != nil || fresh.graphReads == 0 {
				b.Fatalf("History: %v, %d commits from the graph", err, fresh.graphReads)
			}
		}
	})
}

// provenanceOnce does everything a render asks of the repository.
func provenanceOnce(b *testing.B, path string) {
	repo, err := Open(path)
	if err != nil {
		b.Fatal(err)
	}
	rel, err := repo.Rel(path)
	if err != nil {
		b.Fatal(err)
	}
	if _, err := repo.Head(); err != nil {
		b.Fatal(err)
	}
	if _, _, dirty, err := repo.FileState(rel); err != nil || dirty {
		b.Fatalf("FileState: dirty %v, %v", dirty, err)
	}
	if revs, err := repo.History(rel); err != nil || !strings.HasPrefix(revs[0].Subject, "Commit") {
		b.Fatalf("History: %v", err)
	}
	if clean, err := repo.Clean(); err != nil || !clean {
		b.Fatalf("Clean: %v, %v", clean, err)
	}
}

// BenchmarkReadAtBigFile reads a committed 20 MB data file (fictional
// readings): "first" opens the repository and reads it, as one read did
// before blobs were cached; "again" reads it from a Repo that has read it
// once. Issue 11 item 11 listed such a file 300 times in a manifest.
func BenchmarkReadAtBigFile(b *testing.B) {
	r := newTestRepo(b)
	var big strings.Builder
	for i := 0; big.Len() < 20<<20; i++ {
		fmt.Fprintf(&big, "%d,%d.%03d,%d\n", i, 500+i*7919%1000, i*104729%1000, i*31%977)
	}
	r.write("data/big.csv", big.String())
	r.commit("Add big data file")
	r.git("gc", "-q")
	b.Run("first", func(b *testing.B) {
		for b.Loop() {
			repo := r.open(".")
			if got, err := repo.ReadAt("HEAD", "data/big.csv"); err != nil || len(got) != big.Len() {
				b.Fatal(err)
			}
		}
	})
	repo := r.open(".")
	if _, err := repo.ReadAt("HEAD", "data/big.csv"); err != nil {
		b.Fatal(err)
	}
	b.Run("again", func(b *testing.B) {
		for b.Loop() {
			if got, err := repo.ReadAt("HEAD", "data/big.csv"); err != nil || len(got) != big.Len() {
				b.Fatal(err)
			}
		}
	})
}
