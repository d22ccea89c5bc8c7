package audit

import (
	"errors"
	"fmt"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
)

// Preliminary is the stamp of a signed package that still has open
// assumptions: not for construction until they are confirmed.
const Preliminary = "PRELIMINARY"

// preliminary is the stamp of a calc with open assumptions: a package
// that any role has signed reads PRELIMINARY while an assumption is open,
// whatever its signatures reach; an unsigned one stays DRAFT. The cover's
// signature table still shows who signed.
func preliminary(d *calcdoc.Doc, status string) string {
	if status == "DRAFT" || len(d.OpenAssumptions()) == 0 {
		return status
	}
	return Preliminary
}

// openAssumptionsBlock refuses an approver signature while the calc has
// open assumptions, naming them and their lines.
func openAssumptionsBlock(d *calcdoc.Doc, role string) error {
	open := d.OpenAssumptions()
	if role != "approver" || len(open) == 0 {
		return nil
	}
	var names []string
	for _, a := range open {
		names = append(names, fmt.Sprintf("%s (line %d)", a.ID, a.Line))
	}
	noun := "assumption is"
	if len(open) > 1 {
		noun = "assumptions are"
	}
	return fmt.Errorf("%w: %d %s still open: %s; a package with an open assumption is PRELIMINARY. Confirm each (ID confirmed: text | SOURCE), commit, render and sign again", ErrOpenAssumptions, len(open), noun, strings.Join(names, ", "))
}

// ErrOpenAssumptions is returned by Sign for an approver signature while
// the calc has open assumptions: nothing is signed.
var ErrOpenAssumptions = errors.New("not approved")
