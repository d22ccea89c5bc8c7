package main

import (
	"fmt"
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

// writePDF prints an HTML package to PDF beside it with headless Chromium;
// the PDF is written to a temporary file and renamed into place.
func writePDF(htmlPath string) (string, error) {
	browser, err := findBrowser()
	if err != nil {
		return "", err
	}
	abs, err := filepath.Abs(htmlPath)
	if err != nil {
		return "", err
	}
	profile, err := os.MkdirTemp("", "vouch-browser-*")
	if err != nil {
		return "", err
	}
	defer os.RemoveAll(profile)
	dest := strings.TrimSuffix(abs, ".html") + ".pdf"
	tmp := dest + ".tmp"
	args := append(browserArgs(profile), "--no-pdf-header-footer", "--print-to-pdf="+tmp, "file://"+abs)
	if out, err := exec.Command(browser, args...).CombinedOutput(); err != nil {
		os.Remove(tmp)
		return "", fmt.Errorf("printing %s to PDF failed: %v\n%s", htmlPath, err, out)
	}
	if _, err := os.Stat(tmp); err != nil {
		return "", fmt.Errorf("printing %s to PDF wrote no file", htmlPath)
	}
	return dest, os.Rename(tmp, dest)
}
