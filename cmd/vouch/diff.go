package main

import (
	"fmt"
	"io"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/diff"
)

// cmdDiff compares a calc at two revisions from git and prints what
// changed; -o also writes the HTML report. Exit: 0, 1 when either revision
// has errors, 2 for bad usage (unknown revision, file missing at a
// revision), 3 when a check fails at the newer revision.
func cmdDiff(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("diff", stderr)
	from := fs.String("from", "", "the earlier revision: tag, hash, HEAD~1 (default HEAD)")
	to := fs.String("to", "", "the later revision (default: the work tree)")
	all := fs.Bool("all", false, "list unchanged values and checks too")
	out := fs.String("o", "", "also write the HTML report to this file")
	files, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(files) != 1 {
		fmt.Fprintln(stderr, "usage: vouch diff FILE [--from REV] [--to REV] [--all] [-o REPORT.html]")
		return exitUsage
	}
	df, err := diff.Revisions(files[0], diff.Options{From: *from, To: *to})
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return errorCode(err)
	}
	fmt.Fprint(stdout, df.Text(*all))
	if *out != "" {
		if code := writeDiffReport(df, *out, *all, stdout, stderr); code != exitOK {
			return code
		}
	}
	return diffCode(df, stderr)
}

// writeDiffReport writes the HTML report atomically.
func writeDiffReport(df *diff.Diff, dest string, all bool, stdout, stderr io.Writer) int {
	html, err := df.HTML(all)
	if err == nil {
		err = calcdoc.WriteFileAtomic(dest, html)
	}
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	fmt.Fprintf(stdout, "\nwrote %s\n", dest)
	return exitOK
}

// diffCode prints the errors of either revision and returns the exit code.
func diffCode(df *diff.Diff, stderr io.Writer) int {
	if df.HasErrors() {
		fmt.Fprint(stderr, df.ErrorText())
		return exitErrors
	}
	if df.To.Doc.Failed() {
		return exitFailed
	}
	return exitOK
}
