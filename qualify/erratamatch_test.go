package qualify

import (
	"os"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/docs"
)

// TestBuiltinErrataIsTheFile: the errata list built into the binary is
// docs/errata.yaml.
func TestBuiltinErrataIsTheFile(t *testing.T) {
	src, err := os.ReadFile("../docs/errata.yaml")
	if err != nil {
		t.Fatal(err)
	}
	if string(src) != string(docs.Errata) {
		t.Fatal("the built-in errata differ from docs/errata.yaml")
	}
	if _, err := BuiltinErrata(); err != nil {
		t.Fatal(err)
	}
}

// TestErrataAffects: an erratum marks a package made by an affected
// release whose calc used an affected function (for a listed fluid), and
// not one made by another release, nor one whose calc used none of them.
func TestErrataAffects(t *testing.T) {
	list, err := BuiltinErrata()
	if err != nil {
		t.Fatal(err)
	}
	byID := map[string]Erratum{}
	for _, x := range list {
		byID[x.ID] = x
	}
	crit, gauge := byID["VE-2026-002"], byID["VE-2026-004"]
	cases := []struct {
		name string
		x    Erratum
		p    PackageEngine
		want string // "" for not affected
	}{
		{"water at an affected release", crit, PackageEngine{Engine: "vouch 0.1.0", Version: "0.1.0", Uses: []string{"water", "water_sat"}}, "the calc uses water, water_sat"},
		{"organic fluid", crit, PackageEngine{Engine: "vouch 0.1.0", Uses: []string{"fluid", "fluid:isopentane"}}, "fluid (isopentane)"},
		{"no property function", crit, PackageEngine{Engine: "vouch 0.1.0", Version: "0.1.0", Uses: []string{"sweep"}}, ""},
		{"a later release", crit, PackageEngine{Engine: "vouch 0.2.0", Version: "0.2.0", Uses: []string{"water"}}, ""},
		{"gauge units used", gauge, PackageEngine{Engine: "vouch 0.1.0", Uses: []string{"gauge units", "water"}}, "the calc uses gauge units"},
		{"gauge units not used", gauge, PackageEngine{Engine: "vouch 0.1.0", Uses: []string{"water"}}, ""},
		{"uses not recorded", gauge, PackageEngine{Engine: "vouch 0.1.0"}, "check the calc by hand"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			why, ok := c.x.Affects(c.p)
			if ok != (c.want != "") || !strings.Contains(why, c.want) {
				t.Errorf("affected %v: %q; want %q", ok, why, c.want)
			}
			if ok && !strings.HasPrefix(why, c.x.ID+" (") {
				t.Errorf("the reason does not name the erratum: %q", why)
			}
		})
	}
	fixed := crit
	fixed.FixedRevision = "abcdef1"
	if _, ok := fixed.Affects(PackageEngine{Engine: "vouch 0.1.0", Version: "0.1.0", Revision: "abcdef1234", Uses: []string{"water"}}); ok {
		t.Error("the build of the fixing commit is marked affected")
	}
}
