package svgplot

// The palette: black and greys that print well, and one accent colour for
// the cycle path and its states.
const (
	colInk    = "#1a1a1a"
	colAxis   = "#4d4d4d"
	colGrid   = "#e2e2e2"
	colDome   = "#8f8f8f"
	colDashed = "#5e5e5e"
	colAccent = "#b4441c"
	colPaper  = "#ffffff"
)

// tickLen is the length of the tick marks outside the frame, in px.
const tickLen = 4

// render writes the whole <svg> element.
func render(p *Plot, l *layout) []byte {
	var w writer
	w.start("svg",
		"xmlns", "http://www.w3.org/2000/svg",
		"class", "svgplot",
		"viewBox", "0 0 "+num(l.w)+" "+num(l.h),
		"width", num(l.w), "height", num(l.h),
		"role", "img", "aria-label", p.accessibleName(),
		"font-family", "sans-serif", "font-size", num(fontTick),
		"style", "max-width:100%;height:auto")
	w.title(plainOf(p.Title, p.TitleText))
	drawGrid(&w, l)
	drawn := drawSeries(&w, p.Series, l)
	drawFrame(&w, l)
	drawTicks(&w, l)
	drawAxisLabels(&w, p, l)
	marks := drawPoints(&w, p.Points, l)
	taken := drawLegend(&w, p.Series, drawn, marks, l)
	pl := drawLabels(&w, p.Points, marks, drawn, taken, l)
	drawPathLabels(&w, p.PathLabels, pl, l)
	w.end("svg")
	return w.b.Bytes()
}

// accessibleName names the plot for screen readers.
func (p *Plot) accessibleName() string {
	t, x, y := plainOf(p.Title, p.TitleText), plainOf(p.XLabel, p.XText), plainOf(p.YLabel, p.YText)
	switch {
	case t != "":
		return t
	case x != "" || y != "":
		return "plot of " + y + " against " + x
	}
	return "plot"
}

// plainOf returns s, or the plain form of t when s is empty.
func plainOf(s string, t Text) string {
	if s != "" {
		return s
	}
	return t.String()
}

// drawGrid draws light lines at every tick inside the plot area.
func drawGrid(w *writer, l *layout) {
	w.start("g", "class", "grid", "stroke", colGrid, "stroke-width", "1", "shape-rendering", "crispEdges")
	b := l.box
	for _, t := range l.x.ticks {
		x := num(l.x.px(t))
		w.empty("line", "x1", x, "y1", num(b.y0), "x2", x, "y2", num(b.y1))
	}
	for _, t := range l.y.ticks {
		y := num(l.y.px(t))
		w.empty("line", "x1", num(b.x0), "y1", y, "x2", num(b.x1), "y2", y)
	}
	w.end("g")
}

// drawFrame outlines the plot area.
func drawFrame(w *writer, l *layout) {
	b := l.box
	w.empty("rect", "class", "frame",
		"x", num(b.x0), "y", num(b.y0), "width", num(b.x1-b.x0), "height", num(b.y1-b.y0),
		"fill", "none", "stroke", colAxis, "stroke-width", "1", "shape-rendering", "crispEdges")
}

// drawTicks draws the tick marks outside the frame and their labels.
func drawTicks(w *writer, l *layout) {
	b := l.box
	w.start("g", "class", "ticks", "stroke", colAxis, "stroke-width", "1", "shape-rendering", "crispEdges")
	for _, t := range l.x.ticks {
		x := num(l.x.px(t))
		w.empty("line", "x1", x, "y1", num(b.y1), "x2", x, "y2", num(b.y1+tickLen))
	}
	for _, t := range l.y.ticks {
		y := num(l.y.px(t))
		w.empty("line", "x1", num(b.x0-tickLen), "y1", y, "x2", num(b.x0), "y2", y)
	}
	w.end("g")
	w.start("g", "class", "tick-labels", "fill", colInk)
	for i, t := range l.x.ticks {
		w.text("text", l.x.labels[i], "x", num(l.x.px(t)), "y", num(b.y1+tickLen+12), "text-anchor", "middle")
	}
	for i, t := range l.y.ticks {
		w.text("text", l.y.labels[i], "x", num(b.x0-tickLen-3), "y", num(l.y.px(t)+0.35*fontTick), "text-anchor", "end")
	}
	w.end("g")
}

// drawAxisLabels writes the title and the axis labels.
func drawAxisLabels(w *writer, p *Plot, l *layout) {
	b := l.box
	mid := num(float64((b.x0 + b.x1) / 2))
	if t := p.title(); !t.empty() {
		w.rich(t, "class", "plot-title", "x", mid, "y", "22",
			"text-anchor", "middle", "font-size", num(fontTitle), "font-weight", "bold", "fill", colInk)
	}
	if t := p.xLabel(); !t.empty() {
		w.rich(t, "class", "axis-label", "x", mid, "y", num(b.y1+38),
			"text-anchor", "middle", "font-size", num(fontAxis), "fill", colInk)
	}
	if t := p.yLabel(); !t.empty() {
		x, y := num(6+fontAxis*0.8), num(float64((b.y0+b.y1)/2))
		w.rich(t, "class", "axis-label", "x", x, "y", y,
			"transform", "rotate(-90 "+x+" "+y+")",
			"text-anchor", "middle", "font-size", num(fontAxis), "fill", colInk)
	}
}
