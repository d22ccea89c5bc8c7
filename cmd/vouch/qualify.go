package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/qualify"
)

// cmdQualify runs the engine's verification suite and writes
// qualification.html and qualification.json to the output folder. Exit 0
// when every claimed value is reproduced, 3 when one is not, 1 when the
// suite cannot run (a malformed acceptance case).
func cmdQualify(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("qualify", stderr)
	out := fs.String("o", ".", "output folder for qualification.html and qualification.json")
	with := fs.String("with", "", "folder of the firm's acceptance cases (NAME.calc.md with NAME.expect.yaml)")
	rest, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(rest) != 0 {
		fmt.Fprintln(stderr, "usage: vouch qualify [-o DIR] [--with DIR]")
		return exitUsage
	}
	r, err := qualify.Run(qualify.Options{Version: Version, With: *with})
	if err != nil {
		fmt.Fprintf(stderr, "vouch: qualify: %v\n", err)
		return exitErrors
	}
	page, err := r.HTML()
	if err != nil {
		fmt.Fprintf(stderr, "vouch: qualify: %v\n", err)
		return exitErrors
	}
	if err := os.MkdirAll(*out, 0o755); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	for name, data := range map[string][]byte{"qualification.json": r.CanonicalJSON(), "qualification.html": page} {
		if err := calcdoc.WriteFileAtomic(filepath.Join(*out, name), data); err != nil {
			fmt.Fprintf(stderr, "vouch: %v\n", err)
			return exitErrors
		}
	}
	s := r.Summary
	fmt.Fprintf(stdout, "%d values: %d reproduced, %d not reproduced, %d listed but not claimed\n", s.Total, s.Passed, s.Failed, s.NotRun)
	for _, c := range r.Checks {
		if c.Verdict == qualify.Fail {
			got := "no value"
			if c.Computed != nil {
				got = strconv.FormatFloat(*c.Computed, 'g', 12, 64)
			}
			fmt.Fprintf(stdout, "FAIL %s: %s: expected %s %s %s, computed %s (%s)\n", c.Source, c.What, c.Expected, c.Unit, c.ToleranceS, got, c.ID)
		}
	}
	fmt.Fprintf(stdout, "report digest sha256 %s\nwrote %s\n", r.Digest, filepath.Join(*out, "qualification.html"))
	if !r.Passed() {
		return exitFailed
	}
	return exitOK
}
