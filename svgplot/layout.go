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

// pointPad widens an automatic range by this fraction of its length at an
// end that a Point lies near, so state markers clear the frame.
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
	return float64(w * h)
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
	return a.p0 + float64((v-a.lo)/(a.hi-a.lo)*(a.p1-a.p0))
}

// layout holds the size, the plot area and the two scales.
type layout struct {
	w, h float64
	box  rect
	x, y axis
}

// textWidth estimates the width in px of s at font size fs.
func textWidth(s string, fs float64) float64 {
	return float64(charEm * fs * float64(utf8.RuneCountInString(s)))
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
	if !p.title().empty() {
		top = 40
	}
	if !p.xLabel().empty() {
		bottom = 46
	}
	if l.h-top-bottom < minBox {
		return nil, fmt.Errorf("svgplot: height = %s leaves no room for the plot area", fmtErrNum(l.h))
	}
	xd, yd := p.extents()
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

// title, xLabel and yLabel return the texts to draw.
func (p *Plot) title() Text  { return orText(p.TitleText, p.Title) }
func (p *Plot) xLabel() Text { return orText(p.XText, p.XLabel) }
func (p *Plot) yLabel() Text { return orText(p.YText, p.YLabel) }

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
	if !p.yLabel().empty() {
		m += fontAxis + 8
	}
	return math.Ceil(m)
}

// rightMargin leaves room for half of the last x tick label.
func rightMargin(labels []string) float64 {
	if len(labels) == 0 {
		return 12
	}
	return math.Ceil(max(12, float64(textWidth(labels[len(labels)-1], fontTick)/2)+4))
}

// extent is the data extent along one axis: of everything, and of the
// marked and labelled data alone (Points, the pairs of Markers and Marked
// series, the curves of PathLabels).
type extent struct{ all, pts span }

// extents returns the data extents along x and y.
func (p *Plot) extents() (x, y extent) {
	x, y = extent{newSpan(), newSpan()}, extent{newSpan(), newSpan()}
	for _, s := range p.Series {
		marked := s.Marked || s.Style == Markers
		for i := range min(len(s.X), len(s.Y)) {
			x.all.add(s.X[i])
			y.all.add(s.Y[i])
			if marked {
				x.pts.add(s.X[i])
				y.pts.add(s.Y[i])
			}
		}
	}
	for _, pl := range p.PathLabels {
		for i := range min(len(pl.X), len(pl.Y)) {
			x.pts.add(pl.X[i])
			y.pts.add(pl.Y[i])
		}
	}
	for _, pt := range p.Points {
		x.all.add(pt.X)
		y.all.add(pt.Y)
		x.pts.add(pt.X)
		y.pts.add(pt.Y)
	}
	return x, y
}

// span is a running [min, max].
type span [2]float64

func newSpan() span { return span{math.Inf(1), math.Inf(-1)} }

func (s *span) add(v float64) {
	s[0], s[1] = min(s[0], v), max(s[1], v)
}

// padEnds widens lo..hi by pointPad of its length at each end that a point
// lies within that distance of.
func (e extent) padEnds(lo, hi float64) (float64, float64) {
	pad := float64(pointPad * (hi - lo))
	if e.pts[0] <= e.pts[1] {
		lo = min(lo, e.pts[0]-pad)
		hi = max(hi, e.pts[1]+pad)
	}
	return lo, hi
}

// makeAxis builds the scale of one axis, from the explicit range lo..hi or,
// when both are zero, from the data extent ext: widened to whole tick steps
// and then, where a point lies near an end, by pointPad.
func makeAxis(name string, lo, hi float64, ext extent, maxTicks int) (axis, error) {
	if lo == 0 && hi == 0 {
		nlo, nhi, s, ok := autoRange(ext.all[0], ext.all[1], maxTicks)
		if !ok {
			return axis{}, fmt.Errorf("svgplot: %s data from %s to %s cannot be scaled: the span is too narrow for the magnitude or too wide",
				name, fmtErrNum(ext.all[0]), fmtErrNum(ext.all[1]))
		}
		t := s.ticks(nlo, nhi)
		nlo, nhi = ext.padEnds(nlo, nhi)
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
