package svgplot_test

import (
	"bytes"
	"fmt"

	"github.com/vouchcalc/vouch/svgplot"
)

func ExamplePlot_SVG() {
	p := &svgplot.Plot{
		Title:  "Pump power against flow (fictional pump P-101)",
		XLabel: "m_dot [kg/s]",
		YLabel: "P [kW]",
		Series: []svgplot.Series{{X: []float64{0, 50, 100, 150}, Y: []float64{0, 61, 123, 186}}},
		Points: []svgplot.Point{{Label: "duty", X: 120, Y: 148, Title: "duty point"}},
	}
	b, err := p.SVG()
	if err != nil {
		fmt.Println(err)
		return
	}
	first, _, _ := bytes.Cut(b, []byte("\n"))
	fmt.Println(string(first))
	// Output:
	// <svg xmlns="http://www.w3.org/2000/svg" class="svgplot" viewBox="0 0 640 420" width="640" height="420" role="img" aria-label="Pump power against flow (fictional pump P-101)" font-family="sans-serif" font-size="11" style="max-width:100%;height:auto">
}
