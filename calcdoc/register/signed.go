package register

import (
	"crypto/sha256"
	"encoding/hex"
	"path/filepath"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/audit"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/safefile"
)

// Signed is the state of the signed package kept beside a calc
// (NAME.html beside NAME.calc.md), as vouch verify finds it.
type Signed struct {
	Package string `json:"package"` // file name, beside the calc
	Key     string `json:"key"`     // hash of the package, its manifest file, the signers file and the engine
	// Status is the stamp its valid signatures reach: DRAFT, PREPARED,
	// CHECKED or APPROVED.
	Status string `json:"status"`
	// Problem is the first thing verify found wrong with the package,
	// "" when it verifies.
	Problem  string `json:"problem,omitempty"`
	Revision string `json:"revision,omitempty"` // the revision letter it was rendered under
	// Engine, Build and Uses are what its manifest records of the engine
	// that made it and of the functions its calc used.
	Engine string                  `json:"engine,omitempty"`
	Build  *provenance.EngineBuild `json:"engine_build,omitempty"`
	Uses   []string                `json:"uses,omitempty"`
	// Errata are the known engine errors that touch the package, each
	// with the reason (Options.Errata); matched again on every run.
	Errata     []string `json:"errata,omitempty"`
	Commit     string   `json:"commit,omitempty"`      // the commit it was rendered from
	SourceHash string   `json:"source_hash,omitempty"` // the source it records
	DataHashes []string `json:"data_hashes,omitempty"` // the data files it records
	// Stale says why the package no longer matches the calc's source or
	// data files; "" when it matches.
	Stale string `json:"stale,omitempty"`
}

// signedStatus finds the signed package beside a calc, verifies it unless
// the cache already did for the same bytes, and compares it with the
// current source.
func (w *worker) signedStatus(e *Entry, path string, src []byte, old *Entry) {
	pkg := filepath.Join(filepath.Dir(path), calcdoc.PackageName(path))
	html, err := safefile.Read(pkg, audit.MaxPackageBytes)
	if err != nil {
		e.Signed = nil
		return
	}
	key := w.signedKey(html, pkg)
	switch {
	case old != nil && old.Signed != nil && old.Signed.Key == key:
		s := *old.Signed
		e.Signed = &s
	default:
		e.Signed = w.verify(pkg, key)
	}
	e.Signed.Stale = staleness(e.Signed, src, e.Data)
	e.Signed.Errata = nil
	if w.run.opt.Errata != nil {
		e.Signed.Errata = w.run.opt.Errata(e.Signed.Engine, e.Signed.Build, e.Signed.Uses)
	}
}

// signedKey hashes what the verification of a package depends on outside
// git: the package, the manifest file beside it, the allowed-signers file
// and the engine.
func (w *worker) signedKey(html []byte, pkg string) string {
	h := sha256.New()
	manifest, _ := safefile.Read(audit.ManifestPath(pkg), audit.MaxPackageBytes)
	var signers []byte
	if w.run.opt.Signers != "" {
		signers, _ = safefile.Read(w.run.opt.Signers, provenance.MaxKeyFileBytes)
	}
	for _, part := range [][]byte{[]byte(cacheFormat), []byte(w.run.opt.engineKey()), html, manifest, signers} {
		sum := sha256.Sum256(part)
		h.Write(sum[:])
	}
	return hex.EncodeToString(h.Sum(nil))
}

// verify runs vouch verify on the package.
func (w *worker) verify(pkg, key string) *Signed {
	s := &Signed{Package: filepath.Base(pkg), Key: key, Status: "DRAFT"}
	rep, err := audit.Verify(pkg, audit.VerifyOptions{Engine: w.run.opt.Engine, Signers: w.run.opt.Signers, Build: w.run.opt.Build, Qualification: w.run.opt.Qualification})
	if err != nil {
		s.Problem = err.Error()
		return s
	}
	if rep.Status != "" {
		s.Status = rep.Status
	}
	if fails := rep.Failures(); len(fails) > 0 {
		s.Problem = fails[0].Topic + ": " + fails[0].Text
	}
	s.Revision = rep.Revision
	if m := rep.Manifest; m != nil {
		if m.Revision != "" {
			s.Revision = m.Revision
		}
		s.Commit, s.SourceHash = m.Commit, m.SourceHash
		s.Engine, s.Build, s.Uses = m.Engine, m.Build, m.Uses
		for _, d := range m.Data {
			s.DataHashes = append(s.DataHashes, d.Hash)
		}
	}
	return s
}

// staleness says why a signed package no longer matches the calc: its
// source or a data file changed since it was rendered.
func staleness(s *Signed, src []byte, data []DataRef) string {
	if s.SourceHash == "" {
		return ""
	}
	if s.SourceHash != blobHash(src) {
		return "the source has changed since commit " + short(s.Commit)
	}
	now := map[string]int{}
	for _, d := range data {
		now[d.Hash]++
	}
	for _, h := range s.DataHashes {
		if now[h] == 0 {
			return "a data file has changed since commit " + short(s.Commit)
		}
		now[h]--
	}
	if len(s.DataHashes) != len(data) {
		return "the calc reads other data files than at commit " + short(s.Commit)
	}
	return ""
}

func short(h string) string {
	if len(h) > 12 {
		return h[:12]
	}
	return h
}
