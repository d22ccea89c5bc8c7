package qualify

import (
	"fmt"
	"slices"
	"strings"

	"github.com/vouchcalc/vouch/docs"
)

// BuiltinErrataName names the errata list built into the binary in
// messages.
const BuiltinErrataName = "docs/errata.yaml (built in)"

// BuiltinErrata returns the errata list built into the binary.
func BuiltinErrata() ([]Erratum, error) {
	return ParseErrata(BuiltinErrataName, docs.Errata)
}

// PackageEngine is what a package records of the engine that made it and
// of what its calc used, as an erratum is matched against.
type PackageEngine struct {
	Engine   string   // the manifest's engine, such as "vouch 0.1.0"
	Version  string   // the build's release ("" when no build is recorded)
	Revision string   // the build's VCS revision ("" when not recorded)
	Uses     []string // property functions, "fluid:NAME", "sweep", "gauge units"; nil when not recorded
}

// release is the engine's release number: the build's, or the one the
// engine name carries.
func (p PackageEngine) release() string {
	if p.Version != "" {
		return p.Version
	}
	return strings.TrimPrefix(p.Engine, "vouch ")
}

// Affects says whether the erratum touches a package, and why. A package
// is affected when its engine's release is listed as affected (and its
// build is not the fixing commit) and its calc used a listed function or
// feature, for a fluid the erratum names. A package that records no uses
// (rendered before packages recorded them) may be affected: the reason
// says so, and that the calc must be checked by hand.
func (x Erratum) Affects(p PackageEngine) (why string, ok bool) {
	rel := p.release()
	if !slices.Contains(x.AffectedVersions, rel) || x.fixedBy(p.Revision) {
		return "", false
	}
	head := fmt.Sprintf("%s (%s): made by vouch %s, a release the erratum lists as affected", x.ID, x.Title, rel)
	if p.Uses == nil {
		return head + "; the package does not record which functions its calc used, so check the calc by hand for " + strings.Join(x.Functions, ", "), true
	}
	used := x.usedBy(p.Uses)
	if len(used) == 0 {
		return "", false
	}
	return fmt.Sprintf("%s, and the calc uses %s; it shows with %s", head, strings.Join(used, ", "), x.Inputs), true
}

// fixedBy reports whether a build's revision is the fixing commit.
func (x Erratum) fixedBy(rev string) bool {
	if rev == "" || x.FixedRevision == "" {
		return false
	}
	return strings.HasPrefix(rev, x.FixedRevision) || strings.HasPrefix(x.FixedRevision, rev)
}

// usedBy lists the erratum's functions the calc used, each with the fluid
// that makes it count.
func (x Erratum) usedBy(uses []string) []string {
	var out []string
	for _, f := range x.Functions {
		if !slices.Contains(uses, f) {
			continue
		}
		switch {
		case len(x.Fluids) == 0:
			out = append(out, f)
		case f == "water" || f == "water_sat":
			if slices.Contains(x.Fluids, "water") {
				out = append(out, f)
			}
		case strings.HasPrefix(f, "fluid"):
			for _, u := range uses {
				if name, ok := strings.CutPrefix(u, "fluid:"); ok && x.coversFluid(name) {
					out = append(out, f+" ("+name+")")
				}
			}
		default:
			out = append(out, f)
		}
	}
	return out
}

// coversFluid reports whether the erratum names the fluid, or every
// organic fluid and the fluid is not water.
func (x Erratum) coversFluid(name string) bool {
	if slices.Contains(x.Fluids, name) {
		return true
	}
	return name != "water" && slices.Contains(x.Fluids, "any organic fluid")
}
