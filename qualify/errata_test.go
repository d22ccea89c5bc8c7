package qualify

import (
	"os"
	"strings"
	"testing"
)

// TestErrataFile keeps docs/errata.yaml well-formed and holds the entries
// the hardening work (issue 11) recorded.
func TestErrataFile(t *testing.T) {
	src, err := os.ReadFile("../docs/errata.yaml")
	if err != nil {
		t.Fatal(err)
	}
	list, err := ParseErrata("docs/errata.yaml", src)
	if err != nil {
		t.Fatal(err)
	}
	kinds := map[string]string{}
	for _, x := range list {
		kinds[x.ID] = x.Kind
		if x.AffectedUpTo == "" || len(x.AffectedVersions) == 0 || x.FixedNote == "" {
			t.Errorf("%s: affected or fixed not filled", x.ID)
		}
	}
	want := map[string]string{"VE-2026-001": "error", "VE-2026-002": "wrong-result", "VE-2026-003": "wrong-result", "VE-2026-004": "wrong-result"}
	for id, k := range want {
		if kinds[id] != k {
			t.Errorf("%s: kind %q, want %q", id, kinds[id], k)
		}
	}
}

// TestErrataMalformed: each mistake is an error at its line and column.
func TestErrataMalformed(t *testing.T) {
	good, err := os.ReadFile("../docs/errata.yaml")
	if err != nil {
		t.Fatal(err)
	}
	g := string(good)
	cases := []struct{ name, old, new, want string }{
		{"format", "\nformat: vouch-errata/1", "\nformat: vouch-errata/9", `:32:9: format is "vouch-errata/9"`},
		{"unknown key", "    title: Thermal", "    titel: Thermal", `:36:5: unknown key "titel" in an erratum`},
		{"bad id", "id: VE-2026-003", "id: VE-26-3", `id "VE-26-3" must look like`},
		{"duplicate id", "id: VE-2026-003", "id: VE-2026-001", `id VE-2026-001 is used twice`},
		{"bad date", "date: 2026-12-03\n    title: Wrong cp", "date: 2026-13-03\n    title: Wrong cp", `:62:11: date "2026-13-03"`},
		{"bad kind", "kind: error", "kind: bug", `:37:11: kind "bug" must be`},
		{"bad revision", "up_to_revision: 087318a\n    fixed:\n      version: \"\"\n      revision: \"\"\n      note: the next release\n    functions: [sweep]",
			"up_to_revision: main\n    fixed:\n      version: \"\"\n      revision: \"\"\n      note: the next release\n    functions: [sweep]", `up_to_revision "main" must be a commit id`},
		{"versions not a list", "versions: [0.1.0]\n      up_to_revision: 087318a\n    fixed:\n      version: \"\"\n      revision: \"\"\n      note: the next release\n    functions: [sweep]",
			"versions: 0.1.0\n      up_to_revision: 087318a\n    fixed:\n      version: \"\"\n      revision: \"\"\n      note: the next release\n    functions: [sweep]", `versions must be a list`},
		{"missing fix", "    fix: >-\n      A sweep may", "    fixx: >-\n      A sweep may", `unknown key "fixx"`},
		{"no functions", "functions: [sweep]", "functions: []", `functions must name at least one`},
		{"yaml syntax", "fluids: []\n    inputs: the sum", "fluids: [\n    inputs: the sum", `docs/errata.yaml: yaml:`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if !strings.Contains(g, c.old) {
				t.Fatalf("errata.yaml no longer holds %q; update the test", c.old)
			}
			src := strings.Replace(g, c.old, c.new, 1)
			_, err := ParseErrata("docs/errata.yaml", []byte(src))
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("error %v, want %q", err, c.want)
			}
		})
	}
}
