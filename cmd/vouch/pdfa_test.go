package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestArchivalPDF prints the house-style calcs of a committed repository
// with --pdf and checks each PDF as an archive would: PDF/A-2b named in the
// XMP metadata, an sRGB output intent, every font embedded, the paper size
// of the calc (A4 from vouch.yaml, Letter from a calc's front matter), the
// creation and modification dates equal to the commit's, and the same
// bytes when printed again.
func TestArchivalPDF(t *testing.T) {
	if testing.Short() {
		t.Skip("the slow printing test: it runs without -short, as CI does")
	}
	needBrowser(t)
	needTools(t, "git", "gs", "qpdf", "pdfinfo", "pdffonts")
	r := testkit.NewRepo(t)
	if err := os.CopyFS(r.Dir, os.DirFS(filepath.Join("testdata", "house"))); err != nil {
		t.Fatal(err)
	}
	r.Write(".gitignore", "*.html\n*.pdf\n*.manifest.json\n")
	r.Commit("house-style calcs")
	commitDate := strings.TrimSpace(r.Git("log", "-1", "--format=%cd", "--date=iso-strict-local"))
	want := map[string][2]float64{"house-a4": {595, 842}, "house-letter": {612, 792}}
	numbers := map[string]string{"house-a4": "HB-001", "house-letter": "HB-001L"}
	for name, size := range want {
		t.Run(name, func(t *testing.T) {
			calc := filepath.Join(r.Dir, name+".calc.md")
			pdf := filepath.Join(r.Dir, name+".pdf")
			render := func() []byte {
				var out, errs bytes.Buffer
				if code := run([]string{"render", "--pdf", calc}, &out, &errs); code != exitOK {
					t.Fatalf("render --pdf: exit %d: %s", code, errs.String())
				}
				b, err := os.ReadFile(pdf)
				if err != nil {
					t.Fatal(err)
				}
				return b
			}
			first := render()
			checkPDFInfo(t, pdf, size, commitDate)
			title := numbers[name] + " Unit 1 simple Rankine cycle heat balance at 100 % load, revision A"
			if info := tool(t, "pdfinfo", pdf); !strings.Contains(info, "Title:           "+title+"\n") {
				t.Errorf("the PDF's title is not %q:\n%s", title, info)
			}
			checkPDFA(t, pdf)
			checkFonts(t, pdf)
			if !bytes.Equal(first, render()) {
				t.Error("printing the same package again gave a different PDF")
			}
		})
	}
}

// tool runs a command and returns its output, failing the test on error.
func tool(t *testing.T, name string, args ...string) string {
	t.Helper()
	out, err := exec.Command(name, args...).CombinedOutput()
	if err != nil {
		t.Fatalf("%s %v: %v\n%s", name, args, err, out)
	}
	return string(out)
}

var pageSize = regexp.MustCompile(`Page size:\s+([0-9.]+) x ([0-9.]+) pts`)

// checkPDFInfo checks the page size (to the point) and that both dates
// are the commit's.
func checkPDFInfo(t *testing.T, pdf string, size [2]float64, commit string) {
	info := tool(t, "pdfinfo", "-isodates", pdf)
	m := pageSize.FindStringSubmatch(info)
	if m == nil {
		t.Fatalf("pdfinfo gives no page size:\n%s", info)
	}
	w, _ := strconv.ParseFloat(m[1], 64)
	h, _ := strconv.ParseFloat(m[2], 64)
	if absDiff(w-size[0]) > 1 || absDiff(h-size[1]) > 1 {
		t.Errorf("page size %g x %g pt, want %g x %g", w, h, size[0], size[1])
	}
	for _, key := range []string{"CreationDate", "ModDate"} {
		got := regexp.MustCompile(key + `:\s+(\S+)`).FindStringSubmatch(info)
		if got == nil || !sameInstant(t, got[1], commit) {
			t.Errorf("%s = %v, want the commit date %s", key, got, commit)
		}
	}
}

// checkPDFA checks the PDF/A-2b identification in the XMP metadata and
// the sRGB output intent, in the PDF with its streams uncompressed.
func checkPDFA(t *testing.T, pdf string) {
	plain := filepath.Join(t.TempDir(), "plain.pdf")
	tool(t, "qpdf", "--qdf", "--object-streams=disable", pdf, plain)
	b, err := os.ReadFile(plain)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"pdfaid:part='2'", "pdfaid:conformance='B'", "/Type /OutputIntent", "/S /GTS_PDFA1", "/DestOutputProfile", "/OutputIntents"} {
		if !bytes.Contains(b, []byte(want)) {
			t.Errorf("the PDF lacks %s", want)
		}
	}
}

// checkFonts checks that pdffonts lists fonts and every one is embedded.
func checkFonts(t *testing.T, pdf string) {
	lines := strings.Split(strings.TrimSpace(tool(t, "pdffonts", pdf)), "\n")
	if len(lines) < 3 {
		t.Fatalf("pdffonts lists no fonts:\n%s", strings.Join(lines, "\n"))
	}
	for _, l := range lines[2:] {
		f := strings.Fields(l)
		if len(f) < 7 || f[len(f)-5] != "yes" {
			t.Errorf("font not embedded: %s", l)
		}
	}
}

// sameInstant compares two RFC 3339 times.
func sameInstant(t *testing.T, a, b string) bool {
	ta, err1 := parseISO(a)
	tb, err2 := parseISO(b)
	if err1 != nil || err2 != nil {
		t.Logf("dates %q, %q: %v %v", a, b, err1, err2)
		return false
	}
	return ta.Equal(tb)
}

func absDiff(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// parseISO reads an ISO 8601 time as pdfinfo and git print it.
func parseISO(s string) (time.Time, error) { return time.Parse(time.RFC3339, s) }

// TestASCIITitle: the PDF's title keeps what Ghostscript's PDF/A writer
// accepts, spelling the rest plainly.
func TestASCIITitle(t *testing.T) {
	for in, want := range map[string]string{
		"HB-1 Feed pump (revision A)":         "HB-1 Feed pump revision A",
		"Main steam at 540 °C · 16.5 MPa":     "Main steam at 540 deg C - 16.5 MPa",
		`Back\slash and η_th`:                 "Backslash and _th",
		"Condenser — 2 × 50 % pumps, 12 m³/s": "Condenser - 2 x 50 % pumps, 12 m3/s",
	} {
		if got := asciiTitle(in); got != want {
			t.Errorf("asciiTitle(%q) = %q, want %q", in, got, want)
		}
	}
}
