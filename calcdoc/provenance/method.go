package provenance

import (
	"fmt"
	"strings"
	"unicode/utf8"
)

// The methods of checking a checker's signature records.
const (
	MethodReview    = "review"    // the checker reviewed the calc line by line
	MethodAlternate = "alternate" // an alternate calculation; MethodRef is PATH@COMMIT, Report the comparison
	MethodTest      = "test"      // a test; MethodRef is the test's document reference
)

// Methods lists the methods of checking.
var Methods = []string{MethodReview, MethodAlternate, MethodTest}

// addCheckMethod adds a signature's method of checking to its canonical
// object, each field only when set, so that a manifest without one keeps
// its bytes.
func addCheckMethod(o jsonObject, s Signature) {
	for k, v := range map[string]string{"method": s.Method, "method_ref": s.MethodRef, "report": s.Report, "report_sha256": s.ReportHash} {
		if v != "" {
			o[k] = v
		}
	}
}

// methodFields lists a signature's method of checking as its payload
// lines name them, in their order.
func methodFields(s Signature) [][2]string {
	return [][2]string{{"method", s.Method}, {"method-ref", s.MethodRef}, {"report", s.Report}, {"report-sha256", s.ReportHash}}
}

// methodLines are the payload's lines for the method of checking: one
// "KEY: VALUE" line for each field that is set, "" when none is.
func methodLines(s Signature) string {
	var b strings.Builder
	for _, f := range methodFields(s) {
		if f[1] != "" {
			b.WriteString(f[0] + ": " + f[1] + "\n")
		}
	}
	return b.String()
}

// checkMethodFields checks the method of checking's fields that go into
// the payload: each set one is one line of text without leading or
// trailing blanks, and references come only with a method.
func checkMethodFields(s Signature) error {
	for _, f := range methodFields(s) {
		if f[1] != "" && (f[1] != strings.TrimSpace(f[1]) || strings.ContainsAny(f[1], "\r\n") || !utf8.ValidString(f[1])) {
			return fmt.Errorf("%w: the %s signature's %s %q must be one line of text without leading or trailing blanks", ErrManifest, s.Role, f[0], clip(f[1]))
		}
	}
	if s.Method == "" && methodLines(s) != "" {
		return fmt.Errorf("%w: the %s signature records a method-ref, report or report-sha256 without a method of checking", ErrManifest, s.Role)
	}
	return nil
}

// MethodText describes a signature's method of checking for a reader, ""
// when it records none.
func (s Signature) MethodText() string {
	switch s.Method {
	case "":
		return ""
	case MethodReview:
		return "review"
	case MethodAlternate:
		t := "alternate calculation " + s.MethodRef
		if s.Report != "" {
			t += fmt.Sprintf("; comparison report %s (SHA-256 %s)", s.Report, s.ReportHash)
		}
		return t
	case MethodTest:
		return "test, " + s.MethodRef
	}
	return s.Method + " " + s.MethodRef
}

// MethodSummary is MethodText with the commit and the report's SHA-256
// cut to their first 12 characters, for the cover; the manifest holds them
// in full.
func (s Signature) MethodSummary() string {
	if s.Method != MethodAlternate {
		return s.MethodText()
	}
	path, commit, _ := strings.Cut(s.MethodRef, "@")
	t := "alternate calculation " + path + " at commit " + cut12(commit)
	if s.Report != "" {
		t += "; comparison report " + s.Report + " (SHA-256 " + cut12(s.ReportHash) + "…)"
	}
	return t
}

func cut12(s string) string {
	if len(s) > 12 {
		return s[:12]
	}
	return s
}
