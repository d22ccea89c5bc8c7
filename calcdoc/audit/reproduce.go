package audit

import (
	"bytes"
	"errors"
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"html"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// manifestStart opens the element that holds the manifest in a package. The
// template writes the canonical JSON inside it as escaped text, which needs
// no script to read; the calc's own prose cannot forge the element, since
// raw HTML is off and every "<" from the calc file is escaped.
const manifestStart = `<pre class="manifest" id="manifest">`

// ManifestOf reads the manifest embedded in a package.
func ManifestOf(pkg []byte) (*provenance.Manifest, error) {
	start := []byte(manifestStart)
	i := bytes.Index(pkg, start)
	if i < 0 {
		return nil, errors.New("the package holds no manifest: it is not a vouch package")
	}
	rest := pkg[i+len(start):]
	if bytes.Contains(rest, start) {
		return nil, errors.New("the package holds two manifests")
	}
	j := bytes.Index(rest, []byte("</pre>"))
	if j < 0 {
		return nil, errors.New("the package's manifest is not closed")
	}
	return provenance.ParseManifest([]byte(html.UnescapeString(string(rest[:j]))))
}

// ManifestPath is the manifest file written beside a package:
// NAME.manifest.json for NAME.html.
func ManifestPath(pkgPath string) string {
	return strings.TrimSuffix(pkgPath, ".html") + ".manifest.json"
}

// ManifestFile returns the bytes of the manifest file written beside a
// package: the manifest's canonical JSON and a final newline.
func ManifestFile(m *provenance.Manifest) ([]byte, error) {
	b, err := m.Canonical()
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// reproduction is a calc evaluated again from git, as a manifest records
// it: the source and data files as the recorded commit holds them, not as
// the work tree does.
type reproduction struct {
	repo     *provenance.Repo
	commit   string
	src      []byte
	doc      *calcdoc.Doc
	record   *calcdoc.Stamp // the rebuilt record, with the package's clean flag and signatures
	trust    *trust         // the commit's signers and settings
	rendered bool           // doc's Markdown tree has been rendered
}

// reproduce reads the manifest's source at its commit, evaluates it and
// rebuilds the record. An error means there is nothing to compare: the
// commit or the file is missing, or the source has errors.
func reproduce(repo *provenance.Repo, m *provenance.Manifest, engine string) (*reproduction, error) {
	src, err := repo.ReadAt(m.Commit, m.Source)
	if err != nil {
		return nil, err
	}
	d := evaluateAt(repo, m.Commit, m.Source, src)
	if len(d.Errors) > 0 {
		return nil, fmt.Errorf("%s at commit %s has errors:\n%s", m.Source, shortHash(m.Commit), d.Errors.Format(m.Source, src))
	}
	rm, err := d.Manifest(engine)
	if err != nil {
		return nil, err
	}
	rm.Source, rm.SourceHash, rm.Commit, rm.Clean = m.Source, provenance.BlobHash(src), m.Commit, m.Clean
	// Who made the package is as recorded; verify compares it with this
	// engine apart (compareEngine, checkQualification).
	rm.Engine, rm.Build, rm.Qualification, rm.Draft = m.Engine, m.Build, m.Qualification, m.Draft
	rm.Signatures = append([]provenance.Signature{}, m.Signatures...)
	tr, err := loadTrust(repo, m.Commit)
	if err != nil {
		return nil, err
	}
	tr.record(rm)
	rec := &calcdoc.Stamp{Manifest: rm, Committed: true}
	if err := addHistory(repo, rec); err != nil {
		return nil, err
	}
	check(d, rec, tr)
	return &reproduction{repo: repo, commit: m.Commit, src: src, doc: d, record: rec, trust: tr}, nil
}

// evaluateAt reads and evaluates a calc from its bytes at a commit: rel is
// its path in the repository, and data files are read from the commit,
// not from the work tree.
func evaluateAt(repo *provenance.Repo, commit, rel string, src []byte) *calcdoc.Doc {
	return calcdoc.ReadIn(repo.CommitFS(commit), repo.Root(), rel, src)
}

// render renders the reproduction with a stamp, whose verdicts it sets
// first. Rendering changes a Doc's Markdown tree, so each later call
// evaluates the source afresh.
func (r *reproduction) render(engine string, rec *calcdoc.Stamp) ([]byte, error) {
	d := r.doc
	if r.rendered {
		d = evaluateAt(r.repo, r.commit, r.doc.Rel, r.src)
	}
	r.rendered = true
	check(d, rec, r.trust)
	pkg, err := d.Render(calcdoc.RenderOptions{Engine: engine, Stamp: rec})
	if err != nil {
		return nil, err
	}
	return pkg.HTML, nil
}

// shortHash abbreviates a commit hash to 12 hex digits, as reports show it.
func shortHash(h string) string {
	if len(h) > 12 {
		return h[:12]
	}
	return h
}

// day is the date part of an RFC 3339 time.
func day(t string) string {
	if len(t) >= 10 {
		return t[:10]
	}
	return t
}
