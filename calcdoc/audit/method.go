package audit

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"github.com/vouchcalc/vouch/internal/safefile"
	"path/filepath"
	"slices"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// maxReportBytes bounds the comparison report verify reads to check its
// hash (compare.MaxReportBytes; audit does not import compare).
const maxReportBytes = 16 << 20

// CheckMethod is how the checker checked, as vouch sign --method gives it:
// a review (the default), an alternate calculation with its comparison
// report, or a test with its document reference.
type CheckMethod struct {
	Method    string // review, alternate or test; "" is review for the checker
	Alternate string // alternate: the alternate calc's path
	Document  string // test: the test's document reference
	// Report is the comparison report of the alternate calc (vouch
	// compare -o), ReportSHA256 the SHA-256 of its bytes, ReportPass its
	// verdict and ReportBlobs the source blobs of the original and the
	// alternate it compared, as the report records them.
	Report       string
	ReportSHA256 string
	ReportPass   bool
	ReportBlobs  [2]string
}

// withMethod records the checker's method of checking in the signature:
// a method on another role's signature is a usage error, and an alternate
// calculation counts only when it is committed in the package's
// repository and its report passed and compared this calc with it.
func (v *verifier) withMethod(s provenance.Signature, c CheckMethod) (provenance.Signature, error) {
	if s.Role != "checker" {
		if c != (CheckMethod{}) {
			return s, usageErr("--method is recorded with the checker's signature only, not the %s's", s.Role)
		}
		return s, nil
	}
	if c.Method == "" {
		c.Method = provenance.MethodReview
	}
	s.Method = c.Method
	switch c.Method {
	case provenance.MethodReview:
		if c.Alternate != "" || c.Document != "" || c.Report != "" {
			return s, usageErr("--method review takes no --alternate, --document or --report")
		}
	case provenance.MethodTest:
		if strings.TrimSpace(c.Document) == "" || c.Alternate != "" || c.Report != "" {
			return s, usageErr("--method test needs --document REFERENCE, the test's report, and nothing else")
		}
		s.MethodRef = strings.TrimSpace(c.Document)
	case provenance.MethodAlternate:
		return v.alternate(s, c)
	default:
		return s, usageErr("--method %q: the methods are %s", c.Method, strings.Join(provenance.Methods, ", "))
	}
	return s, nil
}

// alternate records an alternate calculation: its path and commit, and
// the comparison report's path and SHA-256.
func (v *verifier) alternate(s provenance.Signature, c CheckMethod) (provenance.Signature, error) {
	if c.Alternate == "" || c.Report == "" || c.Document != "" {
		return s, usageErr("--method alternate needs --alternate CALC and --report REPORT.html (from vouch compare -o)")
	}
	rel, err := v.repo.Rel(c.Alternate)
	if err != nil {
		return s, usageErr("the alternate calc must be in the package's repository: %w", err)
	}
	blob, committed, dirty, err := v.repo.FileState(rel)
	if err != nil {
		return s, usageErr("alternate calc: %w", err)
	}
	head, err := v.repo.Head()
	if err != nil {
		return s, err
	}
	switch {
	case committed == "" || dirty:
		return s, usageErr("the alternate calc %s is not committed as it is; commit it, compare again and sign", rel)
	case !c.ReportPass:
		return s, fmt.Errorf("%w: the comparison report %s has pairs outside their tolerance", ErrNotVerified, c.Report)
	case c.ReportBlobs[0] != v.m.SourceHash || c.ReportBlobs[1] != blob:
		return s, usageErr("the comparison report %s compared other versions of the calcs (blobs %s and %s; the package's source is %s and %s holds %s): compare again", c.Report, c.ReportBlobs[0], c.ReportBlobs[1], v.m.SourceHash, rel, blob)
	}
	s.MethodRef = rel + "@" + head
	s.Report, s.ReportHash = v.reportPath(c.Report), c.ReportSHA256
	return s, nil
}

// reportPath is the report's slash path in the repository, or its base
// name when it lies outside.
func (v *verifier) reportPath(p string) string {
	if rel, err := v.repo.Rel(p); err == nil {
		return rel
	}
	return filepath.Base(p)
}

// methodProblem says why a signature's method of checking does not hold,
// or "" when it does: only a checker records one, and only a known one.
func methodProblem(s provenance.Signature) string {
	switch {
	case s.Method == "" && s.MethodRef == "" && s.Report == "" && s.ReportHash == "":
		return ""
	case s.Role != "checker":
		return "a method of checking on the " + s.Role + "'s signature; only the checker records one"
	case !slices.Contains(provenance.Methods, s.Method):
		return fmt.Sprintf("method of checking %q; the methods are %s", s.Method, strings.Join(provenance.Methods, ", "))
	}
	return ""
}

// checkMethods checks what each checker's signature records of an
// alternate calculation: the alternate calc is at the recorded commit of
// the repository, and the comparison report, when it is in the repository's
// work tree, still has the recorded SHA-256.
func (v *verifier) checkMethods() bool {
	for _, s := range v.m.Signatures {
		if s.Role != "checker" || s.Method != provenance.MethodAlternate {
			continue
		}
		path, commit, ok := strings.Cut(s.MethodRef, "@")
		if _, err := v.repo.BlobHashAt(commit, path); !ok || err != nil {
			v.rep.addRole(Fails, "checker", fmt.Sprintf("the alternate calc %s recorded with the checker's signature is not in the repository at that commit", s.MethodRef))
			continue
		}
		text := fmt.Sprintf("method of checking: alternate calc %s at commit %s", path, shortHash(commit))
		data, err := safefile.Read(filepath.Join(v.repo.Root(), filepath.FromSlash(s.Report)), maxReportBytes)
		switch sum := sha256.Sum256(data); {
		case err != nil:
			v.rep.addRole(Note, "checker", text+fmt.Sprintf("; the comparison report %s is not in the work tree, so its SHA-256 is not checked", s.Report))
		case hex.EncodeToString(sum[:]) != s.ReportHash:
			v.rep.addRole(Fails, "checker", text+fmt.Sprintf("; the comparison report %s has changed since the checker signed (SHA-256 %s, recorded %s)", s.Report, hex.EncodeToString(sum[:]), s.ReportHash))
		default:
			v.rep.addRole(Holds, "checker", text+fmt.Sprintf("; comparison report %s as recorded", s.Report))
		}
	}
	return true
}
