package settings

import (
	"fmt"
	"path"
	"strconv"
	"strings"

	"go.yaml.in/yaml/v3"

	"github.com/vouchcalc/vouch/internal/editdist"
)

func sprintf(format string, args ...any) string { return fmt.Sprintf(format, args...) }

// text reads a non-empty text; oneLine refuses line breaks. It reports
// whether the value was good.
func (d *decoder) text(n *yaml.Node, what string, dst *string, oneLine bool) bool {
	if n.Kind != yaml.ScalarNode || n.Tag == "!!null" || strings.TrimSpace(n.Value) == "" {
		d.errf(n, "%s must be a text", what)
		return false
	}
	for _, r := range n.Value {
		if r == '\n' && oneLine {
			d.errf(n, "%s must be one line", what)
			return false
		}
		if r < 0x20 && r != '\n' && r != '\t' || r == 0x7f {
			d.errf(n, "%s holds the control character %U; remove it", what, r)
			return false
		}
	}
	*dst = n.Value
	return true
}

// choice reads one of a few fixed words.
func (d *decoder) choice(n *yaml.Node, what string, dst *string, options ...string) {
	if n.Kind == yaml.ScalarNode && contains(options, n.Value) {
		*dst = n.Value
		return
	}
	d.errf(n, "%s must be %s, not %q", what, strings.Join(options, " or "), nodeText(n))
}

// nodeText is a node's value as written, or its kind.
func nodeText(n *yaml.Node) string {
	switch n.Kind {
	case yaml.ScalarNode:
		return n.Value
	case yaml.SequenceNode:
		return "a list"
	case yaml.MappingNode:
		return "a mapping"
	}
	return "an alias"
}

// imageExts are the logo's file types, as for images in a calc's prose.
var imageExts = []string{".png", ".jpg", ".jpeg", ".gif", ".webp", ".svg"}

// path reads a path inside the repository: relative to its root, written
// with /, cleaned, not into .git and not leaving the root.
func (d *decoder) path(n *yaml.Node, what string, dst *string, image bool) {
	var p string
	if !d.text(n, what, &p, true) {
		return
	}
	if msg := pathProblem(p); msg != "" {
		d.errf(n, "%s %s", what, msg)
		return
	}
	if image && !contains(imageExts, strings.ToLower(path.Ext(p))) {
		d.errf(n, "%s must be a PNG, JPEG, GIF, WebP or SVG image, not %q", what, p)
		return
	}
	*dst = p
}

// pathProblem says what is wrong with a repository path, or "".
func pathProblem(p string) string {
	if strings.Contains(p, `\`) {
		return sprintf("must be written with / between folders: %q, not %q", strings.ReplaceAll(p, `\`, "/"), p)
	}
	if strings.HasPrefix(p, "/") || len(p) >= 2 && p[1] == ':' {
		return sprintf("must be a path relative to the repository root, such as .vouch/logo.svg, not %q", p)
	}
	c := path.Clean(p)
	if c == ".." || strings.HasPrefix(c, "../") {
		return sprintf("must stay inside the repository; %q leaves it", p)
	}
	if c == "." {
		return "must name a file or folder inside the repository, not its root"
	}
	if c != p {
		return sprintf("must be written %q, not %q", c, p)
	}
	for _, e := range strings.Split(p, "/") {
		if strings.EqualFold(e, ".git") {
			return sprintf("must not point into the repository's .git folder: %q", p)
		}
	}
	return ""
}

func (d *decoder) setRoles(k, v *yaml.Node) {
	switch k.Value {
	case "attestation":
		d.mapping(v, "roles attestation", Roles, func(k, v *yaml.Node) {
			var s string
			if d.text(v, "the attestation of the "+k.Value, &s, false) {
				d.s.Attestation[k.Value] = s
			}
		})
	case "allow_same_signer":
		d.setSameSigner(v)
	}
}

// setSameSigner reads the exceptions to independent roles: a list of
// {roles: [A, B], reason: TEXT}.
func (d *decoder) setSameSigner(v *yaml.Node) {
	if v.Kind != yaml.SequenceNode {
		d.errf(v, "allow_same_signer must be a list of entries, each with roles: [checker, approver] and a reason")
		return
	}
	first := map[[2]string]int{}
	for _, item := range v.Content {
		var x SameSigner
		ok, hasRoles := true, false
		d.mapping(item, "allow_same_signer", []string{"roles", "reason"}, func(k, v *yaml.Node) {
			if k.Value == "roles" {
				hasRoles = true
				ok = d.rolePair(v, &x.Roles) && ok
			} else {
				ok = d.text(v, "the reason", &x.Reason, false) && ok
			}
		})
		if item.Kind != yaml.MappingNode {
			continue
		}
		if !hasRoles || x.Reason == "" && ok {
			d.errf(item, "each allow_same_signer entry needs roles (a pair such as [checker, approver]) and a reason, which the cover prints")
			continue
		}
		if !ok {
			continue
		}
		if line, dup := first[x.Roles]; dup {
			d.errf(item, "the pair [%s, %s] is given twice (first at line %d); keep one", x.Roles[0], x.Roles[1], line)
			continue
		}
		first[x.Roles] = item.Line
		d.s.SameSigner = append(d.s.SameSigner, x)
	}
}

// rolePair reads [A, B]: two different roles, never preparer and checker.
func (d *decoder) rolePair(n *yaml.Node, dst *[2]string) bool {
	if n.Kind != yaml.SequenceNode || len(n.Content) != 2 {
		d.errf(n, "roles must be a pair of roles, such as [checker, approver]")
		return false
	}
	var idx [2]int
	for i, r := range n.Content {
		idx[i] = roleIndex(r.Value)
		if r.Kind != yaml.ScalarNode || idx[i] < 0 {
			d.errf(r, "unknown role %q; the roles are %s", nodeText(r), strings.Join(Roles, ", "))
			return false
		}
	}
	if idx[0] > idx[1] {
		idx[0], idx[1] = idx[1], idx[0]
	}
	switch {
	case idx[0] == idx[1]:
		d.errf(n, "roles must name two different roles, such as [checker, approver]")
		return false
	case idx == [2]int{0, 1}:
		d.errf(n, "the preparer may not check their own calc: a calc checked by the person who made it is not checked; the pairs a firm may allow are [preparer, approver] and [checker, approver]")
		return false
	}
	*dst = [2]string{Roles[idx[0]], Roles[idx[1]]}
	return true
}

func roleIndex(s string) int {
	for i, r := range Roles {
		if r == s {
			return i
		}
	}
	return -1
}

// setTolerance reads a percentage such as 0.5 %.
func (d *decoder) setTolerance(n *yaml.Node) {
	num, ok := strings.CutSuffix(strings.TrimSpace(n.Value), "%")
	v, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
	if n.Kind != yaml.ScalarNode || !ok || err != nil {
		d.errf(n, "compare tolerance must be a percentage such as 0.5 %%, not %q", nodeText(n))
		return
	}
	if !(v > 0 && v < 100) {
		d.errf(n, "compare tolerance must be more than 0 %% and less than 100 %%, not %q", n.Value)
		return
	}
	d.s.TolerancePercent = v
}

// nearest is the known word within two edits of s, or "".
func nearest(s string, known []string) string {
	best, bestD := "", 3
	for _, k := range known {
		if dist := shortDistance(strings.ToLower(s), k); dist < bestD {
			best, bestD = k, dist
		}
	}
	return best
}

// shortDistance is the edit distance in runes of two short words; a word over
// 64 runes counts as 64 apart, so a long value costs no long computation.
func shortDistance(a, b string) int {
	if len([]rune(a)) > 64 || len([]rune(b)) > 64 {
		return 64
	}
	return editdist.Runes(a, b)
}
