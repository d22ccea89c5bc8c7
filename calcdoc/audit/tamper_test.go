package audit

import (
	"bytes"
	"compress/zlib"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// signedRepo is a repository with fp.html signed by preparer and checker,
// and the allowed-signers file that lists both keys.
type signedRepo struct {
	*gitRepo
	pkg, signers string
	prep, chk    key
}

func newSignedRepo(t *testing.T) *signedRepo {
	r := calcRepo(t)
	s := &signedRepo{gitRepo: r, prep: newKey(t, "ed25519"), chk: newKey(t, "ed25519")}
	s.pkg = renderFile(t, r.Path("calcs/fp.calc.md"))
	s.signers = allowedSigners(t, preparerEmail, s.prep, checkerEmail, s.chk)
	signPkg(t, s.pkg, "preparer", s.prep, s.signers)
	signPkg(t, s.pkg, "checker", s.chk, s.signers)
	if rep := verifyPkg(t, s.pkg, s.signers); !rep.OK() {
		t.Fatalf("the untouched package does not verify:\n%s", rep)
	}
	return s
}

// TestTamperResultInHTML: one digit of a result in the package's HTML.
func TestTamperResultInHTML(t *testing.T) {
	s := newSignedRepo(t)
	html := string(s.Read("calcs/fp.html"))
	value := summaryValue(t, html, "P_pump")
	replaceOnce(t, s.pkg, value, bumpDigit(value))
	failsWith(t, verifyPkg(t, s.pkg, s.signers), "package", "differs from its reproduction at line", bumpDigit(value))
}

// summaryValue returns the text of a summary row's value cell.
func summaryValue(t *testing.T, html, name string) string {
	t.Helper()
	i := strings.Index(html, `<td class="num">`)
	if i < 0 {
		t.Fatal("no value cell in the package")
	}
	rest := html[i+len(`<td class="num">`):]
	return rest[:strings.Index(rest, "</td>")]
}

// bumpDigit changes the first digit of s.
func bumpDigit(s string) string {
	for i, c := range s {
		if c >= '0' && c <= '9' {
			return s[:i] + string('0'+(c-'0'+1)%10) + s[i+1:]
		}
	}
	return s
}

// TestTamperManifestValue: one digit of a result in the embedded manifest,
// and in the manifest file beside the package.
func TestTamperManifestValue(t *testing.T) {
	s := newSignedRepo(t)
	m, _ := ManifestOf(s.Read("calcs/fp.html"))
	si := num(m.Results[4].SI) // P_pump in W: 3.357...e+06
	t.Run("embedded", func(t *testing.T) {
		orig := s.Read("calcs/fp.html")
		defer os.WriteFile(s.pkg, orig, 0o644)
		esc := strings.ReplaceAll(si, "+", "&#43;") // as html/template writes it
		replaceOnce(t, s.pkg, `&#34;si&#34;:`+esc, `&#34;si&#34;:`+bumpDigit(esc))
		rep := verifyPkg(t, s.pkg, s.signers)
		failsWith(t, rep, "manifest", "results digest")
		failsWith(t, rep, "results", "P_pump is "+bumpDigit(si)[:6], "in the package, "+si+" m^2*kg/s^3 in the reproduction")
	})
	t.Run("file", func(t *testing.T) {
		replaceOnce(t, ManifestPath(s.pkg), `"si":`+si, `"si":`+bumpDigit(si))
		failsWith(t, verifyPkg(t, s.pkg, s.signers), "manifest", "fp.manifest.json differs", "P_pump is "+bumpDigit(si)[:6])
	})
}

// TestTamperSourceBlob rewrites the loose object of the source at the
// recorded commit with other content.
func TestTamperSourceBlob(t *testing.T) {
	s := newSignedRepo(t)
	blob := s.Git("rev-parse", "HEAD:calcs/fp.calc.md")
	forged := strings.Replace(signCalc, "m_dot = 213.2 kg/s", "m_dot = 203.2 kg/s", 1)
	writeLooseBlob(t, s.Path(".git/objects/"+blob[:2]+"/"+blob[2:]), forged)
	failsWith(t, verifyPkg(t, s.pkg, s.signers), "source", "the manifest records blob "+blob+" for calcs/fp.calc.md",
		"holds blob "+provenance.BlobHash([]byte(forged)))
}

// writeLooseBlob overwrites a loose git object with a blob of content.
func writeLooseBlob(t *testing.T, path, content string) {
	t.Helper()
	var b bytes.Buffer
	z := zlib.NewWriter(&b)
	fmt.Fprintf(z, "blob %d\x00%s", len(content), content)
	z.Close()
	os.Chmod(path, 0o644)
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestWrongSigners: a key not in the allowed signers, a signature for the
// wrong role, and a signer who is not the person named for the role.
func TestWrongSigners(t *testing.T) {
	t.Run("unknown key", func(t *testing.T) {
		s := newSignedRepo(t)
		signers := allowedSigners(t, preparerEmail, s.prep, checkerEmail, newKey(t, "ed25519"))
		rep := verifyPkg(t, s.pkg, signers)
		failsWith(t, rep, "checker", "key "+fingerprint(t, s.chk)+" is not in allowed_signers for checker@example.com")
		if rep.Status != "PREPARED" {
			t.Errorf("status %s, want PREPARED", rep.Status)
		}
	})
	t.Run("wrong role", func(t *testing.T) {
		s := newSignedRepo(t)
		m, _ := ManifestOf(s.Read("calcs/fp.html"))
		m.Signatures[1].Signature = m.Signatures[0].Signature // the preparer's signature, relabelled
		m.Signatures[1].Fingerprint = m.Signatures[0].Fingerprint
		rewriteManifest(t, s.pkg, m)
		rep := verifyPkg(t, s.pkg, s.signers)
		failsWith(t, rep, "checker", "checker signature of checker@example.com", "signature does not verify")
	})
	t.Run("not the person named", func(t *testing.T) {
		r := calcRepo(t)
		pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
		prep := newKey(t, "ed25519")
		signers := allowedSigners(t, preparerEmail, prep)
		signPkg(t, pkg, "preparer", prep, signers)
		forgeSignature(t, pkg, "checker", prep) // the preparer checks their own calc
		failsWith(t, verifyPkg(t, pkg, signers), "checker", "signed with the same key "+fingerprint(t, prep)+" as the preparer signature")
	})
	t.Run("principal not in front matter", func(t *testing.T) {
		s := newSignedRepo(t)
		m, _ := ManifestOf(s.Read("calcs/fp.html"))
		m.Signatures[1].Principal = "someone@example.com"
		rewriteManifest(t, s.pkg, m)
		failsWith(t, verifyPkg(t, s.pkg, s.signers), "checker", "signed as C. Reader <someone@example.com>, but the front matter names C. Reader <checker@example.com>")
	})
}

// rewriteManifest re-renders the package with a changed manifest, as a
// forger with vouch at hand would, so that only the signatures can tell.
func rewriteManifest(t testing.TB, pkg string, m *provenance.Manifest) {
	t.Helper()
	repo, err := provenance.Open(filepath.Dir(pkg))
	if err != nil {
		t.Fatal(err)
	}
	r, err := reproduce(repo, m, "test")
	if err != nil {
		t.Fatal(err)
	}
	html, err := r.render("test", r.record)
	if err != nil {
		t.Fatal(err)
	}
	writePkg(t, pkg, html)
}

// TestHeadMovedOn: the source edited and committed after signing still
// verifies against its recorded commit, and the report says HEAD moved.
func TestHeadMovedOn(t *testing.T) {
	s := newSignedRepo(t)
	s.Write("calcs/fp.calc.md", strings.Replace(signCalc, "213.2 kg/s", "220 kg/s", 1))
	s.Commit("Feed pump power at the new flow", "calcs/fp.calc.md")
	rep := verifyPkg(t, s.pkg, s.signers)
	if !rep.OK() {
		t.Fatalf("verify after a later commit:\n%s", rep)
	}
	out := rep.String()
	for _, want := range []string{"has moved on from the recorded commit", "changed since in 1 later commit", "Feed pump power at the new flow", "result:   VERIFIED"} {
		if !strings.Contains(out, want) {
			t.Errorf("report lacks %q:\n%s", want, out)
		}
	}
}

// TestTamperCheckMethod: the checker's method of checking is signed, so
// editing it in the manifest of a signed package fails the checker's
// signature, in verify and in the script that checks without vouch.
func TestTamperCheckMethod(t *testing.T) {
	for name, edit := range map[string]func(*provenance.Signature){
		"method": func(s *provenance.Signature) {
			s.Method, s.MethodRef = provenance.MethodTest, "TR-7 rev B (fictional pump test)"
		},
		"no method": func(s *provenance.Signature) { s.Method = "" },
	} {
		t.Run(name, func(t *testing.T) {
			s := newSignedRepo(t)
			m, _ := ManifestOf(s.Read("calcs/fp.html"))
			if m.Signatures[1].Method != provenance.MethodReview {
				t.Fatalf("the checker's signature records method %q, want review", m.Signatures[1].Method)
			}
			edit(&m.Signatures[1])
			rewriteManifest(t, s.pkg, m)
			rep := verifyPkg(t, s.pkg, s.signers)
			failsWith(t, rep, "checker", "checker signature of checker@example.com", "signature does not verify")
			if rep.Status != "PREPARED" {
				t.Errorf("status %s, want PREPARED", rep.Status)
			}
			if out, ok := runCheckScript(t, s.pkg, s.signers); ok || !strings.Contains(out, "FAIL checker") || !strings.Contains(out, "ok   preparer") {
				t.Errorf("the script passes an edited method of checking:\n%s", out)
			}
		})
	}
}
