package provenance

import (
	"bytes"
	"crypto/ed25519"
	"errors"
	"fmt"
	"strings"
	"testing"

	"github.com/go-git/go-git/v5/plumbing"
	"golang.org/x/crypto/ssh"
)

// A package's signatures and manifest come from a file anyone can edit:
// their parsers must refuse bad input with an error, never panic.

// fuzzSigner is an ed25519 key made from a fixed seed (for tests only).
func fuzzSigner(f *testing.F) ssh.Signer {
	s, err := ssh.NewSignerFromKey(ed25519.NewKeyFromSeed(bytes.Repeat([]byte{7}, ed25519.SeedSize)))
	if err != nil {
		f.Fatal(err)
	}
	return s
}

// FuzzVerifySig: a mutated signature never verifies against a message it
// was not made for, and garbage is an error.
func FuzzVerifySig(f *testing.F) {
	msg := []byte("calc-package role=checker manifest-sha256=00")
	good, err := Sign(msg, fuzzSigner(f), Namespace)
	if err != nil {
		f.Fatal(err)
	}
	f.Add(good)
	f.Add([]byte("-----BEGIN SSH SIGNATURE-----\nU1NIU0lH\n-----END SSH SIGNATURE-----\n"))
	f.Add([]byte{})
	f.Fuzz(func(t *testing.T, sig []byte) {
		if _, err := VerifySig([]byte("another message"), sig, Namespace); err == nil {
			t.Fatal("a signature verified for a message it was not made for")
		}
		_, _ = VerifySig(msg, sig, Namespace)
	})
}

// FuzzParseManifest: a manifest that parses writes canonical JSON that
// parses again to the same canonical JSON.
func FuzzParseManifest(f *testing.F) {
	f.Add([]byte(`{"format":"vouch-manifest/1","engine":"vouch 0.1.0","results":[{"name":"a","si":1.5,"unit":"m"}],"signatures":[]}`))
	f.Add([]byte(`{"format":"vouch-manifest/1","results":[{"name":"x","si":-0,"unit":""}]}`))
	f.Add([]byte(`{}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		m, err := ParseManifest(data)
		if err != nil {
			return
		}
		a, err := m.Canonical()
		if err != nil {
			return // a manifest that cannot be written (say, a NaN) is refused there
		}
		m2, err := ParseManifest(a)
		if err != nil {
			t.Fatalf("canonical JSON does not parse: %v\n%s", err, a)
		}
		b, err := m2.Canonical()
		if err != nil || !bytes.Equal(a, b) {
			t.Fatalf("canonical JSON is not stable:\n%s\n%s", a, b)
		}
	})
}

// FuzzParseAllowedSigners: any file is a list of signers or an error at
// lines that exist, in order; every signer read has a key; parsing is
// deterministic.
func FuzzParseAllowedSigners(f *testing.F) {
	pub := strings.TrimSpace(string(ssh.MarshalAuthorizedKey(fuzzSigner(f).PublicKey())))
	f.Add([]byte("checker@example.com " + pub))
	f.Add([]byte("# comment\n\"a b\",c@example.com namespaces=\"vouch\" " + pub))
	f.Add([]byte(`a@x valid-before="20300101Z",valid-before="20200101Z" ` + pub))
	f.Add([]byte(`a@x ,cert-authority,valid-after="2030 1 1",namespaces="a\"b" ` + pub + " c\r\n"))
	f.Add([]byte(`a"@x b"c valid-after="20240231235960UTC" ` + pub))
	f.Fuzz(func(t *testing.T, data []byte) {
		signers, err := ParseAllowedSigners(data)
		lines := bytes.Count(data, []byte("\n")) + 1
		for _, s := range signers {
			if s.Key == nil || s.Line < 1 || s.Line > lines || len(s.Principals) == 0 {
				t.Fatalf("signer %+v read from %q", s, data)
			}
		}
		if err != nil {
			last := 0
			for _, e := range err.(interface{ Unwrap() []error }).Unwrap() {
				var le *AllowedSignersError
				if !errors.As(e, &le) || le.Line <= last || le.Line > lines {
					t.Fatalf("error %v is not at a line of the file after line %d", e, last)
				}
				last = le.Line
			}
		}
		again, err2 := ParseAllowedSigners(data)
		if len(again) != len(signers) || fmt.Sprint(err) != fmt.Sprint(err2) {
			t.Fatal("parsing the same file twice differs")
		}
	})
}

// FuzzMatchPattern: the linear-time wildcard matcher agrees with the
// plain recursive definition of * and ?.
func FuzzMatchPattern(f *testing.F) {
	f.Add("a@example.com", "*@*.com")
	f.Add("aaaaaaaaab", "*a*a*a*b")
	f.Add("", "*")
	f.Fuzz(func(t *testing.T, s, p string) {
		if len(s) > 64 || len(p) > 16 {
			return
		}
		if got, want := matchPattern(s, p), matchRecursive(s, p); got != want {
			t.Fatalf("matchPattern(%q, %q) = %v, want %v", s, p, got, want)
		}
	})
}

// matchRecursive is * and ? matching by definition.
func matchRecursive(s, p string) bool {
	if p == "" {
		return s == ""
	}
	switch p[0] {
	case '*':
		return matchRecursive(s, p[1:]) || (s != "" && matchRecursive(s[1:], p))
	case '?':
		return s != "" && matchRecursive(s[1:], p[1:])
	}
	return s != "" && s[0] == p[0] && matchRecursive(s[1:], p[1:])
}

// FuzzCommitGraph: a commit-graph file, however corrupt, is either refused
// by graphFileSane and go-git, or read without a panic or a hang (go-git
// trusts the file's offsets, so a file that passes must keep every look-up
// inside it), and a look-up that panics inside go-git turns the graph off
// for the rest of the walk.
func FuzzCommitGraph(f *testing.F) {
	f.Add([]byte("CGPH\x01\x01\x00\x00"))
	f.Add([]byte{})
	f.Fuzz(func(t *testing.T, data []byte) {
		if !graphFileSane(data) {
			return
		}
		idx, err := openGraphFile(memFile{bytes.NewReader(data)})
		if err != nil {
			return
		}
		w := &historyWalk{graph: idx}
		for i := uint32(0); i < 4 && w.graph != nil; i++ {
			h, err := graphHash(w, i)
			if err != nil {
				break
			}
			w.graphNode(h)
		}
	})
}

// graphHash is GetHashByIndex with go-git's panics counted as errors.
func graphHash(w *historyWalk, i uint32) (h plumbing.Hash, err error) {
	defer func() {
		if recover() != nil {
			err = errors.New("panic")
		}
	}()
	return w.graph.GetHashByIndex(i)
}
