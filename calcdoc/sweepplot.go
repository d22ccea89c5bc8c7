package calcdoc

import (
	"fmt"
	"strings"

	"github.com/vouchcalc/vouch/svgplot"
	"github.com/vouchcalc/vouch/units"
)

// sweepPlot is one plot line of a sweep: `plot a, b` draws the shown
// results a and b on one axis (they must share a dimension); `plot v limit
// v_max` also draws the value of the calc's v_max as a labelled line.
type sweepPlot struct {
	names []field
	limit field // text empty when there is no limit
	off   int
}

// Bounds on a sweep's plots, so that a short line cannot ask for a
// drawing that takes minutes: names on one plot line, plot lines in one
// sweep.
const (
	MaxPlotNames  = 8
	MaxSweepPlots = 16
)

// readPlotLine parses the rest of a plot line: NAME, ... [limit NAME].
func readPlotLine(rest string, off int) (sweepPlot, string) {
	pl := sweepPlot{off: off}
	list, lim, hasLimit := strings.Cut(rest, " limit ")
	pl.names = splitList(list, off)
	if len(pl.names) == 0 {
		return pl, "write: plot NAME, ... or plot NAME limit LIMIT_NAME"
	}
	if len(pl.names) > MaxPlotNames {
		return pl, fmt.Sprintf("plot: %d names on one plot line; a plot shows at most %d, so write a second plot line", len(pl.names), MaxPlotNames)
	}
	if hasLimit {
		name := strings.TrimSpace(lim)
		if name == "" || strings.ContainsAny(name, ", ") {
			return pl, "write the limit as one name: plot NAME limit LIMIT_NAME"
		}
		pl.limit = field{name, off + len(list) + len(" limit ") + strings.Index(lim, name)}
	}
	return pl, ""
}

// sweepPlots builds the plots of a sweep.
func (d *Doc) sweepPlots(sw *Sweep) {
	for _, pl := range sw.plots {
		svg, err := d.drawSweepPlot(sw, pl)
		if err != nil {
			d.errorf(err.off, "%s", err.msg)
			continue
		}
		sw.SVGs = append(sw.SVGs, svg)
	}
}

// plotError is a problem with a plot line, at an offset in the source.
type plotError struct {
	off int
	msg string
}

// plotColumns finds the shown column of each plotted name and checks that
// they share the first one's dimension.
func (d *Doc) plotColumns(sw *Sweep, pl sweepPlot) ([]int, *plotError) {
	var cols []int
	for _, n := range pl.names {
		col := -1
		for j, c := range sw.Show {
			if c.Name == n.text && !c.U {
				col = j
			}
		}
		if col < 0 {
			return nil, &plotError{n.off, fmt.Sprintf("plot %s: show %s in the same sweep first", n.text, n.text)}
		}
		if len(cols) > 0 {
			first, this := sw.Rows[0][cols[0]].D, sw.Rows[0][col].D
			if this != first {
				return nil, &plotError{n.off, fmt.Sprintf("plot %s, %s: %s is %s but %s is %s; one plot shows values of one dimension, so write them on two plot lines",
					pl.names[0].text, n.text, pl.names[0].text, first.Name(), n.text, this.Name())}
			}
		}
		cols = append(cols, col)
	}
	return cols, nil
}

// plotStyles are the styles of the series of a sweep plot, in order.
var plotStyles = [...]svgplot.Style{svgplot.Process, svgplot.Line, svgplot.Branch, svgplot.Dashed}

// drawSweepPlot draws one plot line: each name against the varied input,
// marked at the computed points, and the limit when there is one.
func (d *Doc) drawSweepPlot(sw *Sweep, pl sweepPlot) ([]byte, *plotError) {
	cols, perr := d.plotColumns(sw, pl)
	if perr != nil {
		return nil, perr
	}
	yu := d.ColumnUnit(sw.Show[cols[0]], sw.Rows[0][cols[0]])
	p := &svgplot.Plot{}
	var names []svgplot.Text
	for k, col := range cols {
		name := sw.Show[col].Name
		s := svgplot.Series{Name: name, Label: nameRuns(name), Style: plotStyles[k%len(plotStyles)], Marked: true}
		for i, x := range sw.X {
			xv, err := x.In(sw.XUnit, d.Front.Ctx)
			if err != nil {
				return nil, &plotError{pl.off, err.Error()}
			}
			yv, err := sw.Rows[i][col].In(yu, d.Front.Ctx)
			if err != nil {
				return nil, &plotError{pl.names[k].off, err.Error()}
			}
			s.X, s.Y = append(s.X, xv), append(s.Y, yv)
		}
		p.Series = append(p.Series, s)
		p.Series = append(p.Series, d.bandSeries(sw, name, s, yu)...)
		names = append(names, nameRuns(name))
	}
	if pl.limit.text != "" {
		if perr := d.plotLimit(p, sw, pl.limit, yu); perr != nil {
			return nil, perr
		}
	}
	title := joinText(", ", names...)
	p.TitleText = joinText(" against ", title, nameRuns(sw.Var))
	p.Title = p.TitleText.String()
	p.XText = axisText(sw.Var, sw.XUnit)
	p.YText = title
	if ut := unitText(yu); ut != "" {
		p.YText = append(p.YText, svgplot.Run{Text: " [" + ut + "]"})
	}
	svg, err := p.SVG()
	if err != nil {
		return nil, &plotError{pl.off, "plot: " + err.Error()}
	}
	return svg, nil
}

// plotLimit adds the value of the calc's name lim as a dashed line across
// the plot, labelled with its name and value.
func (d *Doc) plotLimit(p *svgplot.Plot, sw *Sweep, lim field, yu units.Unit) *plotError {
	o, ok := d.outcomeOf(lim.text)
	if !ok {
		return &plotError{lim.off, fmt.Sprintf("plot limit %s: the calc does not define %s", lim.text, lim.text)}
	}
	if lim.text == sw.Var || d.planSweep(sw.Var).redo[lim.text] {
		first := p.Series[0].Name
		return &plotError{lim.off, fmt.Sprintf("plot %s limit %s: %s depends on %s, so it changes along the sweep and is not one line; show %s and plot it with %s: plot %s, %s",
			first, lim.text, lim.text, sw.Var, lim.text, first, first, lim.text)}
	}
	q, isQ := o.Value.(units.Quantity)
	first := p.Series[0]
	if !isQ || q.D != yu.Dim {
		return &plotError{lim.off, fmt.Sprintf("plot %s limit %s: %s is %s but %s is %s", first.Name, lim.text, first.Name, yu.Dim.Name(), lim.text, kindName(o.Value))}
	}
	v, err := q.In(yu, d.Front.Ctx)
	if err != nil {
		return &plotError{lim.off, err.Error()}
	}
	lo, hi := first.X[0], first.X[len(first.X)-1]
	xs, ys := []float64{lo, hi}, []float64{v, v}
	p.Series = append(p.Series, svgplot.Series{Name: lim.text, Label: nameRuns(lim.text), X: xs, Y: ys, Style: svgplot.Dashed})
	p.PathLabels = append(p.PathLabels, svgplot.PathLabel{Text: namedValue(lim.text, q, yu, d.Front.Digits, d.Front.Ctx), X: xs, Y: ys})
	return nil
}
