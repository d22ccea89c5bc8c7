package calcdoc

import (
	gast "github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
)

// fences are the nodes of the Markdown tree that vouch reads, in document
// order: found once, by the transformer below while goldmark parses, and
// shared by the reader (collect), the renderer (replaceCalcNodes) and the
// prose of the diff (calcFenceLines). Nothing matches two walks by index.
type fences struct {
	calcs, sweeps, diagrams, assumptions, states []*gast.FencedCodeBlock
	budgets                                      []*gast.FencedCodeBlock
	others                                       []*gast.FencedCodeBlock // every other fenced block
	comments                                     []*gast.HTMLBlock       // HTML comments (<!-- -->)
	spans                                        []*gast.CodeSpan
	images                                       []*gast.Image
}

// fenceFinder is the goldmark AST transformer that fills a Doc's fences.
type fenceFinder struct{ f *fences }

// Transform records the calc, sweep and diagram fences, the code spans and
// the images of the parsed document.
func (t fenceFinder) Transform(doc *gast.Document, reader text.Reader, _ parser.Context) {
	src := reader.Source()
	gast.Walk(doc, func(n gast.Node, entering bool) (gast.WalkStatus, error) {
		if !entering {
			return gast.WalkContinue, nil
		}
		switch v := n.(type) {
		case *gast.FencedCodeBlock:
			switch string(v.Language(src)) {
			case "calc":
				t.f.calcs = append(t.f.calcs, v)
			case "sweep":
				t.f.sweeps = append(t.f.sweeps, v)
			case "diagram":
				t.f.diagrams = append(t.f.diagrams, v)
			case "budget":
				t.f.budgets = append(t.f.budgets, v)
			case "assumptions":
				t.f.assumptions = append(t.f.assumptions, v)
			case "states":
				t.f.states = append(t.f.states, v)
			default:
				t.f.others = append(t.f.others, v)
			}
		case *gast.HTMLBlock:
			if v.HTMLBlockType == gast.HTMLBlockType2 {
				t.f.comments = append(t.f.comments, v)
			}
		case *gast.CodeSpan:
			t.f.spans = append(t.f.spans, v)
		case *gast.Image:
			t.f.images = append(t.f.images, v)
		}
		return gast.WalkContinue, nil
	})
}
