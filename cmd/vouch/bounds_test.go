package main

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/safefile"
	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestCommandLinePathsNotRegular is issue 11 item 10: every command that
// reads a path from the command line refuses a device or a named pipe at
// once (no memory exhausted, no hang), with a non-zero exit and nothing
// written.
func TestCommandLinePathsNotRegular(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe.calc.md")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip("no named pipes here:", err)
	}
	r := testkit.NewRepo(t) // a repository whose vouch.yaml is a named pipe
	r.Write("c.calc.md", "```calc\na = 1 m\n```\n")
	r.Commit("calc")
	repo := r.Dir
	if err := syscall.Mkfifo(filepath.Join(repo, "vouch.yaml"), 0o600); err != nil {
		t.Fatal(err)
	}
	pkg := filepath.Join(dir, "x.html")
	os.WriteFile(pkg, []byte("<html></html>"), 0o600)
	cases := [][]string{
		{"run", "/dev/zero"},
		{"new", filepath.Join(repo, "d.calc.md")},
		{"run", fifo},
		{"render", fifo, "-o", dir},
		{"verify", "/dev/zero"},
		{"verify", fifo},
		{"verify", pkg, "--signers", "/dev/zero"},
		{"sign", pkg, "--role", "preparer", "--signature", fifo, "--signed", "2026-03-14T09:26:53Z"},
	}
	for _, args := range cases {
		done := make(chan int, 1)
		var out, errs bytes.Buffer
		go func() { done <- run(args, &out, &errs) }()
		select {
		case code := <-done:
			if code == exitOK || !strings.Contains(errs.String()+out.String(), "not a regular file") {
				t.Errorf("vouch %s: exit %d\n%s%s", strings.Join(args, " "), code, out.String(), errs.String())
			}
		case <-time.After(20 * time.Second):
			t.Fatalf("vouch %s hangs", strings.Join(args, " "))
		}
	}
	// sign reads the key after the package verifies; the key reader is
	// held to the same rule directly.
	if _, err := provenance.LoadSigner("/dev/zero"); !errors.Is(err, safefile.ErrNotRegular) {
		t.Errorf("sign --key /dev/zero: %v", err)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 2 {
		t.Errorf("files written: %v", entries)
	}
}
