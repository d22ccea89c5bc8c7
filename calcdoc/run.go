package calcdoc

import (
	"fmt"
	"io/fs"
	"path/filepath"
	"slices"
	"strings"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/internal/safefile"
	"github.com/vouchcalc/vouch/units"
)

func sprintf(format string, args ...any) string { return fmt.Sprintf(format, args...) }

// ReadFile reads and evaluates a calc file with the settings (vouch.yaml)
// of the work tree that holds it. An unreadable file, or a settings file
// with errors, is an error; everything wrong inside the calc is in
// Doc.Errors.
func ReadFile(path string) (*Doc, error) {
	src, err := safefile.Read(path, MaxFileBytes)
	if err != nil {
		return nil, err
	}
	root, _ := locate(path)
	opt, ssrc, err := SettingsIn(newWorkTree(root), root)
	if err != nil {
		return nil, fmt.Errorf("%s", SettingsErrorText(err, ssrc))
	}
	d := ReadWith(path, src, opt)
	d.Evaluate()
	return d, nil
}

// ReadIn reads and evaluates a calc from its bytes at rel inside files, a
// tree whose folder on disk is root (a commit's tree for verify and diff):
// its data files and images are read from files, not from the work tree.
func ReadIn(files fs.FS, root, rel string, src []byte) *Doc {
	opt, ssrc, err := SettingsIn(files, root)
	d := ReadWith(filepath.Join(root, filepath.FromSlash(rel)), src, opt)
	d.Files, d.Root, d.Rel = files, root, rel
	if err != nil {
		d.errorf(0, "the settings file at this commit has errors:\n%s", SettingsErrorText(err, ssrc))
		d.Errors.Sort()
		return d
	}
	d.Evaluate()
	return d
}

// Evaluate runs every calc line and inline value in file order, gathering
// errors; a line that fails does not stop the lines after it.
func (d *Doc) Evaluate() {
	d.useWorkTree()
	eng := eval.NewEngine(d.Front.Ctx)
	eng.Data, eng.YAML = d.dataReader(), d.valuesReader()
	eng.Ahead = map[string]int{}
	for _, it := range d.Items {
		if s := it.Stmt; s != nil && s.Kind == eval.Def && s.Name != "" {
			if _, seen := eng.Ahead[s.Name]; !seen {
				eng.Ahead[s.Name] = s.Line
			}
		}
	}
	for _, it := range d.Items {
		if it.Err {
			if it.Stmt.Kind == eval.Def {
				eng.Fail(it.Stmt.Name)
			}
			continue
		}
		out, err := eng.Exec(it.Stmt)
		if err != nil {
			it.Err = true
			d.evalError(err, it.Stmt.ExprOff)
			continue
		}
		if rec, isRecord := out.Value.(eval.Record); it.Inline && isRecord {
			it.Err = true
			name, fields := strings.TrimSpace(it.Stmt.Expr), rec.FieldNames()
			msg := "an inline value shows a number, a quantity, a truth value or a text, and " + name + " has fields; show one of them"
			if len(fields) > 0 {
				field := fields[0]
				if slices.Contains(fields, "h") {
					field = "h"
				}
				msg += ", such as `=" + name + "." + field + "`"
			}
			d.errorf(it.Stmt.ExprOff, "%s", msg)
			continue
		}
		it.Outcome = out
		d.checkRecordSource(it)
	}
	d.loadImages()
	d.readReview()
	d.loadLogo()
	d.checkStates()
	if len(d.Errors) == 0 {
		d.runSweeps(eng)
		d.drawDiagrams()
	}
	if len(d.Errors) == 0 {
		d.propagate(eng)
		d.runBudgets(eng)
	}
	d.engine = eng
	d.checkSummary(eng)
	d.Errors.Sort()
}

// checkSummary reports summary names that the calc does not define, and
// names of states, which the summary cannot show as one value.
func (d *Doc) checkSummary(eng *eval.Engine) {
	off := 0
	if l := d.Front.SummaryLine; l > 0 && l <= len(d.lines.starts) {
		off = d.lines.starts[l-1]
	}
	for _, name := range d.Front.Summary {
		v, ok := eng.Value(name)
		if _, isRecord := v.(eval.Record); ok && isRecord {
			d.errorf(off, "summary names %s, which has fields (a state, a saturation point or a data file); name a value defined from one of them, such as h_1 = %s.h", name, name)
			continue
		}
		if ok || d.defines(name) {
			continue // defined, or defined on a line whose own error is reported
		}
		msg := "summary names " + name + ", which the calc does not define"
		if near := units.Nearest(name, eng.Names()); near != "" {
			msg += "; did you mean " + near + "?"
		}
		d.errorf(off, "%s", msg)
	}
}

// defines reports whether a line of the calc defines name, whether or not
// it could be evaluated.
func (d *Doc) defines(name string) bool {
	for _, it := range d.Items {
		if it.Stmt.Kind == eval.Def && it.Stmt.Name == name {
			return true
		}
	}
	return false
}

// Results returns the evaluated definitions that hold a quantity, in file
// order.
func (d *Doc) Results() []*Item {
	var out []*Item
	for _, it := range d.Items {
		if it.Outcome == nil || it.Outcome.Skipped || it.Stmt.Kind != eval.Def {
			continue
		}
		if _, ok := it.Outcome.Value.(units.Quantity); ok {
			out = append(out, it)
		}
	}
	return out
}

// Shown returns the definitions a results table lists: quantities and
// texts (a fluid's name, a file path), in file order.
func (d *Doc) Shown() []*Item {
	var out []*Item
	for _, it := range d.Items {
		if it.Outcome == nil || it.Outcome.Skipped || it.Stmt.Kind != eval.Def {
			continue
		}
		switch it.Outcome.Value.(type) {
		case units.Quantity, string:
			out = append(out, it)
		}
	}
	return out
}

// Checks returns the evaluated checks in file order.
func (d *Doc) Checks() []*Item {
	var out []*Item
	for _, it := range d.Items {
		if it.Outcome != nil && !it.Outcome.Skipped && it.Stmt.Kind == eval.Check {
			out = append(out, it)
		}
	}
	return out
}

// Failed reports whether any check failed.
func (d *Doc) Failed() bool {
	for _, c := range d.Checks() {
		if !c.Outcome.Pass {
			return true
		}
	}
	return false
}

// ValueText formats an outcome's value in its display unit with the calc's
// significant figures.
func (d *Doc) ValueText(o *eval.Outcome) string {
	if o.Written != "" {
		return o.Written
	}
	if isNumberInput(o) {
		return o.Stmt.Expr
	}
	if o.Stmt != nil && o.Stmt.Kind == eval.Def && o.Stmt.IsLiteralInput() {
		l := o.Stmt.LoneLiteral()
		if t := l.Unit.String(); t != "1" {
			return l.Num + " " + t
		}
		return l.Num
	}
	switch v := o.Value.(type) {
	case units.Quantity:
		s, err := v.Text(d.shownUnit(o, v), d.Front.Digits, d.Front.Ctx)
		if err != nil {
			return err.Error()
		}
		return s
	case bool:
		return fmt.Sprint(v)
	case string:
		return fmt.Sprintf("%q", v)
	}
	return "(state)"
}

// itemOf returns the evaluated definition of a name.
func (d *Doc) itemOf(name string) *Item {
	if d.byName == nil {
		d.byName = map[string]*Item{}
		for _, it := range d.Items {
			if it.Outcome != nil && it.Stmt.Kind == eval.Def {
				d.byName[it.Stmt.Name] = it
			}
		}
	}
	return d.byName[name]
}

// outcomeOf returns the outcome of a defined name, for substitution.
func (d *Doc) outcomeOf(name string) (*eval.Outcome, bool) {
	it := d.itemOf(name)
	if it == nil {
		return nil, false
	}
	return it.Outcome, true
}
