package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// TestQualifyCommand: exit 0 and both files when every value holds, 3 when
// an acceptance case fails, 1 when a case does not parse; a few seconds at
// most.
func TestQualifyCommand(t *testing.T) {
	out := t.TempDir()
	var so, se bytes.Buffer
	start := time.Now()
	if code := run([]string{"qualify", "-o", out}, &so, &se); code != exitOK {
		t.Fatalf("exit %d: %s%s", code, so.String(), se.String())
	}
	if d := time.Since(start); d > 5*time.Second {
		t.Errorf("qualify took %v", d)
	}
	for _, f := range []string{"qualification.html", "qualification.json"} {
		if st, err := os.Stat(filepath.Join(out, f)); err != nil || st.Size() == 0 {
			t.Errorf("%s not written: %v", f, err)
		}
	}
	cases := t.TempDir()
	calc := "```calc\nx [kPa] = 2 bar\n```\n"
	os.WriteFile(filepath.Join(cases, "a.calc.md"), []byte(calc), 0o644)
	os.WriteFile(filepath.Join(cases, "a.expect.yaml"), []byte("- name: x\n  expect: 201 kPa\n  tolerance: 0.5 kPa\n  source: a wrong value on purpose\n"), 0o644)
	so.Reset()
	if code := run([]string{"qualify", "-o", t.TempDir(), "--with", cases}, &so, &se); code != exitFailed || !strings.Contains(so.String(), "FAIL a wrong value on purpose") {
		t.Errorf("exit %d, output %q; want 3 and the failure named", code, so.String())
	}
	os.WriteFile(filepath.Join(cases, "a.expect.yaml"), []byte("- name: x\n  expect: 200 kPa\n"), 0o644)
	se.Reset()
	if code := run([]string{"qualify", "-o", t.TempDir(), "--with", cases}, &so, &se); code != exitErrors || !strings.Contains(se.String(), "a.expect.yaml:1:3:") {
		t.Errorf("exit %d, stderr %q; want 1 and the error at its line", code, se.String())
	}
}
