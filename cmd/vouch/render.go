package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"time"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/audit"
)

func cmdRender(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("render", stderr)
	outDir := fs.String("o", "", "directory for the packages (default: beside each calc)")
	pdf := fs.Bool("pdf", false, "also print each package to PDF with headless Chromium")
	draft := fs.Bool("draft", false, "render a draft (NAME.draft.html) that is marked DRAFT and can never be signed")
	files, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(files) == 0 {
		fmt.Fprintln(stderr, "usage: vouch render FILE... [-o DIR] [--pdf]")
		return exitUsage
	}
	files, err = distinctPackages(files, *outDir)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	code := exitOK
	for _, path := range files {
		c := renderOne(path, renderFlags{outDir: *outDir, pdf: *pdf, draft: *draft}, stdout, stderr)
		code = max(code, c)
	}
	return code
}

// renderFlags are the options of vouch render.
type renderFlags struct {
	outDir     string
	pdf, draft bool
}

// renderOne evaluates and renders one calc; a calc with errors, or with
// new content under a revision letter that is already signed, writes
// nothing and leaves an earlier package untouched.
func renderOne(path string, fl renderFlags, stdout, stderr io.Writer) int {
	d, err := loadCalc(path, stderr)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	if len(d.Errors) > 0 {
		fmt.Fprint(stderr, d.Errors.Format(d.Path, d.Src))
		fmt.Fprintf(stderr, "vouch: %s has errors; no package written\n", path)
		return exitErrors
	}
	st, err := audit.Provenance(d, Version)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %s: %v\n", path, err)
		return exitErrors
	}
	qual, err := qualification()
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	dest := packagePath(path, fl.outDir)
	if fl.draft {
		dest = strings.TrimSuffix(dest, ".html") + ".draft.html"
	}
	pkg, err := d.Render(calcdoc.RenderOptions{Engine: Version, Stamp: st, Build: thisBuild(), Qualification: qual, Draft: fl.draft})
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %s: %v\n", path, err)
		return exitErrors
	}
	if err := audit.CheckRevision(st, dest, packagePath(path, "")); err != nil {
		fmt.Fprintf(stderr, "vouch: %v; no package written\n", err)
		return exitErrors
	}
	if audit.SignedUnchanged(st, dest) {
		fmt.Fprintf(stdout, "kept %s: it is the signed package of revision %s and the calc has not changed (render --draft for an unsigned copy)\n", dest, st.Manifest.Revision)
		return failedCode(d, stderr)
	}
	if err := writePackage(dest, pkg); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	fmt.Fprintf(stdout, "wrote %s\n", dest)
	if fl.pdf {
		p, err := writePDF(dest)
		if err == nil {
			err = archivePDF(p, pdfMetaOf(d, st))
		}
		if err != nil {
			fmt.Fprintf(stderr, "vouch: %v\n", err)
			return exitErrors
		}
		fmt.Fprintf(stdout, "wrote %s\n", p)
	}
	return failedCode(d, stderr)
}

// failedCode is the exit code of a calc rendered without errors: 3 when a
// check fails, after naming the failing checks on stderr.
func failedCode(d *calcdoc.Doc, stderr io.Writer) int {
	if d.Failed() {
		reportFailedChecks(d, stderr)
		return exitFailed
	}
	return exitOK
}

// reportFailedChecks names the design checks that fail, each with its line,
// description and margin, after a package that records them is written.
func reportFailedChecks(d *calcdoc.Doc, w io.Writer) {
	var failed []*calcdoc.Item
	for _, it := range d.Checks() {
		if !it.Outcome.Pass {
			failed = append(failed, it)
		}
	}
	n := len(d.Checks())
	fmt.Fprintf(w, "vouch: %s: %d of %d design %s FAIL (the package records them):\n", d.Path, len(failed), n, pluralWord(n, "check"))
	for _, it := range failed {
		desc := it.Stmt.Desc
		if desc == "" {
			desc = it.Stmt.Expr
		}
		line := fmt.Sprintf("  FAIL  line %d  %s", it.Stmt.Line, desc)
		if t := d.CheckText(it); t != "" {
			line += " (" + t + ")"
		}
		fmt.Fprintln(w, line)
	}
}

// pluralWord is word, with an s unless n is 1.
func pluralWord(n int, word string) string {
	if n == 1 {
		return word
	}
	return word + "s"
}

// distinctPackages refuses, before anything is written, two calcs whose
// packages would be the same file (a/x.calc.md and b/x.calc.md with -o
// out); a calc named twice is rendered once.
func distinctPackages(files []string, outDir string) ([]string, error) {
	byDest := map[string]string{}
	var out []string
	for _, f := range files {
		dest, _ := filepath.Abs(packagePath(f, outDir))
		src, _ := filepath.Abs(f)
		if prev, ok := byDest[dest]; ok {
			if prev == src {
				continue
			}
			return nil, fmt.Errorf("%s and %s would both be written to %s; render them into different folders (-o) or one at a time; nothing was written", prev, src, packagePath(f, outDir))
		}
		byDest[dest] = src
		out = append(out, f)
	}
	return out, nil
}

// packagePath is NAME.html for NAME.calc.md, in outDir or beside the calc.
func packagePath(path, outDir string) string {
	base := calcdoc.PackageName(path)
	if outDir == "" {
		return filepath.Join(filepath.Dir(path), base)
	}
	return filepath.Join(outDir, base)
}

// pdfMetaOf is what the archival PDF of a package records: its number,
// title and revision, and the commit's date (the Unix epoch when no commit holds the calc).
func pdfMetaOf(d *calcdoc.Doc, st *calcdoc.Stamp) pdfMeta {
	title := d.Front.Number + " " + d.Front.Title
	if d.Front.Revision != "" {
		title += ", revision " + d.Front.Revision
	}
	m := pdfMeta{Title: title, Date: time.Unix(0, 0).UTC()}
	if t, err := time.Parse(time.RFC3339, st.Date); err == nil && st.Versioned {
		m.Date = t.UTC()
	}
	return m
}
