package preview

import (
	"context"
	"fmt"
	"github.com/vouchcalc/vouch/internal/testkit"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// pumpCalc is a small calc of a fictional plant; its pump power is 3.357 MW
// at a discharge pressure of 12.5 MPa and 3.760 MW at 14 MPa.
const pumpCalc = `---
title: Feed pump power (fictional test plant)
number: FP-001
project: Test plant (fictional)
revision: A
summary: [P_pump]
---
# Feed pump

` + "```calc" + `
p_in = 8 kPa                         // pump suction pressure
p_out = 12.5 MPa                     // pump discharge pressure
m_dot = 213.2 kg/s                   // feedwater flow
st_in = water(p_in, 0)               // saturated liquid at suction
w_p [kJ/kg] = st_in.v * (p_out - p_in) / 80 %
P_pump [MW] = m_dot * w_p            // pump power
check P_pump < 5 MW                  // motor frame limit (fictional)
` + "```" + `
`

// gitDir makes a repository (internal/testkit) holding the calc,
// committed, and returns the calc's path.
func gitDir(t testing.TB, name, src string) string {
	t.Helper()
	r := testkit.NewRepo(t)
	r.Write(name, src)
	r.Commit("Feed pump power")
	return r.Path(name)
}

// startServer serves path on a free loopback port until the test ends.
func startServer(t testing.TB, path string) string {
	t.Helper()
	srv, err := New(Options{Path: path, Engine: "0.1.0-test"})
	if err != nil {
		t.Fatal(err)
	}
	ln, err := Listen("127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error, 1)
	go func() { done <- srv.Serve(ctx, ln) }()
	t.Cleanup(func() {
		cancel()
		if err := <-done; err != nil {
			t.Error(err)
		}
	})
	return "http://" + ln.Addr().String() + "/"
}

// snapshot records every file under dir but skip, with size and time.
func snapshot(t testing.TB, dir, skip string) map[string]string {
	t.Helper()
	out := map[string]string{}
	filepath.WalkDir(dir, func(p string, e fs.DirEntry, err error) error {
		if err != nil || p == skip {
			return err
		}
		if info, err := e.Info(); err == nil {
			out[p] = fmt.Sprint(info.Size(), info.ModTime().UnixNano(), info.Mode())
		}
		return nil
	})
	return out
}

func edit(t testing.TB, file, old, new string) {
	t.Helper()
	b, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	s := strings.Replace(string(b), old, new, 1)
	if s == string(b) {
		t.Fatalf("%q is not in %s", old, file)
	}
	if err := os.WriteFile(file, []byte(s), 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestLiveReloadInBrowser opens the preview in headless Chromium, edits
// the calc, and watches the open page change by itself: a new value, then
// a broken edit shown at its line, then the package again once fixed. The
// repository is not written to.
func TestLiveReloadInBrowser(t *testing.T) {
	exe := needBrowser(t)
	calc := gitDir(t, "fp.calc.md", pumpCalc)
	before := snapshot(t, filepath.Dir(calc), calc)
	url := startServer(t, calc)
	b := openBrowser(t, exe, url)
	b.waitFor(t, "3.357", "", 20*time.Second)
	steps := []struct {
		name, old, new, want, gone string
	}{
		{"new value", "p_out = 12.5 MPa", "p_out = 14 MPa", "3.760", "3.357"},
		{"broken edit", "p_out = 14 MPa", "p_out = 14 MPa + 3 kg", "fp.calc.md:12:", "3.760"},
		{"fixed", "p_out = 14 MPa + 3 kg", "p_out = 14 MPa", "3.760", "cannot add"},
	}
	for _, s := range steps {
		edit(t, calc, s.old, s.new)
		took := b.waitFor(t, s.want, s.gone, 10*time.Second)
		t.Logf("%s: the page changed %v after the save", s.name, took.Round(time.Millisecond))
	}
	if text, _ := b.text(); !strings.Contains(text, "Preview of fp.calc.md") {
		t.Error("the page lacks the preview banner")
	}
	after := snapshot(t, filepath.Dir(calc), calc)
	for p, st := range after {
		if before[p] != st {
			t.Errorf("the preview wrote %s", p)
		}
	}
}
