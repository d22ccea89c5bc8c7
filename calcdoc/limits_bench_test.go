package calcdoc

import (
	"fmt"
	"strings"
	"testing"
)

// benchContents generate calc files of about n bytes: typical content
// (headings, prose, a table, calc blocks with checks) and the shapes that
// cost Markdown the most, each at the deepest nesting MaxNesting allows.
var benchContents = map[string]func(n int) string{
	"typical": func(n int) string {
		var b strings.Builder
		for i := 0; b.Len() < n; i++ {
			fmt.Fprintf(&b, "## Stage %d\n\nThe *feed* flow of stage %d is found from the **duty** and the [heat balance](#x).\n\n", i, i)
			fmt.Fprintf(&b, "| item | value |\n|---|---|\n| stage | %d |\n\n", i)
			fmt.Fprintf(&b, "```calc\nQ_%d = %d kW // duty\nm_%d = Q_%d / (42 kJ/kg) // flow\ncheck m_%d < 100 kg/s\n```\n\nThe flow is `=m_%d`.\n\n", i, i+1, i, i, i, i)
		}
		return b.String()
	},
	"quotes": func(n int) string {
		return repeatTo(strings.Repeat("> ", MaxNesting)+"x\n", n)
	},
	"lists": func(n int) string {
		return repeatTo(strings.Repeat("- ", MaxNesting)+"x\n", n)
	},
	"brackets": func(n int) string {
		para := strings.Repeat(strings.Repeat("[", MaxNesting)+strings.Repeat("]", MaxNesting)+"\n", MaxBrackets/MaxNesting)
		return repeatTo(para+"\n", n)
	},
	"emphasis": func(n int) string { return repeatTo("*a _b ", n) + "\n" },
	"trivial":  func(n int) string { return repeatTo("x\n", n) },
}

func repeatTo(s string, n int) string { return strings.Repeat(s, max(n/len(s), 1)) }

// BenchmarkReadRender measures reading, evaluating and rendering per KB of
// input for 10 KB, 100 KB and 1 MB files of each content: the cost per KB
// should not grow with the size (issue 11 item 8).
func BenchmarkReadRender(b *testing.B) {
	for _, name := range []string{"typical", "quotes", "lists", "brackets", "emphasis", "trivial"} {
		for _, size := range []int{10_000, 100_000, 1_000_000} {
			src := []byte(benchContents[name](size))
			b.Run(fmt.Sprintf("%s/%dKB", name, size/1000), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					d := Read("x.calc.md", src)
					d.Evaluate()
					if len(d.Errors) > 0 {
						b.Fatal(d.Errors[0])
					}
					if _, err := d.Render(RenderOptions{}); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(src)/1000), "ns/KB")
			})
		}
	}
}
