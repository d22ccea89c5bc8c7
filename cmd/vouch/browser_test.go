package main

import (
	"bytes"
	"net/http"
	"net/http/httptest"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"sync"
	"testing"
	"time"
)

// needBrowser returns the headless browser, skipping outside CI when none
// is installed (CI installs one and must not skip).
func needBrowser(t *testing.T) string {
	t.Helper()
	b, err := findBrowser()
	if err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("CI must have a headless browser: %v", err)
		}
		t.Skip(err)
	}
	return b
}

// TestPackageInBrowser opens each example's package in headless Chromium:
// the equations are laid out as MathML, no request leaves the page, and the
// package prints to a PDF with a sensible page count.
func TestPackageInBrowser(t *testing.T) {
	if testing.Short() {
		t.Skip("the slow browser test: it runs without -short, as CI does")
	}
	browser := needBrowser(t)
	fractions := 0
	for _, f := range examples(t) {
		name := strings.TrimSuffix(filepath.Base(f), ".calc.md")
		t.Run(name, func(t *testing.T) {
			calc := copyOutsideRepo(t, f)
			var out, errs bytes.Buffer
			if code := run([]string{"render", calc}, &out, &errs); code != exitOK {
				t.Fatalf("render: exit %d: %s", code, errs.String())
			}
			html, err := os.ReadFile(strings.TrimSuffix(calc, ".calc.md") + ".html")
			if err != nil {
				t.Fatal(err)
			}
			dom, requests := serveAndDump(t, browser, html)
			for _, tag := range []string{"<math", "<msub", "<mrow"} {
				if !strings.Contains(dom, tag) {
					t.Errorf("the rendered page has no %s element", tag)
				}
			}
			fractions += strings.Count(dom, "<mfrac")
			if len(requests) != 1 {
				t.Errorf("the page made %d requests, want only its own: %v", len(requests), requests)
			}
			pages := printPages(t, browser, strings.TrimSuffix(calc, ".calc.md")+".html")
			if pages < 3 || pages > 40 {
				t.Errorf("the package prints to %d pages; want 3 to 40", pages)
			}
		})
	}
	if fractions == 0 {
		t.Error("no example's page lays out a fraction as <mfrac>")
	}
}

// serveAndDump serves the package on loopback with every host name mapped
// to the test server, so any fetch the page tried would be seen, and
// returns the DOM after load and the paths requested.
func serveAndDump(t *testing.T, browser string, html []byte) (string, []string) {
	var mu sync.Mutex
	var requests []string
	srv := httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		// The browser's own background traffic carries no Referer; anything
		// the page itself loads does.
		if r.URL.Path == "/package.html" || r.Referer() != "" {
			mu.Lock()
			requests = append(requests, r.Host+r.URL.Path)
			mu.Unlock()
		}
		if r.URL.Path == "/package.html" {
			w.Header().Set("Content-Type", "text/html; charset=utf-8")
			w.Write(html)
			return
		}
		http.NotFound(w, r)
	}))
	defer srv.Close()
	host := strings.TrimPrefix(srv.URL, "http://")
	args := append(browserArgs(browserProfile(t)), "--host-resolver-rules=MAP * "+host, "--dump-dom", srv.URL+"/package.html")
	out, err := exec.Command(browser, args...).Output()
	if err != nil {
		t.Fatalf("browser: %v", err)
	}
	mu.Lock()
	defer mu.Unlock()
	var kept []string
	for _, r := range requests {
		if !strings.HasSuffix(r, "/favicon.ico") {
			kept = append(kept, r)
		}
	}
	return string(out), kept
}

var pageObject = regexp.MustCompile(`/Type\s*/Page[^s]`)

// printPages prints the package to PDF and counts its pages.
func printPages(t *testing.T, browser, htmlPath string) int {
	pdf := filepath.Join(t.TempDir(), "p.pdf")
	args := append(browserArgs(browserProfile(t)), "--no-pdf-header-footer", "--print-to-pdf="+pdf, "file://"+htmlPath)
	if out, err := exec.Command(browser, args...).CombinedOutput(); err != nil {
		t.Fatalf("print: %v\n%s", err, out)
	}
	raw, err := os.ReadFile(pdf)
	if err != nil {
		t.Fatal(err)
	}
	return len(pageObject.FindAll(raw, -1))
}

// TestDeterministicAcrossEnvironments renders the same calc with other time
// zones, locales and core counts and compares the bytes.
func TestDeterministicAcrossEnvironments(t *testing.T) {
	bin := filepath.Join(t.TempDir(), "vouch")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	calc := copyOutsideRepo(t, filepath.Join("..", "..", "examples", "rankine-simple.calc.md"))
	var first []byte
	for i, env := range [][]string{
		{"TZ=UTC", "LANG=C", "GOMAXPROCS=1"},
		{"TZ=Pacific/Chatham", "LANG=de_DE.UTF-8", "LC_ALL=de_DE.UTF-8", "GOMAXPROCS=2"},
		{"TZ=America/St_Johns", "LANG=fr_FR.UTF-8", "GOMAXPROCS=7"},
	} {
		outDir := t.TempDir()
		cmd := exec.Command(bin, "render", calc, "-o", outDir)
		cmd.Env = append(os.Environ(), env...)
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("%v: %v\n%s", env, err, out)
		}
		html, err := os.ReadFile(filepath.Join(outDir, "rankine-simple.html"))
		if err != nil {
			t.Fatal(err)
		}
		if i == 0 {
			first = html
		} else if !bytes.Equal(first, html) {
			t.Errorf("the package differs under %v", env)
		}
	}
}

// browserProfile makes a profile folder for one browser run and removes it
// when the test ends. Chromium's helper processes may still be writing to it
// for a moment after the browser exits, so the removal retries, and a folder
// that cannot be removed stays in the system's temporary folder rather than
// failing the test.
func browserProfile(t *testing.T) string {
	dir, err := os.MkdirTemp("", "vouch-browser-")
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() {
		for i := 0; i < 40 && os.RemoveAll(dir) != nil; i++ {
			time.Sleep(50 * time.Millisecond)
		}
	})
	return dir
}
