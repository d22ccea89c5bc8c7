package calcdoc

import "github.com/vouchcalc/vouch/eval"

// Bounds on sweeps, checked before a sweep allocates its table or
// evaluates a point. A sweep's columns are its shown names and the checks
// it re-evaluates (the failed checks are kept at every point).
const (
	// MaxSweepValues bounds one sweep's points × columns.
	MaxSweepValues = 1_000_000
	// MaxFileSweepPoints bounds the points of all the sweeps of a file.
	MaxFileSweepPoints = 200_000
	// MaxFileSweepValues bounds the points × columns of all the sweeps of a
	// file.
	MaxFileSweepValues = 2_000_000
	// MaxFileSweepEvals bounds the line evaluations of all the sweeps of a
	// file: each sweep's points × the lines it re-evaluates at each point.
	MaxFileSweepEvals = 20_000_000
	// MaxSweepPlotted bounds the points a sweep's plots draw: its points ×
	// the names on all its plot lines.
	MaxSweepPlotted = 200_000
	// MaxFileSweepPlotted bounds the points all the sweeps' plots of a file
	// draw.
	MaxFileSweepPlotted = 400_000
)

// sweepPlan is what a sweep re-evaluates at each point: the lines that
// depend on the varied input, in file order, and the names they define.
type sweepPlan struct {
	redo   map[string]bool
	items  []*Item
	checks int // how many of items are checks
}

// sweepBudget is what the sweeps of a file have used so far.
type sweepBudget struct {
	points, values, evals, plotted int
}

// points is the number of points a sweep asks for, known before any value
// is evaluated.
func (sw *Sweep) points() int {
	if sw.steps > 0 {
		return sw.steps + 1
	}
	return len(sw.bounds)
}

// admit checks a sweep against the bounds of one sweep and what is left of
// the file's; it gives the error at the vary line and reports false when
// the sweep would go over.
func (d *Doc) admit(b *sweepBudget, sw *Sweep, plan sweepPlan) bool {
	n := sw.points()
	limit := MaxSweepPoints
	if d.SweepLimit > 0 && d.SweepLimit < limit {
		limit = d.SweepLimit
	}
	cols := len(sw.Show) + plan.checks
	plotted := 0
	for _, pl := range sw.plots {
		plotted += n * len(pl.names)
	}
	switch {
	case n > limit:
		d.errorf(sw.VarOff, "vary %s: %d points are more than the %d a sweep may have", sw.Var, n, limit)
	case cols > MaxSweepValues || n*cols > MaxSweepValues:
		d.errorf(sw.VarOff, "vary %s: %d points × %d columns (%d shown, %d checks) are %d values, more than the %d one sweep may hold; take fewer points or show fewer names",
			sw.Var, n, cols, len(sw.Show), plan.checks, n*cols, MaxSweepValues)
	case b.points+n > MaxFileSweepPoints:
		d.errorf(sw.VarOff, "vary %s: this sweep's %d points bring the file's sweeps to %d points, more than the %d the sweeps of a file may have together",
			sw.Var, n, b.points+n, MaxFileSweepPoints)
	case b.values+n*cols > MaxFileSweepValues:
		d.errorf(sw.VarOff, "vary %s: this sweep's %d values (points × columns) bring the file's sweeps to %d, more than the %d the sweeps of a file may hold together",
			sw.Var, n*cols, b.values+n*cols, MaxFileSweepValues)
	case len(plan.items) > MaxFileSweepEvals || b.evals+n*len(plan.items) > MaxFileSweepEvals:
		d.errorf(sw.VarOff, "vary %s: %d points × %d lines to re-evaluate bring the file's sweeps to %d line evaluations, more than the %d allowed for a file",
			sw.Var, n, len(plan.items), b.evals+n*len(plan.items), MaxFileSweepEvals)
	case plotted > MaxSweepPlotted || b.plotted+plotted > MaxFileSweepPlotted:
		d.errorf(sw.VarOff, "vary %s: %d points on its plots are %d plotted values, more than the %d a sweep's plots may draw (%d for all the sweeps of a file, %d used before); take fewer points or plot fewer names",
			sw.Var, n, plotted, MaxSweepPlotted, MaxFileSweepPlotted, b.plotted)
	default:
		b.plotted += plotted
		b.points += n
		b.values += n * cols
		b.evals += n * len(plan.items)
		return true
	}
	return false
}

// planSweep finds the lines that depend on the varied input, in file order.
func (d *Doc) planSweep(v string) sweepPlan {
	p := sweepPlan{redo: map[string]bool{v: true}}
	for _, it := range d.Items {
		if it.Inline || it.Err || it.Outcome == nil {
			continue
		}
		if !readsAny(it.Stmt.Deps(), p.redo) {
			continue
		}
		switch it.Stmt.Kind {
		case eval.Def:
			p.redo[it.Stmt.Name] = true
		case eval.Check:
			p.checks++
		}
		p.items = append(p.items, it)
	}
	return p
}
