package svgplot

// Legend geometry, in px.
const (
	legendPad    = 6
	legendRow    = 16
	legendSample = 22
	legendGap    = 6
	legendInset  = 8
)

// drawLegend draws a legend when more than one series has a name, in the
// corner of the plot area that covers the fewest drawn vertices and
// markers, and returns the boxes the labels must avoid. Series that share
// a name and a style share one row.
func drawLegend(w *writer, series []Series, drawn []vec, marks []mark, l *layout) []rect {
	var named []Series
	seen := map[legendRowKey]bool{}
	for _, s := range series {
		if k := (legendRowKey{s.Name, s.Style}); s.Name != "" && !seen[k] {
			seen[k] = true
			named = append(named, s)
		}
	}
	if len(named) < 2 {
		return nil
	}
	avoid := append([]vec(nil), drawn...)
	for _, m := range marks {
		avoid = append(avoid, m.c)
	}
	r := legendBox(named, avoid, l.box)
	w.start("g", "class", "legend")
	w.empty("rect", "x", num(r.x0), "y", num(r.y0), "width", num(r.x1-r.x0), "height", num(r.y1-r.y0),
		"fill", colPaper, "fill-opacity", "0.9", "stroke", "#bdbdbd", "stroke-width", "1")
	for i, s := range named {
		y := r.y0 + legendPad + float64(float64(i)*legendRow) + legendRow/2 - 2
		drawSample(w, s, r.x0+legendPad, y)
		w.rich(legendText(s), "x", num(r.x0+legendPad+legendSample+legendGap), "y", num(y+0.35*fontTick), "fill", colInk)
	}
	w.end("g")
	return []rect{r}
}

// drawSample draws a short stretch of a style, starting at (x, y).
func drawSample(w *writer, s Series, x, y float64) {
	attrs := styleAttrs(s.Style)
	dot := []string{"cx", num(x + legendSample/2), "cy", num(y), "r", num(markerR)}
	if s.Style == Markers {
		w.empty("circle", append(attrs, dot...)...)
		return
	}
	attrs = append(attrs, "x1", num(x), "y1", num(y), "x2", num(x+legendSample), "y2", num(y))
	w.empty("line", attrs...)
	if s.Marked {
		w.empty("circle", append([]string{"fill", strokeOf(s.Style), "stroke", "none"}, dot...)...)
	}
}

// legendBox picks the corner of box, among top right, top left, bottom
// right and bottom left, whose legend covers the fewest of avoid.
func legendBox(named []Series, avoid []vec, box rect) rect {
	tw := 0.0
	for _, s := range named {
		tw = max(tw, legendText(s).width(fontTick))
	}
	wd := 2*legendPad + legendSample + legendGap + tw
	ht := 2*legendPad + float64(float64(len(named))*legendRow) - 4
	l, r := box.x0+legendInset, box.x1-legendInset-wd
	t, b := box.y0+legendInset, box.y1-legendInset-ht
	corners := [...]rect{
		{r, t, r + wd, t + ht}, {l, t, l + wd, t + ht},
		{r, b, r + wd, b + ht}, {l, b, l + wd, b + ht},
	}
	best, bestN := corners[0], -1
	for _, c := range corners {
		if n := countInside(avoid, c); bestN < 0 || n < bestN {
			best, bestN = c, n
		}
	}
	return best
}

// legendText is the text of a series' row: its Label, else its Name.
func legendText(s Series) Text { return orText(s.Label, s.Name) }

// countInside counts the vertices inside r.
func countInside(vs []vec, r rect) int {
	n := 0
	for _, v := range vs {
		if v.x >= r.x0 && v.x <= r.x1 && v.y >= r.y0 && v.y <= r.y1 {
			n++
		}
	}
	return n
}

// legendRowKey identifies a row of the legend.
type legendRowKey struct {
	name  string
	style Style
}
