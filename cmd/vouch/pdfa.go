package main

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"github.com/vouchcalc/vouch/calcdoc"
)

// pdfMeta is what the archival PDF records of its package: the title and
// the date, which is the commit's (the Unix epoch for a calc that no
// commit holds), so the same package gives the same PDF.
type pdfMeta struct {
	Title string
	Date  time.Time
}

// iccCandidates are where Debian's packages install an sRGB ICC profile
// (libgs-common and ghostscript's own folder).
var iccCandidates = []string{
	"/usr/share/color/icc/ghostscript/srgb.icc",
	"/usr/share/ghostscript/*/iccprofiles/srgb.icc",
	"/usr/share/color/icc/sRGB.icc",
}

// findICC returns the path of an installed sRGB profile.
func findICC() (string, error) {
	for _, c := range iccCandidates {
		if m, _ := filepath.Glob(c); len(m) > 0 {
			return m[0], nil
		}
	}
	return "", fmt.Errorf("--pdf needs an sRGB ICC profile for PDF/A, which is not installed; install Ghostscript (Debian: sudo apt-get install ghostscript)")
}

// archivePDF rewrites the PDF at path, as Chromium printed it, as PDF/A-2b
// with Ghostscript: every font embedded, an sRGB output intent, XMP
// metadata, the title and the dates of meta. The file is replaced only
// when Ghostscript succeeds.
func archivePDF(path string, meta pdfMeta) error {
	gs, err := exec.LookPath("gs")
	if err != nil {
		return fmt.Errorf("--pdf needs Ghostscript to write an archival PDF (PDF/A-2b), and it is not installed; install it (Debian: sudo apt-get install ghostscript)")
	}
	icc, err := findICC()
	if err != nil {
		return err
	}
	dir, err := os.MkdirTemp("", "vouch-pdfa-*")
	if err != nil {
		return err
	}
	defer os.RemoveAll(dir)
	def := filepath.Join(dir, "pdfa_def.ps")
	if err := os.WriteFile(def, pdfaDef(icc, meta), 0o600); err != nil {
		return err
	}
	title := filepath.Join(dir, "title.ps")
	if err := os.WriteFile(title, []byte("%!\n[ /Title ("+asciiTitle(meta.Title)+") /DOCINFO pdfmark\n"), 0o600); err != nil {
		return err
	}
	// Ghostscript reads %d and the like in an output name as a page
	// template, so it works on copies with plain names in its own folder.
	in, out := filepath.Join(dir, "in.pdf"), filepath.Join(dir, "out.pdf")
	if err := copyFile(path, in); err != nil {
		return err
	}
	cmd := exec.Command(gs, "-q", "-dPDFA=2", "-dBATCH", "-dNOPAUSE", "-dNOOUTERSAVE", "-dSAFER",
		"-dPDFACompatibilityPolicy=1", "-sColorConversionStrategy=RGB", "-sDEVICE=pdfwrite",
		"--permit-file-read="+filepath.Dir(icc)+"/", "-sOutputFile="+out, def, in, title)
	cmd.Env = append(os.Environ(), "SOURCE_DATE_EPOCH="+strconv.FormatInt(meta.Date.Unix(), 10))
	if msg, err := cmd.CombinedOutput(); err != nil {
		return fmt.Errorf("making %s an archival PDF with Ghostscript failed: %v\n%s", path, err, msg)
	}
	pdf, err := os.ReadFile(out)
	if err == nil {
		err = fixID(pdf)
	}
	if err == nil {
		// the rewrite must still be this package's PDF, titled as asked
		err = checkPDF(pdf, asciiTitle(meta.Title))
	}
	if err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	return calcdoc.WriteFileAtomic(path, pdf)
}

// copyFile copies the file at src to dst.
func copyFile(src, dst string) error {
	b, err := os.ReadFile(src)
	if err != nil {
		return err
	}
	return os.WriteFile(dst, b, 0o600)
}

// pdfaDef is Ghostscript's PDF/A definition file: the document's title
// and dates, the sRGB profile and the output intent that names it.
func pdfaDef(icc string, meta pdfMeta) []byte {
	date := "D:" + meta.Date.UTC().Format("20060102150405") + "Z"
	var b bytes.Buffer
	fmt.Fprintf(&b, "%%!\n[ /CreationDate (%s) /ModDate (%s) /DOCINFO pdfmark\n", date, date)
	fmt.Fprintf(&b, "/ICCProfile %s def\n", psString(icc))
	b.WriteString(`[/_objdef {icc_PDFA} /type /stream /OBJ pdfmark
[{icc_PDFA} << /N 3 >> /PUT pdfmark
[{icc_PDFA} ICCProfile (r) file /PUT pdfmark
[/_objdef {OutputIntent_PDFA} /type /dict /OBJ pdfmark
[{OutputIntent_PDFA} << /Type /OutputIntent /S /GTS_PDFA1 /DestOutputProfile {icc_PDFA} /OutputConditionIdentifier (sRGB) /Info (sRGB IEC61966-2.1) >> /PUT pdfmark
[{Catalog} << /OutputIntents [ {OutputIntent_PDFA} ] >> /PUT pdfmark
`)
	return b.Bytes()
}

// psString is a PostScript string of ASCII text, with \, ( and ) escaped.
func psString(s string) string {
	return "(" + strings.NewReplacer(`\`, `\\`, "(", `\(`, ")", `\)`).Replace(s) + ")"
}

// asciiFold are the plain spellings of the characters a title may hold.
var asciiFold = strings.NewReplacer("°", " deg ", "·", "-", "–", "-", "—", "-", "×", "x", "µ", "u", "±", "+/-", "²", "2", "³", "3", "‘", "'", "’", "'", "“", "'", "”", "'")

// asciiTitle is the title as Ghostscript's PDF/A writer keeps it: printable
// ASCII without the brackets and backslash it refuses (it drops the whole
// document information otherwise); other characters are spelt plainly or
// left out, the XMP and the document information alike.
func asciiTitle(s string) string {
	var b strings.Builder
	for _, r := range asciiFold.Replace(s) {
		if r >= 0x20 && r < 0x7f && r != '(' && r != ')' && r != '\\' {
			b.WriteRune(r)
		}
	}
	return strings.Join(strings.Fields(b.String()), " ")
}

// fixID replaces the file identifier Ghostscript draws from the clock with
// one drawn from the file itself (the same length, so no offset moves):
// the same package gives the same PDF, byte for byte.
func fixID(pdf []byte) error {
	i := bytes.LastIndex(pdf, []byte("/ID ["))
	const idLen = 2 + 2*(32+2) // "/ID [" then <32 hex><32 hex>
	if i < 0 || len(pdf) < i+5+idLen-2 {
		return fmt.Errorf("the archival PDF has no file identifier")
	}
	at := i + len("/ID [")
	ids := pdf[at : at+2*34]
	if ids[0] != '<' || ids[33] != '>' || ids[34] != '<' || ids[67] != '>' {
		return fmt.Errorf("the archival PDF's file identifier is not in the expected form")
	}
	for _, j := range []int{1, 35} {
		copy(ids[j:j+32], bytes.Repeat([]byte("0"), 32))
	}
	sum := sha256.Sum256(pdf)
	id := strings.ToUpper(hex.EncodeToString(sum[:16]))
	copy(ids[1:33], id)
	copy(ids[35:67], id)
	return nil
}
