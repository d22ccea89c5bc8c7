package diff

import (
	"errors"
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"os"
	"path/filepath"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"

	"github.com/vouchcalc/vouch/internal/safefile"
)

// renameSimilarity is the share of lines an earlier file must have in
// common with the calc to count as its earlier name.
const renameSimilarity = 0.5

// Options say which two revisions of a calc to compare.
type Options struct {
	From string // a revision as git names it (tag, hash, HEAD~1); "" means HEAD
	To   string // a revision; "" means the work tree
}

// Revisions reads a calc at two revisions from git, evaluates each
// (data files are read at the same revision) and compares them. When the
// file did not exist at the earlier revision under its present name, the
// calc it was renamed from is found there: a file with the same content,
// the same calc number, or at least half its lines. An unknown revision
// or a file missing at a revision is a *calcdoc.UsageError; errors inside either
// calc are in Side.Doc.Errors.
func Revisions(path string, opt Options) (*Diff, error) {
	repo, err := provenance.Open(path)
	if err != nil {
		return nil, usageErr("%s: %v; diff reads revisions from git", path, err)
	}
	rel, err := repo.Rel(path)
	if err != nil {
		return nil, usageErr("%v", err)
	}
	to, err := readNewSide(repo, rel, opt.To, path)
	if err != nil {
		return nil, err
	}
	from := opt.From
	if from == "" {
		from = "HEAD"
	}
	old, err := readRenamed(repo, to.Path, from, to)
	if err != nil {
		return nil, err
	}
	df := Compare(old.Doc, to.Doc)
	df.From, df.To = old, to
	return df, nil
}

// readWorkTree reads and evaluates the calc in the work tree; its errors
// name the file as the user gave it.
func readWorkTree(repo *provenance.Repo, rel, shown string) (Side, error) {
	path := filepath.Join(repo.Root(), filepath.FromSlash(rel))
	src, err := safefile.Read(path, calcdoc.MaxFileBytes)
	if err != nil {
		return Side{}, usageErr("%s: %v", rel, err)
	}
	opt, ssrc, err := calcdoc.SettingsIn(os.DirFS(repo.Root()), repo.Root())
	if err != nil {
		return Side{}, usageErr("%s", calcdoc.SettingsErrorText(err, ssrc))
	}
	d := calcdoc.ReadWith(path, src, opt)
	d.Evaluate()
	return Side{Label: "work tree", Path: rel, Doc: d, Shown: shown}, nil
}

// readNewSide reads the later side: the work tree when rev is "", else
// the calc at rev, under the name it had there if it was renamed since.
func readNewSide(repo *provenance.Repo, rel, rev, shown string) (Side, error) {
	work, err := readWorkTree(repo, rel, shown)
	if rev == "" {
		return work, err
	}
	if err != nil { // no work-tree file to follow a rename from
		commit, err := resolve(repo, rev)
		if err != nil {
			return Side{}, err
		}
		return readAt(repo, rel, rev, commit)
	}
	return readRenamed(repo, rel, rev, work)
}

// resolve turns a revision into a commit; an unknown one is a usage error
// that lists the nearest tag and branch names.
func resolve(repo *provenance.Repo, rev string) (string, error) {
	commit, err := repo.Resolve(rev)
	if err != nil {
		return "", &calcdoc.UsageError{Err: err}
	}
	return commit, nil
}

// readAt reads and evaluates rel at a resolved commit.
func readAt(repo *provenance.Repo, rel, rev, commit string) (Side, error) {
	src, err := repo.ReadAt(commit, rel)
	if errors.Is(err, provenance.ErrNotAtCommit) {
		return Side{}, usageErr("%s did not exist at %s (commit %s)", rel, rev, shortHash(commit))
	}
	if err != nil {
		return Side{}, err
	}
	label := rev + " (" + shortHash(commit)
	if strings.HasPrefix(commit, rev) {
		label = "commit (" + shortHash(commit)
	}
	if date, err := repo.CommitDate(commit); err == nil {
		label += ", " + date.Format("2006-01-02")
	}
	d := calcdoc.ReadIn(repo.CommitFS(commit), repo.Root(), rel, src)
	return Side{Label: label + ")", Rev: rev, Commit: commit, Path: rel, Doc: d}, nil
}

// readRenamed reads the calc at a revision, under the name it has at the
// newer side or the name it was renamed from.
func readRenamed(repo *provenance.Repo, rel, rev string, newer Side) (Side, error) {
	commit, err := resolve(repo, rev)
	if err != nil {
		return Side{}, err
	}
	side, err := readAt(repo, rel, rev, commit)
	var usage *calcdoc.UsageError
	if !errors.As(err, &usage) {
		return side, err
	}
	earlier, ferr := findRenamed(repo, commit, newer)
	if ferr != nil {
		return Side{}, ferr
	}
	if earlier == "" {
		return Side{}, usageErr("%s did not exist at %s (commit %s), and no calc file there looks like its earlier name", rel, rev, shortHash(commit))
	}
	return readAt(repo, earlier, rev, commit)
}

// findRenamed looks at a commit for the calc file the new side was renamed
// from: among the calc files there that the new side no longer has, one
// with the same content, else one with the same calc number, else the most
// similar with at least renameSimilarity of its lines in common.
func findRenamed(repo *provenance.Repo, commit string, to Side) (string, error) {
	files, err := repo.FilesAt(commit, ".calc.md")
	if err != nil {
		return "", err
	}
	newLines := strings.Split(string(to.Doc.Src), "\n")
	best, bestScore := "", renameSimilarity
	for _, f := range files {
		if existsAt(repo, to, f) {
			continue
		}
		src, err := repo.ReadAt(commit, f)
		if err != nil {
			return "", err
		}
		score := renameScore(src, to.Doc, newLines)
		if score > bestScore || score == bestScore && best == "" {
			best, bestScore = f, score
		}
	}
	return best, nil
}

// renameScore rates how likely src is an earlier version of the calc d:
// 3 for the same bytes, 2 for the same calc number, otherwise the share of
// lines in common.
func renameScore(src []byte, d *calcdoc.Doc, newLines []string) float64 {
	if provenance.BlobHash(src) == provenance.BlobHash(d.Src) {
		return 3
	}
	if n := calcdoc.FrontNumber(src); n != "" && n == d.Front.Number {
		return 2
	}
	return similarity(strings.Split(string(src), "\n"), newLines)
}

// existsAt reports whether the new side has a file at rel.
func existsAt(repo *provenance.Repo, side Side, rel string) bool {
	if side.Commit == "" {
		_, err := os.Stat(filepath.Join(repo.Root(), filepath.FromSlash(rel)))
		return err == nil
	}
	_, err := repo.ReadAt(side.Commit, rel)
	return err == nil
}

// Renamed reports whether the calc's path differs between the two sides.
func (df *Diff) Renamed() bool { return df.From.Path != df.To.Path }

// errorText formats the errors of one side as file:line:col: message,
// naming the file as REV:PATH for a revision from git.
func (s Side) errorText() string {
	name := s.Path
	if s.Shown != "" {
		name = s.Shown
	}
	if s.Rev != "" {
		name = s.Rev + ":" + s.Path
	}
	return s.Doc.Errors.Format(name, s.Doc.Src)
}

// ErrorText formats the errors found in either revision, the older first.
func (df *Diff) ErrorText() string {
	return df.From.errorText() + df.To.errorText()
}

// HasErrors reports whether either revision has errors.
func (df *Diff) HasErrors() bool {
	return len(df.From.Doc.Errors)+len(df.To.Doc.Errors) > 0
}

// usageErr is a diff that cannot start: an unknown revision or a missing
// file. The CLI exits with its usage code.
func usageErr(format string, args ...any) error {
	return &calcdoc.UsageError{Err: fmt.Errorf(format, args...)}
}

// shortHash is the first 12 digits of a commit hash, as reports show it.
func shortHash(h string) string {
	if len(h) > 12 {
		return h[:12]
	}
	return h
}
