package calcdoc

import (
	"runtime"
	"sync"
	"sync/atomic"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// The points of a sweep are spread over GOMAXPROCS workers. Each point
// forks the engine of the main pass (Engine.Fork is safe from several
// goroutines) and writes only its own row, so the workers share nothing
// they change; the results, the error (that of the first failing point)
// and the progress calls are the same on any number of cores.

// pointError is why a sweep point failed, at an offset of the source.
type pointError struct {
	off int
	msg string
}

// sweepRun is one sweep being evaluated.
type sweepRun struct {
	d      *Doc
	eng    *eval.Engine
	sw     *Sweep
	plan   sweepPlan
	vals   []any
	rows   [][]units.Quantity
	failed [][]int
	errs   []*pointError
	next   atomic.Int64 // the next point no worker has taken
	stop   atomic.Int64 // the first point known to fail; len(vals) while none

	// With several workers the data readers, which record each file the
	// calc reads, run one at a time, and each point notes the files it
	// read, so the record keeps the order of one core (replayReads).
	shared bool
	readMu sync.Mutex
	reads  [][]string
}

// sweepPoints evaluates every point of a sweep.
func (d *Doc) sweepPoints(eng *eval.Engine, sw *Sweep, plan sweepPlan, vals []any) {
	n := len(vals)
	r := &sweepRun{d: d, eng: eng, sw: sw, plan: plan, vals: vals,
		rows: make([][]units.Quantity, n), failed: make([][]int, n), errs: make([]*pointError, n)}
	r.stop.Store(int64(n))
	cells := make([]units.Quantity, n*len(sw.Show))
	for i := range r.rows {
		r.rows[i] = cells[i*len(sw.Show) : (i+1)*len(sw.Show) : (i+1)*len(sw.Show)]
	}
	workers := min(runtime.GOMAXPROCS(0), n)
	r.shared = workers > 1
	if r.shared {
		r.reads = make([][]string, n)
	}
	before := len(d.DataFiles)
	r.runAll(workers)
	end := int(r.stop.Load())
	if r.shared && len(d.DataFiles) > before {
		d.DataFiles = d.DataFiles[:before]
		r.replayReads(min(end, n-1))
	}
	if end < n {
		d.errorf(r.errs[end].off, "%s", r.errs[end].msg)
	}
	sw.Rows, sw.Failed = r.rows[:end], r.failed[:end]
}

// runAll runs the workers and reports progress from the calling
// goroutine: Progress is told 1, 2, … up to the first failing point, in
// order, however the points were spread.
func (r *sweepRun) runAll(workers int) {
	n := len(r.vals)
	chunk := max(1, min(64, n/(8*workers)))
	prog := progressTracker{r: r, done: make([]bool, n)}
	if workers <= 1 {
		r.work(chunk, prog.mark)
		return
	}
	spans := make(chan [2]int, 4*workers)
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			r.work(chunk, func(lo, hi int) { spans <- [2]int{lo, hi} })
		}()
	}
	go func() { wg.Wait(); close(spans) }()
	for s := range spans {
		prog.mark(s[0], s[1])
	}
}

// worker is one goroutine's engine, reforked from the main pass's engine
// at every point, and the point it is at.
type worker struct {
	f   *eval.Engine
	cur int
}

// work takes chunks of points until none is left or a point before them
// has failed, and tells done about each chunk it finished.
func (r *sweepRun) work(chunk int, done func(lo, hi int)) {
	w := &worker{f: r.eng.Fork(r.plan.redo)}
	if r.shared {
		r.readersFor(w)
	}
	n := int64(len(r.vals))
	for {
		lo := r.next.Add(int64(chunk)) - int64(chunk)
		if lo >= n || lo > r.stop.Load() {
			return
		}
		hi := min(lo+int64(chunk), n)
		for i := lo; i < hi; i++ {
			if i > r.stop.Load() {
				hi = i
				break
			}
			if err := r.point(w, int(i)); err != nil {
				r.errs[i] = err
				r.lowerStop(i)
			}
		}
		done(int(lo), int(hi))
	}
}

// lowerStop records that point i fails, keeping the first failing point.
func (r *sweepRun) lowerStop(i int64) {
	for {
		cur := r.stop.Load()
		if i >= cur || r.stop.CompareAndSwap(cur, i) {
			return
		}
	}
}

// progressTracker reports the points finished in order: the longest run of
// finished points from the first, up to the first failing one.
type progressTracker struct {
	r      *sweepRun
	done   []bool
	prefix int
}

func (p *progressTracker) mark(lo, hi int) {
	for i := lo; i < hi; i++ {
		p.done[i] = true
	}
	r := p.r
	for p.prefix < len(p.done) && p.done[p.prefix] && r.errs[p.prefix] == nil {
		p.prefix++
		if r.d.Progress != nil {
			r.d.Progress(r.sw.Var, p.prefix, len(p.done))
		}
	}
}

// point re-evaluates the dependent lines at point i on the worker's
// engine and fills its row.
func (r *sweepRun) point(w *worker, i int) *pointError {
	d, sw := r.d, r.sw
	f := w.f
	f.Refork(r.eng, r.plan.redo)
	w.cur = i
	f.Set(sw.Var, r.vals[i])
	var failed []int
	for _, it := range r.plan.items {
		out, err := f.Exec(it.Stmt)
		if err != nil {
			return &pointError{sw.VarOff, sprintf("sweep point %s = %s: line %d: %s", sw.Var, d.SweepX(sw, i), it.Stmt.Line, evalMsg(err))}
		}
		if it.Stmt.Kind == eval.Check && !out.Pass {
			failed = append(failed, it.Stmt.Line)
		}
	}
	row := r.rows[i]
	for k, c := range sw.Show {
		v, _ := f.Value(c.Name)
		q, ok := v.(units.Quantity)
		if !ok {
			return &pointError{c.Off, sprintf("show %s: %s is not a number or quantity", c.Name, c.Name)}
		}
		if c.U {
			if msg := d.uncColumn(f, sw, c, i, &q); msg != "" {
				return &pointError{c.Off, msg}
			}
		}
		if c.HasUnit {
			if _, err := q.In(c.Unit, d.Front.Ctx); err != nil {
				return &pointError{c.Off, sprintf("show %s [%s]: %v", c.Name, c.Unit, err)}
			}
		}
		row[k] = q
	}
	r.failed[i] = failed
	return nil
}

// readersFor gives a worker's engine data readers that run one at a time
// and note, for the worker's point, each file they are asked for.
func (r *sweepRun) readersFor(w *worker) {
	f := w.f
	if data := f.Data; data != nil {
		f.Data = func(name string) ([]byte, error) {
			r.readMu.Lock()
			defer r.readMu.Unlock()
			r.reads[w.cur] = append(r.reads[w.cur], name)
			return data(name)
		}
	}
	if values := f.YAML; values != nil {
		f.YAML = func(name string) ([]eval.KeyValue, error) {
			r.readMu.Lock()
			defer r.readMu.Unlock()
			r.reads[w.cur] = append(r.reads[w.cur], name)
			return values(name)
		}
	}
}

// replayReads records again, in the order of the points up to last, the
// files the sweep's points read: the record of data files then lists them
// as one core would have.
func (r *sweepRun) replayReads(last int) {
	if r.eng.Data == nil {
		return
	}
	seen := map[string]bool{}
	for i := 0; i <= last; i++ {
		for _, name := range r.reads[i] {
			if !seen[name] {
				seen[name] = true
				_, _ = r.eng.Data(name) // an error was reported at its point
			}
		}
	}
}
