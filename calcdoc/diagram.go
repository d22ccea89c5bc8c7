package calcdoc

import (
	"math"
	"strings"

	gast "github.com/yuin/goldmark/ast"

	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/svgplot"
)

// Diagram is one diagram of a `diagram` block: a T-s or h-s diagram of the
// cycle through the named states, in order, closed back to the first, with
// the open branches (bleed steam, heater drains) of the `branch` lines
// that follow it and the lines of constant vapour quality of a `quality`
// line.
//
//	T-s: st_1, st_b, st_2, st_3, st_4, st_5
//	branch: st_b, st_d
//	quality: 0.2, 0.4, 0.6, 0.8
type Diagram struct {
	Kind     string // "T-s" or "h-s"
	Off      int
	States   []field
	Branches [][]field
	Quality  []float64 // vapour qualities of the lines drawn inside the dome
	SVG      []byte
	block    int
}

// diagramBlock groups the diagrams of one block.
type diagramBlock struct {
	diagrams []*Diagram
}

// readDiagram parses a diagram block.
func (d *Doc) readDiagram(b *gast.FencedCodeBlock) {
	d.checkClosed(b)
	blk := &diagramBlock{}
	for _, l := range d.directives(b) {
		kind, list, ok := strings.Cut(l.text, ":")
		kind = strings.TrimSpace(kind)
		if !ok || (kind != "T-s" && kind != "h-s" && kind != "branch" && kind != "quality") {
			d.errorf(l.off, "write a diagram line as T-s: st_1, st_2, ... or h-s: st_1, st_2, ..., and a branch of the cycle above it as branch: st_1, st_2, ... or its quality lines as quality: 0.2, 0.4, ...")
			continue
		}
		listOff := l.off + strings.Index(l.text, ":") + 1
		if kind == "quality" {
			if len(blk.diagrams) == 0 {
				d.errorf(l.off, "a quality line belongs to the T-s or h-s line above it in the same block; write that line first")
			} else if qs, ok := d.readQuality(list, listOff); ok {
				last := blk.diagrams[len(blk.diagrams)-1]
				last.Quality = append(last.Quality, qs...)
			}
			continue
		}
		states := splitList(list, listOff)
		if len(states) == 1 && states[0].text == "states" && kind != "branch" {
			// The states of the states block above, resolved once every
			// block is read (resolveStateRefs).
			blk.diagrams = append(blk.diagrams, &Diagram{Kind: kind, Off: l.off, States: states, block: len(d.diagramBlocks)})
			continue
		}
		if len(states) < 2 {
			d.errorf(l.off, "a %s line needs at least two states", kind)
			continue
		}
		if kind == "branch" {
			if len(blk.diagrams) == 0 {
				d.errorf(l.off, "a branch line belongs to the T-s or h-s line above it in the same block; write that line first")
				continue
			}
			last := blk.diagrams[len(blk.diagrams)-1]
			last.Branches = append(last.Branches, states)
			continue
		}
		blk.diagrams = append(blk.diagrams, &Diagram{Kind: kind, Off: l.off, States: states, block: len(d.diagramBlocks)})
	}
	d.diagramBlocks = append(d.diagramBlocks, blk)
}

// drawDiagrams builds the SVG of every diagram after evaluation.
func (d *Doc) drawDiagrams() {
	for _, blk := range d.diagramBlocks {
		for _, dg := range blk.diagrams {
			d.drawDiagram(dg)
		}
	}
}

// diagramState is one state of a diagram.
type diagramState struct {
	name       string
	p, T, s, h float64
	fluid      string
}

// diagramStates looks up the states of one line of a diagram; fluid, when
// not empty, is the fluid every state must be of.
func (d *Doc) diagramStates(fields []field, fluid string) ([]diagramState, bool) {
	var out []diagramState
	for _, f := range fields {
		o, ok := d.outcomeOf(f.text)
		st, isState := (*props.State)(nil), false
		if ok {
			st, isState = o.Value.(*props.State)
		}
		if !isState {
			d.errorf(f.off, "diagram: %s is not a state; name states made with water(...) or fluid(...)", f.text)
			return nil, false
		}
		q := func(n string) float64 { v, _ := st.Quantity(n); return v.V }
		out = append(out, diagramState{name: f.text, p: q("p"), T: q("T"), s: q("s"), h: q("h"), fluid: st.Fluid})
		if fluid == "" {
			fluid = st.Fluid
		}
		if st.Fluid != fluid {
			d.errorf(f.off, "diagram: %s is %s, but the cycle is %s; a diagram shows one fluid", f.text, st.Fluid, fluid)
			return nil, false
		}
	}
	return out, true
}

// drawDiagram draws one diagram: the dome, any quality lines, the cycle
// and its branches, the states, and the pressure of each heat-exchange
// isobar.
func (d *Doc) drawDiagram(dg *Diagram) {
	states, ok := d.diagramStates(dg.States, "")
	if !ok {
		return
	}
	fluid := states[0].fluid
	branches := make([][]diagramState, len(dg.Branches))
	all := states
	for i, b := range dg.Branches {
		if branches[i], ok = d.diagramStates(b, fluid); !ok {
			return
		}
		all = append(all[:len(all):len(all)], branches[i]...)
	}
	p := diagramPlot(dg.Kind, fluid)
	y := diagramY(dg.Kind)
	dome, err := props.Dome(fluid, domePoints, domeStart(all))
	if err != nil {
		d.errorf(dg.Off, "diagram: %v", err)
		return
	}
	p.Series = append(p.Series, curveSeries("saturation line", dome, y, svgplot.Dome))
	d.qualityLines(p, dg.Quality, dome, y)
	var segs []heatSeg
	path, err := tracePath(states, true, &segs)
	if err != nil {
		d.errorf(dg.Off, "diagram: %v", err)
		return
	}
	p.Series = append(p.Series, curveSeries("cycle", path, y, svgplot.Process))
	for i, b := range branches {
		path, err := tracePath(b, false, &segs)
		if err != nil {
			d.errorf(dg.Branches[i][0].off, "diagram: %v", err)
			return
		}
		p.Series = append(p.Series, curveSeries("branch", path, y, svgplot.Branch))
	}
	p.Points = statePoints(all, y)
	p.PathLabels = append(p.PathLabels, d.isobarLabels(segs, y)...)
	entropyAxis(p)
	svg, err := p.SVG()
	if err != nil {
		d.errorf(dg.Off, "diagram: %v", err)
		return
	}
	dg.SVG = svg
}

// domePoints is the number of points on each side of a diagram's dome.
const domePoints = 80

// diagramPlot is an empty T-s or h-s diagram with its typeset title and
// axes.
func diagramPlot(kind, fluid string) *svgplot.Plot {
	ySym, yUnit := "T", " [°C]"
	if kind == "h-s" {
		ySym, yUnit = "h", " [kJ/kg]"
	}
	p := &svgplot.Plot{Title: kind + " diagram (" + fluid + ")", XLabel: "s [kJ/(kg·K)]", YLabel: ySym + yUnit}
	p.TitleText = svgplot.Text{{Text: ySym, Italic: true}, {Text: "–"}, {Text: "s", Italic: true}, {Text: " diagram (" + fluid + ")"}}
	p.XText = symbolRuns("s", " [kJ/(kg·K)]")
	p.YText = symbolRuns(ySym, yUnit)
	return p
}

// diagramY returns the ordinate of a diagram: T in °C or h in kJ/kg.
func diagramY(kind string) func(props.CurvePoint) float64 {
	if kind == "h-s" {
		return func(c props.CurvePoint) float64 { return c.H / 1000 }
	}
	return func(c props.CurvePoint) float64 { return c.T - 273.15 }
}

// statePoints labels each state once, without its st_ prefix.
func statePoints(all []diagramState, y func(props.CurvePoint) float64) []svgplot.Point {
	var out []svgplot.Point
	labelled := map[string]bool{}
	for _, s := range all {
		if labelled[s.name] {
			continue
		}
		labelled[s.name] = true
		c := props.CurvePoint{T: s.T, S: s.s, H: s.h}
		out = append(out, svgplot.Point{Label: stateLabel(s.name), X: s.s / 1000, Y: y(c), Title: s.name})
	}
	return out
}

// stateLabel is a state's name without a leading "st_".
func stateLabel(name string) string {
	if l := strings.TrimPrefix(name, "st_"); l != "" {
		return l
	}
	return name
}

func curveSeries(name string, pts []props.CurvePoint, y func(props.CurvePoint) float64, style svgplot.Style) svgplot.Series {
	s := svgplot.Series{Name: name, Style: style}
	for _, c := range pts {
		s.X = append(s.X, c.S/1000)
		s.Y = append(s.Y, y(c))
	}
	return s
}

// processPath joins the states in order, and back to the first when
// closed: heat exchange along the isobar (or, with a pressure drop, along
// the line on which the pressure falls evenly with the enthalpy), through
// the dome where it crosses it; compression, expansion and throttling as a
// straight line.
func processPath(states []diagramState, closed bool) ([]props.CurvePoint, error) {
	return tracePath(states, closed, nil)
}

// heatSeg is one heat-exchange step of a diagram: its two states and the
// path between them.
type heatSeg struct {
	a, b diagramState
	path []props.CurvePoint
}

// tracePath is processPath that also appends each heat-exchange step to
// segs, when segs is not nil.
func tracePath(states []diagramState, closed bool, segs *[]heatSeg) ([]props.CurvePoint, error) {
	var out []props.CurvePoint
	n := len(states)
	if !closed {
		n--
	}
	for i := 0; i < n; i++ {
		a, b := states[i], states[(i+1)%len(states)]
		out = append(out, props.CurvePoint{T: a.T, S: a.s, H: a.h})
		if !heatExchange(a, b) {
			continue
		}
		seg, err := props.HeatPath(a.fluid, a.p, b.p, a.h, b.h, 40)
		if err != nil {
			return nil, err
		}
		out = append(out, seg[1:len(seg)-1]...)
		if segs != nil {
			*segs = append(*segs, heatSeg{a, b, seg})
		}
	}
	end := states[len(states)-1]
	if closed {
		end = states[0]
	}
	out = append(out, props.CurvePoint{T: end.T, S: end.s, H: end.h})
	return out, nil
}

// entropyAxis starts the entropy axis at zero when no point lies left of it,
// as engineers draw T-s and h-s diagrams, and ends both axes on a tick
// with headroom beyond the data.
func entropyAxis(p *svgplot.Plot) {
	lo, hi, ylo, yhi := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, s := range p.Series {
		for i, x := range s.X {
			lo, hi = math.Min(lo, x), math.Max(hi, x)
			ylo, yhi = math.Min(ylo, s.Y[i]), math.Max(yhi, s.Y[i])
		}
	}
	if lo < 0 || math.IsInf(hi, 0) {
		return
	}
	xt := svgplot.NiceTicks(0, hi, 8)
	yt := svgplot.NiceTicks(ylo, yhi, 8)
	if len(xt) < 2 || len(yt) < 2 {
		return
	}
	pts := pointExtent(p.Points)
	pad := float64(diagramHeadroom * (yhi - ylo))
	p.XMin = 0
	p.XMax = roomEnd(hi, pts[1] >= hi-float64(diagramHeadroom*hi), float64(diagramHeadroom*hi), xt[1]-xt[0], 1)
	p.YMin = roomEnd(ylo, pts[2] <= ylo+pad, pad, yt[1]-yt[0], -1)
	p.YMax = roomEnd(yhi, pts[3] >= yhi-pad, pad, yt[1]-yt[0], 1)
}

// pointExtent returns the least and greatest X and Y of the points:
// xlo, xhi, ylo, yhi.
func pointExtent(pts []svgplot.Point) [4]float64 {
	e := [4]float64{math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)}
	for _, p := range pts {
		e[0], e[1] = math.Min(e[0], p.X), math.Max(e[1], p.X)
		e[2], e[3] = math.Min(e[2], p.Y), math.Max(e[3], p.Y)
	}
	return e
}

// roomEnd returns the end of an axis whose data end at v (dir +1 for the
// top end, -1 for the bottom): v itself when no state lies near it, else v
// moved out by pad; then out to the next tick of step when that adds at
// most half a step.
func roomEnd(v float64, near bool, pad, step float64, dir float64) float64 {
	if near {
		v += float64(dir * pad)
	}
	t := float64(math.Ceil(v/step) * step)
	if dir < 0 {
		t = float64(math.Floor(v/step) * step)
	}
	if math.Abs(t-v) <= float64(step/2) {
		return t
	}
	return v
}

// diagramHeadroom is the fraction of the data span left clear beyond the
// highest and lowest curve and the largest entropy, before rounding out to
// a whole tick step, so no state sits on the frame.
const diagramHeadroom = 0.04

// domeStart is the temperature the dome is drawn from: 30 K below the
// coldest state, so an organic fluid's dome does not reach down to its
// triple point far below the cycle.
func domeStart(states []diagramState) float64 {
	lo := math.Inf(1)
	for _, s := range states {
		lo = math.Min(lo, s.T)
	}
	return lo - 30
}

// maxHeatPressureDrop is the largest relative pressure change a heat
// exchange between two diagram states may have; a larger one is a pump,
// a turbine or a valve.
const maxHeatPressureDrop = 0.15

// heatExchange reports whether the process from a to b is heat exchange:
// pressure nearly kept, and enthalpy and entropy changing the same way
// (a real expansion lowers h but raises s).
func heatExchange(a, b diagramState) bool {
	dp := math.Abs(a.p-b.p) / math.Max(a.p, b.p)
	dh, ds := b.h-a.h, b.s-a.s
	if dp <= 1e-4 {
		return dh != 0
	}
	return dp <= maxHeatPressureDrop && float64(dh*ds) > 0
}
