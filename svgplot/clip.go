package svgplot

// vec is a point in data coordinates or in px.
type vec struct{ x, y float64 }

// bounds is a closed data-space box to clip against.
type bounds struct{ xlo, xhi, ylo, yhi float64 }

func (b bounds) has(v vec) bool {
	return v.x >= b.xlo && v.x <= b.xhi && v.y >= b.ylo && v.y <= b.yhi
}

// clamp moves v onto b, removing rounding error after an intersection.
func (b bounds) clamp(v vec) vec {
	return vec{min(max(v.x, b.xlo), b.xhi), min(max(v.y, b.ylo), b.yhi)}
}

// clipPolyline cuts the polyline through pts to the box b and returns the
// pieces that lie inside, each with at least two vertices.
func clipPolyline(pts []vec, b bounds) [][]vec {
	var pieces [][]vec
	var cur []vec
	flush := func() {
		if len(cur) >= 2 {
			pieces = append(pieces, cur)
		}
		cur = nil
	}
	for i := 1; i < len(pts); i++ {
		a, c, ok := clipSegment(pts[i-1], pts[i], b)
		if !ok {
			flush()
			continue
		}
		if len(cur) == 0 || cur[len(cur)-1] != a {
			flush()
			cur = append(cur, a)
		}
		cur = append(cur, c)
	}
	flush()
	return pieces
}

// clipSegment clips the segment a–c to b (Liang–Barsky) and reports
// whether any of it is inside. Ends inside b are returned unchanged, so
// consecutive clipped segments still join exactly.
func clipSegment(a, c vec, b bounds) (vec, vec, bool) {
	if b.has(a) && b.has(c) {
		return a, c, true
	}
	dx, dy := c.x-a.x, c.y-a.y
	t0, t1 := 0.0, 1.0
	edges := [4][2]float64{
		{-dx, a.x - b.xlo}, {dx, b.xhi - a.x},
		{-dy, a.y - b.ylo}, {dy, b.yhi - a.y},
	}
	for _, e := range edges {
		var ok bool
		if t0, t1, ok = clipEdge(e[0], e[1], t0, t1); !ok {
			return a, c, false
		}
	}
	na, nc := a, c
	if t0 > 0 {
		na = b.clamp(vec{a.x + float64(t0*dx), a.y + float64(t0*dy)})
	}
	if t1 < 1 {
		nc = b.clamp(vec{a.x + float64(t1*dx), a.y + float64(t1*dy)})
	}
	if !isFinite(na.x) || !isFinite(na.y) || !isFinite(nc.x) || !isFinite(nc.y) {
		return a, c, false
	}
	return na, nc, true
}

// clipEdge narrows the parameter interval [t0, t1] by one edge p·t <= q.
func clipEdge(p, q, t0, t1 float64) (float64, float64, bool) {
	switch {
	case p == 0:
		return t0, t1, q >= 0
	case p < 0:
		t0 = max(t0, q/p)
	default:
		t1 = min(t1, q/p)
	}
	return t0, t1, t0 <= t1
}
