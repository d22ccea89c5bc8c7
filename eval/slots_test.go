package eval

import (
	"errors"
	"reflect"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

func mustLine(t *testing.T, line string, n int) *Stmt {
	t.Helper()
	s, errs := ParseLine(line, 0, n, units.StandardAtmosphere)
	if errs != nil {
		t.Fatalf("%s: %s", line, errs[0].Msg)
	}
	return s
}

func valueV(t *testing.T, e *Engine, name string) float64 {
	t.Helper()
	v, ok := e.Value(name)
	if !ok {
		t.Fatalf("%s is not defined", name)
	}
	return v.(units.Quantity).V
}

// TestForkKeepsAndRedoes: a fork keeps the values outside redo, leaves the
// names in redo free to be defined again, and neither engine sees a name the
// other adds after the fork, though both run the same statements.
func TestForkKeepsAndRedoes(t *testing.T) {
	e := NewEngine(units.StandardAtmosphere)
	a, b := mustLine(t, "a = 2", 1), mustLine(t, "b = a * 10", 2)
	for _, s := range []*Stmt{a, b} {
		if _, err := e.Exec(s); err != nil {
			t.Fatal(msgOf(err))
		}
	}
	f := e.Fork(map[string]bool{"a": true, "b": true})
	if _, ok := f.Value("b"); ok {
		t.Fatal("b is defined in the fork before its line runs again")
	}
	f.Set("a", units.Num(3))
	if _, err := f.Exec(b); err != nil {
		t.Fatal(msgOf(err))
	}
	if got := valueV(t, f, "b"); got != 30 {
		t.Errorf("fork: b = %g, want 30", got)
	}
	if got := valueV(t, e, "b"); got != 20 {
		t.Errorf("parent after the fork: b = %g, want 20", got)
	}
	// Each side adds a different name after the fork: the table is cloned,
	// so the same slot number cannot name c in one and d in the other.
	c, d := mustLine(t, "c = b + 1", 3), mustLine(t, "d = b + 2", 4)
	if _, err := f.Exec(c); err != nil {
		t.Fatal(msgOf(err))
	}
	if _, err := e.Exec(d); err != nil {
		t.Fatal(msgOf(err))
	}
	if _, ok := e.Value("c"); ok {
		t.Error("the parent sees c, defined in the fork")
	}
	if _, ok := f.Value("d"); ok {
		t.Error("the fork sees d, defined in the parent")
	}
	if got, want := f.Names(), []string{"a", "b", "c"}; !reflect.DeepEqual(got, want) {
		t.Errorf("fork names %v, want %v", got, want)
	}
	if got, want := e.Names(), []string{"a", "b", "d"}; !reflect.DeepEqual(got, want) {
		t.Errorf("parent names %v, want %v", got, want)
	}
}

// TestForkTwice: a name defined once per engine; a second definition in
// the same engine is an error naming the first line, also for a fork.
func TestForkTwice(t *testing.T) {
	e := NewEngine(units.StandardAtmosphere)
	a := mustLine(t, "a = 2", 1)
	if _, err := e.Exec(a); err != nil {
		t.Fatal(msgOf(err))
	}
	f := e.Fork(map[string]bool{})
	_, err := f.Exec(mustLine(t, "a = 3", 7))
	if err == nil || msgOf(err) != "a is already defined on line 1; a name is defined once" {
		t.Errorf("second definition in a fork: %v", err)
	}
	// The second definition marks a failed in the parent, which keeps its
	// value; a fork takes the value, not the mark.
	if _, err := e.Exec(mustLine(t, "a = 4", 8)); err == nil {
		t.Fatal("second definition in the parent: no error")
	}
	c := mustLine(t, "c = a + 1", 9)
	if out, _ := e.Exec(c); out == nil || !out.Skipped {
		t.Errorf("parent: c = a + 1 not skipped after a failed: %+v", out)
	}
	g := e.Fork(map[string]bool{})
	if out, err := g.Exec(c); err != nil || out.Skipped || valueV(t, g, "c") != 3 {
		t.Errorf("fork: c = a + 1 gave %+v %v", out, err)
	}
}

// TestLaterNameResolved: a statement resolved while a name it reads was
// missing from the table finds the name once it is added to the same table.
func TestLaterNameResolved(t *testing.T) {
	e := NewEngine(units.StandardAtmosphere)
	c := mustLine(t, "c = a * 2", 1)
	if _, err := e.Exec(c); err == nil {
		t.Fatal("c ran before a was defined")
	}
	e.Set("a", units.Num(4))
	f := e.Fork(map[string]bool{"c": true})
	if _, err := f.Exec(c); err != nil {
		t.Fatal(msgOf(err))
	}
	if got := valueV(t, f, "c"); got != 8 {
		t.Errorf("c = %g, want 8", got)
	}
}

// TestPlaceholderNames: every placeholder name finds its literal, and names
// that only look alike do not.
func TestPlaceholderNames(t *testing.T) {
	lits := make([]*Literal, 40)
	for i := range lits {
		lits[i] = &Literal{Off: i}
	}
	for n := range lits {
		if l, ok := litOf(lits, placeholder(n)); !ok || l.Off != n {
			t.Errorf("%s: literal %v %v, want number %d", placeholder(n), l, ok, n)
		}
	}
	for _, name := range []string{"_", "_00", "_01", "_A", "_14", "x0", "_-1", "_z0"} {
		if l, ok := litOf(lits, name); ok {
			t.Errorf("%s names literal %d", name, l.Off)
		}
	}
}

// TestForksInParallel: forks of one engine run the same statements on
// several goroutines (run with -race) and each gets its own result.
func TestForksInParallel(t *testing.T) {
	e := NewEngine(units.StandardAtmosphere)
	a, b := mustLine(t, "a = 2 MPa", 1), mustLine(t, "b [kPa] = a * 2 + water(a, 500 K).p", 2)
	for _, s := range []*Stmt{a, b} {
		if _, err := e.Exec(s); err != nil {
			t.Fatal(msgOf(err))
		}
	}
	redo := map[string]bool{"a": true, "b": true}
	c := mustLine(t, "c = b + 1 Pa", 3) // a new name: each fork clones the table
	got := make([]float64, 8)
	done := make(chan bool)
	for g := range got {
		go func() {
			defer func() { done <- true }()
			for i := 0; i < 50; i++ {
				f := e.Fork(redo)
				f.Set("a", units.Quantity{V: float64(g+1) * 1e6, D: units.DimPressure})
				if _, err := f.Exec(b); err != nil {
					t.Error(msgOf(err))
					return
				}
				if _, err := f.Exec(c); err != nil {
					t.Error(msgOf(err))
					return
				}
				v, _ := f.Value("c")
				got[g] = v.(units.Quantity).V
			}
		}()
	}
	for range got {
		<-done
	}
	for g, v := range got {
		if want := 3*float64(g+1)*1e6 + 1; v != want {
			t.Errorf("goroutine %d: c = %g, want %g", g, v, want)
		}
	}
}

// TestDepsManyNames: a line reading more names than the scan handles keeps
// them in order of first use, once each, without the name it defines.
func TestDepsManyNames(t *testing.T) {
	line, want := "x = x", []string(nil)
	for i := 0; i < 20; i++ {
		n := sprintf("n_%d", i)
		line += " + " + n + " * 2 m + " + n
		want = append(want, n)
	}
	s := mustLine(t, line+" + pi * n_3 + x", 1)
	if got := s.Deps(); !reflect.DeepEqual(got, want) {
		t.Errorf("deps %v, want %v", got, want)
	}
}

// msgOf is the message of an engine error, without its position.
func msgOf(err error) string {
	var e *Error
	if errors.As(err, &e) {
		return e.Msg
	}
	return err.Error()
}
