package main

import (
	"fmt"
	"io"
	"os"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/internal/safefile"
)

// loadCalc reads and evaluates a calc with its repository's settings
// (vouch.yaml, whose errors it prints at their lines); a long sweep reports its progress on
// stderr when stderr is a terminal.
func loadCalc(path string, stderr io.Writer) (*calcdoc.Doc, error) {
	src, err := safefile.Read(path, calcdoc.MaxFileBytes)
	if err != nil {
		return nil, err
	}
	opt, err := readOptions(path, stderr)
	if err != nil {
		return nil, err
	}
	d := calcdoc.ReadWith(path, src, opt)
	if tty, ok := terminalOf(stderr); ok {
		d.Progress = progressPrinter(tty)
	}
	d.Evaluate()
	return d, nil
}

// isTerminal reports whether w is a character device.
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

// progressPrinter redraws one status line for sweeps of 200 points or more.
func progressPrinter(w io.Writer) func(name string, done, total int) {
	return func(name string, done, total int) {
		if total < 200 || (done%50 != 0 && done != total) {
			return
		}
		fmt.Fprintf(w, "\rsweep of %s: %d of %d points", name, done, total)
		if done == total {
			fmt.Fprint(w, "\r\033[K")
		}
	}
}
