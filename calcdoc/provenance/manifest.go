package provenance

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"io"
	"strings"
)

// ManifestFormat names this version of the manifest layout. Canonical
// writes it under the key "format" and ParseManifest requires it.
const ManifestFormat = "vouch-manifest/1"

// Manifest is the provenance record of a calculation package: what was
// computed, from which inputs, by which engine, and who signed it. It is
// embedded in the package as canonical JSON and written beside it.
type Manifest struct {
	Engine             string      `json:"engine"`              // engine name and version
	Formulation        string      `json:"formulation"`         // property formulation, such as IAPWS-IF97
	FormulationVersion string      `json:"formulation_version"` // the formulation's release or revision
	Source             string      `json:"source"`              // calc file, slash path from the repository root
	SourceHash         string      `json:"source_hash"`         // git blob hash of the calc file as evaluated
	Commit             string      `json:"commit"`              // HEAD commit when evaluated
	Clean              bool        `json:"clean"`               // whether the work tree matched HEAD
	Data               []DataFile  `json:"data"`                // data files read, in reading order
	Results            []Result    `json:"results"`             // every result, in file order
	ResultsDigest      string      `json:"results_digest"`      // ResultsDigest of Results
	Signatures         []Signature `json:"signatures"`          // not covered by Digest
	// SignersFile is the repository's committed allowed-signers file, a
	// slash path from the root, and SignersHash its git blob hash at the
	// commit; both are "" when the repository has none. Canonical writes
	// them only when set.
	SignersFile string `json:"signers_file,omitempty"`
	SignersHash string `json:"signers_hash,omitempty"`

	// The fields below are optional: a manifest written before they
	// existed has none of them, and Canonical leaves out the ones that are
	// empty, so such a manifest keeps its digest and its signatures.

	Build         *EngineBuild `json:"engine_build,omitempty"`         // the engine build that evaluated the calc
	Qualification string       `json:"qualification_sha256,omitempty"` // digest of that build's vouch qualify report
	Uses          []string     `json:"uses,omitempty"`                 // property functions, fluids and features the calc used
	Revision      string       `json:"revision,omitempty"`             // the calc's revision letter (front matter)
	Draft         bool         `json:"draft,omitempty"`                // rendered with --draft: never to be signed
}

// EngineBuild identifies the engine build that evaluated a calc: its
// release, the VCS revision it was built from and whether that tree had
// changes (empty and false when the build carries no VCS information),
// the Go version and the target OS and architecture.
type EngineBuild struct {
	Version   string `json:"version"`
	Revision  string `json:"vcs_revision"`
	Modified  bool   `json:"vcs_modified"`
	GoVersion string `json:"go_version"`
	OS        string `json:"os"`
	Arch      string `json:"arch"`
}

// String describes the build in one line, such as
// "vouch 0.1.0, revision 0123456789ab (modified), go1.24.1, linux/amd64".
func (b EngineBuild) String() string {
	rev := "no VCS revision recorded"
	if b.Revision != "" {
		rev = "revision " + b.Revision
		if len(b.Revision) > 12 {
			rev = "revision " + b.Revision[:12]
		}
		if b.Modified {
			rev += " (modified)"
		}
	}
	return fmt.Sprintf("vouch %s, %s, %s, %s/%s", b.Version, rev, b.GoVersion, b.OS, b.Arch)
}

// DataFile is a data file a calculation read.
type DataFile struct {
	Path string `json:"path"` // slash path from the repository root
	Hash string `json:"hash"` // git blob hash of the content read
}

// Result is one computed value in SI base units.
type Result struct {
	Name string  `json:"name"` // the calc file's name for it
	SI   float64 `json:"si"`   // value in SI base units
	Unit string  `json:"unit"` // the SI unit, such as "m^2*kg*s^-3" or "" for a number
}

// Signature is one signer's SSHSIG over the manifest's Payload for a role.
// Only Role (through the payload) and the manifest's Digest are signed; the
// other fields describe the signer for the reader and are checked against
// the signature's key and the allowed-signers file when verifying.
type Signature struct {
	Role        string `json:"role"`        // preparer, checker or approver
	Principal   string `json:"principal"`   // signer's email, as in allowed-signers
	Name        string `json:"name"`        // signer's name, for the reader
	Fingerprint string `json:"fingerprint"` // SHA256:... of the signing key
	Date        string `json:"date"`        // the commit's date, RFC 3339 in UTC
	Signature   string `json:"signature"`   // armored SSHSIG
	// Signed is the signing time (SigningTimeLayout) and Attestation what
	// the signer attests; both are in the signed Payload.
	Signed      string `json:"signed,omitempty"`
	Attestation string `json:"attestation,omitempty"`
	// Withdrawn is the time (SigningTimeLayout) the signature was
	// withdrawn, "" while it stands. A withdrawn signature stays in the
	// list, so the history is kept, and counts for nothing.
	Withdrawn string `json:"withdrawn,omitempty"`
	// Method is how a checker checked, with its references (method.go);
	// empty on other roles' signatures.
	Method     string `json:"method,omitempty"`
	MethodRef  string `json:"method_ref,omitempty"`
	Report     string `json:"report,omitempty"`
	ReportHash string `json:"report_sha256,omitempty"`
}

// Canonical returns the manifest as canonical JSON, so that the same
// manifest gives the same bytes on every machine: keys sorted by their
// bytes, no whitespace, numbers as strconv.FormatFloat(f, 'g', -1, 64)
// writes them (the shortest text that reads back to the same bits), strings
// as UTF-8 with only the escapes \" \\ \n \r \t, \u00XX for other control
// characters and \u003c \u003e \u0026 for < > & (so the text can sit in an
// HTML script element), and nil slices as []. A NaN or infinite number, or
// a string that is not UTF-8, is an error. The result has no final newline.
func (m *Manifest) Canonical() ([]byte, error) {
	return writeCanonical(nil, m.object(true))
}

// Digest returns the SHA-256, in hex, of the canonical JSON of the manifest
// without its signatures: the value every signature covers.
func (m *Manifest) Digest() (string, error) {
	b, err := writeCanonical(nil, m.object(false))
	if err != nil {
		return "", err
	}
	return sha256Hex(b), nil
}

// Encode returns what Canonical and Digest return, writing the canonical
// JSON once: the digest is taken over the same bytes with the signatures
// member cut out, which are the bytes Digest hashes. A render that embeds
// the manifest and shows its digest calls this once instead of both.
func (m *Manifest) Encode() (canon []byte, digest string, err error) {
	canon, start, end, err := writeObjectMarking(nil, m.object(true), "signatures")
	if err != nil {
		return nil, "", err
	}
	h := sha256.New()
	h.Write(canon[:start])
	h.Write(canon[end:])
	return canon, hex.EncodeToString(h.Sum(nil)), nil
}

// ResultsDigest returns the SHA-256, in hex, of the canonical JSON array of
// the results, in the given order.
func ResultsDigest(results []Result) (string, error) {
	b, err := writeCanonical(nil, resultsArray(results))
	if err != nil {
		return "", fmt.Errorf("results: %w", err)
	}
	return sha256Hex(b), nil
}

// Validate checks that ResultsDigest matches Results and that Source is a
// path inside the repository.
func (m *Manifest) Validate() error {
	if err := checkRel(m.Source); err != nil {
		return fmt.Errorf("%w: source %q is not a path inside the repository", ErrManifest, m.Source)
	}
	got, err := ResultsDigest(m.Results)
	if err != nil {
		return err
	}
	if got != m.ResultsDigest {
		return fmt.Errorf("%w: results digest %s does not match the results, which digest to %s",
			ErrManifest, m.ResultsDigest, got)
	}
	return nil
}

// ParseManifest reads a manifest written by Canonical, or any JSON text
// with the same keys and values (digests are recomputed from the values,
// so whitespace and key order do not matter). Unknown keys, a key given
// twice in one object, a missing or different format, trailing data, and
// a data file listed twice or by a path that is not a clean slash path
// inside the repository are errors.
func ParseManifest(data []byte) (*Manifest, error) {
	if err := checkDuplicateKeys(data); err != nil {
		return nil, err
	}
	m := new(Manifest)
	wire := struct {
		Format string `json:"format"`
		*Manifest
	}{Manifest: m}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&wire); err != nil {
		return nil, fmt.Errorf("%w: %v", ErrManifest, err)
	}
	if _, err := dec.Token(); err != io.EOF {
		return nil, fmt.Errorf("%w: data after the manifest object", ErrManifest)
	}
	if wire.Format != ManifestFormat {
		return nil, fmt.Errorf("%w: format %q, want %q", ErrManifest, wire.Format, ManifestFormat)
	}
	if err := checkDataPaths(m.Data); err != nil {
		return nil, err
	}
	return m, nil
}

// checkDataPaths refuses a data list that names a file twice or by a path
// that is not clean: a manifest lists each file it read once.
func checkDataPaths(files []DataFile) error {
	first := make(map[string]int, len(files))
	for i, f := range files {
		if err := checkRel(f.Path); err != nil {
			return fmt.Errorf("%w: data entry %d: %q is not a clean slash path inside the repository", ErrManifest, i+1, clipPath(f.Path))
		}
		if j, ok := first[f.Path]; ok {
			return fmt.Errorf("%w: data file %q is listed twice, as entries %d and %d: a manifest lists each file once", ErrManifest, clipPath(f.Path), j+1, i+1)
		}
		first[f.Path] = i
	}
	return nil
}

// clipPath cuts a path quoted in a message to a readable length.
func clipPath(p string) string {
	if len(p) > 120 {
		return p[:120] + "..."
	}
	return p
}

// checkDuplicateKeys refuses JSON text in which an object gives a key
// twice, in any case: encoding/json would keep the last silently. Malformed text is
// left to the decoder to report.
func checkDuplicateKeys(data []byte) error {
	dec := json.NewDecoder(bytes.NewReader(data))
	type frame struct {
		keys   map[string]bool
		object bool
		key    bool // the next token in this object is a key
	}
	var stack []frame
	for {
		tok, err := dec.Token()
		if err != nil {
			return nil
		}
		top := len(stack) - 1
		if top >= 0 && stack[top].object && stack[top].key {
			if k, ok := tok.(string); ok {
				// encoding/json matches keys without regard to case.
				folded := strings.ToLower(strings.ToUpper(k))
				if stack[top].keys[folded] {
					return fmt.Errorf("%w: key %q is given twice in one object", ErrManifest, clipPath(k))
				}
				stack[top].keys[folded] = true
				stack[top].key = false
				continue
			}
		}
		switch tok {
		case json.Delim('{'):
			stack = append(stack, frame{keys: map[string]bool{}, object: true, key: true})
		case json.Delim('['):
			stack = append(stack, frame{})
		case json.Delim('}'), json.Delim(']'):
			if top < 0 {
				return nil
			}
			stack = stack[:top]
			if top > 0 && stack[top-1].object {
				stack[top-1].key = true
			}
		default:
			if top >= 0 && stack[top].object {
				stack[top].key = true
			}
		}
	}
}

// object converts the manifest for writeCanonical.
func (m *Manifest) object(withSignatures bool) jsonObject {
	o := jsonObject{
		"format":              ManifestFormat,
		"engine":              m.Engine,
		"formulation":         m.Formulation,
		"formulation_version": m.FormulationVersion,
		"source":              m.Source,
		"source_hash":         m.SourceHash,
		"commit":              m.Commit,
		"clean":               m.Clean,
		"data":                dataArray(m.Data),
		"results":             resultsArray(m.Results),
		"results_digest":      m.ResultsDigest,
	}
	if withSignatures {
		o["signatures"] = signaturesArray(m.Signatures)
	}
	if m.SignersFile != "" || m.SignersHash != "" {
		o["signers_file"], o["signers_hash"] = m.SignersFile, m.SignersHash
	}
	m.addOptional(o)
	return o
}

// addOptional adds the optional keys that are set.
func (m *Manifest) addOptional(o jsonObject) {
	if b := m.Build; b != nil {
		o["engine_build"] = jsonObject{
			"version": b.Version, "vcs_revision": b.Revision, "vcs_modified": b.Modified,
			"go_version": b.GoVersion, "os": b.OS, "arch": b.Arch,
		}
	}
	if m.Qualification != "" {
		o["qualification_sha256"] = m.Qualification
	}
	if len(m.Uses) > 0 {
		a := make([]any, len(m.Uses))
		for i, u := range m.Uses {
			a[i] = u
		}
		o["uses"] = a
	}
	if m.Revision != "" {
		o["revision"] = m.Revision
	}
	if m.Draft {
		o["draft"] = true
	}
}

func dataArray(files []DataFile) []any {
	a := make([]any, len(files))
	for i, f := range files {
		a[i] = jsonObject{"path": f.Path, "hash": f.Hash}
	}
	return a
}

// resultsArray converts the results for writeCanonical. They are written
// by writeResults, without a map per result: a large calc has thousands.
func resultsArray(results []Result) resultList {
	return resultList(results)
}

func signaturesArray(sigs []Signature) []any {
	a := make([]any, len(sigs))
	for i, s := range sigs {
		a[i] = jsonObject{
			"role": s.Role, "principal": s.Principal, "name": s.Name,
			"fingerprint": s.Fingerprint, "date": s.Date, "signature": s.Signature,
		}
		addSigningRecord(a[i].(jsonObject), s)
		addCheckMethod(a[i].(jsonObject), s)
	}
	return a
}

func sha256Hex(b []byte) string {
	sum := sha256.Sum256(b)
	return hex.EncodeToString(sum[:])
}
