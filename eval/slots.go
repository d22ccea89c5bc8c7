package eval

import (
	"sort"
	"sync/atomic"
)

// An engine keeps its names in slots: a table from name to slot number,
// shared by an engine and its forks, and one small slice of slots per
// engine. A fork copies the slice, not the names, so a sweep point costs one
// copy of a few hundred bytes instead of two fresh maps.

// nameTable numbers the names an engine and its forks have met. It only
// grows; an engine that adds a name to a shared table clones it first.
type nameTable struct {
	index  map[string]int
	shared atomic.Bool // a fork has it: add no name in place
}

// slot is what an engine knows of one name.
type slot struct {
	val     any
	def     *Stmt // the line that defines the name; nil when Set defined it
	has     bool  // val holds the name's value
	defined bool  // a line or Set defined the name
	failed  bool  // the name's line failed, or Fail marked it
}

// lookup returns the slot of a name, or nil when the engine has none.
func (e *Engine) lookup(name string) *slot {
	i, ok := e.names.index[name]
	if !ok || i >= len(e.slots) {
		return nil
	}
	return &e.slots[i]
}

// slotFor returns the slot of a name, adding one when the engine has none.
func (e *Engine) slotFor(name string) *slot {
	i, ok := e.names.index[name]
	if !ok {
		if e.names.shared.Load() {
			e.names = e.names.clone()
		}
		i = len(e.names.index)
		e.names.index[name] = i
	}
	for len(e.slots) <= i {
		e.slots = append(e.slots, slot{})
	}
	return &e.slots[i]
}

func (t *nameTable) clone() *nameTable {
	c := &nameTable{index: make(map[string]int, len(t.index)+8)}
	for n, i := range t.index {
		c.index[n] = i
	}
	return c
}

// Names returns the defined names, sorted.
func (e *Engine) Names() []string {
	var out []string
	for n, i := range e.names.index {
		if i < len(e.slots) && e.slots[i].has {
			out = append(out, n)
		}
	}
	sort.Strings(out)
	return out
}

// Value returns the value of a defined name.
func (e *Engine) Value(name string) (any, bool) {
	if s := e.lookup(name); s != nil && s.has {
		return s.val, true
	}
	return nil, false
}

// Fork returns an engine that starts with the values of e, except for the
// names in redo, which it leaves undefined so their lines can run again
// (a sweep re-evaluates only what depends on the varied input). Several
// goroutines may fork one engine at once, each running its own fork.
func (e *Engine) Fork(redo map[string]bool) *Engine {
	f := &Engine{Ctx: e.Ctx, Data: e.Data, YAML: e.YAML, names: e.names}
	f.args = make([]any, 0, 8)
	f.slots = e.forkSlots(make([]slot, len(e.slots)), redo)
	return f
}

// Refork makes f start again from the values of e, as e.Fork(redo) would,
// reusing f's memory, so that a sweep runs every point of one worker on
// one engine. f keeps its Data and YAML readers. The outcomes f returned
// before are overwritten: keep none of them across a Refork. e is only
// read, so several goroutines may refork their own engines from one e.
func (f *Engine) Refork(e *Engine, redo map[string]bool) {
	f.Ctx, f.names = e.Ctx, e.names
	if cap(f.slots) < len(e.slots) {
		f.slots = make([]slot, len(e.slots))
	}
	f.slots = e.forkSlots(f.slots[:len(e.slots)], redo)
	clear(f.args)
	f.args = f.args[:0]
	if cap(f.outs) < f.made {
		f.outs = make([]Outcome, 0, f.made) // one chunk holds a point's outcomes from now on
	}
	f.outs, f.made = f.outs[:0], 0
}

// forkSlots copies e's slots into dst as a fork starts with them: the
// values kept, the names in redo left undefined.
func (e *Engine) forkSlots(dst []slot, redo map[string]bool) []slot {
	if !e.names.shared.Load() {
		e.names.shared.Store(true) // whichever engine adds a name next clones the table
	}
	copy(dst, e.slots) // one bulk copy; then keep only what has a value
	for i := range dst {
		if s := &dst[i]; !s.has {
			*s = slot{}
		} else {
			s.defined, s.failed = true, false
		}
	}
	for n := range redo {
		if i, ok := e.names.index[n]; ok && i < len(dst) {
			dst[i] = slot{}
		}
	}
	return dst
}

// Set defines a name directly, as a sweep does for its varied input.
func (e *Engine) Set(name string, v any) {
	*e.slotFor(name) = slot{val: v, has: true, defined: true}
}

// unset forgets a name's value, as solve does after trying a value.
func (e *Engine) unset(name string) {
	if s := e.lookup(name); s != nil {
		s.val, s.has = nil, false
	}
}
