package calcdoc

import (
	"fmt"
	"sort"
	"strings"

	"github.com/vouchcalc/vouch/units"
)

// A sweep varies an input: a name whose line is a value written out (a
// number or a unit literal, possibly negated, or a text in quotes). Setting
// a computed name would leave the lines that read its inputs as they were,
// and the table would be flat; so varying one is an error that names the
// inputs it is computed from.

// checkInput reports whether the varied name's line is an input, and
// gives the error at the vary line when it is not.
func (d *Doc) checkInput(sw *Sweep, input *Item) bool {
	s := input.Stmt
	if s.IsGivenValue() {
		return true
	}
	head := fmt.Sprintf("vary %s: %s is computed on line %d (%s = %s)", sw.Var, sw.Var, s.Line, s.Name, s.Expr)
	const rule = "a sweep varies an input, a name whose line is a value written out"
	ins := d.inputsOf(input)
	if len(ins) == 0 {
		d.errorf(sw.VarOff, "%s and reads no input; %s, such as %s = %s", head, rule, sw.Var, d.givenText(input))
		return false
	}
	inputs := "the inputs"
	if len(ins) == 1 {
		inputs = "the input"
	}
	d.errorf(sw.VarOff, "%s from %s %s; %s: vary %s", head, inputs, strings.Join(ins, ", "), rule, orList(ins))
	return false
}

// inputsOf returns the inputs a computed line's value depends on, through
// the names it reads and the names those read, in the order of their lines.
func (d *Doc) inputsOf(it *Item) []string {
	seen := map[string]bool{}
	var found []*Item
	var walk func(*Item)
	walk = func(it *Item) {
		for _, n := range it.Stmt.Deps() {
			dep := d.itemOf(n)
			if dep == nil || seen[n] {
				continue
			}
			seen[n] = true
			if dep.Stmt.IsGivenValue() {
				found = append(found, dep)
			} else {
				walk(dep)
			}
		}
	}
	walk(it)
	sort.Slice(found, func(i, j int) bool { return found[i].Stmt.Off < found[j].Stmt.Off })
	out := make([]string, len(found))
	for i, f := range found {
		out[i] = f.Stmt.Name
	}
	return out
}

// givenText is a line's value as it would be written out.
func (d *Doc) givenText(it *Item) string {
	switch v := it.Outcome.Value.(type) {
	case string:
		return fmt.Sprintf("%q", v)
	case units.Quantity:
		if t, err := v.Text(it.Outcome.Display, d.Front.Digits, d.Front.Ctx); err == nil {
			return t
		}
	}
	return "a value"
}

// orList joins names as "a", "a or b", "a, b or c".
func orList(names []string) string {
	if len(names) == 1 {
		return names[0]
	}
	return strings.Join(names[:len(names)-1], ", ") + " or " + names[len(names)-1]
}
