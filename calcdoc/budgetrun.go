package calcdoc

import (
	"math"
	"sort"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// runBudgets evaluates every budget block after the propagation.
func (d *Doc) runBudgets(eng *eval.Engine) {
	for _, bg := range d.Budgets {
		for _, e := range bg.Entries {
			it := d.itemOf(e.Name)
			if it == nil {
				d.errorf(e.Off, "budget %s: the calc does not define %s", e.Name, e.Name)
				continue
			}
			q, ok := it.Outcome.Value.(units.Quantity)
			if !ok {
				d.errorf(e.Off, "budget %s: %s is not a number or quantity", e.Name, e.Name)
				continue
			}
			e.Y, e.Display = q, it.Outcome.Display
			if e.Sens {
				d.sensitivityTable(eng, e)
				continue
			}
			if it.Stmt.Uncertainty() != nil {
				d.errorf(e.Off, "budget %s: %s is an input, whose uncertainty is stated on line %d; a budget is made for a result computed from inputs", e.Name, e.Name, it.Stmt.Line)
				continue
			}
			if !d.gumBudget(e) {
				continue
			}
			if e.MC > 0 {
				d.monteCarlo(eng, e)
			}
		}
	}
}

// gumBudget fills the rows of a budget from the propagation.
func (d *Doc) gumBudget(e *BudgetEntry) bool {
	uc, ok := d.Unc.U(e.Name)
	if !ok {
		d.errorf(e.Off, "budget %s: %s depends on no input with an uncertainty; state one on an input line, such as p_1 = 12.5 MPa ± 0.05 MPa", e.Name, e.Name)
		return false
	}
	e.Uc = uc
	var direct float64
	for _, run := range d.Unc.runs {
		co, ok := run.coefs[e.Name]
		if !ok {
			continue
		}
		r := BudgetRow{In: run.in, Coef: co, CU: float64(co.C * run.in.U)}
		if uc > 0 {
			r.Share = float64(r.CU*r.CU) / float64(uc*uc)
		}
		direct += r.Share
		e.Rows = append(e.Rows, r)
	}
	if uc > 0 {
		e.CovFrac = 1 - direct
	}
	return true
}

// sensitivityTable lists c_i and the relative sensitivity of every input
// the result depends on, largest relative sensitivity first.
func (d *Doc) sensitivityTable(eng *eval.Engine, e *BudgetEntry) {
	for _, it := range d.quantityInputs() {
		redo, _ := d.plan([]string{it.Stmt.Name})
		if !redo[e.Name] || it.Stmt.Name == e.Name {
			continue
		}
		in := &UncInput{Item: it, Name: it.Stmt.Name, X: it.Outcome.Value.(units.Quantity)}
		if unc := it.Stmt.Uncertainty(); unc != nil {
			in.U, in.Unc = unc.U, unc
		}
		run := d.sensRunFor(eng, in)
		if run.err != "" {
			d.errorf(e.Off, "sensitivity %s: %s", e.Name, run.err)
			return
		}
		co, ok := run.coefs[e.Name]
		if !ok {
			continue
		}
		r := BudgetRow{In: in, Coef: co, CU: float64(co.C * in.U)}
		if e.Y.V != 0 {
			r.Rel, r.HasRel = float64(co.C*in.X.V)/e.Y.V, true
		}
		e.Rows = append(e.Rows, r)
	}
	if len(e.Rows) == 0 {
		d.errorf(e.Off, "sensitivity %s: %s depends on no input of the calc", e.Name, e.Name)
		return
	}
	sort.SliceStable(e.Rows, func(i, j int) bool {
		return math.Abs(e.Rows[i].Rel) > math.Abs(e.Rows[j].Rel)
	})
}

// sensRunFor returns the coefficients to an input: those of the
// propagation when it has an uncertainty, else found now.
func (d *Doc) sensRunFor(eng *eval.Engine, in *UncInput) *sensRun {
	if d.Unc != nil {
		for _, run := range d.Unc.runs {
			if run.in.Name == in.Name {
				return run
			}
		}
	}
	return d.sensitivities(eng, in)
}
