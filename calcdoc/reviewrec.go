package calcdoc

import (
	"errors"
	"github.com/vouchcalc/vouch/internal/safefile"
	"io/fs"
	"path"
	"strconv"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/calcdoc/review"
)

// readReview reads the checker's review record beside the calc,
// NAME.review.yaml, through Files, when there is one: it is listed with
// the data files (so the manifest, and every signature, covers its blob),
// and each comment is found in the calc as it is now. A record that does
// not parse, or a comment not closed whose line is gone, is an error at
// the top of the calc naming the record's line and the comment.
func (d *Doc) readReview() {
	rel := review.PathFor(d.Rel)
	raw, err := safefile.ReadFS(d.Files, rel, review.MaxBytes)
	if errors.Is(err, fs.ErrNotExist) || errors.Is(err, provenance.ErrNotAtCommit) {
		return
	}
	if err != nil {
		d.errorf(0, "review record %s: %v", rel, err)
		return
	}
	d.DataFiles = append(d.DataFiles, DataFile{Path: rel, Hash: provenance.BlobHash(raw), Review: true})
	f, err := review.Parse(path.Base(rel), raw)
	if err == nil {
		d.ReviewPlaces, err = f.Anchor(path.Base(d.Rel), review.Lines(d.Src))
	}
	var list review.ErrorList
	if errors.As(err, &list) {
		for _, e := range list {
			d.errorf(0, "%s", e)
		}
		return
	}
	d.Review = f
}

// reviewView is one comment of the package's comment-and-resolution
// appendix.
type reviewView struct {
	ID, Where, Author, Text, Status, Response, AnsweredBy, ClosedBy string
	Line                                                            int // the calc line it concerns now, 0 when lost
}

// reviewRows lists the review record's comments for the appendix, where
// each stands in the calc now.
func (d *Doc) reviewRows() []reviewView {
	if d.Review == nil {
		return nil
	}
	var out []reviewView
	for i, it := range d.Review.Items {
		p := d.ReviewPlaces[i]
		v := reviewView{ID: it.ID, Author: it.Author, Text: it.Text, Status: string(it.Status),
			Response: it.Response, AnsweredBy: it.AnsweredBy, ClosedBy: it.ClosedBy, Line: p.Line}
		switch {
		case p.Lost:
			v.Where = "no longer in the calc (was " + where(it) + ")"
		case it.Section != "":
			v.Where = "section " + strconv.Quote(it.Section) + ", line " + strconv.Itoa(p.Line)
		default:
			v.Where = "line " + strconv.Itoa(p.Line) + ": " + it.Quote
		}
		out = append(out, v)
	}
	return out
}

// where is the place a comment's record names.
func where(it *review.Item) string {
	if it.Section != "" {
		return "section " + strconv.Quote(it.Section)
	}
	return "line " + strconv.Itoa(it.Line) + ": " + it.Quote
}

// setReview fills the view's comment-and-resolution appendix.
func (v *view) setReview(d *Doc) {
	if d.Review == nil {
		return
	}
	v.HasReview, v.Review = true, d.reviewRows()
	o, a, c := d.Review.Counts()
	v.ReviewCounts = plural(len(d.Review.Items), "comment") + ": " + strconv.Itoa(o) + " open, " +
		strconv.Itoa(a) + " answered and awaiting the checker, " + strconv.Itoa(c) + " closed"
}

// plural is "1 comment", "2 comments".
func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return strconv.Itoa(n) + " " + word + "s"
}
