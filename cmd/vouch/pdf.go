package main

import (
	"fmt"
	"net/url"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
)

// browserNames are the headless browsers tried for --pdf, in order.
var browserNames = []string{"chromium", "chromium-browser", "google-chrome"}

// findBrowser returns the path of an installed headless browser.
func findBrowser() (string, error) {
	for _, n := range browserNames {
		if p, err := exec.LookPath(n); err == nil {
			return p, nil
		}
	}
	return "", fmt.Errorf("--pdf needs headless Chromium, which is not installed; install it (Debian: sudo apt-get install chromium) or print the HTML package from a browser")
}

// browserArgs are the flags for a headless run that makes no network
// connection of its own.
func browserArgs(profile string) []string {
	return []string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--user-data-dir=" + profile}
}

// writePDF prints an HTML package to PDF beside it with headless Chromium.
// The PDF is written to a temporary file, checked (it has pages and the
// package's title: the browser printed this package and not another page)
// and renamed into place; on any failure the temporary file is removed.
func writePDF(htmlPath string) (string, error) {
	browser, err := findBrowser()
	if err != nil {
		return "", err
	}
	abs, err := filepath.Abs(htmlPath)
	if err != nil {
		return "", err
	}
	page, err := os.ReadFile(abs)
	if err != nil {
		return "", err
	}
	profile, err := os.MkdirTemp("", "vouch-browser-*")
	if err != nil {
		return "", err
	}
	defer os.RemoveAll(profile)
	dest := strings.TrimSuffix(abs, ".html") + ".pdf"
	tmp, err := reserveTemp(filepath.Dir(dest))
	if err != nil {
		return "", err
	}
	defer os.Remove(tmp) // gone after the rename; removed on any failure
	args := append(browserArgs(profile), "--no-pdf-header-footer", "--print-to-pdf="+tmp, fileURL(abs))
	if out, err := exec.Command(browser, args...).CombinedOutput(); err != nil {
		return "", fmt.Errorf("printing %s to PDF failed: %v\n%s", htmlPath, err, out)
	}
	pdf, err := os.ReadFile(tmp)
	if err != nil || len(pdf) == 0 {
		return "", fmt.Errorf("printing %s to PDF wrote no file", htmlPath)
	}
	if err := checkPDF(pdf, htmlTitle(page)); err != nil {
		return "", fmt.Errorf("printing %s to PDF: %v; no PDF written", htmlPath, err)
	}
	return dest, os.Rename(tmp, dest)
}

// reserveTemp creates an empty temporary file for the browser to write.
func reserveTemp(dir string) (string, error) {
	f, err := os.CreateTemp(dir, ".vouch-*.pdf.tmp")
	if err != nil {
		return "", err
	}
	return f.Name(), f.Close()
}

// fileURL is the file: URL of an absolute path, every character that
// means something in a URL (#, ?, %, space) escaped.
func fileURL(abs string) string {
	p := filepath.ToSlash(abs)
	if !strings.HasPrefix(p, "/") {
		p = "/" + p // a Windows drive path: file:///C:/...
	}
	return (&url.URL{Scheme: "file", Path: p}).String()
}
