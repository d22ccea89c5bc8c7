package main

import (
	"fmt"
	"io"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/compare"
)

func cmdCompare(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("compare", stderr)
	out := fs.String("o", "", "write the comparison report to this HTML file")
	files, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(files) != 2 {
		fmt.Fprintln(stderr, "usage: vouch compare ORIGINAL.calc.md ALTERNATE.calc.md [-o REPORT.html]")
		return exitUsage
	}
	set, _, code := repoSettings(files[0], stderr)
	if code != exitOK {
		return code
	}
	var docs [2]*calcdoc.Doc
	for i, f := range files {
		if docs[i], code = loadClean(f, stderr); code != exitOK {
			return code
		}
	}
	r := compare.Compare(docs[0], docs[1], compare.Options{APath: files[0], BPath: files[1], Tolerance: set.Tolerance()})
	for _, e := range r.Errors {
		fmt.Fprintf(stderr, "vouch: %s\n", e)
	}
	fmt.Fprint(stdout, r.Text())
	if *out != "" {
		html, err := r.Report()
		if err == nil {
			err = calcdoc.WriteFileAtomic(*out, html)
		}
		if err != nil {
			fmt.Fprintf(stderr, "vouch: %v\n", err)
			return exitErrors
		}
		fmt.Fprintf(stdout, "wrote %s\n", *out)
	}
	switch {
	case len(r.Errors) > 0:
		return exitErrors
	case r.Failed > 0:
		return exitFailed
	}
	return exitOK
}

// loadClean reads and evaluates a calc and prints its errors, if any.
func loadClean(path string, stderr io.Writer) (*calcdoc.Doc, int) {
	d, err := loadCalc(path, stderr)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return nil, exitErrors
	}
	if len(d.Errors) > 0 {
		fmt.Fprint(stderr, d.Errors.Format(d.Path, d.Src))
		fmt.Fprintf(stderr, "vouch: %s has errors; nothing compared\n", path)
		return nil, exitErrors
	}
	return d, exitOK
}
