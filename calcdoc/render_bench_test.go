package calcdoc

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// BenchmarkRenderExamples reads, evaluates and renders each example
// (sub-benchmark NAME/render) beside goldmark alone on the same Markdown
// (NAME/goldmark), the yardstick: issue 16 asks for no example above 8×.
func BenchmarkRenderExamples(b *testing.B) {
	files, _ := filepath.Glob(filepath.Join("..", "examples", "*.calc.md"))
	if len(files) < 8 {
		b.Fatalf("found %d examples, want at least 8", len(files))
	}
	for _, f := range files {
		src, err := os.ReadFile(f)
		if err != nil {
			b.Fatal(err)
		}
		name := strings.TrimSuffix(filepath.Base(f), ".calc.md")
		b.Run(name+"/render", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				renderExample(b, f, src)
			}
		})
		b.Run(name+"/goldmark", func(b *testing.B) {
			for b.Loop() {
				var out bytes.Buffer
				if err := newMarkdown(&fences{}).Convert(src, &out); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// renderExample reads, evaluates and renders an example where it lies, so
// its data files are found.
func renderExample(b *testing.B, path string, src []byte) {
	d := Read(path, src)
	d.Evaluate()
	if len(d.Errors) > 0 {
		b.Fatalf("errors:\n%s", d.Errors.Format(path, d.Src))
	}
	if _, err := d.Render(RenderOptions{Engine: "test"}); err != nil {
		b.Fatal(err)
	}
}
