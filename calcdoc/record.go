package calcdoc

import (
	"errors"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/units"
)

// Record is the provenance of a package: its manifest and what the cover
// and the appendix print beside it. Everything in it comes from the calc,
// the engine and git, never from the clock, so the same source at the same
// commit gives the same record.
type Record struct {
	Manifest *provenance.Manifest
	// Versioned reports a calc in a git repository with at least one
	// commit; only a versioned calc can be signed or reproduced.
	Versioned bool
	// Committed reports that the source evaluated is the blob the commit
	// holds for it.
	Committed bool
	// History is the calc file's revisions up to the commit, newest first.
	History []provenance.Revision
	// Date is the committer date of the commit, RFC 3339 in UTC. It is the
	// date every signature of the package carries (see Sign).
	Date string
}

// Provenance records where the evaluated calc comes from: the repository
// that holds the file at d.Path, its HEAD commit, whether the file and the
// tracked work tree match that commit, and the file's history. Outside a
// repository (or in one without commits) the record is unversioned and
// names the file by its base name. engine is the engine's version.
func (d *Doc) Provenance(engine string) (*Record, error) {
	m, err := d.baseManifest(engine)
	if err != nil {
		return nil, err
	}
	m.Source, m.SourceHash = filepath.Base(d.Path), provenance.BlobHash(d.Src)
	rec := &Record{Manifest: m}
	repo, err := provenance.Open(d.Path)
	if errors.Is(err, provenance.ErrNotInRepo) {
		return rec, nil
	}
	if err != nil {
		return nil, err
	}
	head, err := repo.Head()
	if errors.Is(err, provenance.ErrNoCommits) {
		return rec, nil
	}
	if err != nil {
		return nil, err
	}
	return rec, d.recordWorkTree(repo, head, rec)
}

// recordWorkTree fills the record of a calc read from the work tree of repo
// whose HEAD is head.
func (d *Doc) recordWorkTree(repo *provenance.Repo, head string, rec *Record) error {
	rel, err := repo.Rel(d.Path)
	if err != nil {
		return err
	}
	_, committed, _, err := repo.FileState(rel)
	if err != nil {
		return err
	}
	clean, err := repo.Clean()
	if err != nil {
		return err
	}
	dataClean, err := d.dataCommitted(repo)
	if err != nil {
		return err
	}
	m := rec.Manifest
	m.Source, m.Commit = rel, head
	rec.Committed = committed == m.SourceHash
	m.Clean = clean && rec.Committed && dataClean
	return rec.addHistory(repo)
}

// dataCommitted reports whether every data file the calc read is the blob
// HEAD holds for it.
func (d *Doc) dataCommitted(repo *provenance.Repo) (bool, error) {
	for _, f := range d.DataFiles {
		_, committed, _, err := repo.FileState(f.Path)
		if err != nil {
			return false, err
		}
		if committed != f.Hash {
			return false, nil
		}
	}
	return true, nil
}

// addHistory sets the versioned record's history and date from git.
func (rec *Record) addHistory(repo *provenance.Repo) error {
	m := rec.Manifest
	hist, err := repo.HistoryAt(m.Commit, m.Source)
	if err != nil {
		return err
	}
	date, err := repo.CommitDate(m.Commit)
	if err != nil {
		return err
	}
	rec.Versioned, rec.History, rec.Date = true, hist, date.Format(time.RFC3339)
	return nil
}

// baseManifest is the part of the manifest that the evaluation alone
// decides: engine, formulations, results and their digest.
func (d *Doc) baseManifest(engine string) (*provenance.Manifest, error) {
	m := &provenance.Manifest{
		Engine:             "vouch " + engine,
		Formulation:        strings.Join(d.formulationNames(), "; "),
		FormulationVersion: props.IF97Version,
		Data:               d.manifestData(),
		Results:            d.ManifestResults(),
		Signatures:         []provenance.Signature{},
	}
	digest, err := provenance.ResultsDigest(m.Results)
	if err != nil {
		return nil, err
	}
	m.ResultsDigest = digest
	return m, nil
}

// manifestData lists the data files the calc read, in order of first use.
func (d *Doc) manifestData() []provenance.DataFile {
	out := []provenance.DataFile{}
	for _, f := range d.DataFiles {
		out = append(out, provenance.DataFile{Path: f.Path, Hash: f.Hash})
	}
	return out
}

// formulationNames lists the engine's water formulation, IAPWS-IF97, and
// after it any other property formulation the calc used, in first use.
func (d *Doc) formulationNames() []string {
	out := []string{props.IF97}
	for _, it := range d.Items {
		if it.Outcome == nil {
			continue
		}
		for _, s := range it.Outcome.Sources {
			if !contains(out, s) {
				out = append(out, s)
			}
		}
	}
	return out
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// ManifestResults lists every result of the evaluated calc for the
// manifest, in file order: each definition that holds a quantity, with its
// SI value and SI unit, and each check as "check:LINE" with 1 for PASS and
// 0 for FAIL. The manifest's results digest covers all of them.
func (d *Doc) ManifestResults() []provenance.Result {
	out := []provenance.Result{}
	for _, it := range d.Items {
		o := it.Outcome
		if o == nil || o.Skipped {
			continue
		}
		if r, ok := resultOf(it); ok {
			out = append(out, r)
		}
	}
	return out
}

// resultOf is the manifest result of one evaluated item, if it has one.
func resultOf(it *Item) (provenance.Result, bool) {
	if it.Inline {
		return provenance.Result{}, false
	}
	if it.Stmt.Kind == eval.Check {
		pass := 0.0
		if it.Outcome.Pass {
			pass = 1
		}
		return provenance.Result{Name: "check:" + strconv.Itoa(it.Stmt.Line), SI: pass}, true
	}
	q, ok := it.Outcome.Value.(units.Quantity)
	if !ok || it.Stmt.Kind != eval.Def {
		return provenance.Result{}, false
	}
	return provenance.Result{Name: it.Stmt.Name, SI: q.V, Unit: siUnit(q.D)}, true
}

// siUnit is the SI unit text of a dimension, "" for a pure number.
func siUnit(d units.Dim) string {
	if s := units.SIUnitText(d); s != "1" {
		return s
	}
	return ""
}
