package svgplot

import "math"

// Path labels, in px: font size, distance from the curve, and the number
// of spots tried along it.
const (
	fontPath    = 10
	pathGap     = 3
	pathSpots   = 15
	costOffMid  = 8 // per unit of distance from the middle of the curve
	pathMaxCost = costMarker
)

// drawPathLabels writes each path label at the cheapest spot along its
// curve that overlaps no label, legend or marker and lies inside the plot
// area; a label without such a spot is left out.
func drawPathLabels(w *writer, labels []PathLabel, pl *placer, l *layout) {
	var texts []Text
	var boxes []rect
	for _, lb := range labels {
		if lb.Text.empty() {
			continue
		}
		r, ok := pl.placeAlong(pathPx(lb, l), lb.Text.width(fontPath), ascent*fontPath)
		if ok {
			texts, boxes = append(texts, lb.Text), append(boxes, r)
		}
	}
	if len(texts) == 0 {
		return
	}
	w.start("g", "class", "path-labels", "font-size", num(fontPath), "fill", colDashed,
		"stroke", colPaper, "stroke-width", "3", "stroke-linejoin", "round",
		"paint-order", "stroke", "text-anchor", "middle")
	for i, t := range texts {
		r := boxes[i]
		w.rich(t, "x", num((r.x0+r.x1)/2), "y", num(r.y1))
	}
	w.end("g")
}

// pathPx returns the parts of a label's curve inside the axis ranges, in
// px, joined into one polyline.
func pathPx(lb PathLabel, l *layout) []vec {
	var out []vec
	for _, piece := range clipPolyline(seriesData(Series{X: lb.X, Y: lb.Y}), l.bounds()) {
		out = append(out, l.toPx(piece)...)
	}
	return out
}

// placeAlong returns the cheapest box of a w×h label just above or below
// the polyline px, and records it; ok is false when every spot overlaps a
// label, the legend or a marker, or leaves the plot area.
func (pl *placer) placeAlong(px []vec, w, h float64) (rect, bool) {
	spots := alongSpots(px, pathSpots)
	var best rect
	bestCost := math.Inf(1)
	for i, c := range spots {
		f := (float64(i) + 1) / float64(len(spots)+1)
		for _, up := range [2]bool{true, false} {
			r := rect{c.x - w/2, c.y + pathGap, c.x + w/2, c.y + pathGap + h}
			if up {
				r.y0, r.y1 = c.y-pathGap-h, c.y-pathGap
			}
			if !pl.box.contains(r) {
				continue
			}
			cost := pl.cost(r) + costOffMid*math.Abs(f-0.5)*float64(len(spots))
			if cost < bestCost {
				best, bestCost = r, cost
			}
		}
	}
	if bestCost >= pathMaxCost {
		return rect{}, false
	}
	pl.taken = append(pl.taken, best)
	return best, true
}

// alongSpots returns n points spaced evenly by arc length along the
// polyline px, its ends left out.
func alongSpots(px []vec, n int) []vec {
	if len(px) < 2 {
		return nil
	}
	total := 0.0
	for i := 1; i < len(px); i++ {
		total += math.Hypot(px[i].x-px[i-1].x, px[i].y-px[i-1].y)
	}
	if total == 0 {
		return nil
	}
	var out []vec
	seg, done := 1, 0.0
	for k := 1; k <= n; k++ {
		want := total * float64(k) / float64(n+1)
		for seg < len(px)-1 && done+dist(px[seg-1], px[seg]) < want {
			done += dist(px[seg-1], px[seg])
			seg++
		}
		a, b := px[seg-1], px[seg]
		t := 0.0
		if d := dist(a, b); d > 0 {
			t = min((want-done)/d, 1)
		}
		out = append(out, vec{a.x + t*(b.x-a.x), a.y + t*(b.y-a.y)})
	}
	return out
}

func dist(a, b vec) float64 { return math.Hypot(b.x-a.x, b.y-a.y) }
