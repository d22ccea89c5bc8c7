package svgplot

import "testing"

// BenchmarkTS renders a T-s diagram with a 200-point dome and 8 states.
func BenchmarkTS(b *testing.B) {
	p := tsPlot(200)
	for i := 4; i < 8; i++ {
		q := p.Points[i-4]
		p.Points = append(p.Points, Point{Label: q.Label + "'", X: q.X + 0.3, Y: q.Y + 20, Title: q.Title})
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := p.SVG(); err != nil {
			b.Fatal(err)
		}
	}
}
