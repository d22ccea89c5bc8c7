package settings

import (
	"os"
	"reflect"
	"strings"
	"testing"
	"testing/fstest"
)

func TestDefault(t *testing.T) {
	s := Default()
	if s.Paper != "A4" || s.Display != "SI" || s.USPower != "hp" || s.Signers != ".vouch/allowed_signers" ||
		s.Templates != ".vouch/templates" || s.TolerancePercent != 0.5 || s.Caution != DefaultCaution {
		t.Errorf("Default() = %+v", s)
	}
	if got := s.Tolerance(); got != 0.005 {
		t.Errorf("Tolerance() = %v, want 0.005", got)
	}
	for _, r := range Roles {
		if s.Attestation[r] == "" {
			t.Errorf("no default attestation for %s", r)
		}
	}
	if _, ok := s.SameSignerReason(Checker, Approver); ok {
		t.Error("the defaults allow one person to check and approve")
	}
}

func TestLoadMissingFileIsDefault(t *testing.T) {
	s, src, err := Load(fstest.MapFS{}, "/repo")
	if err != nil || src != nil || !reflect.DeepEqual(s, Default()) {
		t.Errorf("Load of an empty repository = %+v, %q, %v; want the defaults", s, src, err)
	}
	s, _, err = Load(fstest.MapFS{FileName: {Data: []byte("paper: Letter\n")}}, "/repo")
	if err != nil || s.Paper != Letter {
		t.Errorf("Load = %+v, %v; want paper Letter", s, err)
	}
	_, _, err = Load(fstest.MapFS{FileName: {Data: []byte("paper: B5\n")}}, "/repo")
	if err == nil || err.Error() != `/repo/vouch.yaml:1:8: paper must be A4 or Letter, not "B5"` {
		t.Errorf("Load of a bad file: %v", err)
	}
}

// referenceExample is the example of docs/REFERENCE.md, between the markers.
func referenceExample(t testing.TB) []byte {
	doc, err := os.ReadFile("../../docs/REFERENCE.md")
	if err != nil {
		t.Fatal(err)
	}
	_, rest, ok := strings.Cut(string(doc), "<!-- settings-example -->\n```yaml\n")
	body, _, ok2 := strings.Cut(rest, "```\n<!-- /settings-example -->")
	if !ok || !ok2 {
		t.Fatal("docs/REFERENCE.md has no settings example between <!-- settings-example --> markers")
	}
	return []byte(body)
}

func TestReferenceExample(t *testing.T) {
	s, err := Parse("vouch.yaml", referenceExample(t))
	if err != nil {
		t.Fatalf("the example of docs/REFERENCE.md does not parse:\n%v", err)
	}
	want := Default()
	want.Firm = Firm{
		Name:    "Harrowgate Thermal Consultants Ltd (fictional)",
		Address: []string{"14 Foundry Wharf", "Eastmere EM4 7QT", "United Kingdom"},
		Logo:    ".vouch/harrowgate-logo.svg",
	}
	want.FrontMatter = []FrontKey{
		{"client", "Client"}, {"client_document", "Client document no."},
		{"discipline", "Discipline"}, {"status_code", "Status code"},
	}
	want.Attestation[Checker] = "I checked the inputs against their sources, the method, the arithmetic and the units, and every review comment is closed."
	want.SameSigner = []SameSigner{{
		Roles:  [2]string{Checker, Approver},
		Reason: "The Eastmere office has two engineers; the engineer of record may check and approve a calc that the other prepared (quality manual QM-4.2, fictional).",
	}}
	want.TolerancePercent = 1
	if !reflect.DeepEqual(s, want) {
		t.Errorf("example parsed as\n%+v\nwant\n%+v", s, want)
	}
	if r, ok := s.SameSignerReason(Approver, Checker); !ok || r != want.SameSigner[0].Reason {
		t.Errorf("SameSignerReason(approver, checker) = %q, %v", r, ok)
	}
	if _, ok := s.SameSignerReason(Preparer, Approver); ok {
		t.Error("preparer and approver allowed, but the example does not allow them")
	}
	if l, ok := s.Label("client_document"); !ok || l != "Client document no." {
		t.Errorf("Label(client_document) = %q, %v", l, ok)
	}
}

func TestRoundTrip(t *testing.T) {
	for _, src := range [][]byte{nil, referenceExample(t)} {
		s, err := Parse("vouch.yaml", src)
		if err != nil {
			t.Fatal(err)
		}
		roundTrip(t, s)
	}
}

// roundTrip writes s and reads it back to the same values.
func roundTrip(t *testing.T, s *Settings) {
	t.Helper()
	out, err := s.Marshal()
	if err != nil {
		t.Fatalf("Marshal: %v", err)
	}
	back, err := Parse("vouch.yaml", out)
	if err != nil {
		t.Fatalf("the written settings do not parse:\n%s\n%v", out, err)
	}
	if !reflect.DeepEqual(s, back) {
		t.Fatalf("round trip changed the settings:\n%+v\n%s\n%+v", s, out, back)
	}
}
