package main

import (
	"crypto/sha256"
	"encoding/hex"
	"flag"
	"fmt"
	"github.com/vouchcalc/vouch/internal/safefile"

	"github.com/vouchcalc/vouch/calcdoc/audit"
	"github.com/vouchcalc/vouch/calcdoc/compare"
)

// methodFlags are sign's flags for the checker's method of checking.
type methodFlags struct {
	method, alternate, document, report *string
}

func checkMethodFlags(fs *flag.FlagSet) methodFlags {
	return methodFlags{
		method:    fs.String("method", "", "the checker's method of checking: review (default), alternate or test"),
		alternate: fs.String("alternate", "", "with --method alternate: the alternate calc, committed"),
		document:  fs.String("document", "", "with --method test: the test's document reference"),
		report:    fs.String("report", "", "with --method alternate: the comparison report (vouch compare -o)"),
	}
}

// read gives the method the flags name, with the comparison report read
// and hashed.
func (f methodFlags) read() (audit.CheckMethod, error) {
	c := audit.CheckMethod{Method: *f.method, Alternate: *f.alternate, Document: *f.document, Report: *f.report}
	if c.Report == "" {
		return c, nil
	}
	html, err := safefile.Read(c.Report, compare.MaxReportBytes)
	if err != nil {
		return c, err
	}
	rec, err := compare.ReadReport(html)
	if err != nil {
		return c, fmt.Errorf("%s: %w", c.Report, err)
	}
	sum := sha256.Sum256(html)
	c.ReportSHA256, c.ReportPass = hex.EncodeToString(sum[:]), rec.Pass
	c.ReportBlobs = [2]string{rec.Original, rec.Alternate}
	return c, nil
}
