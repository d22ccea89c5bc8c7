package calcdoc

import (
	"math"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// Uncertainty propagation (JCGM 100, the law of propagation of
// uncertainty): u_c²(y) = Σ_i Σ_j c_i c_j u(x_i) u(x_j) r(x_i, x_j), with
// the sensitivity coefficients c_i = ∂y/∂x_i found by central differences
// through the whole chain of lines — formulas, property calls, interp(),
// solve() — on forks of the engine that re-evaluate only the lines that
// depend on the perturbed input.

// StabilityTol is the largest relative change of a sensitivity coefficient
// when its step is halved before the budget notes it as step-sensitive.
const StabilityTol = 1e-6

// maxRefine is how often a step is halved again when the coefficient is
// not yet stable.
const maxRefine = 3

// UncInput is an input of the calc with a stated uncertainty, or (for a
// sensitivity table) any input without one.
type UncInput struct {
	Item *Item
	Name string
	X    units.Quantity    // the input's value
	U    float64           // its standard uncertainty in SI units; 0 when none
	Unc  *eval.Uncertainty // how it was stated; nil when none
}

// Coef is the sensitivity coefficient of one result to one input.
type Coef struct {
	C      float64 // ∂y/∂x in SI units
	Step   float64 // the finest step used, in SI units of the input
	Change float64 // relative change of C when the step was last halved
	Stable bool    // Change is within StabilityTol (or the term is negligible)
}

// sensRun holds the coefficients of every result to one input.
type sensRun struct {
	in    *UncInput
	coefs map[string]Coef // result name → coefficient (results that depend on the input)
	err   string          // why no coefficient could be found
}

// Propagation is the outcome of propagating the calc's uncertainties.
type Propagation struct {
	Inputs []*UncInput // the inputs with an uncertainty, in file order
	Corr   [][]float64 // their correlation matrix
	CorrAt []int       // offset of the corr line that set each pair last (by i*n+j), 0 if none
	runs   []*sensRun
}

// U returns the combined standard uncertainty of a result in SI units and
// whether it depends on any uncertain input.
func (p *Propagation) U(name string) (float64, bool) {
	if p == nil {
		return 0, false
	}
	var sum float64
	any := false
	for i, ri := range p.runs {
		ci, ok := ri.coefs[name]
		if !ok {
			continue
		}
		any = true
		for j, rj := range p.runs {
			cj, ok := rj.coefs[name]
			if !ok || p.Corr[i][j] == 0 {
				continue
			}
			sum += float64(float64(float64(ci.C*ri.in.U)*float64(cj.C*rj.in.U)) * p.Corr[i][j])
		}
	}
	if !any {
		return 0, false
	}
	return math.Sqrt(math.Max(sum, 0)), true
}

// quantityInputs returns the definitions with no dependencies that hold a
// quantity (the calc's inputs), in file order.
func (d *Doc) quantityInputs() []*Item {
	var out []*Item
	for _, it := range d.Items {
		if it.Inline || it.Err || it.Outcome == nil || it.Outcome.Skipped || it.Stmt.Kind != eval.Def || len(it.Stmt.Deps()) > 0 {
			continue
		}
		if _, ok := it.Outcome.Value.(units.Quantity); ok {
			out = append(out, it)
		}
	}
	return out
}

// plan lists the lines that depend on any of the varied names, in file
// order, and the names they define.
func (d *Doc) plan(varied []string) (redo map[string]bool, items []*Item) {
	redo = map[string]bool{}
	for _, v := range varied {
		redo[v] = true
	}
	for _, it := range d.Items {
		if it.Inline || it.Err || it.Outcome == nil || it.Stmt.Kind != eval.Def {
			continue
		}
		if !readsAny(it.Stmt.Deps(), redo) {
			continue
		}
		redo[it.Stmt.Name] = true
		items = append(items, it)
	}
	return redo, items
}

// perturbed evaluates the dependent lines with the inputs set to xs and
// returns the fork; the error is the first failing line's.
func (d *Doc) perturbed(eng *eval.Engine, redo map[string]bool, items []*Item, names []string, xs []units.Quantity) (*eval.Engine, *Item, error) {
	f := eng.Fork(redo)
	for i, n := range names {
		f.Set(n, xs[i])
	}
	for _, it := range items {
		if _, err := f.Exec(it.Stmt); err != nil {
			return nil, it, err
		}
	}
	return f, nil, nil
}

// stepFor is the first difference step of an input: its standard
// uncertainty, but at most a thousandth of its value (so the property
// calls stay near the state), and at least a millionth of it (so rounding
// does not swamp the difference).
func stepFor(x, u float64) float64 {
	ax := math.Abs(x)
	h := u
	if ax > 0 && (h == 0 || h > float64(1e-3*ax)) {
		h = float64(1e-3 * ax)
	}
	if ax > 0 && h < float64(1e-6*ax) {
		h = float64(1e-6 * ax)
	}
	if h == 0 {
		h = 1e-6
	}
	return h
}
