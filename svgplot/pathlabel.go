package svgplot

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// Path labels, in px: font size, least distance from the curve, and the
// number of spots tried along it.
const (
	fontPath     = 10
	pathGap      = 3
	pathSpots    = 15
	costOffMid   = 8  // per unit of distance from the middle of the curve
	costStandoff = 2  // per px a box stands off the curve
	maxStandoff  = 14 // px
	pathMaxCost  = costMarker
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
		r, ok := pl.placeAlong(pathPx(lb, l), lb.Text.width(fontPath), ascent*fontPath+lb.Text.drop(fontPath))
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
		w.rich(t, "x", num(float64((r.x0+r.x1)/2)), "y", num(r.y1-t.drop(fontPath)))
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

// placeAlong returns the cheapest box of a w×h label beside the polyline
// px, and records it; ok is false when every spot overlaps a label, the
// legend or a marker, or leaves the plot area.
func (pl *placer) placeAlong(px []vec, w, h float64) (rect, bool) {
	spots := alongSpots(px, pathSpots)
	var best rect
	bestCost := math.Inf(1)
	for i, sp := range spots {
		f := (float64(i) + 1) / float64(len(spots)+1)
		boxes, offs := besideBoxes(sp, w, h)
		for j, r := range boxes {
			if !pl.box.contains(r) {
				continue
			}
			cost := pl.cost(r) + float64(costOffMid*math.Abs(f-0.5)*float64(len(spots))) + float64(costStandoff*offs[j])
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

// spot is a point on a curve and the unit tangent there, in px.
type spot struct{ c, t vec }

// besideBoxes returns the w×h boxes above, below, left and right of a spot
// that clear the curve's tangent line there by pathGap, each with the
// distance it stands off: a box beside a sloping curve stands off by as
// much as the slope takes the line across its half-width (or half-height).
// Boxes that would stand off more than maxStandoff are not offered.
func besideBoxes(sp spot, w, h float64) ([]rect, []float64) {
	c, t := sp.c, sp.t
	var out []rect
	var off []float64
	if tx := math.Abs(t.x); tx > 0 {
		if dy := pathGap + float64(math.Abs(t.y)/tx*w/2); dy <= maxStandoff {
			out = append(out,
				rect{c.x - float64(w/2), c.y - dy - h, c.x + float64(w/2), c.y - dy},
				rect{c.x - float64(w/2), c.y + dy, c.x + float64(w/2), c.y + dy + h})
			off = append(off, dy, dy)
		}
	}
	if ty := math.Abs(t.y); ty > 0 {
		if dx := pathGap + float64(math.Abs(t.x)/ty*h/2); dx <= maxStandoff {
			out = append(out,
				rect{c.x + dx, c.y - float64(h/2), c.x + dx + w, c.y + float64(h/2)},
				rect{c.x - dx - w, c.y - float64(h/2), c.x - dx, c.y + float64(h/2)})
			off = append(off, dx, dx)
		}
	}
	return out, off
}

// alongSpots returns n spots spaced evenly by arc length along the
// polyline px, its ends left out.
func alongSpots(px []vec, n int) []spot {
	if len(px) < 2 {
		return nil
	}
	total := 0.0
	for i := 1; i < len(px); i++ {
		total += dist(px[i-1], px[i])
	}
	if total == 0 {
		return nil
	}
	var out []spot
	seg, done := 1, 0.0
	for k := 1; k <= n; k++ {
		want := total * float64(k) / float64(n+1)
		for seg < len(px)-1 && done+dist(px[seg-1], px[seg]) < want {
			done += dist(px[seg-1], px[seg])
			seg++
		}
		a, b := px[seg-1], px[seg]
		d := dist(a, b)
		if d == 0 {
			continue
		}
		u := min((want-done)/d, 1)
		t := vec{(b.x - a.x) / d, (b.y - a.y) / d}
		out = append(out, spot{vec{a.x + float64(u*(b.x-a.x)), a.y + float64(u*(b.y-a.y))}, t})
	}
	return out
}

func dist(a, b vec) float64 { return fpmath.Hypot(b.x-a.x, b.y-a.y) }
