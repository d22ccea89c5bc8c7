package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestReference keeps docs/REFERENCE.md's generated lists current; run with
// -update to rewrite them.
func TestReference(t *testing.T) {
	path := filepath.Join("..", "..", "docs", "REFERENCE.md")
	doc, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	got := string(doc)
	for _, sec := range []struct {
		name string
		cmd  string
	}{{"functions", "functions"}, {"units", "units"}} {
		var out bytes.Buffer
		run([]string{sec.cmd}, &out, &out)
		got = replaceSection(t, got, sec.name, "```text\n"+out.String()+"```\n")
	}
	if *update {
		os.WriteFile(path, []byte(got), 0o644)
		return
	}
	if got != string(doc) {
		t.Error("docs/REFERENCE.md is out of date; run go test ./cmd/vouch -run Reference -update")
	}
}

func replaceSection(t *testing.T, doc, name, body string) string {
	open, end := "<!-- "+name+" -->\n", "<!-- /"+name+" -->"
	i, j := strings.Index(doc, open), strings.Index(doc, end)
	if i < 0 || j < i {
		t.Fatalf("REFERENCE.md lacks the %s markers", name)
	}
	return doc[:i+len(open)] + body + doc[j:]
}
