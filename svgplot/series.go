package svgplot

import "github.com/vouchcalc/vouch/internal/fpmath"

// markerR is the radius of a dot of a Markers series, in px.
const markerR = 2.4

// layers is the drawing order of the styles: the dome underneath, the
// cycle path on top.
var layers = [...]Style{Dome, Line, Dashed, Markers, Branch, Process}

// styleAttrs returns the presentation attributes of a style's group.
func styleAttrs(s Style) []string {
	switch s {
	case Dashed:
		return []string{"fill", "none", "stroke", colDashed, "stroke-width", "1.1", "stroke-dasharray", "5 3"}
	case Dome:
		return []string{"fill", "none", "stroke", colDome, "stroke-width", "2.4"}
	case Process:
		return []string{"fill", "none", "stroke", colAccent, "stroke-width", "2"}
	case Branch:
		return []string{"fill", "none", "stroke", colAccent, "stroke-width", "1.4", "stroke-dasharray", "6 3"}
	case Markers:
		return []string{"fill", colInk, "stroke", "none"}
	}
	return []string{"fill", "none", "stroke", colInk, "stroke-width", "1.3"}
}

// strokeOf returns the line colour of a style.
func strokeOf(s Style) string {
	a := styleAttrs(s)
	for i := 0; i+1 < len(a); i += 2 {
		if a[i] == "stroke" && a[i+1] != "none" {
			return a[i+1]
		}
	}
	return colInk
}

// drawSeries draws every series, layer by layer, and returns the px
// vertices it drew, for the legend and the labels to avoid.
func drawSeries(w *writer, series []Series, l *layout) []vec {
	var drawn []vec
	for _, st := range layers {
		for _, s := range series {
			if s.Style == st {
				drawn = drawOne(w, s, l, drawn)
			}
		}
	}
	return drawn
}

// drawOne draws one series as a group and appends its px vertices to drawn.
func drawOne(w *writer, s Series, l *layout, drawn []vec) []vec {
	attrs := append([]string{"class", "series " + s.Style.String()}, styleAttrs(s.Style)...)
	if s.Style != Markers {
		attrs = append(attrs, "stroke-linejoin", "round", "stroke-linecap", "round")
	}
	w.start("g", attrs...)
	w.title(s.Name)
	pts := seriesData(s)
	b := l.bounds()
	if s.Style == Markers {
		drawn = drawDots(w, pts, b, l, drawn)
	} else {
		for _, piece := range clipPolyline(pts, b) {
			px := l.toPx(piece)
			w.empty("polyline", "points", points(px))
			drawn = densify(px, drawn)
		}
		if s.Marked {
			w.start("g", "class", "series marks", "fill", strokeOf(s.Style), "stroke", "none")
			drawn = drawDots(w, pts, b, l, drawn)
			w.end("g")
		}
	}
	w.end("g")
	return drawn
}

// drawDots draws a dot at each pair inside the axis ranges.
func drawDots(w *writer, pts []vec, b bounds, l *layout, drawn []vec) []vec {
	for _, v := range pts {
		if !b.has(v) {
			continue
		}
		c := l.vecPx(v)
		w.empty("circle", "cx", num(c.x), "cy", num(c.y), "r", num(markerR))
		drawn = append(drawn, c)
	}
	return drawn
}

// seriesData pairs up the coordinates of a series.
func seriesData(s Series) []vec {
	n := min(len(s.X), len(s.Y))
	out := make([]vec, n)
	for i := range n {
		out[i] = vec{s.X[i], s.Y[i]}
	}
	return out
}

// bounds returns the axis ranges as a clipping box in data space.
func (l *layout) bounds() bounds {
	return bounds{l.x.lo, l.x.hi, l.y.lo, l.y.hi}
}

// vecPx maps a data point to px.
func (l *layout) vecPx(v vec) vec {
	return vec{l.x.px(v.x), l.y.px(v.y)}
}

// toPx maps data points to px.
func (l *layout) toPx(vs []vec) []vec {
	out := make([]vec, len(vs))
	for i, v := range vs {
		out[i] = l.vecPx(v)
	}
	return out
}

// densifyStep is the spacing, in px, of the samples densify adds;
// maxSamples bounds the samples added to one segment.
const (
	densifyStep = 8
	maxSamples  = 500
)

// densify appends the vertices of a px polyline to drawn, with extra
// samples along long segments so that boxes crossed by a segment notice it.
func densify(px, drawn []vec) []vec {
	for i, v := range px {
		if i > 0 {
			a := px[i-1]
			n := int(min(float64(fpmath.Hypot(v.x-a.x, v.y-a.y)/densifyStep), maxSamples))
			for k := 1; k <= n; k++ {
				t := float64(k) / float64(n+1)
				drawn = append(drawn, vec{a.x + float64(t*(v.x-a.x)), a.y + float64(t*(v.y-a.y))})
			}
		}
		drawn = append(drawn, v)
	}
	return drawn
}
