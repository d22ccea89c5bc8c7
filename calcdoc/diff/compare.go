package diff

import (
	"github.com/vouchcalc/vouch/calcdoc"
	"math"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// Side is one of the two revisions a diff compares.
type Side struct {
	Label  string       // how the report names it: "v1 (1a2b3c4d5e6f, 2031-05-02)" or "work tree"
	Rev    string       // the revision as given; "" for the work tree
	Commit string       // the full commit hash; "" for the work tree
	Path   string       // the calc's path in the repository at this revision
	Doc    *calcdoc.Doc // the calc read and evaluated at this revision
	Shown  string       // the file as the user named it, for the work tree's errors
}

// Diff is what changed in a calc between two revisions: front matter,
// inputs and results, calc lines, checks and prose.
type Diff struct {
	From, To Side
	Front    []FieldChange
	Values   []ValueChange // every value defined at both sides, in the new file's order
	Lines    []LineChange  // calc lines added, removed or rewritten
	Checks   []CheckChange // checks found at both sides
	Files    []FileChange  // data files and images added, removed or changed
	Prose    []Hunk
}

// FileChange is a data file or image that one revision read and the other
// did not, or read with other contents.
type FileChange struct {
	Path             string
	Kind             string // "added", "removed" or "changed"
	OldHash, NewHash string // git blob hashes, "" on the side without the file
	// Values are the values that changed in a changed CSV or YAML file
	// (at most MaxCellChanges; More counts the rest); Note says why they
	// could not be compared.
	Values []CellChange
	More   int
	Note   string
}

// FieldChange is a front-matter field that changed.
type FieldChange struct {
	Field, Old, New string
}

// ValueChange compares a value defined at both revisions.
type ValueChange struct {
	Name             string
	Input            bool // an input: its expression reads no names
	OldLine, NewLine int
	Old, New         string // the values as the package shows them
	Change           string // new minus old, in the new display unit; "" when not a number
	Rel              string // the change relative to the old value, in per cent
	Same             bool   // the values are equal, bit for bit
}

// LineChange is a calc line added, removed or rewritten.
type LineChange struct {
	Kind             string // "added", "removed" or "changed"
	Name             string // the name defined, or "check"
	OldLine, NewLine int    // 0 on the side without the line
	Old, New         string // the line as written, "" on the side without it
	Value            string // an added line's value, or an added check's PASS or FAIL
}

// CheckChange compares a check found at both revisions.
type CheckChange struct {
	Old, New         string // the check's expression at each side
	Desc             string
	OldLine, NewLine int
	OldPass, NewPass bool
	Evaluated        bool // both sides evaluated the check
}

// Flipped reports a check that passed at one revision and failed at the
// other.
func (c CheckChange) Flipped() bool { return c.Evaluated && c.OldPass != c.NewPass }

// Compare compares two evaluated calcs: the old one first.
func Compare(old, new *calcdoc.Doc) *Diff {
	df := &Diff{From: Side{Doc: old}, To: Side{Doc: new}}
	df.Front = frontChanges(old.Front, new.Front)
	df.compareDefs(old, new)
	df.compareChecks(old, new)
	df.Files = fileChanges(old.DataFiles, new.DataFiles)
	for i, f := range df.Files {
		if f.Kind == "changed" {
			fc := &df.Files[i]
			fc.Values, fc.More, fc.Note = dataValueChanges(old, new, calcdoc.DataFile{Path: f.Path, Hash: f.NewHash}, f.OldHash)
		}
	}
	df.Prose = proseHunks(old.Prose(), new.Prose())
	return df
}

// fileChanges compares the data files and images two revisions read, by
// path: the new revision's in its order, then those only the old one read.
func fileChanges(old, new []calcdoc.DataFile) []FileChange {
	was := map[string]string{}
	for _, f := range old {
		was[f.Path] = f.Hash
	}
	var out []FileChange
	seen := map[string]bool{}
	for _, f := range new {
		seen[f.Path] = true
		switch h, ok := was[f.Path]; {
		case !ok:
			out = append(out, FileChange{Path: f.Path, Kind: "added", NewHash: f.Hash})
		case h != f.Hash:
			out = append(out, FileChange{Path: f.Path, Kind: "changed", OldHash: h, NewHash: f.Hash})
		}
	}
	for _, f := range old {
		if !seen[f.Path] {
			out = append(out, FileChange{Path: f.Path, Kind: "removed", OldHash: f.Hash})
		}
	}
	return out
}

// Unchanged reports a diff that found nothing changed.
func (df *Diff) Unchanged() bool {
	if len(df.Front)+len(df.Lines)+len(df.Files)+len(df.Prose) > 0 {
		return false
	}
	for _, v := range df.Values {
		if !v.Same {
			return false
		}
	}
	for _, c := range df.Checks {
		if c.Flipped() {
			return false
		}
	}
	return true
}

// frontChanges lists the front-matter fields that differ.
func frontChanges(a, b calcdoc.Front) []FieldChange {
	fields := []FieldChange{
		{"title", a.Title, b.Title},
		{"number", a.Number, b.Number},
		{"project", a.Project, b.Project},
		{"revision", a.Revision, b.Revision},
		{"digits", strconv.Itoa(a.Digits), strconv.Itoa(b.Digits)},
		{"atmosphere", a.Atmosphere, b.Atmosphere},
		{"preparer", a.People.Preparer.Text, b.People.Preparer.Text},
		{"checker", a.People.Checker.Text, b.People.Checker.Text},
		{"approver", a.People.Approver.Text, b.People.Approver.Text},
		{"summary", strings.Join(a.Summary, ", "), strings.Join(b.Summary, ", ")},
	}
	fields = append(fields, referenceChanges(a.References, b.References)...)
	var out []FieldChange
	for _, f := range fields {
		if f.Old != f.New {
			out = append(out, f)
		}
	}
	return out
}

// referenceChanges compares the references by id: the new side's in its
// order, then those only the old side lists.
func referenceChanges(a, b []calcdoc.Reference) []FieldChange {
	text := func(r calcdoc.Reference) string {
		s := r.Title + ", " + r.Revision
		if r.Date != "" {
			s += ", " + r.Date
		}
		return s
	}
	was := map[string]string{}
	for _, r := range a {
		was[r.ID] = text(r)
	}
	var out []FieldChange
	seen := map[string]bool{}
	for _, r := range b {
		seen[r.ID] = true
		out = append(out, FieldChange{"reference " + r.ID, was[r.ID], text(r)})
	}
	for _, r := range a {
		if !seen[r.ID] {
			out = append(out, FieldChange{"reference " + r.ID, text(r), ""})
		}
	}
	return out
}

// definitions maps each defined name to its item, in file order.
func definitions(d *calcdoc.Doc) (map[string]*calcdoc.Item, []*calcdoc.Item) {
	byName := map[string]*calcdoc.Item{}
	var order []*calcdoc.Item
	for _, it := range d.Items {
		if it.Inline || it.Stmt == nil || it.Stmt.Kind != eval.Def || it.Stmt.Name == "" {
			continue
		}
		if _, dup := byName[it.Stmt.Name]; !dup {
			byName[it.Stmt.Name] = it
			order = append(order, it)
		}
	}
	return byName, order
}

// compareDefs compares the definitions by name: values of names defined at
// both sides, and lines added, removed or rewritten.
func (df *Diff) compareDefs(old, new *calcdoc.Doc) {
	oldDefs, oldOrder := definitions(old)
	newDefs, newOrder := definitions(new)
	for _, it := range oldOrder {
		if newDefs[it.Stmt.Name] == nil {
			df.Lines = append(df.Lines, LineChange{Kind: "removed", Name: it.Stmt.Name, OldLine: it.Stmt.Line, Old: sourceLine(old, it)})
		}
	}
	for _, it := range newOrder {
		was := oldDefs[it.Stmt.Name]
		if was == nil {
			df.Lines = append(df.Lines, LineChange{Kind: "added", Name: it.Stmt.Name, NewLine: it.Stmt.Line,
				New: sourceLine(new, it), Value: valueText(new, it)})
			continue
		}
		if a, b := sourceLine(old, was), sourceLine(new, it); normalise(a) != normalise(b) {
			df.Lines = append(df.Lines, LineChange{Kind: "changed", Name: it.Stmt.Name, OldLine: was.Stmt.Line, NewLine: it.Stmt.Line, Old: a, New: b})
		}
		if vc, ok := compareValue(old, was, new, it); ok {
			df.Values = append(df.Values, vc)
		}
	}
}

// sourceLine is the calc line of an item as written, without its line
// break.
func sourceLine(d *calcdoc.Doc, it *calcdoc.Item) string {
	return d.SourceLine(it.Stmt.Line)
}

// normalise collapses runs of blanks, so that re-aligning a line is no
// change.
func normalise(s string) string { return strings.Join(strings.Fields(s), " ") }

// valueText is an item's value as the package shows it, or what stopped it.
func valueText(d *calcdoc.Doc, it *calcdoc.Item) string {
	switch {
	case it.Outcome == nil || it.Outcome.Skipped:
		return "(not evaluated)"
	case it.Stmt.Kind == eval.Check:
		return verdictText(it.Outcome.Pass)
	}
	if _, ok := it.Outcome.Value.(eval.Record); ok {
		return "(state)"
	}
	return d.ValueText(it.Outcome)
}

func verdictText(pass bool) string {
	if pass {
		return "PASS"
	}
	return "FAIL"
}

// comparable reports whether an item's value is one a diff lists: a
// quantity, a truth value or a text, or no value because the line failed.
func comparable(it *calcdoc.Item) bool {
	if it.Outcome == nil || it.Outcome.Skipped {
		return true
	}
	switch it.Outcome.Value.(type) {
	case units.Quantity, bool, string:
		return true
	}
	return false
}

// compareValue compares the values of one name at both sides.
func compareValue(old *calcdoc.Doc, a *calcdoc.Item, new *calcdoc.Doc, b *calcdoc.Item) (ValueChange, bool) {
	if !comparable(a) || !comparable(b) {
		return ValueChange{}, false
	}
	vc := ValueChange{
		Name: b.Stmt.Name, Input: len(b.Stmt.Deps()) == 0,
		OldLine: a.Stmt.Line, NewLine: b.Stmt.Line,
		Old: valueText(old, a), New: valueText(new, b),
	}
	qa, okA := quantityOf(a)
	qb, okB := quantityOf(b)
	switch {
	case okA && okB:
		vc.Same = qa.V == qb.V && qa.D == qb.D
		if !vc.Same {
			vc.Change, vc.Rel = quantityChange(qa, qb, new, b.Outcome.Display)
		}
	default:
		vc.Same = vc.Old == vc.New && a.Outcome != nil && b.Outcome != nil
	}
	return vc, true
}

func quantityOf(it *calcdoc.Item) (units.Quantity, bool) {
	if it.Outcome == nil || it.Outcome.Skipped {
		return units.Quantity{}, false
	}
	q, ok := it.Outcome.Value.(units.Quantity)
	return q, ok
}

// quantityChange formats new minus old in the new display unit (a
// temperature change in K or Fdeg, since a change is a difference; a
// change of a value in % in percentage points, calcdoc.PercentagePoints)
// and the change relative to the old value, in per cent. There is no
// relative change of a value on a scale whose zero is not nothing
// (offsetScale): 545 °C against 540 °C is not "+0.9 %" nor, on kelvin,
// "+0.6 %".
func quantityChange(a, b units.Quantity, d *calcdoc.Doc, display units.Unit) (change, rel string) {
	if a.D != b.D {
		return "dimension changed", ""
	}
	delta := units.Quantity{V: b.V - a.V, D: b.D}
	u := changeUnit(delta, display)
	text, err := delta.Text(u, d.Front.Digits, d.Front.Ctx)
	if err != nil {
		text = err.Error()
	} else {
		if calcdoc.IsPercent(u) {
			text = strings.TrimSuffix(text, " %") + " " + calcdoc.PercentagePoints
		}
		if delta.V > 0 {
			text = "+" + text
		}
	}
	if a.V != 0 && !offsetScale(a, b, display) {
		rel = signed(units.FormatSig(100*(b.V-a.V)/math.Abs(a.V), 3)) + " %"
	}
	return text, rel
}

// offsetScale reports a value whose ratio to another means nothing: a
// temperature that is not a difference (degC, degF, and kelvin, which
// reads the same for the checker), a gauge pressure, or any value shown in
// a unit with an offset.
func offsetScale(a, b units.Quantity, display units.Unit) bool {
	switch {
	case display.Kind != units.Linear:
		return true
	case a.D == units.DimTemperature:
		return a.T != units.Rel || b.T != units.Rel
	case a.D == units.DimPressure:
		return a.P == units.GaugeP || b.P == units.GaugeP
	}
	return false
}

// changeUnit is the unit a change is shown in: the display unit, unless it
// has an offset (degC, degF, barg), which a difference must not carry.
func changeUnit(delta units.Quantity, display units.Unit) units.Unit {
	switch {
	case display.Kind == units.Linear && display.Dim == delta.D && !display.Kelvin:
		return display
	case display.Kind == units.AbsTemp && strings.Contains(display.String(), "degF"):
		return units.MustParse("Fdeg")
	case delta.D == units.DimTemperature:
		return units.MustParse("K")
	}
	return units.DefaultUnit(delta)
}

func signed(s string) string {
	if !strings.HasPrefix(s, "-") {
		return "+" + s
	}
	return s
}

// checkItems lists the checks of a calc that parsed, in file order.
func checkItems(d *calcdoc.Doc) []*calcdoc.Item {
	var out []*calcdoc.Item
	for _, it := range d.Items {
		if it.Stmt != nil && it.Stmt.Kind == eval.Check && !it.Inline {
			out = append(out, it)
		}
	}
	return out
}

// compareChecks pairs the checks of both sides — first those with the same
// expression, then those with the same description — and lists the rest as
// added or removed.
func (df *Diff) compareChecks(old, new *calcdoc.Doc) {
	a, b := checkItems(old), checkItems(new)
	pair := make([]int, len(b)) // index into a, or -1
	used := make([]bool, len(a))
	for i := range pair {
		pair[i] = -1
	}
	match := func(same func(x, y *calcdoc.Item) bool) {
		for i, y := range b {
			for j, x := range a {
				if pair[i] < 0 && !used[j] && same(x, y) {
					pair[i], used[j] = j, true
				}
			}
		}
	}
	match(func(x, y *calcdoc.Item) bool { return normalise(x.Stmt.Expr) == normalise(y.Stmt.Expr) })
	match(func(x, y *calcdoc.Item) bool { return x.Stmt.Desc != "" && x.Stmt.Desc == y.Stmt.Desc })
	df.addCheckLines(old, new, a, b, pair, used)
}

// addCheckLines records the paired checks and the lines of the others.
func (df *Diff) addCheckLines(old, new *calcdoc.Doc, a, b []*calcdoc.Item, pair []int, used []bool) {
	for j, x := range a {
		if !used[j] {
			df.Lines = append(df.Lines, LineChange{Kind: "removed", Name: "check", OldLine: x.Stmt.Line, Old: sourceLine(old, x)})
		}
	}
	for i, y := range b {
		if pair[i] < 0 {
			df.Lines = append(df.Lines, LineChange{Kind: "added", Name: "check", NewLine: y.Stmt.Line, New: sourceLine(new, y), Value: valueText(new, y)})
			continue
		}
		x := a[pair[i]]
		if sa, sb := sourceLine(old, x), sourceLine(new, y); normalise(sa) != normalise(sb) {
			df.Lines = append(df.Lines, LineChange{Kind: "changed", Name: "check", OldLine: x.Stmt.Line, NewLine: y.Stmt.Line, Old: sa, New: sb})
		}
		df.Checks = append(df.Checks, checkChange(x, y))
	}
}

func checkChange(x, y *calcdoc.Item) CheckChange {
	c := CheckChange{Old: x.Stmt.Expr, New: y.Stmt.Expr, Desc: y.Stmt.Desc, OldLine: x.Stmt.Line, NewLine: y.Stmt.Line}
	ex := x.Outcome != nil && !x.Outcome.Skipped
	ey := y.Outcome != nil && !y.Outcome.Skipped
	if c.Evaluated = ex && ey; c.Evaluated {
		c.OldPass, c.NewPass = x.Outcome.Pass, y.Outcome.Pass
	}
	return c
}
