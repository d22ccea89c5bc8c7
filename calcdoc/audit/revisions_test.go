package audit

import (
	"errors"
	"os"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
)

// stampOf evaluates a calc from disk and builds its stamp as vouch render
// does, with the package marked draft when asked.
func stampOf(t *testing.T, calc string, draft bool) (*calcdoc.Doc, *calcdoc.Stamp, []byte) {
	t.Helper()
	d, err := calcdoc.ReadFile(calc)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Errors) > 0 {
		t.Fatalf("errors:\n%s", d.Errors.Format(calc, d.Src))
	}
	st, err := Provenance(d, "test")
	if err != nil {
		t.Fatal(err)
	}
	p, err := d.Render(calcdoc.RenderOptions{Engine: "test", Stamp: st, Draft: draft})
	if err != nil {
		t.Fatal(err)
	}
	return d, st, p.HTML
}

// preparedRepo is a repository whose revision A of calcs/fp.calc.md has a
// package signed by its preparer.
func preparedRepo(t *testing.T) (*gitRepo, string) {
	r := calcRepo(t)
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	signPkg(t, pkg, "preparer", newKey(t, "ed25519"), "")
	return r, pkg
}

// TestRevisionChangedUnderSignedLetterRefused: an input changed and
// committed under the same revision A, after A was signed, is refused at
// render with a message that says to bump the revision; a new letter or a
// draft is accepted.
func TestRevisionChangedUnderSignedLetterRefused(t *testing.T) {
	r, pkg := preparedRepo(t)
	changed := strings.Replace(signCalc, "m_dot = 213.2 kg/s", "m_dot = 220 kg/s", 1)
	r.Write("calcs/fp.calc.md", changed)
	r.Commit("More flow under the same revision")
	_, st, _ := stampOf(t, r.Path("calcs/fp.calc.md"), false)
	err := CheckRevision(st, pkg)
	if !errors.Is(err, ErrRevisionSigned) {
		t.Fatalf("not refused: %v", err)
	}
	for _, want := range []string{"revision A of calcs/fp.calc.md has a signed package (fp.html, signed by preparer P. Writer", "the source", "the results", "set a new revision letter", "--draft"} {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("the message lacks %q: %v", want, err)
		}
	}
	var ue *calcdoc.UsageError
	if !errors.As(err, &ue) {
		t.Errorf("not a usage error: %T", err)
	}
	_, st, _ = stampOf(t, r.Path("calcs/fp.calc.md"), true)
	if err := CheckRevision(st, pkg); err != nil {
		t.Errorf("a draft is refused: %v", err)
	}
	os.Remove(ManifestPath(pkg))
	_, st, _ = stampOf(t, r.Path("calcs/fp.calc.md"), false)
	if err := CheckRevision(st, pkg); !errors.Is(err, ErrRevisionSigned) {
		t.Errorf("not refused from the manifest inside the package: %v", err)
	}
	r.Write("calcs/fp.calc.md", strings.Replace(changed, "revision: A", "revision: B", 1))
	r.Commit("Revision B: more flow")
	_, st, _ = stampOf(t, r.Path("calcs/fp.calc.md"), false)
	if err := CheckRevision(st, pkg); err != nil {
		t.Errorf("revision B is refused: %v", err)
	}
}

// TestRevisionUnchangedNotRefused: rendering the signed revision again
// from the same content is not refused, nor is a change before any
// signature.
func TestRevisionUnchangedNotRefused(t *testing.T) {
	r, pkg := preparedRepo(t)
	r.Write("calcs/notes.txt", "unrelated\n")
	r.Commit("An unrelated file")
	if _, st, _ := stampOf(t, r.Path("calcs/fp.calc.md"), false); CheckRevision(st, pkg) != nil {
		t.Errorf("the unchanged calc is refused: %v", CheckRevision(st, pkg))
	}
	r2 := calcRepo(t)
	pkg2 := renderFile(t, r2.Path("calcs/fp.calc.md"))
	r2.Write("calcs/fp.calc.md", strings.Replace(signCalc, "213.2", "220", 1))
	r2.Commit("More flow before any signature")
	if _, st, _ := stampOf(t, r2.Path("calcs/fp.calc.md"), false); CheckRevision(st, pkg2) != nil {
		t.Errorf("an unsigned revision is refused: %v", CheckRevision(st, pkg2))
	}
}

// TestRevisionCommittedSignedManifestRefuses: a signed manifest committed
// in the repository refuses a change under its letter even when no
// package is left in the work tree, and fills the revision table.
func TestRevisionCommittedSignedManifestRefuses(t *testing.T) {
	r, _ := preparedRepo(t)
	r.Git("add", "-f", "calcs/fp.manifest.json")
	r.Commit("Revision A prepared")
	withNotes := strings.Replace(signCalc, "revision: A\n", "revision: A\nrevisions:\n  - {letter: A, date: 2025-12-01, description: First issue}\n", 1)
	r.Write("calcs/fp.calc.md", strings.Replace(withNotes, "8 kPa", "9 kPa", 1))
	r.Commit("Lower vacuum under revision A")
	_, st, _ := stampOf(t, r.Path("calcs/fp.calc.md"), false)
	if err := CheckRevision(st); !errors.Is(err, ErrRevisionSigned) || !strings.Contains(err.Error(), "committed at") {
		t.Fatalf("not refused from the committed manifest: %v", err)
	}
	bumped := strings.Replace(withNotes, "revision: A\n", "revision: B\n", 1)
	bumped = strings.Replace(bumped, "description: First issue}\n", "description: First issue}\n  - {letter: B, date: 2025-12-20, description: Lower condenser vacuum}\n", 1)
	r.Write("calcs/fp.calc.md", strings.Replace(bumped, "8 kPa", "9 kPa", 1))
	r.Commit("Revision B")
	_, st, html := stampOf(t, r.Path("calcs/fp.calc.md"), false)
	if err := CheckRevision(st); err != nil {
		t.Fatal(err)
	}
	page := string(html)
	for _, want := range []string{
		"<tr><td>B (this package)</td><td class=\"signed\">2025-12-20</td><td>Lower condenser vacuum</td><td></td><td></td><td></td></tr>",
		"<tr><td>A</td><td class=\"signed\">2025-12-01</td><td>First issue</td><td>P. Writer</td><td></td><td></td></tr>",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("the revision table lacks %s", want)
		}
	}
	if i, j := strings.Index(page, "<h2>Commits</h2>"), strings.Index(page, "Appendix: provenance record"); i < j {
		t.Error("the git commits are not in the appendix")
	}
}

// TestSignRefusesDraft: a package rendered as a draft is never signed.
func TestSignRefusesDraft(t *testing.T) {
	r := calcRepo(t)
	_, _, html := stampOf(t, r.Path("calcs/fp.calc.md"), true)
	pkg := r.Path("calcs/fp.draft.html")
	writePkg(t, pkg, html)
	if !strings.Contains(string(html), "can never be signed") {
		t.Error("the cover does not mark the draft")
	}
	_, _, err := Sign(pkg, SignOptions{Role: "preparer", Key: newKey(t, "ed25519").path, VerifyOptions: VerifyOptions{Engine: "test"}})
	if !errors.Is(err, ErrNotVerified) || !strings.Contains(err.Error(), "--draft") {
		t.Errorf("a draft was signed or refused for another reason: %v", err)
	}
}

// TestRevisionOfOldManifestFromGit: a signed package whose manifest was
// made before manifests recorded the revision letter still refuses a
// change under its letter: the letter is read from the source at its
// commit.
func TestRevisionOfOldManifestFromGit(t *testing.T) {
	r, pkg := preparedRepo(t)
	m := packageManifest(pkg)
	m.Revision = "" // as an older engine wrote it
	file, err := ManifestFile(m)
	if err != nil {
		t.Fatal(err)
	}
	os.WriteFile(ManifestPath(pkg), file, 0o644)
	r.Write("calcs/fp.calc.md", strings.Replace(signCalc, "12.5 MPa", "13 MPa", 1))
	r.Commit("Higher discharge pressure under revision A")
	_, st, _ := stampOf(t, r.Path("calcs/fp.calc.md"), false)
	if err := CheckRevision(st, pkg); !errors.Is(err, ErrRevisionSigned) {
		t.Errorf("not refused: %v", err)
	}
}
