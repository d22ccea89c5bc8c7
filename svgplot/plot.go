package svgplot

import (
	"errors"
	"fmt"
	"math"
	"strconv"
)

// Default size of a plot, in px of the viewBox, used when Width or Height
// is zero.
const (
	DefaultWidth  = 640
	DefaultHeight = 420
)

// Plot is a two-dimensional plot with linear axes.
type Plot struct {
	// Title is drawn above the plot and used as its accessible name.
	Title string
	// XLabel and YLabel name the axes, units included, as plain text:
	// "s [kJ/(kg·K)]", "T [°C]".
	XLabel, YLabel string
	// TitleText, XText and YText, when not empty, are drawn in place of
	// Title, XLabel and YLabel: typeset text with italic symbols and real
	// subscripts ("η_th [%]"). The plain strings still name the plot for
	// screen readers when they are set.
	TitleText, XText, YText Text
	// Width and Height give the size of the viewBox in px; zero means
	// DefaultWidth and DefaultHeight.
	Width, Height float64
	// Series are the lines and marker sets, drawn in layers by style:
	// Dome first, then Line and Dashed, then Markers, then Branch, then
	// Process; within
	// a layer in the order given.
	Series []Series
	// Points are labelled markers, such as the states of a cycle, drawn
	// on top of all series.
	Points []Point
	// XMin, XMax, YMin and YMax fix the axis ranges. An axis whose two
	// ends are both zero is ranged automatically: the data extent widened
	// to whole tick steps. Otherwise both ends are used as given, so
	// XMin = 0, XMax = 10 is the range [0, 10].
	XMin, XMax, YMin, YMax float64
	// PathLabels are labels laid along a curve that is not drawn itself,
	// such as the pressure of an isobar along the part of the cycle path
	// that follows it. Each is placed where it overlaps no other label,
	// marker or legend, or left out when there is no such place.
	PathLabels []PathLabel
}

// PathLabel is a label to place somewhere along a curve.
type PathLabel struct {
	// Text is the label: "16.5 MPa", "x = 0.4".
	Text Text
	// X and Y are the curve in data coordinates; they must have the same
	// length.
	X, Y []float64
}

// Series is a named run of (X[i], Y[i]) pairs drawn in one style.
type Series struct {
	// Name labels the series in the legend, which is drawn when more
	// than one series has a name.
	Name string
	// X and Y hold the coordinates; they must have the same length.
	X, Y []float64
	// Style selects how the series is drawn.
	Style Style
	// Label, when not empty, is drawn in the legend in place of Name:
	// typeset text with italic symbols and subscripts.
	Label Text
	// Marked puts a dot in the series' colour at each of its pairs, as at
	// the computed points of a sweep.
	Marked bool
}

// Point is a labelled marker, such as a state of a cycle.
type Point struct {
	// Label is drawn next to the marker: "1", "2s", "3".
	Label string
	// X and Y place the marker in data coordinates.
	X, Y float64
	// Title, when not empty, becomes the marker's tooltip.
	Title string
}

// Style is the way a series is drawn.
type Style int

// The styles of a series.
const (
	// Line is a thin solid dark line; the zero value.
	Line Style = iota
	// Dashed is a thin dashed grey line, for isobars or reference curves.
	Dashed
	// Dome is a thick muted line, for a saturation dome.
	Dome
	// Process is an emphasised line in the accent colour, for a cycle path.
	Process
	// Markers draws each pair as a small dot, without a line.
	Markers
	// Branch is a thinner dashed line in the accent colour, for the
	// branches of a cycle path: bleed steam, heater drains.
	Branch
)

var styleNames = [...]string{"line", "dashed", "dome", "process", "markers", "branch"}

// String returns the lowercase name of the style, which is also its CSS class.
func (s Style) String() string {
	if s < 0 || int(s) >= len(styleNames) {
		return fmt.Sprintf("style(%d)", int(s))
	}
	return styleNames[s]
}

// SVG renders the plot as one <svg> element. It fails, listing every
// problem, on non-finite numbers, series whose X and Y differ in length, an
// unknown style, an inverted or empty axis range, a size too small to hold
// the plot, or a plot with nothing to draw.
func (p *Plot) SVG() ([]byte, error) {
	if err := p.validate(); err != nil {
		return nil, err
	}
	l, err := p.layout()
	if err != nil {
		return nil, err
	}
	return render(p, l), nil
}

// validate reports every problem with the plot's data, joined.
func (p *Plot) validate() error {
	var errs []error
	add := func(format string, args ...any) {
		errs = append(errs, fmt.Errorf("svgplot: "+format, args...))
	}
	p.validateSize(add)
	p.validateRanges(add)
	n := len(p.Points)
	for i, s := range p.Series {
		n += s.validate(i, add)
	}
	for i, pt := range p.Points {
		if !isFinite(pt.X) || !isFinite(pt.Y) {
			name := fmt.Sprintf("point %d (%q)", i+1, pt.Label)
			checkFinite(name+": x", pt.X, add)
			checkFinite(name+": y", pt.Y, add)
		}
	}
	for i, pl := range p.PathLabels {
		if len(pl.X) != len(pl.Y) {
			add("path label %d (%q): len(X) = %d but len(Y) = %d", i+1, pl.Text.String(), len(pl.X), len(pl.Y))
		}
		for j := range min(len(pl.X), len(pl.Y)) {
			if !isFinite(pl.X[j]) || !isFinite(pl.Y[j]) {
				add("path label %d (%q): pair %d is not finite", i+1, pl.Text.String(), j)
				break
			}
		}
	}
	if n == 0 {
		add("empty plot: no series data and no points")
	}
	return errors.Join(errs...)
}

func (p *Plot) validateSize(add func(string, ...any)) {
	checkFinite("width", p.Width, add)
	checkFinite("height", p.Height, add)
	if p.Width < 0 {
		add("width = %s is negative", fmtErrNum(p.Width))
	}
	if p.Height < 0 {
		add("height = %s is negative", fmtErrNum(p.Height))
	}
}

func (p *Plot) validateRanges(add func(string, ...any)) {
	check := func(axis string, lo, hi float64) {
		okLo := checkFinite(axis+"min", lo, add)
		okHi := checkFinite(axis+"max", hi, add)
		if okLo && okHi && (lo != 0 || hi != 0) && lo >= hi {
			add("%s range: %smin = %s is not below %smax = %s",
				axis, axis, fmtErrNum(lo), axis, fmtErrNum(hi))
		}
	}
	check("x", p.XMin, p.XMax)
	check("y", p.YMin, p.YMax)
}

// validate checks series number i (0-based) and returns its number of pairs.
func (s Series) validate(i int, add func(string, ...any)) int {
	name := func() string { return fmt.Sprintf("series %d (%q)", i+1, s.Name) }
	if s.Style < Line || s.Style > Branch {
		add("%s: unknown style %d", name(), int(s.Style))
	}
	if len(s.X) != len(s.Y) {
		add("%s: len(X) = %d but len(Y) = %d", name(), len(s.X), len(s.Y))
	}
	for _, c := range [...]struct {
		axis string
		v    []float64
	}{{"X", s.X}, {"Y", s.Y}} {
		for j, v := range c.v {
			if !isFinite(v) {
				add("%s: %s[%d] = %s is not finite", name(), c.axis, j, fmtErrNum(v))
			}
		}
	}
	return min(len(s.X), len(s.Y))
}

// checkFinite reports v when it is NaN or infinite and says whether it is finite.
func checkFinite(what string, v float64, add func(string, ...any)) bool {
	if isFinite(v) {
		return true
	}
	add("%s = %s is not finite", what, fmtErrNum(v))
	return false
}

func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// fmtErrNum formats a number for an error message, exactly and briefly.
func fmtErrNum(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
