package register

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// exampleTree builds a repository of n calcs copied from the examples
// (fictional plants), spread over ten folders, each with the examples'
// data files, every calc with its own number.
func exampleTree(b *testing.B, n int) *tree {
	b.Helper()
	files, err := filepath.Glob(filepath.Join("..", "..", "examples", "*.calc.md"))
	if err != nil || len(files) == 0 {
		b.Fatalf("no examples: %v", err)
	}
	data, _ := filepath.Glob(filepath.Join("..", "..", "examples", "data", "*"))
	r := newTree(b)
	for a := 0; a < 10; a++ {
		for _, d := range data {
			src, _ := os.ReadFile(d)
			r.Write(fmt.Sprintf("area-%d/data/%s", a, filepath.Base(d)), string(src))
		}
	}
	for i := 0; i < n; i++ {
		src, err := os.ReadFile(files[i%len(files)])
		if err != nil {
			b.Fatal(err)
		}
		s := strings.Replace(string(src), "\nnumber: ", fmt.Sprintf("\nnumber: X%03d-", i), 1)
		r.Write(fmt.Sprintf("area-%d/calc-%03d.calc.md", i%10, i), s)
	}
	r.Commit("Calcs copied from the examples")
	return r
}

// BenchmarkRegister200 registers 200 calcs: "first" into an empty output
// folder (every calc rendered), "unchanged" again with nothing changed.
// Compare cores with -cpu:
//
//	go test -run '^$' -bench Register200 -benchtime 3x -cpu 1,2 ./calcdoc/register/
func BenchmarkRegister200(b *testing.B) {
	r := exampleTree(b, 200)
	b.Run("first", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			out := b.TempDir()
			if sum := registerTree(b, r.Dir, out, nil); sum.Rendered != 200 {
				b.Fatalf("rendered %d", sum.Rendered)
			}
		}
	})
	out := b.TempDir()
	registerTree(b, r.Dir, out, nil)
	b.Run("unchanged", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			if sum := registerTree(b, r.Dir, out, nil); sum.Rendered != 0 {
				b.Fatalf("rendered %d", sum.Rendered)
			}
		}
	})
}
