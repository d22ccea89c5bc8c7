package calcdoc

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// FuzzRead feeds arbitrary documents to the reader and the evaluator: they
// must never panic, and every error must have a position inside the file.
func FuzzRead(f *testing.F) {
	files, _ := filepath.Glob(filepath.Join("..", "examples", "*.calc.md"))
	for _, p := range files {
		if src, err := os.ReadFile(p); err == nil {
			f.Add(src)
		}
	}
	f.Add([]byte("---\ntitle: x\n---\n```calc\na = 1 m\ncheck a > 0 m\n```\n`=a [mm]`\n"))
	f.Add([]byte("> ```calc\n> a = 1\n> ```\n- ~~~calc\n  b = a\n  ~~~\n"))
	f.Add([]byte("```calc\nx = 2 m\ny = x^2\nz = solve(z * 2 m == y, 0 m, 10 m)\n```\n```sweep\nvary x over [1 m, 2 m]\nshow y\nplot y\n```\n"))
	f.Add([]byte("```calc\ns = water(1 bar, 400 K)\nt = water(1 bar, 0)\n```\n```diagram\nT-s: s, t\n```\n"))
	f.Add([]byte("```calc\na = 1 m ± 0.1 m\nb = 2 +/- 0.1 rect\ncorr(a, b) = 0.3\ny = a * b\n```\n```budget\ny k=2 mc 1000\nsensitivity y\n```\n"))
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, src []byte) {
		d := Read(filepath.Join(dir, "f.calc.md"), src)
		d.SweepLimit = 50 // long sweeps are correct but slow; keep the fuzzer fast
		d.Evaluate()
		for _, e := range d.Errors {
			if e.Pos.Line < 1 || e.Pos.Col < 1 || e.Pos.Off < 0 || e.Pos.Off > len(src) {
				t.Fatalf("error outside the file: %+v", e)
			}
		}
		_ = d.Errors.Format("f.calc.md", src)
		for _, it := range d.Items {
			if it.Outcome == nil {
				continue
			}
			if q, ok := it.Outcome.Value.(units.Quantity); ok && (math.IsNaN(q.V) || math.IsInf(q.V, 0)) {
				t.Fatalf("line %d: %s is not finite", it.Stmt.Line, it.Stmt.Name)
			}
			if len(d.Errors) == 0 {
				_ = d.ValueText(it.Outcome)
			}
		}
		for _, sw := range d.Sweeps {
			for _, row := range sw.Rows {
				for _, q := range row {
					if math.IsNaN(q.V) || math.IsInf(q.V, 0) {
						t.Fatalf("sweep of %s: a value is not finite", sw.Var)
					}
				}
			}
		}
	})
}

// FuzzRender renders every fuzzed document that evaluates without errors:
// no panic, no script, the content policy in place, and no number in the
// MathML that is not finite.
func FuzzRender(f *testing.F) {
	f.Add([]byte("---\ntitle: x\n---\n```calc\na = 1 m\nb [mm] = a^2 / (2 m) + sqrt(a * 3 m)\ncheck b > 0 m\n```\n`=b [m]`\n"))
	f.Add([]byte("---\nreferences:\n  - {id: HB-1, title: t, revision: C}\n---\n```calc\na = 1 m // x | HB-1 rev C\n```\n```assumptions\nA1 open: x\nA2 confirmed: y | HB-1\n```\n"))
	f.Add([]byte("```calc\nst = water(1 MPa, 500 K)\nh_1 [kJ/kg] = st.h\neta_th = abs(-0.4) * max(1, 2)\nx = solve(x * 2 == 3, 0, 5)\n```\n"))
	f.Add([]byte("# T\n\n| a | b |\n|---|---|\n| 1 | 2 |\n\n```calc\nDelta_T = 30 degC - 20 degC\nrho_1 = 1000 kg/m^3\nq = rho_1 * 4.18 kJ/(kg*K) * Delta_T\n```\n"))
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, src []byte) {
		d := Read(filepath.Join(dir, "f.calc.md"), src)
		d.SweepLimit = 20
		d.Evaluate()
		if len(d.Errors) > 0 {
			return
		}
		out, err := renderHTML(d)
		if err != nil {
			t.Fatalf("render: %v", err)
		}
		s := string(out)
		if !strings.Contains(s, ContentPolicyTag) || !strings.HasSuffix(strings.TrimSpace(s), "</html>") {
			t.Fatal("the package is cut short or lacks its content policy")
		}
		if strings.Contains(strings.ToLower(s), "<script") {
			t.Fatal("the package holds a script")
		}
		for _, bad := range []string{"<mn>NaN", "<mn>+Inf", "<mn>-Inf", "<mn>Inf"} {
			if strings.Contains(s, bad) {
				t.Fatalf("the package shows %s", bad)
			}
		}
	})
}
