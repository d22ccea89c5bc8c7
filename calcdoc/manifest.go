package calcdoc

import (
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"sync"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/units"
)

// Stamp is what a package records and shows of its provenance: the
// manifest, what the cover and the appendix print beside it, and the
// verdict on each signature. Everything in it comes from the calc, the
// engine and git, never from the clock, so the same source at the same
// commit gives the same stamp. calcdoc only shows a stamp; the audit
// package builds it from git and checks its signatures.
type Stamp struct {
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
	// date every signature of the package carries.
	Date string
	// Signatures holds the verdict on each signature of the manifest, in
	// manifest order.
	Signatures []SignatureState
	// SignedRevisions are the earlier revisions whose signed packages the
	// repository holds at the commit, for the revision table.
	SignedRevisions []SignedRevision
	// Status is the cover stamp the valid signatures reach: DRAFT,
	// PREPARED, CHECKED or APPROVED ("" shows as DRAFT).
	Status string
}

// SignatureState is a signature of a package and whether it holds.
type SignatureState struct {
	Sig    provenance.Signature
	Valid  bool
	Reason string // why it does not hold
	// Checked reports a valid signature whose key an allowed-signers file
	// allows for the signer at the signing time; a valid signature not
	// Checked is intact, but nobody said whose key it is.
	Checked bool
	// Exception is the firm's permission, in words, for this signer to
	// hold an earlier role too, or "".
	Exception string
}

// Unversioned is the stamp of an evaluated calc that no repository holds:
// the manifest names the file by its base name, and nothing is signed. It
// reads nothing: the stamp of a calc in git comes from audit.Provenance.
func (d *Doc) Unversioned(engine string) (*Stamp, error) {
	m, err := d.Manifest(engine)
	if err != nil {
		return nil, err
	}
	m.Source, m.SourceHash = filepath.Base(d.Path), provenance.BlobHash(d.Src)
	return &Stamp{Manifest: m}, nil
}

// Manifest is the part of the manifest that the evaluation alone decides:
// engine, formulations, data files, results and their digest. The source,
// commit and signatures are for the caller to add.
func (d *Doc) Manifest(engine string) (*provenance.Manifest, error) {
	m := &provenance.Manifest{
		Engine:             "vouch " + engine,
		Formulation:        strings.Join(d.formulationNames(), "; "),
		FormulationVersion: props.IF97Version,
		Data:               d.manifestData(),
		Results:            d.manifestResults(),
		Signatures:         []provenance.Signature{},
		Uses:               d.Uses(),
		Revision:           d.Front.Revision,
	}
	digest, err := provenance.ResultsDigest(m.Results)
	if err != nil {
		return nil, err
	}
	m.ResultsDigest = digest
	return m, nil
}

// manifestData lists the settings file and the firm's logo, when read, and
// the data files the calc read, in order of first use.
func (d *Doc) manifestData() []provenance.DataFile {
	out := append([]provenance.DataFile{}, d.settingsData()...)
	if d.logoData != nil {
		out = append(out, *d.logoData)
	}
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

// Uses lists, sorted, the property functions the calc called (water,
// water_sat, fluid, fluid_sat, fluid_crit), "fluid:NAME" for each fluid it
// named, "gauge units" when a line writes a gauge pressure, and "sweep"
// when it has a sweep: what an erratum is matched against.
func (d *Doc) Uses() []string {
	var out []string
	for _, it := range d.Items {
		if it.Outcome == nil {
			continue
		}
		if !contains(out, "gauge units") && writesGauge(it.Stmt) {
			out = append(out, "gauge units")
		}
		for _, u := range it.Outcome.Uses {
			if !contains(out, u) {
				out = append(out, u)
			}
		}
	}
	if len(d.Sweeps) > 0 {
		out = append(out, "sweep")
	}
	sort.Strings(out)
	return out
}

// writesGauge reports whether a statement writes a gauge pressure.
func writesGauge(s *eval.Stmt) bool {
	for _, l := range s.Literals() {
		if l.Unit.Kind == units.Gauge {
			return true
		}
	}
	return false
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// manifestResults lists every result of the evaluated calc for the
// manifest, in file order: each definition that holds a quantity, with its
// SI value and SI unit, and each check as "check:LINE" with 1 for PASS and
// 0 for FAIL, and after each quantity with an uncertainty (stated or
// propagated) its standard uncertainty as "u:NAME". The manifest's results
// digest covers all of them.
func (d *Doc) manifestResults() []provenance.Result {
	out := []provenance.Result{}
	for _, it := range d.Items {
		o := it.Outcome
		if o == nil || o.Skipped {
			continue
		}
		if r, ok := resultOf(it); ok {
			out = append(out, r)
			if u, _, _, has := d.StdUnc(it); has && !it.Inline {
				out = append(out, provenance.Result{Name: "u:" + r.Name, SI: u, Unit: r.Unit})
			}
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

// siUnit is the SI unit text of a dimension, "" for a pure number; each
// dimension's text is built once (siUnits).
func siUnit(d units.Dim) string {
	if s, ok := siUnits.Load(d); ok {
		return s.(string)
	}
	s := units.SIUnitText(d)
	if s == "1" {
		s = ""
	}
	siUnits.Store(d, s)
	return s
}

// siUnits holds siUnit's texts, one per dimension met, shared by every
// render (a register renders on all cores, hence sync.Map).
var siUnits sync.Map
