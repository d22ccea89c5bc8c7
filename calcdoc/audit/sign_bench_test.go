package audit

import (
	"bytes"
	"fmt"
	"github.com/vouchcalc/vouch/calcdoc"
	"os"
	"os/exec"
	"path/filepath"
	"testing"
)

// The benchmark repository: a plant-sized calc repository with many data
// files and a long history.
const (
	benchFiles   = 5000
	benchCommits = 300
	benchTouch   = 27 // every 27th commit edits the calc file
	benchCalc    = "calcs/fp.calc.md"
)

// buildBenchRepo writes the repository with git fast-import: commit 1 adds
// every file, each later commit edits three data files, and every
// benchTouch-th commit the calc file too.
func buildBenchRepo(b *testing.B) *gitRepo {
	r := newGitRepo(b)
	var s bytes.Buffer
	for c := 1; c <= benchCommits; c++ {
		writeBenchCommit(&s, c)
	}
	cmd := exec.Command("git", "fast-import", "--quiet")
	cmd.Dir, cmd.Env, cmd.Stdin = r.Dir, r.Env(), &s
	if out, err := cmd.CombinedOutput(); err != nil {
		b.Fatalf("git fast-import: %v\n%s", err, out)
	}
	r.Git("reset", "-q", "--hard", "main")
	r.Write(".git/info/exclude", "*.html\n*.manifest.json\n")
	return r
}

func writeBenchCommit(s *bytes.Buffer, c int) {
	msg := fmt.Sprintf("Commit %d", c)
	fmt.Fprintf(s, "commit refs/heads/main\nmark :%d\n", c)
	for _, who := range []string{"author", "committer"} {
		fmt.Fprintf(s, "%s P. Writer (fictional) <preparer@example.com> %d +0000\n", who, 1767000000+3600*c)
	}
	fmt.Fprintf(s, "data %d\n%s\n", len(msg), msg)
	if c > 1 {
		fmt.Fprintf(s, "from :%d\n", c-1)
	}
	for _, f := range benchFilesOf(c) {
		body := fmt.Sprintf("%s at commit %d\n", f, c)
		if f == benchCalc {
			body = signCalc + fmt.Sprintf("\nRevised at commit %d.\n", c)
		}
		fmt.Fprintf(s, "M 100644 inline %s\ndata %d\n%s\n", f, len(body), body)
	}
}

// benchFilesOf lists the files commit c writes.
func benchFilesOf(c int) []string {
	name := func(i int) string { return fmt.Sprintf("data/d%02d/f%03d.csv", i/100, i%100) }
	if c == 1 {
		files := []string{benchCalc}
		for i := 0; i < benchFiles; i++ {
			files = append(files, name(i))
		}
		return files
	}
	files := []string{name(c * 7 % benchFiles), name(c * 13 % benchFiles), name(c * 31 % benchFiles)}
	if c%benchTouch == 0 {
		files = append(files, benchCalc)
	}
	return files
}

// BenchmarkRenderProvenance times rendering a calc in a repository of
// 5,000 files and 300 commits against rendering the same calc outside any
// repository; the difference is what provenance adds. Provenance alone is
// Doc.Provenance: Open, Rel, Head, FileState, Clean, History, CommitDate.
func BenchmarkRenderProvenance(b *testing.B) {
	r := buildBenchRepo(b)
	inRepo := r.Path(benchCalc)
	outside := filepath.Join(b.TempDir(), "fp.calc.md")
	if err := os.WriteFile(outside, r.Read(benchCalc), 0o644); err != nil {
		b.Fatal(err)
	}
	b.Run("render-outside", func(b *testing.B) {
		for b.Loop() {
			renderQuiet(b, outside)
		}
	})
	b.Run("render-in-repo", func(b *testing.B) {
		for b.Loop() {
			renderQuiet(b, inRepo)
		}
	})
	d, _ := calcdoc.ReadFile(inRepo)
	b.Run("provenance", func(b *testing.B) {
		for b.Loop() {
			rec, err := Provenance(d, "test")
			if err != nil || !rec.Versioned || !rec.Manifest.Clean || len(rec.History) != 1+benchCommits/benchTouch {
				b.Fatalf("provenance: %v, %+v", err, rec)
			}
		}
	})
}

func renderQuiet(b *testing.B, calc string) {
	d, err := calcdoc.ReadFile(calc)
	if err != nil {
		b.Fatal(err)
	}
	st, err := Provenance(d, "test")
	if err != nil {
		b.Fatal(err)
	}
	if _, err := d.Render(calcdoc.RenderOptions{Engine: "test", Stamp: st}); err != nil {
		b.Fatal(err)
	}
}

// BenchmarkVerify200 verifies a signed package of a 200-line calc, a
// quarter of whose lines call water(), in the 5,000-file repository.
func BenchmarkVerify200(b *testing.B) {
	r := buildBenchRepo(b)
	r.Write("calcs/long.calc.md", propertyCalc(200))
	r.Commit("long calc", "calcs/long.calc.md")
	pkg := renderFile(b, r.Path("calcs/long.calc.md"))
	k := newKey(b, "ed25519")
	signers := allowedSigners(b, preparerEmail, k)
	signPkg(b, pkg, "preparer", k, signers)
	for b.Loop() {
		if rep := verifyPkg(b, pkg, signers); !rep.OK() {
			b.Fatalf("verify:\n%s", rep)
		}
	}
}

// propertyCalc writes n calc lines in groups of four: a pressure, a
// temperature, a water state and an enthalpy from it.
func propertyCalc(n int) string {
	var b bytes.Buffer
	b.WriteString("---\ntitle: generated (fictional)\npeople:\n  preparer: P. Writer <preparer@example.com>\n---\n```calc\n")
	for i := 0; i < n/4; i++ {
		fmt.Fprintf(&b, "p_%d = %d kPa // pressure %d\n", i, 100+50*i, i)
		fmt.Fprintf(&b, "T_%d = %d degC // temperature %d\n", i, 200+5*i, i)
		fmt.Fprintf(&b, "st_%d = water(p_%d, T_%d)\n", i, i, i)
		fmt.Fprintf(&b, "h_%d [kJ/kg] = st_%d.h // enthalpy %d\n", i, i, i)
	}
	b.WriteString("```\n")
	return b.String()
}
