package calcdoc

import (
	"math"
	"strings"

	gast "github.com/yuin/goldmark/ast"

	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/svgplot"
	"github.com/vouchcalc/vouch/units"
)

// Diagram is one diagram of a `diagram` block: a T-s or h-s diagram of the
// cycle through the named states, in order, closed back to the first, with
// the open branches (bleed steam, heater drains) of the `branch` lines
// that follow it.
//
//	T-s: st_1, st_b, st_2, st_3, st_4, st_5
//	branch: st_b, st_d
type Diagram struct {
	Kind     string // "T-s" or "h-s"
	Off      int
	States   []field
	Branches [][]field
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
		if !ok || (kind != "T-s" && kind != "h-s" && kind != "branch") {
			d.errorf(l.off, "write a diagram line as T-s: st_1, st_2, ... or h-s: st_1, st_2, ..., and a branch of the cycle above it as branch: st_1, st_2, ...")
			continue
		}
		states := splitList(list, l.off+strings.Index(l.text, ":")+1)
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
	p := &svgplot.Plot{Title: dg.Kind + " diagram (" + fluid + ")", XLabel: "s [kJ/(kg·K)]", YLabel: "T [°C]"}
	if dg.Kind == "h-s" {
		p.YLabel = "h [kJ/kg]"
	}
	y := func(c props.CurvePoint) float64 {
		if dg.Kind == "h-s" {
			return c.H / 1000
		}
		return c.T - 273.15
	}
	dome, err := props.Dome(fluid, 80, domeStart(all))
	if err != nil {
		d.errorf(dg.Off, "diagram: %v", err)
		return
	}
	p.Series = append(p.Series, curveSeries("saturation line", dome, y, svgplot.Dome))
	path, err := processPath(states, true)
	if err != nil {
		d.errorf(dg.Off, "diagram: %v", err)
		return
	}
	p.Series = append(p.Series, curveSeries("cycle", path, y, svgplot.Process))
	for i, b := range branches {
		path, err := processPath(b, false)
		if err != nil {
			d.errorf(dg.Branches[i][0].off, "diagram: %v", err)
			return
		}
		p.Series = append(p.Series, curveSeries("branch", path, y, svgplot.Branch))
	}
	labelled := map[string]bool{}
	for _, s := range all {
		if labelled[s.name] {
			continue
		}
		labelled[s.name] = true
		c := props.CurvePoint{T: s.T, S: s.s, H: s.h}
		p.Points = append(p.Points, svgplot.Point{Label: stateLabel(s.name), X: s.s / 1000, Y: y(c), Title: s.name})
	}
	entropyAxis(p)
	svg, err := p.SVG()
	if err != nil {
		d.errorf(dg.Off, "diagram: %v", err)
		return
	}
	dg.SVG = svg
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
	}
	end := states[len(states)-1]
	if closed {
		end = states[0]
	}
	out = append(out, props.CurvePoint{T: end.T, S: end.s, H: end.h})
	return out, nil
}

// sweepPlots builds the plots of a sweep: each named result against the
// varied input.
func (d *Doc) sweepPlots(sw *Sweep) {
	for k, name := range sw.Plot {
		col := -1
		for j, c := range sw.Show {
			if c.Name == name {
				col = j
			}
		}
		if col < 0 {
			d.errorf(sw.plotOffs[k], "plot %s: show %s in the same sweep first", name, name)
			continue
		}
		svg, err := d.sweepPlot(sw, col)
		if err != nil {
			d.errorf(sw.plotOffs[k], "plot %s: %v", name, err)
			continue
		}
		sw.SVGs = append(sw.SVGs, svg)
	}
}

func (d *Doc) sweepPlot(sw *Sweep, col int) ([]byte, error) {
	c := sw.Show[col]
	yu := d.ColumnUnit(c, sw.Rows[0][col])
	s := svgplot.Series{Name: c.Name, Style: svgplot.Process}
	for i, x := range sw.X {
		xv, err := x.In(sw.XUnit, d.Front.Ctx)
		if err != nil {
			return nil, err
		}
		yv, err := sw.Rows[i][col].In(yu, d.Front.Ctx)
		if err != nil {
			return nil, err
		}
		s.X, s.Y = append(s.X, xv), append(s.Y, yv)
	}
	p := &svgplot.Plot{Title: plainName(c.Name) + " against " + plainName(sw.Var), XLabel: axisLabel(sw.Var, sw.XUnit), YLabel: axisLabel(c.Name, yu), Series: []svgplot.Series{s}}
	return p.SVG()
}

func axisLabel(name string, u units.Unit) string {
	if t := unitText(u); t != "" {
		return plainName(name) + " [" + t + "]"
	}
	return plainName(name)
}

// entropyAxis starts the entropy axis at zero when no point lies left of it,
// as engineers draw T-s and h-s diagrams, and lets the other axis range
// itself.
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
	p.XMin, p.XMax = 0, math.Max(xt[len(xt)-1], hi)
	p.YMin, p.YMax = math.Min(yt[0], ylo), math.Max(yt[len(yt)-1], yhi)
}

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
	return dp <= maxHeatPressureDrop && dh*ds > 0
}
