package calcdoc

import (
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// propagate finds the sensitivity coefficients of every result to every
// input with an uncertainty, and checks the correlations.
func (d *Doc) propagate(eng *eval.Engine) {
	p := &Propagation{}
	index := map[string]int{}
	for _, it := range d.quantityInputs() {
		if unc := it.Stmt.Uncertainty(); unc != nil {
			index[it.Stmt.Name] = len(p.Inputs)
			p.Inputs = append(p.Inputs, &UncInput{Item: it, Name: it.Stmt.Name, X: it.Outcome.Value.(units.Quantity), U: unc.U, Unc: unc})
		}
	}
	if len(p.Inputs) == 0 {
		return
	}
	if !d.readCorr(p, index) {
		return
	}
	p.runs = d.allSensitivities(eng, p.Inputs)
	for _, run := range p.runs {
		if run.err != "" {
			d.errorf(run.in.Unc.Off, "%s", run.err)
			return
		}
	}
	d.Unc = p
}

// allSensitivities finds the coefficients of every input on all cores;
// each input's run is its own, stored at its index, so the result does not
// depend on the number of cores.
func (d *Doc) allSensitivities(eng *eval.Engine, ins []*UncInput) []*sensRun {
	runs := make([]*sensRun, len(ins))
	var next atomic.Int64
	var wg sync.WaitGroup
	for w := 0; w < min(runtime.GOMAXPROCS(0), len(ins)); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1)) - 1
				if i >= len(ins) {
					return
				}
				runs[i] = d.sensitivities(eng, ins[i])
			}
		}()
	}
	wg.Wait()
	return runs
}

// readCorr fills the correlation matrix from the corr lines and checks
// that it is positive semi-definite.
func (d *Doc) readCorr(p *Propagation, index map[string]int) bool {
	last := d.fillCorr(p, index)
	if _, ok := cholesky(p.Corr); !ok {
		d.errorf(last, "the correlations are not consistent: their matrix is not positive semi-definite (for example corr(a, b) = 0.9, corr(b, c) = 0.9 and corr(a, c) = -0.9 cannot all hold); check the corr lines")
		return false
	}
	return true
}

// fillCorr fills the correlation matrix from the corr lines and returns
// the offset of the last one.
func (d *Doc) fillCorr(p *Propagation, index map[string]int) int {
	n := len(p.Inputs)
	p.Corr = make([][]float64, n)
	p.CorrAt = make([]int, n*n)
	for i := range p.Corr {
		p.Corr[i] = make([]float64, n)
		p.Corr[i][i] = 1
	}
	last := 0
	for _, it := range d.Items {
		if it.Err || it.Outcome == nil || it.Stmt.Kind != eval.Corr {
			continue
		}
		a, b, _, _, r := it.Stmt.Corr()
		i, okA := index[a]
		j, okB := index[b]
		if !okA || !okB {
			continue // execCorr has reported it
		}
		p.Corr[i][j], p.Corr[j][i] = r, r
		p.CorrAt[i*n+j], p.CorrAt[j*n+i] = it.Stmt.ExprOff, it.Stmt.ExprOff
		last = it.Stmt.ExprOff
	}
	return last
}

// cholesky returns the lower factor L of a positive semi-definite matrix
// (R = L·Lᵀ), with zero columns where a pivot is zero, and false when the
// matrix is not positive semi-definite.
func cholesky(r [][]float64) ([][]float64, bool) {
	const tol = 1e-12
	n := len(r)
	l := make([][]float64, n)
	for i := range l {
		l[i] = make([]float64, n)
	}
	for j := 0; j < n; j++ {
		piv := r[j][j]
		for k := 0; k < j; k++ {
			piv -= float64(l[j][k] * l[j][k])
		}
		if piv < -tol {
			return nil, false
		}
		for i := j + 1; i < n; i++ {
			s := r[i][j]
			for k := 0; k < j; k++ {
				s -= float64(l[i][k] * l[j][k])
			}
			switch {
			case piv > tol:
				l[i][j] = s / math.Sqrt(piv)
			case math.Abs(s) > 1e-9:
				return nil, false
			}
		}
		if piv > tol {
			l[j][j] = math.Sqrt(piv)
		}
	}
	return l, true
}

// sensitivities finds ∂y/∂x for every result that depends on the input:
// central differences at a step h and h/2, combined by Richardson's rule
// when they agree to StabilityTol, the step halved again (up to maxRefine
// times) when they do not. A perturbed evaluation that fails is tried
// again with a step ten times smaller, three times.
func (d *Doc) sensitivities(eng *eval.Engine, in *UncInput) *sensRun {
	run := &sensRun{in: in, coefs: map[string]Coef{}}
	redo, items := d.plan([]string{in.Name})
	base := map[string]float64{}
	for _, it := range items {
		if q, ok := it.Outcome.Value.(units.Quantity); ok {
			base[it.Stmt.Name] = q.V
		}
	}
	h := stepFor(in.X.V, in.U)
	var prev map[string]float64
	for tries := 0; ; tries++ {
		var msg string
		prev, msg = d.centralDiff(eng, redo, items, in, h, base)
		if msg == "" {
			break
		}
		if tries == 3 {
			run.err = msg
			return run
		}
		h /= 10
	}
	for k := 0; ; k++ {
		next, msg := d.centralDiff(eng, redo, items, in, float64(h/2), base)
		if msg != "" {
			run.err = msg
			return run
		}
		allStable := true
		for name, c2 := range next {
			c1 := prev[name]
			diff, scale := math.Abs(c2-c1), math.Max(math.Abs(c1), math.Abs(c2))
			co := Coef{C: c2, Step: float64(h / 2), Stable: true}
			if scale > 0 {
				co.Change = diff / scale
			}
			negligible := float64(diff*math.Max(in.U, h)) <= float64(1e-12*math.Abs(base[name]))
			switch {
			case co.Change <= StabilityTol:
				co.C = (float64(4*c2) - c1) / 3 // Richardson: the h² term cancels
			case negligible:
			default:
				co.Stable, allStable = false, false
			}
			run.coefs[name] = co
		}
		if allStable || k == maxRefine {
			return run
		}
		prev, h = next, float64(h/2)
	}
}

// centralDiff evaluates the dependent lines at x ± h and returns
// (y(x+h) − y(x−h)) / 2h for every quantity result, or why it failed.
func (d *Doc) centralDiff(eng *eval.Engine, redo map[string]bool, items []*Item, in *UncInput, h float64, base map[string]float64) (map[string]float64, string) {
	var ys [2]*eval.Engine
	for k, sign := range []float64{1, -1} {
		x := in.X
		x.V += float64(sign * h)
		f, bad, err := d.perturbed(eng, redo, items, []string{in.Name}, []units.Quantity{x})
		if err != nil {
			return nil, sprintf("%s: the calc fails when %s is moved by %s to find the sensitivities: line %d: %s", in.Name, in.Name, d.stepText(in, float64(sign*h)), bad.Stmt.Line, evalMsg(err))
		}
		ys[k] = f
	}
	out := make(map[string]float64, len(base))
	for name := range base {
		a, _ := ys[0].Value(name)
		b, _ := ys[1].Value(name)
		qa, okA := a.(units.Quantity)
		qb, okB := b.(units.Quantity)
		if okA && okB {
			out[name] = (qa.V - qb.V) / (2 * h)
		}
	}
	return out, ""
}

// stepText writes a step of an input in the input's unit as a difference.
func (d *Doc) stepText(in *UncInput, h float64) string {
	q := units.Quantity{V: h, D: in.X.D}
	return quantityText(q, units.DefaultUnit(q), 3, d.Front.Ctx)
}
