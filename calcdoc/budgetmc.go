package calcdoc

import (
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/internal/fpmath"
	"github.com/vouchcalc/vouch/units"
)

// The Monte Carlo check of JCGM 101 (GUM Supplement 1): N draws of the
// inputs — normal for a standard or expanded uncertainty, rectangular for
// a half-width, correlated normal inputs through the Cholesky factor of
// their correlation matrix — each evaluated through the dependent lines
// on a fork of the engine. Draws come in blocks of mcBlock, block b from a
// PCG generator seeded (mcSeed, b), and every result is stored at its own
// index, so the figures are the same bytes whatever the number of cores.

const (
	mcSeed  = 0x766f756368 // fixed: the same draws on every run
	mcBlock = 1000
	mcP     = 0.95 // coverage probability of the interval
	mcKp    = 1.96 // coverage factor of the GUM interval it is compared with (normal, 95 %)
	mcNDig  = 2    // significant digits of u_c that set the validation tolerance
)

// MCResult is the Monte Carlo check of one budget.
type MCResult struct {
	N         int
	Mean, Std float64 // SI units of the result
	Low, High float64 // the probabilistically symmetric 95 % coverage interval
	GLow      float64 // the GUM interval y ± 1.96·u_c
	GHigh     float64
	Delta     float64 // the numerical tolerance of u_c (JCGM 101, 8.2)
	DLow, DHi float64 // |GLow − Low|, |GHigh − High|
	Agree     bool    // both within Delta
	SEMean    float64 // standard deviation of the mean, Std/√N
}

// mcInput is one input drawn by the Monte Carlo check.
type mcInput struct {
	in   *UncInput
	rect bool
	half float64 // the half-width of a rectangular input
}

// monteCarlo runs the Monte Carlo check of a budget entry.
func (d *Doc) monteCarlo(eng *eval.Engine, e *BudgetEntry) {
	var ins []mcInput
	var idx []int
	for i, run := range d.Unc.runs {
		if _, ok := run.coefs[e.Name]; ok {
			ins = append(ins, mcInput{in: run.in, rect: run.in.Unc.Kind == eval.UncRect, half: run.in.Unc.Given.V})
			idx = append(idx, i)
		}
	}
	n := len(ins)
	corr := make([][]float64, n)
	for a := range corr {
		corr[a] = make([]float64, n)
		for b := range corr[a] {
			corr[a][b] = d.Unc.Corr[idx[a]][idx[b]]
			if a != b && corr[a][b] != 0 && (ins[a].rect || ins[b].rect) {
				d.errorf(e.Off, "budget %s mc: %s is rectangular and correlated with %s; the Monte Carlo check draws correlated inputs as normal only", e.Name, map[bool]string{true: ins[a].in.Name, false: ins[b].in.Name}[ins[a].rect], map[bool]string{true: ins[b].in.Name, false: ins[a].in.Name}[ins[a].rect])
				return
			}
		}
	}
	l, _ := cholesky(corr) // checked positive semi-definite by readCorr
	ys, msg := d.mcDraws(eng, e, ins, l)
	if msg != "" {
		d.errorf(e.Off, "budget %s mc: %s", e.Name, msg)
		return
	}
	e.MCRes = mcSummary(ys, e.Y.V, e.Uc)
}

// mcDraws evaluates the N draws on all cores, block by block.
func (d *Doc) mcDraws(eng *eval.Engine, e *BudgetEntry, ins []mcInput, l [][]float64) ([]float64, string) {
	names := make([]string, len(ins))
	for i, m := range ins {
		names[i] = m.in.Name
	}
	redo, items := d.plan(names)
	ys := make([]float64, e.MC)
	blocks := (e.MC + mcBlock - 1) / mcBlock
	var next atomic.Int64
	var mu sync.Mutex
	firstBad, badMsg := blocks, ""
	var wg sync.WaitGroup
	for w := 0; w < min(runtime.GOMAXPROCS(0), blocks); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				b := int(next.Add(1)) - 1
				if b >= blocks {
					return
				}
				if msg := d.mcBlock(eng, redo, items, e.Name, names, ins, l, ys, b); msg != "" {
					mu.Lock()
					if b < firstBad {
						firstBad, badMsg = b, msg
					}
					mu.Unlock()
				}
			}
		}()
	}
	wg.Wait()
	return ys, badMsg
}

// mcBlock evaluates the draws of block b into ys.
func (d *Doc) mcBlock(eng *eval.Engine, redo map[string]bool, items []*Item, name string, names []string, ins []mcInput, l [][]float64, ys []float64, b int) string {
	rng := rand.New(rand.NewPCG(mcSeed, uint64(b)))
	n := len(ins)
	z, x := make([]float64, n), make([]units.Quantity, n)
	var f *eval.Engine
	for k := b * mcBlock; k < min((b+1)*mcBlock, len(ys)); k++ {
		for i := 0; i < n; i += 2 {
			z0, z1 := normalPair(rng)
			z[i] = z0
			if i+1 < n {
				z[i+1] = z1
			}
		}
		for i, m := range ins {
			x[i] = m.in.X
			if m.rect {
				x[i].V += float64(m.half * (float64(2*uniform(rng)) - 1))
				continue
			}
			var s float64
			for j := 0; j <= i; j++ {
				s += float64(l[i][j] * z[j])
			}
			x[i].V += float64(m.in.U * s)
		}
		if f == nil {
			f = eng.Fork(redo)
		} else {
			f.Refork(eng, redo) // one engine per block: no fresh memory per draw
		}
		for i, n := range names {
			f.Set(n, x[i])
		}
		for _, it := range items {
			if _, err := f.Exec(it.Stmt); err != nil {
				return sprintf("draw %d fails: line %d: %s", k+1, it.Stmt.Line, evalMsg(err))
			}
		}
		v, _ := f.Value(name)
		q, _ := v.(units.Quantity)
		ys[k] = q.V
	}
	return ""
}

// uniform draws from [0, 1) with the products of this package, which the
// guard against fused multiply-adds covers (math/rand's Float64 is
// inlined unguarded).
func uniform(rng *rand.Rand) float64 {
	return float64(float64(rng.Uint64()>>11) / (1 << 53))
}

// normalPair draws two independent standard normal numbers (Box–Muller,
// with the project's own exp, log and trigonometric functions, so every
// architecture draws the same bits).
func normalPair(rng *rand.Rand) (float64, float64) {
	u1 := float64((float64(rng.Uint64()>>11) + 1) / (1 << 53)) // (0, 1]
	u2 := float64(float64(rng.Uint64()>>11) / (1 << 53))       // [0, 1)
	r := math.Sqrt(float64(-2 * fpmath.Log(u1)))
	t := float64(2 * math.Pi * u2)
	return float64(r * fpmath.Cos(t)), float64(r * fpmath.Sin(t))
}

// mcSummary computes the mean, standard deviation and 95 % coverage
// interval of the draws and compares the interval with the GUM's
// y ± 1.96·u_c (JCGM 101, 8.2): the GUM is validated when both ends agree
// to δ, half a unit in the last of the two significant digits of u_c.
func mcSummary(ys []float64, y, uc float64) *MCResult {
	r := &MCResult{N: len(ys)}
	var sum float64
	for _, v := range ys {
		sum += v
	}
	r.Mean = sum / float64(len(ys))
	var ss float64
	for _, v := range ys {
		ss += float64((v - r.Mean) * (v - r.Mean))
	}
	r.Std = math.Sqrt(ss / float64(len(ys)-1))
	r.SEMean = r.Std / math.Sqrt(float64(len(ys)))
	sorted := slices.Clone(ys)
	slices.Sort(sorted)
	q := int(float64(mcP*float64(len(ys))) + 0.5)
	lo := (len(ys) - q) / 2
	if (len(ys)-q)%2 != 0 {
		lo = (len(ys) - q + 1) / 2
	}
	lo = max(lo, 1)
	r.Low, r.High = sorted[lo-1], sorted[min(lo+q, len(ys))-1]
	r.GLow, r.GHigh = y-float64(mcKp*uc), y+float64(mcKp*uc)
	r.DLow, r.DHi = math.Abs(r.GLow-r.Low), math.Abs(r.GHigh-r.High)
	r.Delta = tolOf(uc)
	r.Agree = r.DLow <= r.Delta && r.DHi <= r.Delta
	return r
}

// tolOf is the numerical tolerance of u: written with mcNDig significant
// digits as c × 10^l, δ = 10^l / 2.
func tolOf(u float64) float64 {
	if !(u > 0) {
		return 0
	}
	l := math.Floor(fpmath.Log10(u)) - (mcNDig - 1)
	return float64(0.5 * fpmath.Pow(10, l))
}
