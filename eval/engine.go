package eval

import (
	"errors"
	"fmt"

	"github.com/vouchcalc/vouch/units"
)

// Error is an evaluation or parse error at a byte offset of the calc file.
type Error struct {
	Off int
	Msg string
}

// Error returns the message; the caller adds the position.
func (e *Error) Error() string { return e.Msg }

func sprintf(format string, args ...any) string { return fmt.Sprintf(format, args...) }

func errorf(format string, args ...any) error { return errors.New(sprintf(format, args...)) }

// Outcome is the evaluated result of one statement.
type Outcome struct {
	Stmt    *Stmt
	Value   any              // units.Quantity, bool, string or Record
	Display units.Unit       // the unit the value is shown in (quantities)
	Pass    bool             // a check's result
	Skipped bool             // not evaluated because a name it reads failed
	Sources []string         // formulations of the property calls the line makes (shared: read only)
	Uses    []string         // property functions the line calls, and "fluid:NAME" for each fluid named
	Solve   *Solution        // how solve found the value, for NAME = solve(...)
	Interps []*Interpolation // the rows each interp call of the line used, in order
	// Written is the value as a data file writes it, for a line that is
	// one value of a YAML file (NAME = data.key) without a display unit.
	Written string
	// WrittenIn is where: the file and line ("data/x.yaml line 4").
	WrittenIn string
}

// Engine evaluates statements in file order and holds the defined names.
type Engine struct {
	Ctx  units.Context
	Data DataReader   // reads csv() files; nil: data files are refused
	YAML ValuesReader // reads yaml() files; nil: data files are refused
	// Ahead, when set, gives the line of every name's definition in the
	// whole file, so that a name used above its definition is reported as
	// defined later rather than undefined.
	Ahead map[string]int
	names *nameTable // name → slot number (slots.go)
	slots []slot
	args  []any     // the argument stack of function calls (resolve.go)
	outs  []Outcome // room for the next outcomes (newOutcome)
	made  int       // outcomes made since the last Refork
}

// NewEngine returns an engine with nothing defined.
func NewEngine(ctx units.Context) *Engine {
	return &Engine{Ctx: ctx, names: &nameTable{index: map[string]int{}}}
}

// Exec evaluates a statement. A definition that fails leaves its name
// marked failed, so lines that read it are skipped without a second error.
// An error is an *Error, with the offset of the node that caused it.
func (e *Engine) Exec(s *Stmt) (*Outcome, error) {
	if s.Kind == Corr {
		return e.execCorr(s)
	}
	r := e.resolve(s)
	if s.Kind == Def {
		sl := e.defSlot(s)
		if sl.defined {
			sl.failed = true
			return nil, &Error{Off: s.NameOff, Msg: sprintf("%s is already defined on line %d; a name is defined once", s.Name, sl.def.line())}
		}
		sl.def, sl.defined = s, true
	}
	out := e.newOutcome(s)
	for i := range s.deps {
		if d := e.depSlot(r, s, i); d != nil && d.failed {
			out.Skipped = true
			e.markFailed(s)
			return out, nil
		}
	}
	sc := &scope{e: e, s: s, res: r}
	v, err := sc.eval(s.tree)
	if err != nil {
		e.markFailed(s)
		return nil, err
	}
	out.Sources, out.Solve, out.Interps, out.Uses = sc.sources, sc.solution, sc.interps, sc.uses
	out.Written, out.WrittenIn = "", sc.wfrom
	if !s.hasUnit {
		out.Written = sc.wtext
	}
	if err := e.finish(out, v, sc.written); err != nil {
		e.markFailed(s)
		return nil, err
	}
	return out, nil
}

// Fail marks a name whose line has an error, so that lines reading it are
// skipped rather than reported again.
func (e *Engine) Fail(name string) {
	if name != "" {
		e.slotFor(name).failed = true
	}
}

func (e *Engine) markFailed(s *Stmt) {
	if s.Kind == Def {
		e.defSlot(s).failed = true
	}
}

// finish checks the value against the statement kind and display unit.
func (e *Engine) finish(out *Outcome, v any, written *units.Unit) *Error {
	s := out.Stmt
	out.Value = v
	if s.Kind == Check {
		b, ok := v.(bool)
		if !ok {
			return &Error{Off: s.ExprOff, Msg: sprintf("a check must be true or false, but this is %s", kindOf(v))}
		}
		out.Pass = b
		return nil
	}
	q, isQ := v.(units.Quantity)
	if s.hasUnit && !isQ {
		return &Error{Off: s.UnitOff, Msg: sprintf("%s is %s, which cannot be shown in %s", s.label(), kindOf(v), s.Unit)}
	}
	if isQ {
		out.Display = e.displayUnit(s, q)
		if written != nil && !s.hasUnit {
			out.Display = *written
		}
		if _, err := q.In(out.Display, e.Ctx); err != nil {
			off := s.ExprOff
			if s.hasUnit {
				off = s.UnitOff
			}
			return &Error{Off: off, Msg: sprintf("%s: %s", s.label(), err.Error())}
		}
	}
	if s.Kind == Def {
		sl := e.defSlot(s)
		sl.val, sl.has = v, true
	}
	return nil
}

// displayUnit picks the [UNIT], else the unit of a lone literal, else a
// sensible SI unit. (A line that is one value of a data file, NAME =
// data.key, shows it in the unit the file writes: see finish.)
func (e *Engine) displayUnit(s *Stmt, q units.Quantity) units.Unit {
	if s.hasUnit {
		return s.display
	}
	if l := s.LoneLiteral(); l != nil {
		return l.Unit
	}
	return units.DefaultUnit(q)
}

// label names a statement in messages: its name, or its expression.
func (s *Stmt) label() string {
	if s.Kind == Def {
		return s.Name
	}
	return s.Expr
}

// line is the line of a definition; 0 for a name Set defined.
func (s *Stmt) line() int {
	if s == nil {
		return 0
	}
	return s.Line
}
