// Package register keeps the register of a repository's calcs: it finds
// every calc file under a folder, renders the ones whose source, data files
// or engine changed since the last run (a content-hash cache in the output
// folder), on all cores, and writes index.html with each calc's number,
// title, revision, signature status, checks and whether its signed package
// is stale. A broken calc is listed as broken; it does not stop the others.
package register

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"runtime/debug"
	"sync"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// ErrNoCalcs reports a folder that holds no calc file.
var ErrNoCalcs = errors.New("no calc files (*.calc.md)")

// Options say what to register and where.
type Options struct {
	Dir    string // the folder searched for calc files
	Out    string // the output folder: packages, index.html and the cache
	Engine string // the engine version; a new one renders everything again
	// Build and Qualification are this engine's build and the digest of
	// its qualification report, recorded in each package rendered and
	// checked against each signed package; nil and "" when not known.
	Build         *provenance.EngineBuild
	Qualification string
	// Errata, when set, returns the known engine errors that touch a
	// signed package, each with the reason, from what its manifest records
	// of its engine (name and build, nil when not recorded) and of the
	// functions its calc used (nil when not recorded). The caller holds
	// the errata list (qualify sits above this package).
	Errata func(engine string, build *provenance.EngineBuild, uses []string) []string
	// Shard and Shards split the calcs between CI runners: this run
	// renders shard Shard (1-based) of Shards and writes no index; a later
	// run without a shard over the merged output folders writes it. Zero
	// Shards means all calcs.
	Shard, Shards int
	// Workers is the number of calcs rendered at once; 0 means one per
	// core (GOMAXPROCS).
	Workers int
	// Signers is an allowed-signers file for checking the keys of the
	// signed packages; "" checks signatures without it.
	Signers string
	// Read are the repository's settings (vouch.yaml) every calc is read
	// with.
	Read calcdoc.ReadOptions
	// Progress, when set, is told after each calc how many are done. It
	// is called from one goroutine at a time.
	Progress func(done, total int)
}

// Summary is the outcome of a run.
type Summary struct {
	Entries  []*Entry // the calcs of this run, in register order
	Rendered int      // calcs evaluated and rendered (or found broken) in this run
	Cached   int      // calcs taken from the cache
	Index    string   // the index written; "" for a shard
}

// Broken counts the calcs with errors.
func (s *Summary) Broken() int { return count(s.Entries, func(e *Entry) bool { return e.Broken() }) }

// Failing counts the calcs with a failed check.
func (s *Summary) Failing() int { return count(s.Entries, func(e *Entry) bool { return e.Failed > 0 }) }

func count(entries []*Entry, f func(*Entry) bool) int {
	n := 0
	for _, e := range entries {
		if f(e) {
			n++
		}
	}
	return n
}

// Run brings the register in opt.Out up to date and writes its index.
func Run(opt Options) (*Summary, error) {
	r, err := newRun(opt)
	if err != nil {
		return nil, err
	}
	r.work()
	sum := &Summary{Entries: r.entries, Rendered: r.rendered, Cached: len(r.entries) - r.rendered}
	if err := r.cache.write(opt.Out, shardCacheFile(opt.Shard, opt.Shards), r.entries); err != nil {
		return sum, err
	}
	if opt.Shards > 0 || r.firstErr != nil {
		return sum, r.firstErr
	}
	r.cache.prune(opt.Out, r.calcs)
	sum.Index, err = r.writeIndex()
	return sum, err
}

// run is one register run.
type run struct {
	opt      Options
	calcs    []string // slash paths relative to Dir
	entries  []*Entry
	cache    *cache
	space    *lazyWorkspace
	mu       sync.Mutex
	done     int
	rendered int
	firstErr error
}

func newRun(opt Options) (*run, error) {
	if err := opt.check(); err != nil {
		return nil, err
	}
	calcs, err := findCalcs(opt.Dir, opt.Out)
	if err != nil {
		return nil, err
	}
	if len(calcs) == 0 {
		return nil, fmt.Errorf("%s: %w", opt.Dir, ErrNoCalcs)
	}
	if opt.Shards > 0 {
		calcs = shard(calcs, opt.Shard, opt.Shards)
	}
	if err := os.MkdirAll(cacheDir(opt.Out), 0o755); err != nil {
		return nil, err
	}
	return &run{opt: opt, calcs: calcs, entries: make([]*Entry, len(calcs)), cache: loadCache(opt.Out),
		space: &lazyWorkspace{dir: opt.Dir}}, nil
}

// check refuses options that cannot work.
func (o Options) check() error {
	if o.Shards < 0 || o.Shards > 0 && (o.Shard < 1 || o.Shard > o.Shards) {
		return fmt.Errorf("shard %d/%d: give --shard i/n with 1 <= i <= n", o.Shard, o.Shards)
	}
	st, err := os.Stat(o.Dir)
	if err != nil {
		return err
	}
	if !st.IsDir() {
		return fmt.Errorf("%s is not a folder", o.Dir)
	}
	dir, errD := filepath.Abs(o.Dir)
	out, errO := filepath.Abs(o.Out)
	if errors.Join(errD, errO) == nil && filepath.Clean(dir) == filepath.Clean(out) {
		return fmt.Errorf("-o %s is the folder of the calcs: the register's packages would overwrite the packages beside them; give another folder", o.Out)
	}
	return nil
}

// batchGCPercent is the garbage collector's target while a register
// renders: a batch of short-lived documents, where the collector's default
// pace costs a quarter of the time and keeps two cores from scaling.
const batchGCPercent = 400

// work renders the calcs on the workers.
func (r *run) work() {
	workers := r.opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	defer debug.SetGCPercent(debug.SetGCPercent(batchGCPercent))
	jobs := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < min(workers, len(r.calcs)); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			wk := &worker{run: r}
			for i := range jobs {
				r.finish(i, wk.do(r.calcs[i]))
			}
		}()
	}
	for i := range r.calcs {
		jobs <- i
	}
	close(jobs)
	wg.Wait()
}

// outcome is what a worker reports for one calc.
type outcome struct {
	entry    *Entry
	rendered bool
	err      error // a failure of the register itself (a file it cannot write)
}

// finish records one calc's outcome and reports progress.
func (r *run) finish(i int, o outcome) {
	r.mu.Lock()
	defer r.mu.Unlock()
	r.entries[i] = o.entry
	if o.rendered {
		r.rendered++
	}
	if o.err != nil && r.firstErr == nil {
		r.firstErr = o.err
	}
	r.done++
	if r.opt.Progress != nil {
		r.opt.Progress(r.done, len(r.calcs))
	}
}

// cacheEngine is what the cache key records of the engine and of the
// settings every calc is read with: a changed vouch.yaml renders every
// calc again.
func (o Options) cacheEngine() string {
	if o.Read.SettingsSource == nil {
		return o.engineKey()
	}
	return o.engineKey() + " settings " + provenance.BlobHash(o.Read.SettingsSource)
}

// engineKey names the engine for the render cache: its version, build and
// qualification digest, so that another build renders everything again.
func (o Options) engineKey() string {
	if o.Build == nil {
		return o.Engine
	}
	return o.Engine + "\x00" + o.Build.String() + "\x00" + o.Qualification
}
