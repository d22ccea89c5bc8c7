package main

import (
	"bytes"
	"context"
	"github.com/vouchcalc/vouch/internal/testkit"
	"net"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// reviewRepo makes a repository holding the example calc as hb.calc.md,
// committed and tagged v1, with fictional identities and dates.
func reviewRepo(t *testing.T) string {
	t.Helper()
	src, err := os.ReadFile(filepath.Join("..", "..", "examples", "rankine-simple.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	r := testkit.NewRepo(t)
	r.Write("hb.calc.md", string(src))
	r.Commit("Unit 1 heat balance")
	r.Git("tag", "v1")
	return r.Dir
}

func replaceIn(t *testing.T, file, old, new string) {
	t.Helper()
	b, _ := os.ReadFile(file)
	if !bytes.Contains(b, []byte(old)) {
		t.Fatalf("%q not in %s", old, file)
	}
	os.WriteFile(file, bytes.Replace(b, []byte(old), []byte(new), 1), 0o644)
}

func TestDiffCommand(t *testing.T) {
	dir := reviewRepo(t)
	calc := filepath.Join(dir, "hb.calc.md")
	report := filepath.Join(t.TempDir(), "changes.html")
	cases := []struct {
		name         string
		edit         [2]string
		args         []string
		code         int
		stdout, errs string
	}{
		{"unchanged", [2]string{}, []string{"diff", calc}, exitOK, "no changes", ""},
		{"changed input, report", [2]string{"P_el = 250 MW", "P_el = 260 MW"}, []string{"diff", calc, "--from", "v1", "-o", report}, exitOK, "wrote " + report, ""},
		{"flipped check", [2]string{"check x_2 >= 0.86", "check x_2 >= 0.88"}, []string{"diff", calc, "--from", "v1"}, exitFailed, "PASS -> FAIL", ""},
		{"all values", [2]string{}, []string{"diff", "--all", calc, "--from", "v1"}, exitFailed, "=  28", ""},
		{"errors", [2]string{"p_2 = 8 kPa", "p_2 = 8 kPa + 1 K"}, []string{"diff", calc}, exitErrors, "", "hb.calc.md:29:"},
		{"unknown revision", [2]string{}, []string{"diff", calc, "--from", "v2"}, exitUsage, "", `unknown revision "v2": nearest names are v1`},
		{"no file", [2]string{}, []string{"diff"}, exitUsage, "", "usage: vouch diff"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if c.edit[0] != "" {
				replaceIn(t, calc, c.edit[0], c.edit[1])
			}
			var out, errs bytes.Buffer
			if code := run(c.args, &out, &errs); code != c.code {
				t.Fatalf("exit %d, want %d\n%s%s", code, c.code, out.String(), errs.String())
			}
			if !strings.Contains(out.String(), c.stdout) || !strings.Contains(errs.String(), c.errs) {
				t.Errorf("stdout %q lacks %q or stderr %q lacks %q", out.String(), c.stdout, errs.String(), c.errs)
			}
		})
	}
	if b, err := os.ReadFile(report); err != nil || !bytes.Contains(b, []byte("Inputs changed (1 of 7)")) || !bytes.Contains(b, []byte("<i>P</i><sub>el</sub>")) {
		t.Errorf("report: %v", err)
	}
}

// anyButUsage accepts any exit code but bad usage: a shard's calcs depend
// on how the paths hash.
const anyButUsage = -1

func TestRegisterCommand(t *testing.T) {
	dir := t.TempDir()
	src, _ := os.ReadFile(filepath.Join("..", "..", "examples", "rankine-simple.calc.md"))
	os.WriteFile(filepath.Join(dir, "a.calc.md"), src, 0o644)
	out := t.TempDir()
	cases := []struct {
		name         string
		setup        func()
		args         []string
		code         int
		stdout, errs string
	}{
		{"first run", nil, []string{"register", dir, "-o", out}, exitOK, "1 calc under " + dir + ": 1 rendered, 0 unchanged", ""},
		{"second run", nil, []string{"register", dir, "-o", out}, exitOK, "0 rendered, 1 unchanged", ""},
		{"a failing check", func() {
			os.WriteFile(filepath.Join(dir, "b.calc.md"), bytes.Replace(src, []byte("check eta_th > 30 %"), []byte("check eta_th > 50 %"), 1), 0o644)
		}, []string{"register", dir, "-o", out}, exitFailed, "b.calc.md: 1 of 2 checks FAIL", ""},
		{"a broken calc", func() {
			os.WriteFile(filepath.Join(dir, "c.calc.md"), bytes.Replace(src, []byte("p_2 = 8 kPa"), []byte("p_2 = 8 kPa + 1 K"), 1), 0o644)
		}, []string{"register", dir, "-o", out}, exitErrors, "1 rendered, 2 unchanged", "c.calc.md:29:"},
		{"a shard", nil, []string{"register", dir, "-o", t.TempDir(), "--shard", "1/2"}, anyButUsage, "run vouch register without --shard", ""},
		{"bad shard", nil, []string{"register", dir, "--shard", "3/2"}, exitUsage, "", "give i/n with 1 <= i <= n"},
		{"no calcs", nil, []string{"register", t.TempDir(), "-o", t.TempDir()}, exitUsage, "", "no calc files (*.calc.md)"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if c.setup != nil {
				c.setup()
			}
			var so, se bytes.Buffer
			code := run(c.args, &so, &se)
			if c.code == anyButUsage && code == exitUsage || c.code != anyButUsage && code != c.code {
				t.Fatalf("exit %d, want %d\n%s%s", code, c.code, so.String(), se.String())
			}
			if !strings.Contains(so.String(), c.stdout) || !strings.Contains(se.String(), c.errs) {
				t.Errorf("stdout %q lacks %q or stderr %q lacks %q", so.String(), c.stdout, se.String(), c.errs)
			}
		})
	}
}

func TestServeCommand(t *testing.T) {
	dir := t.TempDir()
	src, _ := os.ReadFile(filepath.Join("..", "..", "examples", "rankine-simple.calc.md"))
	calc := filepath.Join(dir, "a.calc.md")
	os.WriteFile(calc, src, 0o644)
	busy, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	defer busy.Close()
	defer func(old func() (context.Context, context.CancelFunc)) { serveContext = old }(serveContext)
	serveContext = func() (context.Context, context.CancelFunc) {
		return context.WithTimeout(context.Background(), 200*time.Millisecond)
	}
	cases := []struct {
		name         string
		args         []string
		code         int
		stdout, errs string
	}{
		{"serves until stopped", []string{"serve", calc, "--addr", "127.0.0.1:0"}, exitOK, "previewing " + calc + " at http://127.0.0.1:", ""},
		{"not loopback", []string{"serve", calc, "--addr", "0.0.0.0:8417"}, exitUsage, "", "give --allow-remote"},
		{"port in use", []string{"serve", calc, "--addr", busy.Addr().String()}, exitUsage, "", "is in use by another program"},
		{"missing file", []string{"serve", filepath.Join(dir, "none.calc.md")}, exitUsage, "", "no such file"},
		{"folder without calcs", []string{"serve", t.TempDir()}, exitUsage, "", "holds no calc files"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var so, se bytes.Buffer
			if code := run(c.args, &so, &se); code != c.code {
				t.Fatalf("exit %d, want %d\n%s%s", code, c.code, so.String(), se.String())
			}
			if !strings.Contains(so.String(), c.stdout) || !strings.Contains(se.String(), c.errs) {
				t.Errorf("stdout %q lacks %q or stderr %q lacks %q", so.String(), c.stdout, se.String(), c.errs)
			}
		})
	}
}
