package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/calcdoc/register"
	"github.com/vouchcalc/vouch/internal/safefile"
	"github.com/vouchcalc/vouch/qualify"
)

// cmdRegister renders every changed calc under a folder and writes the
// register's index.html. Exit: 0, 1 when a calc is broken, 2 for bad usage
// (no calcs, a bad shard), 3 when a check fails.
func cmdRegister(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("register", stderr)
	out := fs.String("o", "", "output folder for the packages, index.html and the cache (default: a folder in the user's cache)")
	shardFlag := fs.String("shard", "", "render only shard i of n (i/n, 1-based), for CI runners; writes no index")
	signers := fs.String("signers", "", "allowed-signers file for checking the keys of signed packages")
	workers := fs.Int("j", 0, "calcs rendered at once (default: one per core)")
	errataFile := fs.String("errata", "", "errata file marking signed packages a known engine error touches (default: the built-in docs/errata.yaml)")
	dirs, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(dirs) != 1 {
		fmt.Fprintln(stderr, "usage: vouch register DIR [-o DIR] [--shard i/n] [--signers FILE] [--errata FILE] [-j N]")
		return exitUsage
	}
	qual, err := qualification()
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	opt := register.Options{Dir: dirs[0], Out: *out, Engine: Version, Signers: *signers, Workers: *workers, Build: thisBuild(), Qualification: qual}
	if opt.Errata, err = errataMatcher(*errataFile); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	if opt.Shard, opt.Shards, err = parseShard(*shardFlag); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	if opt.Out == "" {
		if opt.Out, err = register.DefaultOut(opt.Dir); err != nil {
			fmt.Fprintf(stderr, "vouch: %v; give -o DIR\n", err)
			return exitUsage
		}
	}
	if tty, ok := terminalOf(stderr); ok {
		opt.Progress = progressBar(tty)
	}
	if opt.Read, err = readOptions(opt.Dir, stderr); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	sum, err := register.Run(opt)
	return registerReport(opt, sum, err, stdout, stderr)
}

// parseShard reads "i/n"; "" means no shard.
func parseShard(s string) (i, n int, err error) {
	if s == "" {
		return 0, 0, nil
	}
	a, b, ok := strings.Cut(s, "/")
	i, errI := strconv.Atoi(a)
	n, errN := strconv.Atoi(b)
	if !ok || errI != nil || errN != nil || n < 1 || i < 1 || i > n {
		return 0, 0, fmt.Errorf("--shard %s: give i/n with 1 <= i <= n, such as 2/4", s)
	}
	return i, n, nil
}

// progressBar redraws one line on a terminal: a bar and the calcs done.
func progressBar(w io.Writer) func(done, total int) {
	const width = 30
	return func(done, total int) {
		filled := width * done / max(total, 1)
		fmt.Fprintf(w, "\r[%s%s] %d/%d calcs", strings.Repeat("#", filled), strings.Repeat("-", width-filled), done, total)
		if done == total {
			fmt.Fprint(w, "\r\033[K")
		}
	}
}

// registerReport prints the outcome and returns the exit code.
func registerReport(opt register.Options, sum *register.Summary, err error, stdout, stderr io.Writer) int {
	if sum == nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	what := pluralWord(len(sum.Entries), "calc")
	if opt.Shards > 0 {
		what = fmt.Sprintf("calcs of shard %d/%d", opt.Shard, opt.Shards)
	}
	fmt.Fprintf(stdout, "%d %s under %s: %d rendered, %d unchanged\n", len(sum.Entries), what, opt.Dir, sum.Rendered, sum.Cached)
	listProblems(opt.Dir, sum.Entries, stdout, stderr)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	if sum.Index != "" {
		fmt.Fprintf(stdout, "wrote %s\n", sum.Index)
	} else {
		fmt.Fprintf(stdout, "packages and cache in %s; run vouch register without --shard over the merged output to write index.html\n", opt.Out)
	}
	switch {
	case sum.Broken() > 0:
		return exitErrors
	case sum.Failing() > 0:
		return exitFailed
	}
	return exitOK
}

// listProblems prints broken calcs (errors on stderr), failing checks and
// stale signed packages.
func listProblems(dir string, entries []*register.Entry, stdout, stderr io.Writer) {
	for _, e := range entries {
		name := filepath.Join(dir, filepath.FromSlash(e.Path))
		switch {
		case e.Broken():
			fmt.Fprintf(stderr, "broken: %s\n", strings.Join(e.ErrorText(name), "\n        "))
		case e.Failed > 0:
			fmt.Fprintf(stdout, "  %s: %d of %d %s FAIL\n", name, e.Failed, e.Failed+e.Passed, pluralWord(e.Failed+e.Passed, "check"))
		}
		if e.Signed != nil && e.Signed.Stale != "" {
			fmt.Fprintf(stdout, "  %s: signed package %s is stale: %s\n", name, e.Signed.Package, e.Signed.Stale)
		}
		if e.Signed != nil {
			for _, why := range e.Signed.Errata {
				fmt.Fprintf(stdout, "  %s: signed package %s: erratum %s\n", name, e.Signed.Package, why)
			}
		}
	}
}

// maxErrataBytes bounds an errata file given with --errata.
const maxErrataBytes = 4 << 20

// errataMatcher reads the errata list (the built-in one when file is "")
// and returns the register's test of a signed package against it.
func errataMatcher(file string) (func(string, *provenance.EngineBuild, []string) []string, error) {
	list, err := qualify.BuiltinErrata()
	if file != "" {
		src, rerr := safefile.Read(file, maxErrataBytes)
		if rerr != nil {
			return nil, rerr
		}
		list, err = qualify.ParseErrata(file, src)
	}
	if err != nil {
		return nil, err
	}
	return func(eng string, b *provenance.EngineBuild, uses []string) []string {
		p := qualify.PackageEngine{Engine: eng, Uses: uses}
		if b != nil {
			p.Version, p.Revision = b.Version, b.Revision
			if uses == nil {
				p.Uses = []string{} // recorded, and empty: the calc used none
			}
		}
		var out []string
		for _, x := range list {
			if why, ok := x.Affects(p); ok {
				out = append(out, why)
			}
		}
		return out
	}, nil
}
