package calcdoc

import (
	"os"
	"path/filepath"
	"testing"
)

// TestExamplesSolveQuickly: every solve in the examples converges in under
// 30 evaluations of its equation.
func TestExamplesSolveQuickly(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join("..", "examples", "*.calc.md"))
	solves := 0
	for _, f := range files {
		src, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		d := Read(f, src)
		d.Evaluate()
		if len(d.Errors) > 0 {
			t.Fatalf("%s: %s", f, d.Errors.Format(f, src))
		}
		for _, it := range d.Items {
			if it.Outcome == nil || it.Outcome.Solve == nil {
				continue
			}
			solves++
			n := it.Outcome.Solve.Iterations
			if n >= 30 {
				t.Errorf("%s:%d: solve took %d evaluations", f, it.Stmt.Line, n)
			}
			t.Logf("%s:%d: %d evaluations", filepath.Base(f), it.Stmt.Line, n)
		}
	}
	if solves == 0 {
		t.Error("no example uses solve")
	}
	t.Logf("%d solves", solves)
}
