package calcdoc

import (
	"errors"
	"os"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/safefile"
	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestCommittedSymlinkDataFile is issue 11 item 15 for verify: a data file
// committed as a symbolic link is refused when read from the commit with
// a message saying so (not "uncommitted changes"), as it is at render.
func TestCommittedSymlinkDataFile(t *testing.T) {
	testkit.NeedTool(t, "git")
	r := testkit.NewRepo(t)
	r.Write("real.csv", "x [m]\n1\n2\n")
	r.Write("c.calc.md", "```calc\nd = csv(\"link.csv\")\n```\n")
	if err := os.Symlink("real.csv", r.Path("link.csv")); err != nil {
		t.Skip("no symbolic links here:", err)
	}
	commit := r.Commit("calc with a linked data file")
	repo, err := provenance.Open(r.Dir)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := repo.ReadAt(commit, "link.csv"); !errors.Is(err, provenance.ErrSymlink) {
		t.Errorf("ReadAt of a committed link: %v", err)
	}
	d := ReadIn(repo.CommitFS(commit), r.Dir, "c.calc.md", r.Read("c.calc.md"))
	if len(d.Errors) != 1 || !strings.Contains(d.Errors[0].Msg, "committed as a symbolic link; commit the file itself") {
		t.Errorf("from the commit: %v", d.Errors)
	}
	d, _ = ReadFile(r.Path("c.calc.md"))
	if len(d.Errors) != 1 || !strings.Contains(d.Errors[0].Msg, "is a symbolic link") {
		t.Errorf("from the work tree: %v", d.Errors)
	}
}

// TestCommittedDataFileCapped is issue 11 item 9 for verify and diff: a
// blob in a commit is measured before it is read, so one over the cap is
// refused without loading it.
func TestCommittedDataFileCapped(t *testing.T) {
	testkit.NeedTool(t, "git")
	r := testkit.NewRepo(t)
	r.Write("big.csv", strings.Repeat("1\n", 1000))
	commit := r.Commit("a data file")
	repo, err := provenance.Open(r.Dir)
	if err != nil {
		t.Fatal(err)
	}
	if n, err := repo.SizeAt(commit, "big.csv"); n != 2000 || err != nil {
		t.Errorf("SizeAt = %d, %v", n, err)
	}
	if _, err := safefile.ReadFS(repo.CommitFS(commit), "big.csv", 1999); !errors.Is(err, safefile.ErrTooLarge) {
		t.Errorf("over the cap: %v", err)
	}
	if b, err := safefile.ReadFS(repo.CommitFS(commit), "big.csv", 2000); err != nil || len(b) != 2000 {
		t.Errorf("at the cap: %d bytes, %v", len(b), err)
	}
}
