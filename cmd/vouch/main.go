// Command vouch turns Markdown calc files into checked, signed calculation
// packages. This file wires the subcommands; the work is in calcdoc.
package main

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"strings"
)

// Version is the engine version recorded in every package.
const Version = "0.1.0"

// Exit codes (PRODUCT.md §5).
const (
	exitOK     = 0
	exitErrors = 1 // the calc has errors
	exitUsage  = 2 // bad usage
	exitFailed = 3 // a check failed or verification failed
)

type command struct {
	name, args, doc string
	run             func(args []string, stdout, stderr io.Writer) int
}

var commands []command

func init() {
	commands = []command{
		{"run", "[--json] FILE", "evaluate a calc and print its results and checks", cmdRun},
		{"render", "FILE... [-o DIR] [--pdf]", "write the HTML package of each calc", cmdRender},
		{"sign", "PACKAGE --role ROLE [--key KEY]", "verify, reproduce and sign a package for one role", cmdSign},
		{"verify", "PACKAGE [--signers FILE] [--repo DIR]", "check a package's signatures and reproduce it from git", cmdVerify},
		{"review", "add|answer|close|list CALC …", "record the checker's comments on a calc and their resolution", cmdReview},
		{"compare", "ORIGINAL ALTERNATE [-o REPORT.html]", "compare the results an alternate calculation shares with the original", cmdCompare},
		{"diff", "FILE [--from REV] [--to REV]", "show what changed in a calc between two revisions", cmdDiff},
		{"register", "DIR [-o DIR] [--shard i/n]", "render the changed calcs under DIR and write the register's index", cmdRegister},
		{"serve", "FILE|DIR [--addr HOST:PORT]", "serve a live preview that refreshes on save", cmdServe},
		{"new", "[--template NAME] FILE.calc.md", "write a starter calc from a template (--list lists them)", cmdNew},
		{"qualify", "[-o DIR] [--with DIR]", "run the engine's verification suite and write its report", cmdQualify},
		{"units", "", "list every unit with its SI factor", cmdUnits},
		{"functions", "", "list the functions a calc can call", cmdFunctions},
		{"help", "", "show this help", cmdHelp},
	}
}

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// run runs one command; everything it prints goes through a safeWriter.
func run(args []string, stdout, stderr io.Writer) int {
	out, errs := newSafeWriter(stdout), newSafeWriter(stderr)
	defer out.Flush()
	defer errs.Flush()
	return runCommand(args, out, errs)
}

func runCommand(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		usage(stderr)
		return exitUsage
	}
	switch args[0] {
	case "--version", "-version", "version":
		fmt.Fprintf(stdout, "vouch %s\n", Version)
		return exitOK
	case "-h", "--help":
		usage(stdout)
		return exitOK
	}
	for _, c := range commands {
		if c.name == args[0] {
			if wantsHelp(args[1:]) {
				commandHelp(c, stdout)
				return exitOK
			}
			return c.run(args[1:], stdout, stderr)
		}
	}
	fmt.Fprintf(stderr, "vouch: unknown command %q\n", args[0])
	usage(stderr)
	return exitUsage
}

func usage(w io.Writer) {
	fmt.Fprintln(w, "usage: vouch COMMAND [ARGS]\n\ncommands:")
	width := 0
	for _, c := range commands {
		width = max(width, len(c.args))
	}
	for _, c := range commands {
		fmt.Fprintf(w, "  %-10s %-*s  %s\n", c.name, width, c.args, c.doc)
	}
	fmt.Fprintf(w, "  %-10s %-*s  %s\n", "--version", width, "", "print the engine version")
	fmt.Fprintln(w, "\nexit codes: 0 success, 1 the calc has errors, 2 bad usage, 3 a check or verification failed")
}

// wantsHelp reports whether a command's arguments ask for its help
// (-h, -help or --help before a "--").
func wantsHelp(args []string) bool {
	for _, a := range args {
		switch a {
		case "--":
			return false
		case "-h", "-help", "--help":
			return true
		}
	}
	return false
}

// commandHelp prints a command's usage and its flags. The flags come from
// the command itself, run with -h alone: its flag set prints them and
// stops before doing anything.
func commandHelp(c command, w io.Writer) {
	fmt.Fprintf(w, "%s\n\n%s\n", strings.TrimSpace("usage: vouch "+c.name+" "+c.args), c.doc)
	var flags bytes.Buffer
	c.run([]string{"-h"}, io.Discard, &flags)
	if _, rest, ok := strings.Cut(flags.String(), ":\n"); ok && strings.HasPrefix(flags.String(), "Usage of ") && strings.TrimSpace(rest) != "" {
		fmt.Fprintf(w, "\nflags:\n%s", rest)
	}
}

func cmdHelp(_ []string, stdout, _ io.Writer) int {
	usage(stdout)
	return exitOK
}
