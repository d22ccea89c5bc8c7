package provenance

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"reflect"
	"strings"
	"testing"
)

// sampleManifest is the record of a fictional heat balance.
func sampleManifest(t testing.TB) *Manifest {
	t.Helper()
	m := &Manifest{
		Engine:             "vouch 0.1.0",
		Formulation:        "IAPWS-IF97",
		FormulationVersion: "R7-97(2012)",
		Source:             "calcs/hb-002.calc.md",
		SourceHash:         "8baef1b4abc478178b004d62031cf7fe6db6f903",
		Commit:             "0123456789abcdef0123456789abcdef01234567",
		Clean:              true,
		Data:               []DataFile{{Path: "data/loads.csv", Hash: "e69de29bb2d1d6434b8b29ae775ad8c2e48c5391"}},
		Results: []Result{
			{Name: "p_1", SI: 12.5e6, Unit: "Pa"},
			{Name: "eta_th", SI: 0.4123, Unit: ""},
		},
	}
	d, err := ResultsDigest(m.Results)
	if err != nil {
		t.Fatal(err)
	}
	m.ResultsDigest = d
	return m
}

func TestCanonicalGolden(t *testing.T) {
	m := sampleManifest(t)
	got, err := m.Canonical()
	if err != nil {
		t.Fatal(err)
	}
	want := `{"clean":true,"commit":"0123456789abcdef0123456789abcdef01234567",` +
		`"data":[{"hash":"e69de29bb2d1d6434b8b29ae775ad8c2e48c5391","path":"data/loads.csv"}],` +
		`"engine":"vouch 0.1.0","format":"vouch-manifest/1","formulation":"IAPWS-IF97",` +
		`"formulation_version":"R7-97(2012)",` +
		`"results":[{"name":"p_1","si":1.25e+07,"unit":"Pa"},{"name":"eta_th","si":0.4123,"unit":""}],` +
		`"results_digest":"` + m.ResultsDigest + `","signatures":[],` +
		`"source":"calcs/hb-002.calc.md","source_hash":"8baef1b4abc478178b004d62031cf7fe6db6f903"}`
	if string(got) != want {
		t.Fatalf("Canonical() =\n%s\nwant\n%s", got, want)
	}
	if !json.Valid(got) {
		t.Fatal("canonical output is not valid JSON")
	}
}

func TestCanonicalRoundTrip(t *testing.T) {
	m := sampleManifest(t)
	m.Signatures = []Signature{{Role: "checker", Principal: "checker@example.com", Name: "C. Reader",
		Fingerprint: "SHA256:abc", Date: "2025-01-02T03:04:05Z", Signature: "-----BEGIN SSH SIGNATURE-----\n"}}
	first, err := m.Canonical()
	if err != nil {
		t.Fatal(err)
	}
	back, err := ParseManifest(first)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(back, m) {
		t.Fatalf("round trip changed the manifest:\n%+v\n%+v", back, m)
	}
	var pretty bytes.Buffer
	if err := json.Indent(&pretty, first, "", "  "); err != nil {
		t.Fatal(err)
	}
	again, err := ParseManifest(pretty.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	if second, _ := again.Canonical(); !bytes.Equal(first, second) {
		t.Fatalf("indented manifest reads back differently:\n%s\n%s", first, second)
	}
}

func TestCanonicalFloatsBitExact(t *testing.T) {
	tests := []struct {
		v    float64
		text string
	}{
		{0.1, "0.1"},
		{1e-300, "1e-300"},
		{5e-324, "5e-324"}, // smallest subnormal
		{1.0 / 3, "0.3333333333333333"},
		{math.Copysign(0, -1), "-0"},
		{0, "0"},
		{math.MaxFloat64, "1.7976931348623157e+308"},
		{2.2250738585072014e-308, "2.2250738585072014e-308"}, // smallest normal
		{101325, "101325"},
		{-273.15, "-273.15"},
		{1e21, "1e+21"},
		{1e-7, "1e-07"},
	}
	for _, tt := range tests {
		m := &Manifest{Source: "a.calc.md", Results: []Result{{Name: "x", SI: tt.v, Unit: "K"}}}
		b, err := m.Canonical()
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Contains(b, []byte(`"si":`+tt.text+`,`)) {
			t.Errorf("%v written as %s, want %s", tt.v, b, tt.text)
		}
		back, err := ParseManifest(b)
		if err != nil {
			t.Fatal(err)
		}
		if got := back.Results[0].SI; math.Float64bits(got) != math.Float64bits(tt.v) {
			t.Errorf("%v read back as %v (bits %x, want %x)", tt.v, got, math.Float64bits(got), math.Float64bits(tt.v))
		}
	}
}

func TestCanonicalRejects(t *testing.T) {
	for _, v := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		m := &Manifest{Results: []Result{{Name: "x", SI: v}}}
		if _, err := m.Canonical(); !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(), "not finite") {
			t.Errorf("Canonical with %v: got %v, want a not-finite error", v, err)
		}
		if _, err := ResultsDigest(m.Results); !errors.Is(err, ErrManifest) {
			t.Errorf("ResultsDigest with %v: got %v, want ErrManifest", v, err)
		}
	}
	m := &Manifest{Engine: "bad \xff byte"}
	if _, err := m.Canonical(); !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(), "utf-8") {
		t.Errorf("Canonical with invalid utf-8: got %v", err)
	}
}

func TestCanonicalStrings(t *testing.T) {
	tests := []struct{ in, want string }{
		{`plain`, `"plain"`},
		{`quote " and \ backslash`, `"quote \" and \\ backslash"`},
		{"tab\tnew\nline\rcr", `"tab\tnew\nline\rcr"`},
		{"bell\x07 del\x7f", `"bell\u0007 del` + "\x7f" + `"`},
		{`</script> & <b>`, `"\u003c/script\u003e \u0026 \u003cb\u003e"`},
		{"Δp η 25 °C", `"Δp η 25 °C"`},
	}
	for _, tt := range tests {
		got, err := writeString(nil, tt.in)
		if err != nil || string(got) != tt.want {
			t.Errorf("writeString(%q) = %s, %v; want %s", tt.in, got, err, tt.want)
			continue
		}
		var back string
		if err := json.Unmarshal(got, &back); err != nil || back != tt.in {
			t.Errorf("%s reads back as %q, %v", got, back, err)
		}
	}
}

func TestDigestExcludesSignatures(t *testing.T) {
	m := sampleManifest(t)
	before, err := m.Digest()
	if err != nil {
		t.Fatal(err)
	}
	unsigned, _ := writeCanonical(nil, m.object(false))
	if before != hex.EncodeToString(sha256Sum(unsigned)) || bytes.Contains(unsigned, []byte("signatures")) {
		t.Fatalf("Digest is not the sha256 of the manifest without signatures")
	}
	m.Signatures = append(m.Signatures, Signature{Role: "preparer"})
	if after, _ := m.Digest(); after != before {
		t.Fatalf("adding a signature changed the digest: %s -> %s", before, after)
	}
	m.Results[1].SI = math.Nextafter(m.Results[1].SI, 1)
	if after, _ := m.Digest(); after == before {
		t.Fatal("changing a result by one ulp left the digest unchanged")
	}
}

func TestResultsDigest(t *testing.T) {
	results := []Result{{Name: "eta_th", SI: 0.4, Unit: ""}}
	got, err := ResultsDigest(results)
	want := hex.EncodeToString(sha256Sum([]byte(`[{"name":"eta_th","si":0.4,"unit":""}]`)))
	if err != nil || got != want {
		t.Fatalf("ResultsDigest = %s, %v; want %s", got, err, want)
	}
	if empty, _ := ResultsDigest(nil); empty != hex.EncodeToString(sha256Sum([]byte(`[]`))) {
		t.Fatalf("ResultsDigest(nil) = %s, want the digest of []", empty)
	}
}

func TestValidate(t *testing.T) {
	m := sampleManifest(t)
	if err := m.Validate(); err != nil {
		t.Fatalf("Validate: %v", err)
	}
	m.Results[0].SI = 13e6
	if err := m.Validate(); !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(), "results digest") {
		t.Fatalf("Validate after editing a result: got %v", err)
	}
	m = sampleManifest(t)
	m.Source = "../elsewhere.calc.md"
	if err := m.Validate(); !errors.Is(err, ErrManifest) {
		t.Fatalf("Validate with an escaping source: got %v", err)
	}
}

func TestParseManifestErrors(t *testing.T) {
	good, _ := sampleManifest(t).Canonical()
	tests := []struct{ name, in, mention string }{
		{"unknown key", strings.Replace(string(good), `"clean"`, `"extra":1,"clean"`, 1), "unknown field"},
		{"format", strings.Replace(string(good), ManifestFormat, "other/9", 1), `format "other/9"`},
		{"no format", strings.Replace(string(good), `"format":"vouch-manifest/1",`, "", 1), `format ""`},
		{"trailing", string(good) + "{}", "data after"},
		{"not json", "{", "unexpected EOF"},
		{"huge number", strings.Replace(string(good), "1.25e+07", "1e999", 1), "si"},
	}
	for _, tt := range tests {
		_, err := ParseManifest([]byte(tt.in))
		if !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(), tt.mention) {
			t.Errorf("%s: got %v, want ErrManifest mentioning %q", tt.name, err, tt.mention)
		}
	}
}

// TestManifestListsPathTwice is issue 11 item 11: a package whose manifest
// listed one committed 20 MB file 300 times took 26 s to verify. A
// manifest lists each file it read once, so a path given twice (or not as
// a clean path) is refused where the manifest is read, naming the entries.
func TestManifestListsPathTwice(t *testing.T) {
	m := sampleManifest(t)
	big := DataFile{Path: "data/big.csv", Hash: "e69de29bb2d1d6434b8b29ae775ad8c2e48c5391"}
	m.Data = append(m.Data, big)
	for i := 0; i < 299; i++ {
		m.Data = append(m.Data, big)
	}
	b, err := m.Canonical()
	if err != nil {
		t.Fatal(err)
	}
	_, err = ParseManifest(b)
	if !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(),
		`data file "data/big.csv" is listed twice, as entries 2 and 3: a manifest lists each file once`) {
		t.Fatalf("ParseManifest = %v", err)
	}
	for _, p := range []string{"data/./big.csv", "../big.csv", "/etc/big.csv", "", ".git/config", "data//big.csv"} {
		m.Data = []DataFile{{Path: p, Hash: big.Hash}}
		b, _ := m.Canonical()
		if _, err := ParseManifest(b); !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(), "not a clean slash path") {
			t.Errorf("data path %q: ParseManifest = %v", p, err)
		}
	}
}

// TestManifestKeyGivenTwice: encoding/json keeps the last of two equal
// keys (in any case) silently, so a manifest could show one commit to a
// reader and another to verify; such a manifest is refused.
func TestManifestKeyGivenTwice(t *testing.T) {
	good, _ := sampleManifest(t).Canonical()
	for _, tt := range []struct{ name, in, key string }{
		{"top level", strings.Replace(string(good), `"clean":true`, `"clean":true,"commit":"ffff"`, 1), "commit"},
		{"other case", strings.Replace(string(good), `"clean":true`, `"clean":true,"COMMIT":"ffff"`, 1), "commit"},
		{"in a result", strings.Replace(string(good), `{"name":"p_1"`, `{"name":"p_1","si":1,"name":"q"`, 1), "name"},
		{"in a data entry", strings.Replace(string(good), `{"hash":`, `{"path":"a","hash":`, 1), "path"},
	} {
		_, err := ParseManifest([]byte(tt.in))
		if !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(), `key "`+tt.key+`" is given twice`) {
			t.Errorf("%s: ParseManifest = %v", tt.name, err)
		}
	}
	if _, err := ParseManifest(good); err != nil {
		t.Fatalf("the sample no longer parses: %v", err)
	}
}

// TestPayloadSigningTimeAndAttestation: the signed payload holds the role,
// the signer, the signing time, the attestation and the digest, in six
// lines ended by newlines, and refuses a field that would break the lines.
func TestPayloadSigningTimeAndAttestation(t *testing.T) {
	m := sampleManifest(t)
	d, _ := m.Digest()
	s := Signature{Role: "checker", Principal: "checker@example.com", Name: "C. Reader",
		Signed: "2026-03-14T09:26:53Z", Attestation: "I checked it."}
	got, err := m.Payload(s)
	want := "vouch-signature/1\nrole: checker\nsigner: C. Reader <checker@example.com>\n" +
		"signed: 2026-03-14T09:26:53Z\nattestation: I checked it.\nmanifest-sha256: " + d + "\n"
	if err != nil || string(got) != want {
		t.Fatalf("Payload = %q, %v\nwant %q", got, err, want)
	}
	for name, edit := range map[string]func(*Signature){
		"empty role":            func(x *Signature) { x.Role = "" },
		"role of two words":     func(x *Signature) { x.Role = "check er" },
		"role with =":           func(x *Signature) { x.Role = "role=x" },
		"role with newline":     func(x *Signature) { x.Role = "a\n" },
		"name with newline":     func(x *Signature) { x.Name = "C.\nReader" },
		"name with <":           func(x *Signature) { x.Name = "C. <Reader>" },
		"principal with blank":  func(x *Signature) { x.Principal = "a b@example.com" },
		"no attestation":        func(x *Signature) { x.Attestation = "" },
		"attestation two lines": func(x *Signature) { x.Attestation = "I checked\nit." },
		"blank-padded text":     func(x *Signature) { x.Attestation = " I checked it." },
	} {
		x := s
		edit(&x)
		if _, err := m.Payload(x); !errors.Is(err, ErrManifest) {
			t.Errorf("%s: got %v, want ErrManifest", name, err)
		}
	}
	for _, signed := range []string{"", "2026-03-14 09:26:53", "2026-03-14T09:26:53+01:00", "2026-03-14T09:26:53.5Z"} {
		x := s
		x.Signed = signed
		if _, err := m.Payload(x); !errors.Is(err, ErrSigningTime) {
			t.Errorf("signed %q: got %v, want ErrSigningTime", signed, err)
		}
	}
}

// TestCanonicalSigningRecord: the signing time, attestation, withdrawal and
// signers file are written only when set, so older manifests keep their
// bytes, and they read back.
func TestCanonicalSigningRecord(t *testing.T) {
	m := sampleManifest(t)
	digest, _ := m.Digest()
	m.Signatures = nil
	plain, _ := m.Canonical()
	if bytes.Contains(plain, []byte("signers_file")) || bytes.Contains(plain, []byte(`"withdrawn"`)) {
		t.Fatalf("unset fields written: %s", plain)
	}
	m.SignersFile, m.SignersHash = ".vouch/allowed_signers", "0123456789abcdef0123456789abcdef01234567"
	if d, _ := m.Digest(); d == digest {
		t.Error("the signers file's hash is not covered by the digest")
	}
	m.Signatures = []Signature{{Role: "checker", Principal: "c@example.com", Name: "C", Signed: "2026-03-14T09:26:53Z",
		Attestation: "I checked it.", Withdrawn: "2026-03-15T09:00:00Z", Signature: "x", Fingerprint: "SHA256:x", Date: "2026-03-01T00:00:00Z"}}
	c, _ := m.Canonical()
	back, err := ParseManifest(c)
	if err != nil {
		t.Fatal(err)
	}
	c2, _ := back.Canonical()
	if !bytes.Equal(c, c2) || back.Signatures[0].Withdrawn == "" || back.SignersHash != m.SignersHash {
		t.Fatalf("round trip:\n%s\n%s", c, c2)
	}
}

func sha256Sum(b []byte) []byte {
	s := sha256.Sum256(b)
	return s[:]
}

// A manifest's canonical form has sorted keys and no whitespace, and its
// digest leaves the signatures out. The plant is fictional.
func ExampleManifest_Canonical() {
	m := &Manifest{
		Engine:      "vouch 0.1.0",
		Formulation: "IAPWS-IF97",
		Source:      "calcs/hb-002.calc.md",
		Results:     []Result{{Name: "W_net", SI: 2.5e8, Unit: "m^2*kg*s^-3"}},
	}
	b, _ := m.Canonical()
	fmt.Println(string(b))
	// Output:
	// {"clean":false,"commit":"","data":[],"engine":"vouch 0.1.0","format":"vouch-manifest/1","formulation":"IAPWS-IF97","formulation_version":"","results":[{"name":"W_net","si":2.5e+08,"unit":"m^2*kg*s^-3"}],"results_digest":"","signatures":[],"source":"calcs/hb-002.calc.md","source_hash":""}
}

// TestManifestOptionalFields: the engine build, qualification, uses,
// revision and draft flag are written, read back and covered by the
// digest, and a manifest without them keeps the digest it had before they
// existed (its keys are exactly the old ones).
func TestManifestOptionalFields(t *testing.T) {
	m := &Manifest{Engine: "vouch 0.1.0", Source: "a.calc.md", Signatures: []Signature{}}
	old, err := m.Canonical()
	if err != nil {
		t.Fatal(err)
	}
	for _, key := range []string{"engine_build", "qualification_sha256", "uses", "revision", "draft"} {
		if strings.Contains(string(old), key) {
			t.Errorf("a manifest without %s writes the key", key)
		}
	}
	d0, _ := m.Digest()
	m.Build = &EngineBuild{Version: "0.1.0", Revision: "abc", Modified: true, GoVersion: "go1.0", OS: "plan9", Arch: "arm64"}
	m.Qualification, m.Uses, m.Revision, m.Draft = "ff00", []string{"fluid:isopentane", "water"}, "B", true
	d1, _ := m.Digest()
	if d0 == d1 {
		t.Fatal("the optional fields are not covered by the digest")
	}
	b, err := m.Canonical()
	if err != nil {
		t.Fatal(err)
	}
	back, err := ParseManifest(b)
	if err != nil {
		t.Fatal(err)
	}
	if d2, _ := back.Digest(); d2 != d1 || *back.Build != *m.Build || back.Revision != "B" || !back.Draft || len(back.Uses) != 2 {
		t.Errorf("read back %+v, want %+v", back, m)
	}
	bad := strings.Replace(string(b), `"arch":"arm64"`, `"arch":"arm64","cpu":"x"`, 1)
	if _, err := ParseManifest([]byte(bad)); err == nil {
		t.Error("an unknown key in engine_build is accepted")
	}
}

// TestPayloadMethodOfChecking: a checker's method of checking adds its
// lines between attestation and manifest-sha256, each only when set; a
// signature without one keeps the six lines; a field that would break the
// lines, or a reference without a method, is refused.
func TestPayloadMethodOfChecking(t *testing.T) {
	m := sampleManifest(t)
	d, _ := m.Digest()
	s := Signature{Role: "checker", Principal: "checker@example.com", Name: "C. Reader",
		Signed: "2026-03-14T09:26:53Z", Attestation: "I checked it.", Method: MethodAlternate,
		MethodRef: "calcs/fp-alt.calc.md@" + strings.Repeat("b", 40), Report: "calcs/fp-compare.html", ReportHash: strings.Repeat("c", 64)}
	head := "vouch-signature/1\nrole: checker\nsigner: C. Reader <checker@example.com>\n" +
		"signed: 2026-03-14T09:26:53Z\nattestation: I checked it.\n"
	for _, tt := range []struct {
		edit  func(*Signature)
		lines string
	}{
		{func(*Signature) {}, "method: alternate\nmethod-ref: calcs/fp-alt.calc.md@" + strings.Repeat("b", 40) +
			"\nreport: calcs/fp-compare.html\nreport-sha256: " + strings.Repeat("c", 64) + "\n"},
		{func(x *Signature) { x.Method, x.MethodRef, x.Report, x.ReportHash = MethodTest, "TR-7 rev B", "", "" }, "method: test\nmethod-ref: TR-7 rev B\n"},
		{func(x *Signature) { x.Method, x.MethodRef, x.Report, x.ReportHash = MethodReview, "", "", "" }, "method: review\n"},
		{func(x *Signature) { x.Method, x.MethodRef, x.Report, x.ReportHash = "", "", "", "" }, ""},
	} {
		x := s
		tt.edit(&x)
		got, err := m.Payload(x)
		if want := head + tt.lines + "manifest-sha256: " + d + "\n"; err != nil || string(got) != want {
			t.Errorf("Payload = %q, %v\nwant %q", got, err, want)
		}
	}
	for name, edit := range map[string]func(*Signature){
		"reference two lines":   func(x *Signature) { x.MethodRef = "TR-7\nrev B" },
		"blank-padded method":   func(x *Signature) { x.Method = "review " },
		"report without method": func(x *Signature) { x.Method = "" },
	} {
		x := s
		edit(&x)
		if _, err := m.Payload(x); !errors.Is(err, ErrManifest) {
			t.Errorf("%s: got %v, want ErrManifest", name, err)
		}
	}
}

// TestEncodeMatchesCanonicalAndDigest: Encode gives Canonical's bytes and
// Digest's digest, unsigned and signed, with the optional fields and the
// signers file set, and the same errors.
func TestEncodeMatchesCanonicalAndDigest(t *testing.T) {
	m := sampleManifest(t)
	check := func(what string) {
		t.Helper()
		canon, digest, err := m.Encode()
		wantCanon, err1 := m.Canonical()
		wantDigest, err2 := m.Digest()
		if err != nil || err1 != nil || err2 != nil {
			t.Fatalf("%s: %v, %v, %v", what, err, err1, err2)
		}
		if !bytes.Equal(canon, wantCanon) || digest != wantDigest {
			t.Errorf("%s: Encode = %s, %s\nwant %s, %s", what, canon, digest, wantCanon, wantDigest)
		}
	}
	check("unsigned")
	m.Signatures = []Signature{{Role: "preparer", Principal: "a@example.invalid", Name: "A. Fictional", Signature: "x"},
		{Role: "checker", Method: "alternate", Report: "r.html"}}
	check("signed")
	m.SignersFile, m.SignersHash = "allowed_signers", "ff"
	m.Build = &EngineBuild{Version: "0.1.0", OS: "plan9"}
	m.Qualification, m.Uses, m.Revision, m.Draft = "ff00", []string{"water"}, "B", true
	check("every optional field")
	m.Results[0].SI = math.NaN()
	if _, _, err := m.Encode(); !errors.Is(err, ErrManifest) {
		t.Errorf("Encode of a NaN result: %v, want ErrManifest", err)
	}
}

// TestWriteObjectMarking: cutting the marked span out of the object leaves
// the canonical JSON of the object without that member, wherever the key
// sorts, and an absent key marks nothing.
func TestWriteObjectMarking(t *testing.T) {
	objects := []jsonObject{
		{"m": 1.0},
		{"m": 1.0, "z": "b"},
		{"a": true, "m": []any{"x", 2.0}},
		{"a": true, "m": jsonObject{"k": "v"}, "z": "b"},
		{"a": true, "z": "b"},
		{},
	}
	for _, o := range objects {
		got, start, end, err := writeObjectMarking(nil, o, "m")
		if err != nil {
			t.Fatal(err)
		}
		full, _ := writeCanonical(nil, o)
		without := jsonObject{}
		for k, v := range o {
			if k != "m" {
				without[k] = v
			}
		}
		want, _ := writeCanonical(nil, without)
		cut := append(append([]byte{}, got[:start]...), got[end:]...)
		if !bytes.Equal(got, full) || !bytes.Equal(cut, want) {
			t.Errorf("%v: wrote %s, cut to %s; want %s and %s", o, got, cut, full, want)
		}
	}
}

// TestWriteResultsAsGenericArray: the results writer gives the bytes, and
// the errors, of the generic writer over one object per result.
func TestWriteResultsAsGenericArray(t *testing.T) {
	generic := func(rs []Result) ([]byte, error) {
		a := make([]any, len(rs))
		for i, r := range rs {
			a[i] = jsonObject{"unit": r.Unit, "si": r.SI, "name": r.Name}
		}
		return writeCanonical(nil, a)
	}
	cases := [][]Result{
		nil,
		{{Name: "p_1", SI: 12.5e6, Unit: "Pa"}},
		{{Name: "eta", SI: math.Copysign(0, -1)}, {Name: `q "<&>"`, SI: 5e-324, Unit: "W/(m²·K)"}, {Name: "check:12", SI: 1}},
		{{Name: "ok", SI: 1}, {Name: "bad", SI: math.Inf(1)}},
		{{Name: "bad \xff", SI: 1}},
		{{Name: "u", SI: 1, Unit: "\xfe"}},
	}
	for _, rs := range cases {
		got, err := writeCanonical(nil, resultsArray(rs))
		want, wantErr := generic(rs)
		if !bytes.Equal(got, want) || fmt.Sprint(err) != fmt.Sprint(wantErr) {
			t.Errorf("%v: wrote %s, %v; want %s, %v", rs, got, err, want, wantErr)
		}
	}
}
