package calcdoc

import (
	"bytes"
	"errors"
	"fmt"
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
	doc      *Doc
	record   *Record // the rebuilt record, with the package's clean flag and signatures
	rendered bool    // doc's Markdown tree has been rendered
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
	rm, err := d.baseManifest(engine)
	if err != nil {
		return nil, err
	}
	rm.Source, rm.SourceHash, rm.Commit, rm.Clean = m.Source, provenance.BlobHash(src), m.Commit, m.Clean
	rm.Signatures = append([]provenance.Signature{}, m.Signatures...)
	rec := &Record{Manifest: rm, Committed: true}
	if err := rec.addHistory(repo); err != nil {
		return nil, err
	}
	return &reproduction{repo: repo, commit: m.Commit, src: src, doc: d, record: rec}, nil
}

// evaluateAt reads and evaluates a calc from its bytes at a commit: rel is
// its path in the repository, and data files are read from the commit,
// not from the work tree.
func evaluateAt(repo *provenance.Repo, commit, rel string, src []byte) *Doc {
	return ReadIn(repo.CommitFS(commit), repo.Root(), rel, src)
}

// render renders the reproduction with a record. Rendering changes a
// Doc's Markdown tree, so each later call evaluates the source afresh.
func (r *reproduction) render(engine string, rec *Record) ([]byte, error) {
	d := r.doc
	if r.rendered {
		d = evaluateAt(r.repo, r.commit, r.doc.Rel, r.src)
	}
	r.rendered = true
	return d.Render(RenderOptions{Engine: engine, Record: rec})
}
