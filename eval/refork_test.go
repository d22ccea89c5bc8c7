package eval

import (
	"reflect"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// TestReforkIsFork: an engine reforked point after point gives at every
// point the values and outcomes a fresh fork gives, though it reuses its
// memory, also after a point that failed, was skipped or added a name.
func TestReforkIsFork(t *testing.T) {
	e := NewEngine(units.StandardAtmosphere)
	lines := []*Stmt{mustLine(t, "a = 2", 1), mustLine(t, "b = sqrt(a) * 10", 2), mustLine(t, "c = b + 1", 3), mustLine(t, "check c > 20", 4)}
	for _, s := range lines {
		if _, err := e.Exec(s); err != nil {
			t.Fatal(msgOf(err))
		}
	}
	redo := map[string]bool{"a": true, "b": true, "c": true}
	extra := mustLine(t, "z = c * 2", 5) // a name the main pass never met
	run := func(f *Engine, a float64, withExtra bool) []Outcome {
		f.Set("a", units.Num(a))
		var outs []Outcome
		for _, s := range append(lines[1:], extra)[:3+btoi(withExtra)] {
			out, err := f.Exec(s)
			if err != nil {
				outs = append(outs, Outcome{Stmt: s, Value: msgOf(err)})
				continue
			}
			outs = append(outs, *out)
		}
		return outs
	}
	var r *Engine
	for i, a := range []float64{9, 1, -4, 16, 0.25, 4} {
		withExtra := i%2 == 0
		want := run(e.Fork(redo), a, withExtra)
		if r == nil {
			r = e.Fork(redo)
		} else {
			r.Refork(e, redo)
		}
		if got := run(r, a, withExtra); !reflect.DeepEqual(got, want) {
			t.Errorf("a = %g: reforked %+v\nforked %+v", a, got, want)
		}
	}
	if got := valueV(t, e, "c"); got != 10*1.4142135623730951+1 {
		t.Errorf("the parent changed: c = %g", got)
	}
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}
