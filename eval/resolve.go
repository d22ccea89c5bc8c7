package eval

import (
	"sync"

	"github.com/expr-lang/expr/ast"
)

// A statement's names are resolved to slot numbers once per name table and
// kept with the statement, so that running it again — at every point of a
// sweep — looks no name up by its text. Forks share their parent's table
// until one of them adds a name (it then clones the table, and a clone is a
// new table), so within one table a name's number never changes.

// resolution is a statement's slot numbers in one name table.
type resolution struct {
	table *nameTable
	name  int   // the defined name's slot; -1 for a check or inline value
	deps  []int // the slots of Stmt.deps; -1 for a name the table lacked
}

// resolve returns the statement's slot numbers in the engine's table,
// computing them on first use. The stored pointer is atomic, so engines
// running the same statements on several goroutines may share it.
func (e *Engine) resolve(s *Stmt) *resolution {
	if r := s.res.Load(); r != nil && r.table == e.names {
		return r
	}
	r := &resolution{table: e.names, name: -1, deps: make([]int, len(s.deps))}
	if s.Kind == Def {
		e.slotFor(s.Name)
		r.table = e.names // slotFor may have cloned a shared table
		r.name = r.table.index[s.Name]
	}
	for i, d := range s.deps {
		if k, ok := r.table.index[d]; ok {
			r.deps[i] = k
		} else {
			r.deps[i] = -1
		}
	}
	s.res.Store(r)
	return r
}

// at returns the slot of number k, or nil when this engine has none.
func (e *Engine) at(k int) *slot {
	if k < 0 || k >= len(e.slots) {
		return nil
	}
	return &e.slots[k]
}

// depSlot returns the slot of the statement's i-th dependency.
func (e *Engine) depSlot(r *resolution, s *Stmt, i int) *slot {
	if r.deps[i] < 0 {
		return e.lookup(s.deps[i]) // added to the table after the resolution
	}
	return e.at(r.deps[i])
}

// valueOf returns the value of a name the statement reads: through its
// resolution when the name is one of its dependencies (or the name it
// defines, as solve reads it), else by the name's text.
func (c *scope) valueOf(name string) (any, bool) {
	if c.res == nil {
		return c.e.Value(name)
	}
	var sl *slot
	switch {
	case name == c.s.Name && c.res.name >= 0:
		sl = c.e.at(c.res.name)
	default:
		i := indexOf(c.s.deps, name)
		if i < 0 {
			return c.e.Value(name)
		}
		sl = c.e.depSlot(c.res, c.s, i)
	}
	if sl == nil || !sl.has {
		return nil, false
	}
	return sl.val, true
}

// indexOf returns the position of name in list, or -1. The lists are a
// line's few names, so a scan beats a map.
func indexOf(list []string, name string) int {
	for i, n := range list {
		if n == name {
			return i
		}
	}
	return -1
}

// defSlot returns the slot of the name a definition defines.
func (e *Engine) defSlot(s *Stmt) *slot {
	if r := s.res.Load(); r != nil && r.table == e.names {
		if sl := e.at(r.name); sl != nil {
			return sl
		}
	}
	return e.slotFor(s.Name)
}

// pushArgs evaluates a call's arguments onto the engine's argument stack
// and returns them with the stack's height before them, for popArgs: a
// property call then allocates no slice. A call inside an argument pushes
// above and pops before the next argument, so the stack stays in order.
func (c *scope) pushArgs(nodes []ast.Node) ([]any, int, *Error) {
	e := c.e
	base := len(e.args)
	for _, a := range nodes {
		x, err := c.eval(a)
		if err != nil {
			e.popArgs(base)
			return nil, 0, err
		}
		e.args = append(e.args, x)
	}
	return e.args[base:len(e.args):len(e.args)], base, nil
}

// popArgs drops the arguments above base, clearing them for the collector.
func (e *Engine) popArgs(base int) {
	clear(e.args[base:])
	e.args = e.args[:base]
}

// sourceLists holds a one-element list per formulation name (string →
// []string), shared by every outcome whose line calls one formulation;
// formulation names are a handful of constants.
var sourceLists sync.Map

// oneSource returns the shared list holding only src.
func oneSource(src string) []string {
	if l, ok := sourceLists.Load(src); ok {
		return l.([]string)
	}
	l, _ := sourceLists.LoadOrStore(src, []string{src})
	return l.([]string)
}

// newOutcome returns a fresh outcome for s, cut from a chunk of sixteen: a
// sweep point's lines then share one allocation. An outcome handed out is
// never reused, except by Refork; it keeps its chunk alive.
func (e *Engine) newOutcome(s *Stmt) *Outcome {
	if len(e.outs) == cap(e.outs) {
		e.outs = make([]Outcome, 0, 16)
	}
	e.outs = e.outs[:len(e.outs)+1]
	e.made++
	out := &e.outs[len(e.outs)-1]
	*out = Outcome{Stmt: s} // a chunk Refork reuses holds old outcomes
	return out
}
