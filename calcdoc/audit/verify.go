package audit

import (
	"bytes"
	"errors"
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"io/fs"
	"path/filepath"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/safefile"
)

func usageErr(format string, args ...any) error {
	return &calcdoc.UsageError{Err: fmt.Errorf(format, args...)}
}

// VerifyOptions say where and how to verify a package.
type VerifyOptions struct {
	Engine string // this engine's version
	// Repo is a path inside the repository that holds the recorded commit;
	// "" means the package's own directory.
	Repo string
	// Signers is an allowed-signers file in OpenSSH's format. Without it
	// signatures are checked, but not whose keys they are.
	Signers string
	// Build is this engine's build, compared with the build the package
	// records; nil when not known (then the engine names are compared).
	Build *provenance.EngineBuild
	// Qualification is the digest of this build's qualification report,
	// checked against the one the package names; "" skips the check.
	Qualification string
}

// Verify checks a package as an auditor would: that its manifest is whole
// and matches the manifest file beside it, that the source and data files
// at the recorded commit are the ones recorded, that evaluating them again
// gives the same results and the same package byte for byte, and that each
// signature verifies, is made as the person the front matter names for its
// role and, given an allowed-signers file, with that person's key. The
// source is read from git at the manifest's commit, never from the work
// tree. Problems with the package are findings in the report; the error
// is for a verification that cannot start (a *calcdoc.UsageError).
func Verify(pkgPath string, opt VerifyOptions) (*Report, error) {
	v, err := newVerifier(pkgPath, opt)
	if err != nil {
		return nil, err
	}
	v.run()
	return v.rep, nil
}

// verifier holds the state of one verification.
type verifier struct {
	opt     VerifyOptions
	path    string
	pkg     []byte
	rep     *Report
	m       *provenance.Manifest
	repo    *provenance.Repo
	allowed provenance.AllowedSigners
	repro   *reproduction
	// sameBytes reports that the results reproduced bit for bit and the
	// package re-rendered byte for byte: a package another build made may
	// then be signed by this one, as it is exactly what that build made.
	sameBytes bool
}

// MaxPackageBytes is the largest package or manifest file verify reads.
const MaxPackageBytes = 256 << 20

func newVerifier(pkgPath string, opt VerifyOptions) (*verifier, error) {
	pkg, err := safefile.Read(pkgPath, MaxPackageBytes)
	if err != nil {
		return nil, usageErr("package: %w", err)
	}
	v := &verifier{opt: opt, path: pkgPath, pkg: pkg, rep: &Report{Package: pkgPath, Signers: opt.Signers}}
	if opt.Signers == "" {
		return v, nil
	}
	data, err := safefile.Read(opt.Signers, provenance.MaxKeyFileBytes)
	if err != nil {
		return nil, usageErr("allowed signers: %w", err)
	}
	if v.allowed, err = provenance.ParseAllowedSigners(data); err != nil {
		return nil, fmt.Errorf("allowed signers %s: %w", opt.Signers, err) // a file with errors: exit 1
	}
	return v, nil
}

// run performs the checks in order; a check that leaves nothing to compare
// ends the run.
func (v *verifier) run() {
	steps := []func() bool{
		v.readManifest, v.compareEngine, v.checkQualification, v.checkManifestFile, v.openRepo, v.checkSource, v.reproduce,
		v.compareResults, v.compareManifest, v.comparePackage, v.checkSignatures, v.checkMethods, v.noteHead,
	}
	for _, step := range steps {
		if !step() {
			return
		}
	}
}

func (v *verifier) readManifest() bool {
	m, err := ManifestOf(v.pkg)
	if err != nil {
		v.rep.add(Fails, "manifest", "%v", err)
		return false
	}
	v.m, v.rep.Manifest = m, m
	if err := m.Validate(); err != nil {
		v.rep.add(Fails, "manifest", "%v: a result in the package's manifest was changed", err)
		return true
	}
	v.rep.add(Holds, "manifest", "results digest matches the manifest's %d results", len(m.Results))
	return true
}

// checkManifestFile compares the manifest file beside the package, if
// there is one, with the manifest inside it.
func (v *verifier) checkManifestFile() bool {
	path := ManifestPath(v.path)
	data, err := safefile.Read(path, MaxPackageBytes)
	if errors.Is(err, fs.ErrNotExist) {
		v.rep.add(Note, "manifest", "no %s beside the package", filepath.Base(path))
		return true
	}
	var file *provenance.Manifest
	if err == nil {
		file, err = provenance.ParseManifest(data)
	}
	if err != nil {
		v.rep.add(Fails, "manifest", "%s: %v", filepath.Base(path), err)
		return true
	}
	a, errA := v.m.Canonical()
	b, errB := file.Canonical()
	if errA != nil || errB != nil || !bytes.Equal(a, b) {
		diffs := append(manifestDiffs(file, v.m, "the file", "the package"), resultDiffs(file.Results, v.m.Results, "the file", "the package", 5)...)
		if len(file.Signatures) != len(v.m.Signatures) {
			diffs = append(diffs, fmt.Sprintf("%d signatures in the file, %d in the package", len(file.Signatures), len(v.m.Signatures)))
		}
		v.rep.add(Fails, "manifest", "%s differs from the manifest in the package: %s", filepath.Base(path), joinOr(diffs, "a signature differs"))
		return true
	}
	v.rep.add(Holds, "manifest", "%s matches the manifest in the package", filepath.Base(path))
	return true
}

func joinOr(list []string, none string) string {
	if len(list) == 0 {
		return none
	}
	return strings.Join(list, "; ")
}

func (v *verifier) openRepo() bool {
	m := v.m
	if m.Commit == "" {
		v.rep.add(Fails, "source", "the calc was not under version control when the package was rendered: it cannot be reproduced or signed")
		return false
	}
	dir := v.opt.Repo
	if dir == "" {
		dir = filepath.Dir(v.path)
	}
	repo, err := provenance.Open(dir)
	if err != nil {
		v.rep.add(Fails, "source", "%v: run verify in a clone of the calc's repository, or give --repo DIR", err)
		return false
	}
	if _, err := repo.Resolve(m.Commit); err != nil {
		v.rep.add(Fails, "source", "commit %s is not in the repository at %s: fetch it, or give --repo DIR", m.Commit, repo.Root())
		return false
	}
	if date, err := repo.CommitDate(m.Commit); err == nil {
		v.rep.Date = date.Format("2006-01-02")
	}
	v.repo = repo
	return true
}

// checkSource checks that the commit holds the recorded source and data
// files, and that the work tree was clean.
func (v *verifier) checkSource() bool {
	m := v.m
	b, err := v.repo.ReadAt(m.Commit, m.Source)
	if err != nil {
		v.rep.add(Fails, "source", "%v", err)
		return false
	}
	if got := provenance.BlobHash(b); got != m.SourceHash {
		v.rep.add(Fails, "source", "the manifest records blob %s for %s, but commit %s holds blob %s: the package was rendered from uncommitted changes, or the repository's objects were altered",
			m.SourceHash, m.Source, shortHash(m.Commit), got)
		return false
	}
	v.rep.add(Holds, "source", "%s at commit %s is blob %s, as recorded", m.Source, shortHash(m.Commit), m.SourceHash)
	ok := v.checkData()
	if !m.Clean {
		v.rep.add(Fails, "source", "the work tree had uncommitted changes when the package was rendered (clean: false): commit them and render again")
	}
	return ok
}

func (v *verifier) checkData() bool {
	ok := true
	for _, f := range v.m.Data {
		got, err := v.repo.BlobHashAt(v.m.Commit, f.Path) // each blob read and hashed once
		switch {
		case err != nil:
			v.rep.add(Fails, "data", "%v", err)
			ok = false
		case got != f.Hash:
			v.rep.add(Fails, "data", "the manifest records blob %s for %s, but commit %s holds blob %s", f.Hash, f.Path, shortHash(v.m.Commit), got)
			ok = false
		default:
			v.rep.add(Holds, "data", "%s at the commit is blob %s, as recorded", f.Path, f.Hash)
		}
	}
	return ok
}

func (v *verifier) reproduce() bool {
	r, err := reproduce(v.repo, v.m, v.opt.Engine)
	if err != nil {
		v.rep.add(Fails, "results", "cannot evaluate the calc again: %v", err)
		return false
	}
	v.repro = r
	f := r.doc.Front
	v.rep.Calc = strings.TrimSpace(fmt.Sprintf("%s revision %s, %s", f.Number, f.Revision, f.Title))
	v.rep.Revision = f.Revision
	return true
}

func (v *verifier) compareManifest() bool {
	want, err1 := v.m.Digest()
	got, err2 := v.repro.record.Manifest.Digest()
	if err := errors.Join(err1, err2); err != nil {
		v.rep.add(Fails, "manifest", "%v", err)
		return true
	}
	if want != got {
		diffs := manifestDiffs(v.m, v.repro.record.Manifest, "the package", "the reproduction")
		v.rep.add(Fails, "manifest", "the manifest does not reproduce: %s", joinOr(diffs, "the results differ"))
		return true
	}
	v.rep.add(Holds, "manifest", "the manifest reproduces; digest %s", got)
	return true
}

func (v *verifier) comparePackage() bool {
	html, err := v.repro.render(v.opt.Engine, v.repro.record)
	if err != nil {
		v.rep.add(Fails, "package", "cannot render the reproduction: %v", err)
		return true
	}
	if !bytes.Equal(html, v.pkg) {
		line, got, want := firstDifference(v.pkg, html)
		verdict := Fails
		if v.rep.Different {
			verdict = Note // another engine may print a last digit or a page differently
		}
		v.rep.add(verdict, "package", "the package differs from its reproduction at line %d:\n  package:      %s\n  reproduction: %s", line, got, want)
		return true
	}
	v.rep.add(Holds, "package", "the package re-rendered from the commit is byte-identical (%d bytes)", len(html))
	v.sameBytes = v.rep.Reproduction == ReproducedExact
	return true
}

// designCheck is a check line with its verdict and, for each comparison,
// both sides in one unit and the margin.
func designCheck(d *calcdoc.Doc, it *calcdoc.Item) DesignCheck {
	c := DesignCheck{Line: it.Stmt.Line, Desc: it.Stmt.Desc, Pass: it.Outcome.Pass}
	if c.Desc == "" {
		c.Desc = it.Stmt.Expr
	}
	c.Detail = d.CheckText(it)
	return c
}
