package preview

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// longCalc is a calc of about 500 calc lines: a fictional expansion line
// of 124 steps, each a pressure, a water state, its enthalpy and entropy.
// The prose names the edit, so a test can see which save the page shows.
func longCalc(edit int) string {
	var b strings.Builder
	fmt.Fprintf(&b, "---\ntitle: Expansion line, 500 calc lines (fictional)\nnumber: BM-500\nproject: Benchmark plant (fictional)\nrevision: A\nsummary: [h_124]\n---\n# Expansion line\n\nEdit number %d.\n\n```calc\n", edit)
	fmt.Fprintf(&b, "p_0 = %d MPa // start pressure\nT_0 = 500 degC // temperature along the line\n", 10+edit%2)
	for i := 1; i <= 124; i++ {
		if i%25 == 0 {
			fmt.Fprintf(&b, "```\n\n## Steps from %d\n\n```calc\n", i)
		}
		fmt.Fprintf(&b, "p_%d [MPa] = p_%d * 0.98 // pressure after step %d\n", i, i-1, i)
		fmt.Fprintf(&b, "st_%d = water(p_%d, T_0)\n", i, i)
		fmt.Fprintf(&b, "h_%d [kJ/kg] = st_%d.h\n", i, i)
		fmt.Fprintf(&b, "s_%d [kJ/(kg*K)] = st_%d.s\n", i, i)
	}
	b.WriteString("check h_124 > 3000 kJ/kg // superheated throughout\n```\n")
	return b.String()
}

// BenchmarkLiveReload500 saves a 500-line calc with the preview open in
// headless Chromium and times until the open page shows the save.
//
//	go test -run '^$' -bench LiveReload -benchtime 20x ./calcdoc/preview/
func BenchmarkLiveReload500(b *testing.B) {
	exe := needBrowser(b)
	calc := gitDir(b, "long.calc.md", longCalc(0))
	url := startServer(b, calc)
	br := openBrowser(b, exe, url)
	br.waitFor(b, "Edit number 0.", "", 30*time.Second)
	var worst time.Duration
	b.ResetTimer()
	for i := 1; i <= b.N; i++ {
		if err := os.WriteFile(calc, []byte(longCalc(i)), 0o644); err != nil {
			b.Fatal(err)
		}
		took := br.waitFor(b, fmt.Sprintf("Edit number %d.", i), "", 10*time.Second)
		worst = max(worst, took)
	}
	b.ReportMetric(float64(worst.Microseconds())/1000, "worst-ms")
}

// BenchmarkRender500 times one render of the 500-line calc as the preview
// does it (evaluate, provenance from git, package).
func BenchmarkRender500(b *testing.B) {
	calc := gitDir(b, "long.calc.md", longCalc(0))
	srv, err := New(Options{Path: calc})
	if err != nil {
		b.Fatal(err)
	}
	for i := 0; i < b.N; i++ {
		srv.render(filepath.Base(calc))
	}
}
