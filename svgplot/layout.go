package svgplot

import (
	"fmt"
	"math"
	"unicode/utf8"
)

// Font sizes in px and the assumed mean advance of a character in em, used
// to estimate the width of text (the output names a generic sans-serif).
const (
	fontTick  = 11
	fontAxis  = 12
	fontTitle = 14
	fontLabel = 12
	charEm    = 0.6
)

// minBox is the smallest width or height of the plot area, in px.
const minBox = 40

// pointPad widens the automatic range around Points by this fraction of
// the data span, so state markers and their labels clear the frame.
const pointPad = 0.03

// rect is an axis-aligned box in px, x0 < x1 and y0 < y1 (y grows down).
type rect struct{ x0, y0, x1, y1 float64 }

// overlap returns the area shared by r and o.
func (r rect) overlap(o rect) float64 {
	w := min(r.x1, o.x1) - max(r.x0, o.x0)
	h := min(r.y1, o.y1) - max(r.y0, o.y0)
	if w <= 0 || h <= 0 {
		return 0
	}
	return w * h
}

// contains reports whether o lies wholly inside r.
func (r rect) contains(o rect) bool {
	return o.x0 >= r.x0 && o.x1 <= r.x1 && o.y0 >= r.y0 && o.y1 <= r.y1
}

// axis is one linear scale with its ticks.
type axis struct {
	lo, hi float64 // data range
	p0, p1 float64 // px of lo and hi
	ticks  []float64
	labels []string
}

// px maps a data value to px.
func (a *axis) px(v float64) float64 {
	return a.p0 + (v-a.lo)/(a.hi-a.lo)*(a.p1-a.p0)
}

// layout holds the size, the plot area and the two scales.
type layout struct {
	w, h float64
	box  rect
	x, y axis
}

// textWidth estimates the width in px of s at font size fs.
func textWidth(s string, fs float64) float64 {
	return charEm * fs * float64(utf8.RuneCountInString(s))
}

func orDefault(v, d float64) float64 {
	if v == 0 {
		return d
	}
	return v
}

// layout fixes the margins, the plot area and the scales.
func (p *Plot) layout() (*layout, error) {
	l := &layout{w: orDefault(p.Width, DefaultWidth), h: orDefault(p.Height, DefaultHeight)}
	top, bottom := 14.0, 26.0
	if p.Title != "" {
		top = 40
	}
	if p.XLabel != "" {
		bottom = 46
	}
	if l.h-top-bottom < minBox {
		return nil, fmt.Errorf("svgplot: height = %s leaves no room for the plot area", fmtErrNum(l.h))
	}
	xd, yd := p.extent()
	var err error
	if l.y, err = makeAxis("y", p.YMin, p.YMax, yd, ticksFor(l.h-top-bottom, 45)); err != nil {
		return nil, err
	}
	left := p.leftMargin(l.y.labels)
	if l.x, err = makeAxis("x", p.XMin, p.XMax, xd, ticksFor(l.w-left-12, 80)); err != nil {
		return nil, err
	}
	right := rightMargin(l.x.labels)
	if l.w-left-right < minBox {
		return nil, fmt.Errorf("svgplot: width = %s leaves no room for the plot area", fmtErrNum(l.w))
	}
	l.box = rect{left, top, l.w - right, l.h - bottom}
	l.x.p0, l.x.p1 = l.box.x0, l.box.x1
	l.y.p0, l.y.p1 = l.box.y1, l.box.y0
	return l, nil
}

// ticksFor returns the most ticks to put along length px, about one per gap px.
func ticksFor(length, gap float64) int {
	return min(max(int(length/gap)+1, 2), 12)
}

// leftMargin leaves room for the y tick labels and the y axis label.
func (p *Plot) leftMargin(labels []string) float64 {
	w := 0.0
	for _, s := range labels {
		w = max(w, textWidth(s, fontTick))
	}
	m := 10 + w + 6
	if p.YLabel != "" {
		m += fontAxis + 8
	}
	return math.Ceil(m)
}

// rightMargin leaves room for half of the last x tick label.
func rightMargin(labels []string) float64 {
	if len(labels) == 0 {
		return 12
	}
	return math.Ceil(max(12, textWidth(labels[len(labels)-1], fontTick)/2+4))
}

// extent returns the [min, max] of the data along x and y; the extent of
// the Points is widened by pointPad of the span.
func (p *Plot) extent() (xd, yd [2]float64) {
	sx, sy := newSpan(), newSpan()
	for _, s := range p.Series {
		for i := range min(len(s.X), len(s.Y)) {
			sx.add(s.X[i])
			sy.add(s.Y[i])
		}
	}
	px, py := newSpan(), newSpan()
	for _, pt := range p.Points {
		px.add(pt.X)
		py.add(pt.Y)
	}
	return sx.union(px), sy.union(py)
}

// span is a running [min, max].
type span [2]float64

func newSpan() span { return span{math.Inf(1), math.Inf(-1)} }

func (s *span) add(v float64) {
	s[0], s[1] = min(s[0], v), max(s[1], v)
}

func (s span) empty() bool { return s[0] > s[1] }

// union returns the extent of s and of the points pts padded by pointPad.
func (s span) union(pts span) [2]float64 {
	all := s
	if !pts.empty() {
		all.add(pts[0])
		all.add(pts[1])
		pad := pointPad * (all[1] - all[0])
		all.add(pts[0] - pad)
		all.add(pts[1] + pad)
	}
	return all
}

// makeAxis builds the scale of one axis, from the explicit range lo..hi or,
// when both are zero, from the data extent ext.
func makeAxis(name string, lo, hi float64, ext [2]float64, maxTicks int) (axis, error) {
	if lo == 0 && hi == 0 {
		nlo, nhi, s, ok := autoRange(ext[0], ext[1], maxTicks)
		if !ok {
			return axis{}, fmt.Errorf("svgplot: %s data from %s to %s cannot be scaled: the span is too narrow for the magnitude or too wide",
				name, fmtErrNum(ext[0]), fmtErrNum(ext[1]))
		}
		t := s.ticks(nlo, nhi)
		return axis{lo: nlo, hi: nhi, ticks: t, labels: tickLabels(t, s)}, nil
	}
	s, ok := chooseStep(lo, hi, maxTicks)
	if !ok {
		return axis{}, fmt.Errorf("svgplot: %s range from %s to %s cannot be scaled: the span is too narrow for the magnitude or too wide",
			name, fmtErrNum(lo), fmtErrNum(hi))
	}
	t := s.ticks(lo, hi)
	return axis{lo: lo, hi: hi, ticks: t, labels: tickLabels(t, s)}, nil
}
