package main

import (
	"errors"
	"fmt"
	"io"
	"time"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/audit"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/safefile"
)

func cmdSign(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("sign", stderr)
	role := fs.String("role", "", "the role signed: preparer, checker or approver")
	key := fs.String("key", "", "SSH private key, or KEY.pub of a key in the ssh-agent (default: the ssh-agent's key)")
	signers := fs.String("signers", "", "allowed-signers file to check the key against")
	repo := fs.String("repo", "", "a directory inside the calc's repository (default: the package's directory)")
	sigFile := fs.String("signature", "", "an SSHSIG made elsewhere over the role's payload, instead of a key")
	signedAt := fs.String("signed", "", "with --signature: the signing time its payload holds, as 2026-03-14T09:26:53Z")
	withdraw := fs.Bool("withdraw", false, "withdraw the role's standing signature (it stays in the manifest, marked withdrawn)")
	method := checkMethodFlags(fs)
	signer := fs.String("signer", "", `a qualification report's signer, as "NAME <E-MAIL>"`)
	files, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(files) != 1 || *role == "" {
		fmt.Fprintln(stderr, "usage: vouch sign PACKAGE.html --role preparer|checker|approver [--key KEYFILE | --signature FILE --signed TIME | --withdraw] [--signers FILE] [--repo DIR]")
		fmt.Fprintln(stderr, `       vouch sign qualification.html --role ROLE --key KEYFILE --signer "NAME <E-MAIL>" [--signers FILE]`)
		return exitUsage
	}
	if html, json, ok := qualificationFiles(files[0]); ok {
		if *sigFile != "" || *signedAt != "" || *withdraw || *repo != "" || *method.method+*method.alternate+*method.document+*method.report != "" {
			fmt.Fprintln(stderr, "vouch: sign: a qualification report is signed with --role, --key, --signer and --signers only")
			return exitUsage
		}
		return signQualification(html, json, qualificationSign{role: *role, key: *key, signer: *signer, signers: *signers, now: time.Now()}, stdout, stderr)
	}
	if *signer != "" {
		fmt.Fprintln(stderr, "vouch: sign: --signer is for a qualification report; a package is signed as the person its front matter names for the role")
		return exitUsage
	}
	if msg := signFlagConflict(*key, *sigFile, *signedAt, *withdraw); msg != "" {
		fmt.Fprintln(stderr, "vouch: sign: "+msg)
		return exitUsage
	}
	vopt, err := verifyOptions(*repo, *signers)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	opt := audit.SignOptions{Role: *role, Key: *key, Signed: *signedAt, Withdraw: *withdraw, VerifyOptions: vopt}
	if opt.Method, err = method.read(); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	if *sigFile != "" {
		if opt.Signature, err = safefile.Read(*sigFile, provenance.MaxKeyFileBytes); err != nil {
			fmt.Fprintf(stderr, "vouch: %v\n", err)
			return exitUsage
		}
	}
	return signOne(files[0], opt, stdout, stderr)
}

// signFlagConflict says why a combination of sign's flags makes no sense,
// or "".
func signFlagConflict(key, sigFile, signedAt string, withdraw bool) string {
	switch {
	case withdraw && (key != "" || sigFile != "" || signedAt != ""):
		return "--withdraw signs nothing: give it without --key, --signature or --signed"
	case sigFile != "" && key != "":
		return "give either --key or --signature, not both"
	case sigFile != "" && signedAt == "":
		return "--signature needs --signed TIME, the signing time its payload holds (such as 2026-03-14T09:26:53Z)"
	case signedAt != "" && sigFile == "":
		return "--signed goes with --signature; vouch sign with a key signs at the present time"
	}
	return ""
}

// signOne signs a package and writes it back with its manifest file; a
// package that does not verify is left untouched.
func signOne(path string, opt audit.SignOptions, stdout, stderr io.Writer) int {
	signed, rep, err := audit.Sign(path, opt)
	if err != nil {
		if rep != nil && errors.Is(err, audit.ErrNotVerified) {
			fmt.Fprint(stderr, rep.String())
		}
		fmt.Fprintf(stderr, "vouch: %s: %v\n", path, err)
		return errorCode(err)
	}
	if err := writePackageFiles(path, signed.HTML, signed.ManifestFile); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	s := signed.Signature
	if s.Withdrawn != "" {
		fmt.Fprintf(stdout, "withdrew the %s signature of %s <%s> (signed %s) in %s at %s\nstatus %s\n",
			s.Role, s.Name, s.Principal, s.Signed, path, s.Withdrawn, signed.Status)
		return exitOK
	}
	fmt.Fprintf(stdout, "signed %s as %s: %s <%s>, key %s, signed %s (commit of %s)\nattests: %s\n",
		path, s.Role, s.Name, s.Principal, s.Fingerprint, s.Signed, s.Date[:min(10, len(s.Date))], s.Attestation)
	if m := s.MethodText(); m != "" {
		fmt.Fprintf(stdout, "method of checking: %s\n", m)
	}
	fmt.Fprintf(stdout, "status %s\n", signed.Status)
	return exitOK
}

// errorCode maps a sign or verify error to an exit code.
func errorCode(err error) int {
	var usage *calcdoc.UsageError
	switch {
	case errors.As(err, &usage):
		return exitUsage
	case errors.Is(err, audit.ErrNotVerified), errors.Is(err, audit.ErrKeyRejected), errors.Is(err, audit.ErrReviewOpen), errors.Is(err, audit.ErrOpenAssumptions):
		return exitFailed
	}
	return exitErrors
}

// writePackage writes a rendered package and, beside it, its manifest
// file, from the manifest Render returned with the HTML.
func writePackage(dest string, pkg *calcdoc.Package) error {
	file, err := audit.ManifestFile(pkg.Manifest)
	if err != nil {
		return err
	}
	return writePackageFiles(dest, pkg.HTML, file)
}

// writePackageFiles writes the package and its manifest file as a pair
// (calcdoc.WritePairAtomic): the package is the source of truth, the
// manifest file a copy of the manifest it holds, and the folder never
// holds a package beside a manifest file of another version.
func writePackageFiles(dest string, html, manifest []byte) error {
	return calcdoc.WritePairAtomic(dest, html, audit.ManifestPath(dest), manifest)
}
