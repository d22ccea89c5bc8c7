package audit

import (
	"math"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

var (
	buildA = provenance.EngineBuild{Version: "test", Revision: "aaaa", GoVersion: "go1.0", OS: "linux", Arch: "amd64"}
	buildB = provenance.EngineBuild{Version: "test", Revision: "aaaa", GoVersion: "go1.0", OS: "linux", Arch: "arm64"}
)

// renderAs renders calcs/fp.calc.md as the engine build b would, with the
// result P_pump moved by shift ulps (as another architecture's rounding
// might leave it), and writes the package.
func renderAs(t *testing.T, r *gitRepo, b provenance.EngineBuild, shift int) string {
	t.Helper()
	calc := r.Path("calcs/fp.calc.md")
	d, err := calcdoc.ReadFile(calc)
	if err != nil {
		t.Fatal(err)
	}
	st, err := Provenance(d, "test")
	if err != nil {
		t.Fatal(err)
	}
	m := st.Manifest
	for i := range m.Results {
		if m.Results[i].Name == "P_pump" {
			for range shift {
				m.Results[i].SI = math.Nextafter(m.Results[i].SI, math.Inf(1))
			}
		}
	}
	if m.ResultsDigest, err = provenance.ResultsDigest(m.Results); err != nil {
		t.Fatal(err)
	}
	p, err := d.Render(calcdoc.RenderOptions{Engine: "test", Stamp: st, Build: &b, Qualification: "q-" + b.Arch})
	if err != nil {
		t.Fatal(err)
	}
	pkg := r.Path("calcs/fp.html")
	writePkg(t, pkg, p.HTML)
	return pkg
}

// TestVerifyEngineTolerance: results of a different engine build within
// MaxULPs reproduce "within", and are listed one by one; the same build
// must reproduce bit for bit; a larger difference does not reproduce.
func TestVerifyEngineTolerance(t *testing.T) {
	r := calcRepo(t)
	cases := []struct {
		name     string
		made     provenance.EngineBuild
		shift    int
		ok       bool
		status   string
		mentions string
	}{
		{"same build, same bits", buildA, 0, true, ReproducedExact, "made by this engine build"},
		{"other build, 3 ulps", buildB, 3, true, ReproducedWithin, "P_pump is 3.3573253726028"},
		{"same build, 3 ulps", buildA, 3, false, NotReproduced, "this is the engine build that made the package"},
		{"other build, too far", buildB, MaxULPs + 1, false, NotReproduced, "DIFFERS, relative difference"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			pkg := renderAs(t, r, c.made, c.shift)
			rep, err := Verify(pkg, VerifyOptions{Engine: "test", Build: &buildA, Qualification: "q-amd64"})
			if err != nil {
				t.Fatal(err)
			}
			s := rep.String()
			if rep.OK() != c.ok || rep.Reproduction != c.status || !strings.Contains(s, c.mentions) {
				t.Errorf("ok %v, reproduction %q; want %v, %q, mentioning %q:\n%s", rep.OK(), rep.Reproduction, c.ok, c.status, c.mentions, s)
			}
			if c.shift == 3 && c.ok && !strings.Contains(s, "in the reproduction: within 3 ulps") {
				t.Errorf("the differing result is not listed with its ulps:\n%s", s)
			}
		})
	}
}

// TestVerifyQualification: the package's qualification digest must be the
// one this build's qualify report gives; another build's is only noted.
func TestVerifyQualification(t *testing.T) {
	r := calcRepo(t)
	pkg := renderAs(t, r, buildA, 0)
	rep, _ := Verify(pkg, VerifyOptions{Engine: "test", Build: &buildA, Qualification: "q-other"})
	failsWith(t, rep, "qualify", "names qualification report q-amd64", "digests to q-other")
	rep, _ = Verify(pkg, VerifyOptions{Engine: "test", Build: &buildA, Qualification: "q-amd64"})
	if !rep.OK() || !strings.Contains(rep.String(), "qualification report q-amd64 is what vouch qualify gives") {
		t.Errorf("the matching qualification is not confirmed:\n%s", rep)
	}
}

// TestULPs: the distance in units in the last place.
func TestULPs(t *testing.T) {
	one := 1.0
	cases := []struct {
		a, b float64
		want uint64
	}{
		{1, 1, 0},
		{0, math.Copysign(0, -1), 0},
		{one, math.Nextafter(one, 2), 1},
		{math.Nextafter(0, 1), math.Nextafter(0, -1), 2},
		{-1, math.Nextafter(-1, -2), 1},
		{math.NaN(), 1, math.MaxUint64},
	}
	for _, c := range cases {
		if got := ulps(c.a, c.b); got != c.want {
			t.Errorf("ulps(%g, %g) = %d, want %d", c.a, c.b, got, c.want)
		}
	}
}

// TestSignByOtherBuild: a package made by another build may be signed by
// this one only when this build reproduces it byte for byte; results that
// agree only within the tolerance are not signed.
func TestSignByOtherBuild(t *testing.T) {
	r := calcRepo(t)
	k := newKey(t, "ed25519")
	pkg := renderAs(t, r, buildA, 0)
	if _, rep, err := Sign(pkg, SignOptions{VerifyOptions: VerifyOptions{Engine: "test", Build: &buildB}, Role: "preparer", Key: k.path}); err != nil {
		t.Errorf("a package this build reproduces byte for byte is not signed: %v\n%s", err, rep)
	}
	pkg = renderAs(t, r, buildA, 3)
	_, _, err := Sign(pkg, SignOptions{VerifyOptions: VerifyOptions{Engine: "test", Build: &buildB}, Role: "preparer", Key: k.path})
	if err == nil || !strings.Contains(err.Error(), "does not reproduce it byte for byte") {
		t.Errorf("a package reproduced only within the tolerance is signed: %v", err)
	}
}
