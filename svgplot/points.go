package svgplot

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// Point markers and their labels, in px.
const (
	pointR   = 3.6 // radius of a state marker
	labelGap = 6   // distance from a marker's centre to its label's box
	labelPad = 1   // clearance kept between labels
	ascent   = 0.74
	boldEm   = 1.08 // bold text is about this much wider than regular
)

// Penalties of a label position; the cheapest position wins.
const (
	costOutside = 1e6 // the label leaves the plot area
	costLabel   = 1e4 // it overlaps an earlier label or the legend
	costMarker  = 1e3 // it covers a marker
	costVertex  = 10  // it covers a drawn vertex of a series
	costRing    = 40  // it lies one ring further from its marker
)

// rings is the number of distances from its marker a state label tries;
// leaderMin is the distance from a marker to its label beyond which a
// leader line joins them.
const (
	rings     = 8
	leaderMin = 12
)

// mark is a drawn state marker: its centre in px and its index in Points.
type mark struct {
	c vec
	i int
}

// drawPoints draws a marker for each point inside the axis ranges and
// returns the markers drawn.
func drawPoints(w *writer, pts []Point, l *layout) []mark {
	var marks []mark
	b := l.bounds()
	w.start("g", "class", "points", "fill", colAccent, "stroke", colPaper, "stroke-width", "1.2")
	for i, p := range pts {
		v := vec{p.X, p.Y}
		if !b.has(v) {
			continue
		}
		c := l.vecPx(v)
		marks = append(marks, mark{c, i})
		attrs := []string{"cx", num(c.x), "cy", num(c.y), "r", num(pointR)}
		if p.Title == "" {
			w.empty("circle", attrs...)
			continue
		}
		w.start("circle", attrs...)
		w.title(p.Title)
		w.end("circle")
	}
	w.end("g")
	return marks
}

// dirs are the eight directions a label may sit in from its marker; the
// order breaks ties.
var dirs = [8]vec{{1, -1}, {1, 0}, {0, -1}, {1, 1}, {-1, -1}, {-1, 0}, {0, 1}, {-1, 1}}

// placer places labels one after another, greedily.
type placer struct {
	box    rect
	taken  []rect // earlier labels and the legend
	marks  []mark
	drawn  []vec
	centre vec // centroid of the markers; labels lean away from it
}

// drawLabels writes the labels of the drawn markers, each in the cheapest
// of the spots around its marker, and returns the placer holding every
// box taken so far.
func drawLabels(w *writer, pts []Point, marks []mark, drawn []vec, taken []rect, l *layout) *placer {
	pl := &placer{box: l.box, taken: taken, marks: marks, drawn: drawn, centre: centroid(marks)}
	type placed struct {
		label string
		c     vec
		r     rect
	}
	var out []placed
	for _, m := range marks {
		label := pts[m.i].Label
		if label == "" {
			continue
		}
		r := pl.place(m.c, float64(boldEm*textWidth(label, fontLabel)), ascent*fontLabel)
		out = append(out, placed{label, m.c, r})
	}
	var leaders []string
	for _, p := range out {
		if e := nearestOn(p.r, p.c); fpmath.Hypot(e.x-p.c.x, e.y-p.c.y) > leaderMin {
			leaders = append(leaders, "x1", num(p.c.x), "y1", num(p.c.y), "x2", num(e.x), "y2", num(e.y))
		}
	}
	if len(leaders) > 0 {
		w.start("g", "class", "leaders", "stroke", colDashed, "stroke-width", "0.8")
		for i := 0; i < len(leaders); i += 8 {
			w.empty("line", leaders[i:i+8]...)
		}
		w.end("g")
	}
	w.start("g", "class", "point-labels", "font-size", num(fontLabel), "font-weight", "bold",
		"fill", colInk, "stroke", colPaper, "stroke-width", "3", "stroke-linejoin", "round",
		"paint-order", "stroke", "text-anchor", "middle")
	for _, p := range out {
		w.text("text", p.label, "x", num(float64((p.r.x0+p.r.x1)/2)), "y", num(p.r.y1))
	}
	w.end("g")
	return pl
}

// nearestOn returns the point of r nearest to c.
func nearestOn(r rect, c vec) vec {
	return vec{min(max(c.x, r.x0), r.x1), min(max(c.y, r.y0), r.y1)}
}

// place returns the box of a w×h label for the marker at c and records it.
// It tries the eight directions at the usual gap and then on rings
// further out, each box moved inside the plot area, and takes the
// cheapest; the order of the candidates breaks ties.
func (pl *placer) place(c vec, w, h float64) rect {
	var best rect
	bestCost := math.Inf(1)
	for ring := range rings {
		extra := float64(float64(ring) * (h + 2*labelPad))
		for rank, d := range pl.order(c) {
			r := shiftInto(labelRect(c, d, w, h, extra), pl.box)
			cost := pl.cost(r) + float64(rank) + float64(costRing*float64(ring))
			if cost < bestCost {
				best, bestCost = r, cost
			}
		}
		if bestCost < float64(costRing*float64(ring+1)) {
			break // no later ring can be cheaper
		}
	}
	pl.taken = append(pl.taken, best)
	return best
}

// order returns the directions sorted so that those pointing away from the
// centroid come first.
func (pl *placer) order(c vec) []vec {
	out := make([]vec, len(dirs))
	copy(out, dirs[:])
	away := vec{c.x - pl.centre.x, c.y - pl.centre.y}
	score := func(d vec) float64 {
		n := fpmath.Hypot(d.x, d.y)
		return (float64(d.x*away.x) + float64(d.y*away.y)) / n
	}
	// insertion sort: stable, and the slice is tiny
	for i := 1; i < len(out); i++ {
		for j := i; j > 0 && score(out[j]) > score(out[j-1]); j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	return out
}

// cost scores a label box; lower is better.
func (pl *placer) cost(r rect) float64 {
	cost := 0.0
	if !pl.box.contains(r) {
		cost += costOutside
	}
	padded := rect{r.x0 - labelPad, r.y0 - labelPad, r.x1 + labelPad, r.y1 + labelPad}
	for _, t := range pl.taken {
		if a := padded.overlap(t); a > 0 {
			cost += costLabel + a
		}
	}
	for _, m := range pl.marks {
		if r.overlap(rect{m.c.x - pointR, m.c.y - pointR, m.c.x + pointR, m.c.y + pointR}) > 0 {
			cost += costMarker
		}
	}
	return cost + float64(costVertex*float64(countInside(pl.drawn, r)))
}

// labelRect puts a w×h box next to c in direction d, extra px further
// out than the usual gap.
func labelRect(c, d vec, w, h, extra float64) rect {
	g := labelGap + extra
	if d.x != 0 && d.y != 0 {
		g = float64(g * 3 / 4)
	}
	var x0, y0 float64
	switch {
	case d.x > 0:
		x0 = c.x + g
	case d.x < 0:
		x0 = c.x - g - w
	default:
		x0 = c.x - float64(w/2)
	}
	switch {
	case d.y > 0:
		y0 = c.y + g
	case d.y < 0:
		y0 = c.y - g - h
	default:
		y0 = c.y - float64(h/2)
	}
	return rect{x0, y0, x0 + w, y0 + h}
}

// shiftInto moves r the least distance that puts it inside box, as far as
// it fits.
func shiftInto(r, box rect) rect {
	dx := max(0, box.x0-r.x0) + min(0, box.x1-r.x1)
	dy := max(0, box.y0-r.y0) + min(0, box.y1-r.y1)
	return rect{r.x0 + dx, r.y0 + dy, r.x1 + dx, r.y1 + dy}
}

// centroid returns the mean centre of the markers.
func centroid(marks []mark) vec {
	var s vec
	for _, m := range marks {
		s.x += m.c.x
		s.y += m.c.y
	}
	if n := float64(len(marks)); n > 0 {
		s.x, s.y = s.x/n, s.y/n
	}
	return s
}
