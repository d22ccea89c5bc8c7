package audit

import (
	"errors"
	stdhtml "html"
	"os"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc/review"
)

// editReview applies one edit to the calc's review record, commits it with
// the calc as it is, and renders the package again.
func editReview(t *testing.T, r *gitRepo, msg string, edit func(f *review.File, lines []string) error) string {
	t.Helper()
	f := &review.File{}
	if raw := r.Path("calcs/fp.review.yaml"); fileExists(raw) {
		var err error
		if f, err = review.Parse("fp.review.yaml", r.Read("calcs/fp.review.yaml")); err != nil {
			t.Fatal(err)
		}
	}
	if err := edit(f, review.Lines(r.Read("calcs/fp.calc.md"))); err != nil {
		t.Fatal(err)
	}
	r.Write("calcs/fp.review.yaml", string(f.Marshal("fp.calc.md")))
	r.Commit(msg)
	return renderFile(t, r.Path("calcs/fp.calc.md"))
}

// TestCheckerWorkflow: a checker's comment stops the checker's signature
// while it is open and while it is answered but not closed; once closed,
// the checker signs and the package verifies, its appendix showing the
// comment and its resolution, and the record's blob in the manifest.
func TestCheckerWorkflow(t *testing.T) {
	r := calcRepo(t)
	checker := review.Person{Name: "C. Reader", Email: checkerEmail}
	preparer := review.Person{Name: "P. Writer", Email: preparerEmail}
	prep, chk := newKey(t, "ed25519"), newKey(t, "ed25519")
	signers := allowedSigners(t, preparerEmail, prep, checkerEmail, chk)
	signChecker := func(pkg string) error {
		signPkg(t, pkg, "preparer", prep, signers)
		s, _, err := Sign(pkg, SignOptions{Role: "checker", Key: chk.path, VerifyOptions: VerifyOptions{Engine: "test", Signers: signers}})
		if err == nil {
			writePkg(t, pkg, s.HTML)
		}
		return err
	}

	pkg := editReview(t, r, "Check comment C1", func(f *review.File, lines []string) error {
		_, err := f.Add(lines, review.Target{Line: 16}, checker, "give the source of the discharge pressure")
		return err
	})
	if err := signChecker(pkg); !errors.Is(err, ErrReviewOpen) || !strings.Contains(err.Error(), "C1 open") {
		t.Fatalf("checker signs with C1 open: %v", err)
	}
	pkg = editReview(t, r, "Answer C1", func(f *review.File, _ []string) error {
		_, err := f.Answer("C1", preparer, "HB-001 rev C (fictional)")
		return err
	})
	if err := signChecker(pkg); !errors.Is(err, ErrReviewOpen) || !strings.Contains(err.Error(), "C1 answered") {
		t.Fatalf("checker signs with C1 answered: %v", err)
	}
	pkg = editReview(t, r, "Close C1", func(f *review.File, _ []string) error {
		_, err := f.Close("C1", checker, checker)
		return err
	})
	if err := signChecker(pkg); err != nil {
		t.Fatalf("checker signs with C1 closed: %v", err)
	}
	rep := verifyPkg(t, pkg, signers)
	if !rep.OK() || rep.Status != "CHECKED" {
		t.Fatalf("verify: %s\n%s", rep.Status, rep)
	}
	m, _ := ManifestOf(r.Read("calcs/fp.html"))
	blob := strings.TrimSpace(r.Git("rev-parse", "HEAD:calcs/fp.review.yaml"))
	if len(m.Data) != 1 || m.Data[0].Path != "calcs/fp.review.yaml" || m.Data[0].Hash != blob {
		t.Errorf("manifest data %+v, want the review record's blob %s", m.Data, blob)
	}
	html := stdhtml.UnescapeString(string(r.Read("calcs/fp.html")))
	for _, want := range []string{"Appendix: review comments and their resolution", "line 16: p_out =", "HB-001 rev C (fictional)", "CLOSED"} {
		if !strings.Contains(html, want) {
			t.Errorf("package lacks %q", want)
		}
	}
}

// TestReviewRecordSigned: the manifest, and so every signature, covers
// the review record: a package rendered after the record changed has
// another manifest digest.
func TestReviewRecordSigned(t *testing.T) {
	r := calcRepo(t)
	checker := review.Person{Name: "C. Reader", Email: checkerEmail}
	digest := func(pkg string) string {
		m, err := ManifestOf(r.Read("calcs/fp.html"))
		if err != nil {
			t.Fatal(err)
		}
		d, err := m.Digest()
		if err != nil {
			t.Fatal(err)
		}
		return d
	}
	first := digest(editReview(t, r, "Check comment C1", func(f *review.File, lines []string) error {
		_, err := f.Add(lines, review.Target{Section: "Feed pump"}, checker, "state the pump curve")
		return err
	}))
	second := digest(editReview(t, r, "Close C1", func(f *review.File, lines []string) error {
		_, err := f.Close("C1", checker, checker)
		return err
	}))
	if first == second {
		t.Errorf("the manifest digest %s does not change with the review record", first)
	}
}

func fileExists(path string) bool {
	_, err := os.Stat(path)
	return err == nil
}
