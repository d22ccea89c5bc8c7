package main

import (
	"bytes"
	"math/rand"
	"path/filepath"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/vouchcalc/vouch/internal/testkit"
)

// steering reports the first character in out that could steer a
// terminal, or "" when there is none.
func steering(out string) string {
	for i, r := range out {
		switch {
		case r == utf8.RuneError:
			if _, n := utf8.DecodeRuneInString(out[i:]); n == 1 {
				return "an invalid UTF-8 byte"
			}
		case r < 0x20 && r != '\n' && r != '\t', r == 0x7f, hiddenRune(r):
			return cleanText(string(r))
		}
	}
	return ""
}

// hostile is a calc whose title, description, names of people and file
// name carry terminal escapes and a bidirectional override (fictional).
const hostile = "---\ntitle: \"Header \\e[8mhidden\\e[0m \\e]0;retitled\\a \\u202eFAIL\"\nnumber: \"HB-\\e[2J1\"\n" +
	"people:\n  preparer: P. Writer <preparer@example.com>\n---\n# Intro \x1b[8m\n\n" +
	"```calc\nx = 1 // input \x1b[8m hidden \u202e\ncheck x > 2 // the \x1b[8mcheck\x1b[0m that fails\n```\n"

// TestHostileTextNeverReachesTheTerminal: issue 11 item 17. A title with
// terminal escapes (ESC [8m) hid the rest of run's and verify's output,
// FAIL lines included. Every command's output, with a calc whose title,
// descriptions, people and file name are hostile, holds no character that
// steers a terminal, and the FAIL line is there.
func TestHostileTextNeverReachesTheTerminal(t *testing.T) {
	needTools(t, "git", "ssh-keygen")
	r := testkit.NewRepo(t)
	r.Write("hb.calc.md", hostile)
	r.Write(".gitignore", "*.html\n*.manifest.json\nout/\n")
	r.Commit("Hostile calc")
	calc, pkg := r.Path("hb.calc.md"), r.Path("hb.html")
	odd := filepath.Join(t.TempDir(), "hb\x1b[8m.calc.md") // a hostile file name, outside git
	writeFile(t, odd, hostile)
	key, _ := sshKey(t)
	cases := []struct {
		want int
		args []string
	}{
		{exitFailed, []string{"run", calc}},
		{exitFailed, []string{"run", odd}},
		{exitFailed, []string{"run", "--json", odd}},
		{exitFailed, []string{"render", odd}},
		{exitFailed, []string{"render", calc}},
		{exitFailed, []string{"verify", pkg}},
		{exitOK, []string{"sign", pkg, "--role", "preparer", "--key", key}},
		{exitFailed, []string{"diff", calc}},
		{exitFailed, []string{"register", r.Dir, "-o", filepath.Join(r.Dir, "out")}},
		{exitErrors, []string{"run", filepath.Join(r.Dir, "missing\x1b[8m.calc.md")}},
		{exitUsage, []string{"new", calc}},
		{exitUsage, []string{"serve", filepath.Join(r.Dir, "missing\x1b[8m.calc.md")}},
		{exitUsage, []string{"no-such-\x1b[8m-command"}},
	}
	for _, c := range cases {
		var out, errs bytes.Buffer
		got := run(c.args, &out, &errs)
		if got != c.want {
			t.Errorf("vouch %q: exit %d, want %d\n%s%s", c.args, got, c.want, out.String(), errs.String())
		}
		for _, s := range []string{out.String(), errs.String()} {
			if bad := steering(s); bad != "" {
				t.Errorf("vouch %q printed %s:\n%s", c.args, bad, cleanText(s))
			}
		}
		if c.args[0] == "run" && c.args[1] != "--json" && c.want == exitFailed && !strings.Contains(out.String(), "FAIL") {
			t.Errorf("vouch %q lost its FAIL line:\n%s", c.args, out.String())
		}
	}
}

// TestSafeWriterProperty: random bytes, written in random pieces, come out
// with nothing that steers a terminal, and text without such characters
// comes out unchanged however it is cut.
func TestSafeWriterProperty(t *testing.T) {
	rng := rand.New(rand.NewSource(17))
	alphabet := []string{"a", " ", "\n", "\t", "\x1b", "\r", "\x07", "\x7f", "\xc2\x9b", "\u202e", "η", "°C", "\xff", "\xe2\x80", "→", "\x00"}
	for i := 0; i < 2000; i++ {
		var in strings.Builder
		for j := rng.Intn(30); j > 0; j-- {
			in.WriteString(alphabet[rng.Intn(len(alphabet))])
		}
		var out bytes.Buffer
		w := newSafeWriter(&out)
		b := []byte(in.String())
		for len(b) > 0 {
			n := 1 + rng.Intn(len(b))
			w.Write(b[:n])
			b = b[n:]
		}
		w.Flush()
		if bad := steering(out.String()); bad != "" {
			t.Fatalf("%q came out as %q, with %s", in.String(), out.String(), bad)
		}
		if out.String() != cleanText(in.String()) {
			t.Fatalf("%q cut in pieces gave %q, whole %q", in.String(), out.String(), cleanText(in.String()))
		}
		if steering(in.String()) == "" && out.String() != in.String() {
			t.Fatalf("clean text %q changed to %q", in.String(), out.String())
		}
	}
}
