// Package settings reads a repository's settings file, vouch.yaml at the
// repository root: the firm's title block, paper, caution text, display
// system, the firm's extra front-matter keys, the committed allowed-signers
// file, the roles' attestation texts and the exceptions to independent
// roles, the default tolerance of alternate calcs and the folder of the
// firm's calc templates.
//
// The file is decoded as yaml.Node values, so every unknown key, wrong type,
// duplicate key or bad value is reported at its own line and column, as the
// calc file's front matter is. The package reads no git and no files of its
// own: the caller passes the file's bytes (Parse) or the repository as an
// fs.FS (Load). A missing file means Default.
package settings

// FileName is the settings file's name, at the repository root.
const FileName = "vouch.yaml"

// Paper sizes.
const (
	A4     = "A4"     // ISO 216, 210 mm × 297 mm: the default
	Letter = "Letter" // US Letter, 8.5 in × 11 in
)

// Display systems: the units in which results without a [UNIT] are shown.
const (
	SI = "SI" // the default
	US = "US" // psia, °F, BTU/lb, lb/h, ...
)

// Power units of the US display system.
const (
	PowerHP = "hp"
	PowerKW = "kW"
)

// The signing roles, in the order of the cover.
const (
	Preparer = "preparer"
	Checker  = "checker"
	Approver = "approver"
)

// Roles lists the signing roles in the order of the cover.
var Roles = []string{Preparer, Checker, Approver}

// Defaults of the settings.
const (
	// DefaultPaper is A4: the size a consultant in most of the world
	// expects (ISO 216); US and Canadian firms set Letter.
	DefaultPaper = A4
	// DefaultDisplay is the SI system.
	DefaultDisplay = SI
	// DefaultUSPower is the power unit of the US system unless set.
	DefaultUSPower = PowerHP
	// DefaultSigners is the committed allowed-signers file.
	DefaultSigners = ".vouch/allowed_signers"
	// DefaultTemplates is the folder of the firm's `vouch new` templates.
	DefaultTemplates = ".vouch/templates"
	// DefaultTolerancePercent is the default tolerance, in per cent, of a
	// result of a calc against the same result of an alternate calc.
	DefaultTolerancePercent = 0.5
	// DefaultCaution is the notice on every cover unless the firm sets its
	// own (PRODUCT.md §3).
	DefaultCaution = "This package records calculations. It is no substitute for the review of a licensed professional engineer under the codes and rules that apply where the plant is built, and a signature made with this tool is not a professional seal unless those rules say so."
)

// Default attestation texts: what a signature of each role states.
const (
	DefaultPreparerAttestation = "I prepared this calculation and checked my own work before passing it for checking."
	DefaultCheckerAttestation  = "I checked the inputs and their sources, the method, the arithmetic and the units, and every review comment on this calculation is resolved."
	DefaultApproverAttestation = "I approve this calculation for issue."
)

// BuiltinFrontKeys are the front-matter keys that vouch itself reads, now or
// as the issues already agreed add them; a firm's extra key may not take one
// of these names. The calc reader's own list must stay a subset of this one.
var BuiltinFrontKeys = []string{
	"atmosphere", "compare", "digits", "display", "number", "paper", "people",
	"project", "references", "revision", "revisions", "summary", "title", "us_power",
}

// Settings are a repository's settings. The zero value is not useful: start
// from Default or from Parse.
type Settings struct {
	// Firm is the title block on every cover and page header.
	Firm Firm
	// Paper is A4 or Letter; a calc may override it in its front matter.
	Paper string
	// Caution is the notice printed on every cover.
	Caution string
	// Display is SI or US, the system of results shown without a [UNIT].
	Display string
	// USPower is hp or kW, the power unit of the US system.
	USPower string
	// FrontMatter are the firm's extra front-matter keys, in file order.
	FrontMatter []FrontKey
	// Signers is the path, from the repository root, of the committed
	// allowed-signers file.
	Signers string
	// Attestation is the text each role's signature states, by role.
	Attestation map[string]string
	// SameSigner are the pairs of roles that one person may hold, each with
	// the firm's reason, which the cover prints.
	SameSigner []SameSigner
	// TolerancePercent is the default tolerance, in per cent, of a result
	// against an alternate calc's (relative to the original's value).
	TolerancePercent float64
	// Templates is the folder, from the repository root, of the firm's own
	// `vouch new` templates.
	Templates string
}

// Firm is the firm's title block.
type Firm struct {
	Name    string
	Address []string // one entry per printed line
	// Logo is the path, from the repository root, of an image file; the
	// caller reads it. Empty when the firm has no logo.
	Logo string
}

// FrontKey is one of the firm's extra front-matter keys and its label on the
// cover.
type FrontKey struct {
	Key   string // as written in a calc's front matter: client_document
	Label string // as printed on the cover: Client document no.
}

// SameSigner is a firm's exception to independent roles: one person may
// sign both Roles of a package.
type SameSigner struct {
	Roles  [2]string // two different roles, in the order of Roles
	Reason string    // printed on the cover beside the signatures
}

// Default returns the settings of a repository without a vouch.yaml.
func Default() *Settings {
	return &Settings{
		Paper:   DefaultPaper,
		Caution: DefaultCaution,
		Display: DefaultDisplay,
		USPower: DefaultUSPower,
		Signers: DefaultSigners,
		Attestation: map[string]string{
			Preparer: DefaultPreparerAttestation,
			Checker:  DefaultCheckerAttestation,
			Approver: DefaultApproverAttestation,
		},
		TolerancePercent: DefaultTolerancePercent,
		Templates:        DefaultTemplates,
	}
}

// Tolerance is the default tolerance as a fraction (0.005 for 0.5 %).
func (s *Settings) Tolerance() float64 { return s.TolerancePercent / 100 }

// SameSignerReason reports whether one person may sign roles a and b of one
// package, and the firm's reason when it may.
func (s *Settings) SameSignerReason(a, b string) (string, bool) {
	for _, x := range s.SameSigner {
		if x.Roles == [2]string{a, b} || x.Roles == [2]string{b, a} {
			return x.Reason, true
		}
	}
	return "", false
}

// Label is the cover label of a firm's extra front-matter key, and whether
// the firm uses that key.
func (s *Settings) Label(key string) (string, bool) {
	for _, k := range s.FrontMatter {
		if k.Key == key {
			return k.Label, true
		}
	}
	return "", false
}
