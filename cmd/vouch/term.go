package main

import (
	"fmt"
	"io"
	"os"
	"sync"
	"unicode/utf8"
)

// safeWriter is the one door from vouch to a terminal: every command's
// stdout and stderr go through it (run wraps them), so text from a calc —
// a title, a description, a name, a file path, a quoted source line — can
// never move the cursor, hide what follows (ESC [8m), retitle the window or
// reorder a line (bidirectional overrides). It writes each C0 and C1
// control character but newline and tab, DEL, each invalid UTF-8 byte and
// each invisible bidirectional control as a visible escape (\x1b,
// \u009b, \u202e); inside JSON strings those escapes read back as the same
// characters, so JSON output stays exact. vouch's own progress lines,
// which redraw with \r and ESC [K, go to the terminal itself
// (terminalOf).
type safeWriter struct {
	mu      sync.Mutex // commands may print from several goroutines
	w       io.Writer
	pending []byte // the start of a UTF-8 sequence cut by the end of a write
}

// newSafeWriter wraps w.
func newSafeWriter(w io.Writer) *safeWriter { return &safeWriter{w: w} }

// Write cleans p and writes it; a UTF-8 sequence cut at the end of p
// waits for the next write (or Flush).
func (s *safeWriter) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	b := append(s.pending, p...)
	s.pending = nil
	cut := len(b)
	for k := 1; k < utf8.UTFMax && k <= len(b); k++ {
		if i := len(b) - k; utf8.RuneStart(b[i]) {
			if !utf8.FullRune(b[i:]) {
				cut = i
			}
			break
		}
	}
	s.pending = append([]byte(nil), b[cut:]...)
	if _, err := s.w.Write(cleanTerm(nil, b[:cut])); err != nil {
		return 0, err
	}
	return len(p), nil
}

// Flush writes a cut sequence left at the end, escaped.
func (s *safeWriter) Flush() error {
	s.mu.Lock()
	defer s.mu.Unlock()
	if len(s.pending) == 0 {
		return nil
	}
	b := s.pending
	s.pending = nil
	_, err := s.w.Write(cleanTerm(nil, b))
	return err
}

// cleanText is cleanTerm for a string.
func cleanText(s string) string { return string(cleanTerm(nil, []byte(s))) }

// cleanTerm appends b to out with every character that could steer a
// terminal written as a visible escape.
func cleanTerm(out, b []byte) []byte {
	for i := 0; i < len(b); {
		c := b[i]
		if c < utf8.RuneSelf {
			if (c >= 0x20 && c != 0x7f) || c == '\n' || c == '\t' {
				out = append(out, c)
			} else {
				out = fmt.Appendf(out, `\x%02x`, c)
			}
			i++
			continue
		}
		r, n := utf8.DecodeRune(b[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			out = fmt.Appendf(out, `\x%02x`, c)
		case hiddenRune(r):
			out = fmt.Appendf(out, `\u%04x`, r)
		default:
			out = append(out, b[i:i+n]...)
		}
		i += n
	}
	return out
}

// hiddenRune reports the C1 controls and the invisible characters that
// reorder text (bidirectional embeddings, overrides and isolates).
func hiddenRune(r rune) bool {
	switch {
	case r >= 0x80 && r <= 0x9f:
		return true
	case r == 0x061c, r == 0x200e, r == 0x200f:
		return true
	case r >= 0x202a && r <= 0x202e, r >= 0x2066 && r <= 0x2069:
		return true
	}
	return false
}

// terminalOf returns the terminal behind w (unwrapping a safeWriter) for
// vouch's own progress lines, and whether there is one.
func terminalOf(w io.Writer) (io.Writer, bool) {
	if s, ok := w.(*safeWriter); ok {
		w = s.w
	}
	if f, ok := w.(*os.File); ok && isTerminal(f) {
		return f, true
	}
	return nil, false
}
