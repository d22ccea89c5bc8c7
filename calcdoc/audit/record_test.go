package audit

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"sync/atomic"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/testkit"
)

func TestRecordOutsideRepository(t *testing.T) {
	dir := testkit.TempDir(t)
	calc := filepath.Join(dir, "fp.calc.md")
	if err := os.WriteFile(calc, []byte(signCalc), 0o644); err != nil {
		t.Fatal(err)
	}
	pkg := renderFile(t, calc)
	html, _ := os.ReadFile(pkg)
	for _, want := range []string{
		"The calc is not under version control: it has no recorded revisions and cannot be signed.",
		`<div class="stamp draft">DRAFT</div>`,
	} {
		if !bytes.Contains(html, []byte(want)) {
			t.Errorf("package lacks %q", want)
		}
	}
	m, err := ManifestOf(html)
	if err != nil {
		t.Fatal(err)
	}
	if m.Commit != "" || m.Clean || m.Source != "fp.calc.md" || m.SourceHash != provenance.BlobHash([]byte(signCalc)) {
		t.Errorf("manifest = commit %q, clean %v, source %q, hash %s", m.Commit, m.Clean, m.Source, m.SourceHash)
	}
	_, rep, err := Sign(pkg, SignOptions{Role: "preparer", Key: "unused", VerifyOptions: VerifyOptions{Engine: "test"}})
	if !errors.Is(err, ErrNotVerified) {
		t.Fatalf("sign outside a repository: %v, want ErrNotVerified", err)
	}
	failsWith(t, rep, "source", "not under version control")
}

func TestRecordInRepository(t *testing.T) {
	r := calcRepo(t)
	head := r.Git("rev-parse", "HEAD")
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	html := r.Read("calcs/fp.html")
	m, err := ManifestOf(html)
	if err != nil {
		t.Fatal(err)
	}
	blob := r.Git("rev-parse", "HEAD:calcs/fp.calc.md")
	if m.Source != "calcs/fp.calc.md" || m.Commit != head || !m.Clean || m.SourceHash != blob {
		t.Errorf("manifest = source %q commit %s clean %v hash %s; want calcs/fp.calc.md %s true %s", m.Source, m.Commit, m.Clean, m.SourceHash, head, blob)
	}
	if m.Engine != "vouch test" || m.Formulation != "IAPWS-IF97" || m.FormulationVersion == "" {
		t.Errorf("engine %q, formulation %q %q", m.Engine, m.Formulation, m.FormulationVersion)
	}
	names := []string{}
	for _, res := range m.Results {
		names = append(names, res.Name)
	}
	if got := strings.Join(names, " "); got != "p_in p_out m_dot w_p P_pump check:21" {
		t.Errorf("results = %s", got)
	}
	for _, want := range []string{head[:12], "Feed pump power, first issue", "with a clean work tree", "vouch verify fp.html --signers allowed_signers"} {
		if !bytes.Contains(html, []byte(want)) {
			t.Errorf("package lacks %q", want)
		}
	}
	file, err := provenance.ParseManifest(r.Read("calcs/fp.manifest.json"))
	if err != nil {
		t.Fatal(err)
	}
	if a, b := canonical(t, file), canonical(t, m); !bytes.Equal(a, b) {
		t.Error("the manifest file differs from the embedded manifest")
	}
	if again := renderFile(t, r.Path("calcs/fp.calc.md")); !bytes.Equal(html, r.Read("calcs/fp.html")) || again != pkg {
		t.Error("two renders at the same commit differ")
	}
}

func canonical(t *testing.T, m *provenance.Manifest) []byte {
	t.Helper()
	b, err := m.Canonical()
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// TestRecordDirty: uncommitted changes to the calc or to another tracked
// file mark the package unclean, and sign refuses it.
func TestRecordDirty(t *testing.T) {
	for _, c := range []struct{ name, file, note string }{
		{"source", "calcs/fp.calc.md", "Rendered from uncommitted changes to the calc file"},
		{"tree", "README.md", "while the work tree had uncommitted changes"},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := calcRepo(t)
			r.Write("README.md", "Test plant calcs (fictional).\n")
			r.Commit("readme")
			content := signCalc + "\nA note.\n"
			if c.file == "README.md" {
				content = "changed\n"
			}
			r.Write(c.file, content)
			pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
			html := r.Read("calcs/fp.html")
			m, _ := ManifestOf(html)
			if m.Clean {
				t.Error("manifest says clean")
			}
			if !bytes.Contains(html, []byte(c.note)) {
				t.Errorf("cover lacks %q", c.note)
			}
			k := newKey(t, "ed25519")
			_, rep, err := Sign(pkg, SignOptions{Role: "preparer", Key: k.path, VerifyOptions: VerifyOptions{Engine: "test"}})
			if !errors.Is(err, ErrNotVerified) {
				t.Fatalf("sign: %v, want ErrNotVerified", err)
			}
			if c.name == "source" {
				failsWith(t, rep, "source", "rendered from uncommitted changes")
			} else {
				failsWith(t, rep, "source", "clean: false")
			}
		})
	}
}

// TestRecordDataFiles: a data file's hash is recorded; verify reads it at
// the commit, so a later edit in the work tree changes nothing.
func TestRecordDataFiles(t *testing.T) {
	r := newGitRepo(t)
	r.Write("calcs/data/cw.csv", "# cooling-water curve (fictional)\nT_cw [degC],p [kPa]\n10,4.5\n20,6.5\n30,9.8\n")
	r.Write("calcs/cw.calc.md", "---\ntitle: condenser pressure (fictional)\n---\n```calc\ncw = csv(\"data/cw.csv\")\np_c [kPa] = interp(cw, \"T_cw\", 25 degC, \"p\")\n```\n")
	r.Commit("condenser curve")
	pkg := renderFile(t, r.Path("calcs/cw.calc.md"))
	m, _ := ManifestOf(r.Read("calcs/cw.html"))
	blob := r.Git("rev-parse", "HEAD:calcs/data/cw.csv")
	if len(m.Data) != 1 || m.Data[0].Path != "calcs/data/cw.csv" || m.Data[0].Hash != blob || !m.Clean {
		t.Fatalf("data = %+v, clean %v; want calcs/data/cw.csv %s", m.Data, m.Clean, blob)
	}
	r.Write("calcs/data/cw.csv", "T_cw [degC],p [kPa]\n10,5\n30,10\n")
	if rep := verifyPkg(t, pkg, ""); !rep.OK() {
		t.Fatalf("verify after a work-tree edit of the data:\n%s", rep)
	}
	renderFile(t, r.Path("calcs/cw.calc.md"))
	if m, _ := ManifestOf(r.Read("calcs/cw.html")); m.Clean {
		t.Error("a modified data file left the manifest clean")
	}
}

// TestWorkspaceCleanShared: git status starts when the workspace opens;
// the workspace and its forks, on their own goroutines, all wait for the
// one answer, a dirty tracked file included.
func TestWorkspaceCleanShared(t *testing.T) {
	for _, dirty := range []bool{false, true} {
		r := calcRepo(t)
		r.Write("README.md", "Test plant calcs (fictional).\n")
		r.Commit("readme")
		if dirty {
			r.Write("README.md", "changed\n")
		}
		w, err := OpenWorkspace(r.Path("calcs"))
		if err != nil {
			t.Fatal(err)
		}
		spaces := []*Workspace{w}
		for i := 0; i < 3; i++ {
			f, err := w.Fork()
			if err != nil {
				t.Fatal(err)
			}
			spaces = append(spaces, f)
		}
		clean := make([]bool, len(spaces))
		errs := make([]error, len(spaces))
		var wg sync.WaitGroup
		for i, s := range spaces {
			wg.Add(1)
			go func() {
				defer wg.Done()
				d, err := calcdoc.ReadFile(r.Path("calcs/fp.calc.md"))
				if err != nil {
					errs[i] = err
					return
				}
				st, err := s.Stamp(d, "test")
				if err != nil {
					errs[i] = err
					return
				}
				clean[i] = st.Manifest.Clean
			}()
		}
		wg.Wait()
		for i := range spaces {
			if errs[i] != nil || clean[i] == dirty {
				t.Errorf("dirty %v, workspace %d: clean %v, %v", dirty, i, clean[i], errs[i])
			}
		}
	}
}

// TestCleanStateWaitsOnce: however many goroutines ask, git status is
// waited for once and its answer, error included, given to each.
func TestCleanStateWaitsOnce(t *testing.T) {
	var calls atomic.Int32
	fail := errors.New("status failed")
	c := &cleanState{wait: func() (bool, error) { calls.Add(1); return true, fail }}
	var wg sync.WaitGroup
	for i := 0; i < 8; i++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			if clean, err := c.get(); !clean || err != fail {
				t.Errorf("get = %v, %v", clean, err)
			}
		}()
	}
	wg.Wait()
	if n := calls.Load(); n != 1 {
		t.Errorf("waited %d times, want 1", n)
	}
}
