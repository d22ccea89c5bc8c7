package audit

import (
	"errors"
	"fmt"
	"path"
	"path/filepath"
	"sort"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/safefile"
)

// manifestRel is the repository path of the manifest file of the package
// kept beside a calc: NAME.manifest.json beside NAME.calc.md.
func manifestRel(source string) string {
	return path.Join(path.Dir(source), strings.TrimSuffix(calcdoc.PackageName(source), ".html")+".manifest.json")
}

// signedRevisions lists the revisions of the calc whose signed packages
// the repository holds up to the commit: every committed version of the
// manifest file beside the calc that records a revision letter and
// signatures, with the signers whose signatures verify over that manifest
// (their keys are not checked against a signers file here). The newest
// manifest of each letter counts. The list comes from the commit alone, so
// a package rendered again from it shows the same table.
func signedRevisions(repo *provenance.Repo, m *provenance.Manifest) ([]calcdoc.SignedRevision, error) {
	rel := manifestRel(m.Source)
	hist, err := repo.HistoryAt(m.Commit, rel)
	if err != nil {
		return nil, err
	}
	var out []calcdoc.SignedRevision
	seen := map[string]bool{}
	for _, h := range hist {
		data, err := repo.ReadAt(h.Commit, rel)
		if err != nil {
			continue // deleted in this commit
		}
		pm, err := provenance.ParseManifest(data)
		if err != nil || pm.Revision == "" || len(pm.Signatures) == 0 || seen[pm.Revision] {
			continue
		}
		seen[pm.Revision] = true
		out = append(out, signedRevisionOf(pm))
	}
	return out, nil
}

// signedRevisionOf is a signed manifest's entry for the revision table.
func signedRevisionOf(pm *provenance.Manifest) calcdoc.SignedRevision {
	s := calcdoc.SignedRevision{Letter: pm.Revision, Commit: pm.Commit, SourceHash: pm.SourceHash, ResultsDigest: pm.ResultsDigest,
		Signers: map[string]string{}, Dates: map[string]string{}}
	for _, sig := range pm.Signatures {
		if _, err := pm.VerifySignature(sig); err != nil || s.Signers[sig.Role] != "" {
			continue
		}
		s.Signers[sig.Role], s.Dates[sig.Role] = sig.Name, sig.Date
	}
	return s
}

// ErrRevisionSigned is returned by CheckRevision when a calc has changed
// under a revision letter that already has a signed package.
var ErrRevisionSigned = errors.New("revision already signed")

// CheckRevision refuses new content under a revision letter that already
// has a signature. It reads the manifest of each existing package given
// (the package at the output path, and the one kept beside the calc) and
// the committed manifest files beside the calc: one that records the same
// source path and revision letter, carries a signature, and differs from
// the new manifest in the source, the data files or the results means the
// calc changed after that revision was signed. A package rendered with
// --draft is not checked: it can never be signed.
func CheckRevision(st *calcdoc.Stamp, packages ...string) error {
	m := st.Manifest
	if m.Draft || m.Revision == "" {
		return nil
	}
	for _, pkg := range packages {
		old := packageManifest(pkg)
		if old == nil {
			continue
		}
		if old.Revision == "" {
			old.Revision = revisionAt(filepath.Dir(pkg), old)
		}
		if err := sameRevisionChanged(old, m, filepath.Base(pkg)); err != nil {
			return err
		}
	}
	for _, r := range st.SignedRevisions {
		if r.Letter != m.Revision || len(r.Signers) == 0 {
			continue
		}
		old := &provenance.Manifest{Source: m.Source, Revision: r.Letter, SourceHash: r.SourceHash, ResultsDigest: r.ResultsDigest, Data: m.Data}
		for role, name := range r.Signers {
			old.Signatures = append(old.Signatures, provenance.Signature{Role: role, Name: name, Date: r.Dates[role]})
		}
		sort.Slice(old.Signatures, func(i, j int) bool { return roleIndex(old.Signatures[i].Role) < roleIndex(old.Signatures[j].Role) })
		if err := sameRevisionChanged(old, m, "committed at "+shortHash(r.Commit)); err != nil {
			return err
		}
	}
	return nil
}

// sameRevisionChanged is the refusal for a signed manifest of the same
// calc and revision whose content differs from the new one, or nil.
func sameRevisionChanged(old, m *provenance.Manifest, where string) error {
	if old.Source != m.Source || old.Revision != m.Revision || len(old.Signatures) == 0 {
		return nil
	}
	var what []string
	if old.SourceHash != m.SourceHash {
		what = append(what, "the source (blob "+shortHash(old.SourceHash)+" then, "+shortHash(m.SourceHash)+" now)")
	}
	if dataText(old.Data) != dataText(m.Data) {
		what = append(what, "the data files")
	}
	if old.ResultsDigest != m.ResultsDigest {
		what = append(what, "the results")
	}
	if len(what) == 0 {
		return nil
	}
	var signed []string
	for _, s := range old.Signatures {
		signed = append(signed, s.Role+" "+s.Name+" on "+day(s.Date))
	}
	return &calcdoc.UsageError{Err: fmt.Errorf("%w: revision %s of %s has a signed package (%s, signed by %s), and %s changed since: set a new revision letter in the front matter (revision:, and an entry under revisions:) and render again, or render with --draft for a package that can never be signed",
		ErrRevisionSigned, m.Revision, m.Source, where, strings.Join(signed, ", "), strings.Join(what, " and "))}
}

// SignedUnchanged reports whether the package at pkg is a signed package
// of the same calc and revision as the new stamp, with the same source,
// data files and results: writing the new, unsigned package over it would
// lose its signatures and gain nothing.
func SignedUnchanged(st *calcdoc.Stamp, pkg string) bool {
	m := st.Manifest
	old := packageManifest(pkg)
	if old == nil || m.Draft || len(old.Signatures) == 0 {
		return false
	}
	return old.Source == m.Source && old.Revision == m.Revision && old.SourceHash == m.SourceHash &&
		dataText(old.Data) == dataText(m.Data) && old.ResultsDigest == m.ResultsDigest
}

// packageManifest reads the manifest of an existing package: the manifest
// file beside it, or the one embedded in it when there is no such file;
// nil when there is no package or it holds no readable manifest.
func packageManifest(pkg string) *provenance.Manifest {
	if data, err := safefile.Read(ManifestPath(pkg), MaxPackageBytes); err == nil {
		if m, err := provenance.ParseManifest(data); err == nil {
			return m
		}
	}
	html, err := safefile.Read(pkg, MaxPackageBytes)
	if err != nil {
		return nil
	}
	m, err := ManifestOf(html)
	if err != nil {
		return nil
	}
	return m
}

// revisionAt is the revision letter a manifest made before manifests
// recorded it was rendered under: the front matter of its source at its
// commit, read from the repository that holds dir; "" when it cannot be
// read.
func revisionAt(dir string, m *provenance.Manifest) string {
	if m.Commit == "" {
		return ""
	}
	repo, err := provenance.Open(dir)
	if err != nil {
		return ""
	}
	src, err := repo.ReadAt(m.Commit, m.Source)
	if err != nil {
		return ""
	}
	return calcdoc.Read(m.Source, src).Front.Revision
}
