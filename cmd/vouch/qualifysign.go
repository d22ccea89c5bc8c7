package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/safefile"
	"github.com/vouchcalc/vouch/qualify"
)

// maxQualificationBytes bounds the qualification files sign and verify read.
const maxQualificationBytes = 64 << 20

// qualReport is a qualification report read from its two files.
type qualReport struct {
	html, json string // the paths of the page and of its JSON
	page       []byte
	report     *qualify.Report
}

// qualificationFiles says whether path names a qualification report: a
// page whose JSON (the same name with .json) is in the report's format,
// or that JSON itself. It returns the two paths.
func qualificationFiles(path string) (html, json string, ok bool) {
	base := strings.TrimSuffix(strings.TrimSuffix(path, ".html"), ".json")
	if base == path {
		return "", "", false
	}
	data, err := safefile.Read(base+".json", maxQualificationBytes)
	if err != nil || !bytes.Contains(data, []byte(`"format": "`+qualify.FormatName+`"`)) {
		return "", "", false
	}
	return base + ".html", base + ".json", true
}

// readQualification reads both files; the JSON must be a report whose
// digest matches its content, and the page must be the one it renders.
func readQualification(html, json string) (*qualReport, error) {
	data, err := safefile.Read(json, maxQualificationBytes)
	if err != nil {
		return nil, err
	}
	r, err := qualify.ReadReport(data)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", json, err)
	}
	page, err := safefile.Read(html, maxQualificationBytes)
	if err != nil {
		return nil, err
	}
	want, err := r.HTML()
	if err != nil {
		return nil, err
	}
	if !bytes.Equal(page, want) {
		return nil, fmt.Errorf("%w: %s is not the page its JSON %s renders: one of them was edited", qualify.ErrReport, html, filepath.Base(json))
	}
	return &qualReport{html: html, json: json, page: page, report: r}, nil
}

// reproduce runs the suite again with this engine and says whether it
// gives the report's digest, and if not why: another engine, or the same
// engine giving other results.
func (q *qualReport) reproduce() (bool, string, error) {
	again, err := qualify.Run(qualify.Options{Version: Version, With: q.report.With})
	if err != nil {
		return false, "", fmt.Errorf("running the suite again: %w", err)
	}
	switch {
	case again.Digest == q.report.Digest:
		return true, "this engine reproduces the report: digest " + again.Digest, nil
	case again.Engine != q.report.Engine:
		return false, fmt.Sprintf("made by another engine (vouch %s, revision %s, %s, %s/%s); this engine (vouch %s, revision %s, %s, %s/%s) gives digest %s, so it cannot reproduce the report",
			q.report.Engine.Version, q.report.Engine.Short(), q.report.Engine.GoVersion, q.report.Engine.OS, q.report.Engine.Arch,
			again.Engine.Version, again.Engine.Short(), again.Engine.GoVersion, again.Engine.OS, again.Engine.Arch, again.Digest), nil
	}
	return false, "the same engine gives digest " + again.Digest + ", not the report's: the report does not reproduce", nil
}

// checkSignature says whether a signature of the report holds: it
// verifies over the report's payload, its signing time is not in the
// future, and with a signers file the key is the signer's at that time.
func (q *qualReport) checkSignature(s qualify.Signature, signers *provenance.AllowedSigners, now time.Time) (bool, string) {
	pub, err := q.report.VerifySignature(s)
	if err != nil {
		return false, err.Error()
	}
	at, _ := provenance.ParseSigningTime(s.Signed) // checked by the payload
	if at.After(now) {
		return false, "signing time " + s.Signed + " is later than the present"
	}
	who := fmt.Sprintf("%s <%s>, key %s, signed %s", s.Name, s.Principal, s.Fingerprint, s.Signed)
	if signers == nil {
		return true, "intact; key not checked against a signers file: " + who
	}
	if err := signers.Check(s.Principal, pub, provenance.Namespace, at); err != nil {
		return false, who + ": " + err.Error()
	}
	return true, "VALID: " + who
}

// readSigners reads an allowed-signers file, or gives nil for "".
func readSigners(path string) (*provenance.AllowedSigners, error) {
	if path == "" {
		return nil, nil
	}
	data, err := safefile.Read(path, provenance.MaxKeyFileBytes)
	if err != nil {
		return nil, err
	}
	a, err := provenance.ParseAllowedSigners(data)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	return &a, nil
}

// verifyQualification checks a qualification report: its digest, its page,
// that this engine reproduces it, and its signatures. Exit 0 when all hold.
func verifyQualification(html, json, signersPath string, stdout, stderr io.Writer) int {
	signers, err := readSigners(signersPath)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	q, err := readQualification(html, json)
	if errors.Is(err, qualify.ErrReport) {
		fmt.Fprintf(stdout, "FAIL report: %v\nstatus NOT VERIFIED\n", err)
		return exitFailed
	} else if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	ok := true
	line := func(holds bool, topic, text string) {
		verdict := "ok  "
		if !holds {
			verdict, ok = "FAIL", false
		}
		fmt.Fprintf(stdout, "%s %s: %s\n", verdict, topic, text)
	}
	line(true, "report", "digest "+q.report.Digest+" matches its JSON, and the page is the one it renders")
	line(q.report.Passed(), "values", fmt.Sprintf("%d reproduced, %d not reproduced, %d listed but not claimed", q.report.Summary.Passed, q.report.Summary.Failed, q.report.Summary.NotRun))
	same, text, err := q.reproduce()
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	line(same, "engine", text)
	if len(q.report.Signatures) == 0 {
		fmt.Fprintln(stdout, "note signatures: the report is not signed")
	}
	seen := map[string]bool{}
	for _, s := range q.report.Signatures {
		holds, text := q.checkSignature(s, signers, time.Now())
		if seen[s.Role] {
			holds, text = false, "a second "+s.Role+" signature; a role is signed once"
		}
		seen[s.Role] = true
		line(holds, s.Role, text)
	}
	if !ok {
		fmt.Fprintln(stdout, "status NOT VERIFIED")
		return exitFailed
	}
	fmt.Fprintln(stdout, "status VERIFIED"+keysNote(q.report.Signatures, signers))
	return exitOK
}

// keysNote is " — keys unchecked" when the report has signatures and no
// signers file was given.
func keysNote(sigs []qualify.Signature, signers *provenance.AllowedSigners) string {
	if len(sigs) > 0 && signers == nil {
		return " — keys unchecked"
	}
	return ""
}

// qualificationSign are sign's options for a qualification report.
type qualificationSign struct {
	role, key, signer, signers string
	now                        time.Time
}

// signQualification signs a qualification report that this engine
// reproduces, as the person --signer names, and writes both files again.
func signQualification(html, json string, o qualificationSign, stdout, stderr io.Writer) int {
	fail := func(code int, format string, args ...any) int {
		fmt.Fprintf(stderr, "vouch: sign %s: %s; not signed\n", html, fmt.Sprintf(format, args...))
		return code
	}
	if !slices.Contains(qualify.SignatureRoles, o.role) {
		return fail(exitUsage, "role %q: the roles are %s", o.role, strings.Join(qualify.SignatureRoles, ", "))
	}
	name, principal, ok := parseSigner(o.signer)
	if !ok || o.key == "" {
		return fail(exitUsage, `a qualification report is signed with --key KEYFILE --signer "NAME <E-MAIL>"`)
	}
	signers, err := readSigners(o.signers)
	if err != nil {
		return fail(exitUsage, "%v", err)
	}
	q, err := readQualification(html, json)
	if err != nil {
		return fail(exitFailed, "%v", err)
	}
	if i := slices.IndexFunc(q.report.Signatures, func(s qualify.Signature) bool { return s.Role == o.role }); i >= 0 {
		return fail(exitFailed, "the report already has a %s signature (%s)", o.role, q.report.Signatures[i].Name)
	}
	if !q.report.Passed() {
		return fail(exitFailed, "the report records %d values not reproduced", q.report.Summary.Failed)
	}
	if same, text, err := q.reproduce(); err != nil || !same {
		return fail(exitFailed, "%s%v", text, errOrEmpty(err))
	}
	signer, err := provenance.LoadSigner(o.key)
	if err != nil {
		return fail(exitUsage, "%v", err)
	}
	if signers != nil {
		if err := signers.Check(principal, signer.PublicKey(), provenance.Namespace, o.now); err != nil {
			return fail(exitFailed, "%v", err)
		}
	}
	s, err := q.report.SignAs(qualify.Signature{Role: o.role, Principal: principal, Name: name,
		Signed: provenance.FormatSigningTime(o.now), Attestation: qualify.Attestation}, signer)
	if err != nil {
		return fail(exitUsage, "%v", err)
	}
	return q.write(s, stdout, stderr)
}

// write adds the signature, in role order, and writes the JSON and the
// page as a pair.
func (q *qualReport) write(s qualify.Signature, stdout, stderr io.Writer) int {
	r := q.report
	r.Signatures = append(r.Signatures, s)
	slices.SortStableFunc(r.Signatures, func(a, b qualify.Signature) int {
		return slices.Index(qualify.SignatureRoles, a.Role) - slices.Index(qualify.SignatureRoles, b.Role)
	})
	page, err := r.HTML()
	if err == nil {
		err = calcdoc.WritePairAtomic(q.html, page, q.json, r.CanonicalJSON())
	}
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	fmt.Fprintf(stdout, "signed %s as %s: %s <%s>, key %s, signed %s\nattests: %s\nreport digest sha256 %s\n",
		q.html, s.Role, s.Name, s.Principal, s.Fingerprint, s.Signed, s.Attestation, r.Digest)
	return exitOK
}

// parseSigner reads "NAME <E-MAIL>".
func parseSigner(s string) (name, principal string, ok bool) {
	name, rest, ok := strings.Cut(s, "<")
	principal, tail, closed := strings.Cut(rest, ">")
	name, principal = strings.TrimSpace(name), strings.TrimSpace(principal)
	if !ok || !closed || strings.TrimSpace(tail) != "" || name == "" || principal == "" {
		return "", "", false
	}
	return name, principal, true
}

func errOrEmpty(err error) string {
	if err != nil {
		return err.Error()
	}
	return ""
}
