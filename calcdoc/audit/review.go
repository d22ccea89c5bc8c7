package audit

import (
	"errors"
	"fmt"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/review"
)

// ErrReviewOpen is returned by Sign for the checker while the review
// record holds a comment that is open, or answered but not closed.
var ErrReviewOpen = errors.New("the review record has comments that are not closed")

// checkReview refuses the checker's signature while any comment of the
// review record at the commit is not closed, naming each.
func (v *verifier) checkReview(role string) error {
	d := v.repro.doc
	if role != "checker" || d.Review == nil {
		return nil
	}
	var left []string
	for _, it := range d.Review.Unresolved() {
		s := it.ID + " " + string(it.Status)
		if it.Status == review.Answered {
			s += " (the checker closes it with vouch review close)"
		}
		left = append(left, s)
	}
	if len(left) == 0 {
		return nil
	}
	return fmt.Errorf("%w: %s; not signed", ErrReviewOpen, strings.Join(left, ", "))
}
