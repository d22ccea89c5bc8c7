package register

import (
	"path/filepath"
	"strings"
	"testing"
)

// TestRegisterOpenAssumptions: the register counts each calc's open
// assumptions and shows the count in the index.
func TestRegisterOpenAssumptions(t *testing.T) {
	r := newTree(t)
	r.Write("calcs/a.calc.md", genCalc(1, "")+"\n```assumptions\nA1 open: suction is flooded\nA2 open: no recirculation\nA3 confirmed: feedwater is clean | WQ-1 (fictional)\n```\n")
	r.Write("calcs/b.calc.md", genCalc(2, ""))
	r.Commit("two calcs")
	out := t.TempDir()
	sum := registerTree(t, r.Dir, out, nil)
	open := map[string]int{}
	for _, e := range sum.Entries {
		open[e.Path] = e.Open
	}
	if open["calcs/a.calc.md"] != 2 || open["calcs/b.calc.md"] != 0 {
		t.Errorf("open assumptions %v, want a: 2, b: 0", open)
	}
	index := string(readFile(t, filepath.Join(out, "index.html")))
	if !strings.Contains(index, "<th>Open assumptions</th>") || !strings.Contains(index, `<td class="num fail">2</td>`) {
		t.Error("the index does not show the open assumptions")
	}
	again := registerTree(t, r.Dir, out, nil) // from the cache
	for _, e := range again.Entries {
		if e.Path == "calcs/a.calc.md" && e.Open != 2 {
			t.Errorf("cached entry: %d open assumptions, want 2", e.Open)
		}
	}
}
