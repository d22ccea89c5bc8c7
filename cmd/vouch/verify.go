package main

import (
	"fmt"
	"io"

	"github.com/vouchcalc/vouch/calcdoc/audit"
)

func cmdVerify(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("verify", stderr)
	signers := fs.String("signers", "", "allowed-signers file (OpenSSH format) naming each person's key")
	repo := fs.String("repo", "", "a directory inside the calc's repository (default: the package's directory)")
	files, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(files) != 1 {
		fmt.Fprintln(stderr, "usage: vouch verify PACKAGE.html|qualification.html [--signers FILE] [--repo DIR]")
		return exitUsage
	}
	if html, json, ok := qualificationFiles(files[0]); ok {
		if *repo != "" {
			fmt.Fprintln(stderr, "vouch: verify: a qualification report needs no repository; --repo is for packages")
			return exitUsage
		}
		return verifyQualification(html, json, *signers, stdout, stderr)
	}
	opt, err := verifyOptions(*repo, *signers)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	rep, err := audit.Verify(files[0], opt)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return errorCode(err)
	}
	fmt.Fprint(stdout, rep.String())
	if !rep.OK() || rep.DesignFailed() {
		return exitFailed // verification failed, or it holds and a design check fails
	}
	return exitOK
}
