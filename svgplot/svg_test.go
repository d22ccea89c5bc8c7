package svgplot

import (
	"bytes"
	"encoding/xml"
	"flag"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata")

// sweepPlot is a sweep of net efficiency over condenser pressure for
// three fictional units.
func sweepPlot() *Plot {
	p := []float64{4, 5, 6, 7, 8, 9, 10, 12}
	eff := func(a, b float64) []float64 {
		out := make([]float64, len(p))
		for i, v := range p {
			out[i] = a - b*math.Log(v)
		}
		return out
	}
	return &Plot{
		Title:  "Net efficiency against condenser pressure (fictional units)",
		XLabel: "p_cond [kPa]",
		YLabel: "η_net [%]",
		Series: []Series{
			{Name: "Unit A", X: p, Y: eff(41.2, 1.1)},
			{Name: "Unit B", X: p, Y: eff(40.1, 0.9), Style: Dashed},
			{Name: "test points", X: []float64{5, 7.5, 11}, Y: []float64{39.5, 38.9, 38.6}, Style: Markers},
		},
	}
}

// clippedPlot fixes ranges that cut the cycle and leave one state outside.
func clippedPlot() *Plot {
	p := tsPlot(40)
	p.Title = ""
	p.XMin, p.XMax, p.YMin, p.YMax = 0, 7, 100, 500
	p.Width, p.Height = 480, 320
	return p
}

// escapePlot puts markup and quotes in every piece of text.
func escapePlot() *Plot {
	bad := `<script>alert("x")</script> & 'q'`
	return &Plot{
		Title: bad, XLabel: bad, YLabel: `"y"`,
		Series: []Series{
			{Name: bad, X: []float64{0, 1}, Y: []float64{0, 1}},
			{Name: `a"b`, X: []float64{0, 1}, Y: []float64{1, 0}, Style: Dashed},
		},
		Points: []Point{{Label: `<b>"1"</b>`, X: 0.5, Y: 0.5, Title: bad + "\x00\xff"}},
	}
}

// smallPlot has negative values and decimal ticks, and no labels.
func smallPlot() *Plot {
	return &Plot{Series: []Series{{X: []float64{-0.031, 0, 0.012, 0.024}, Y: []float64{-0.3, 0.05, 0.2, 0.24}}}}
}

// sym returns a typeset name: an italic symbol with an upright subscript.
func sym(base, sub string) Text {
	t := Text{{Text: base, Italic: true}}
	if sub != "" {
		t = append(t, Run{Text: sub, Sub: true})
	}
	return t
}

// typesetPlot is a sweep plot with typeset title, axes and legend, two
// marked series and a check limit drawn as a labelled line.
func typesetPlot() *Plot {
	x := []float64{4, 6, 8, 10, 12}
	return &Plot{
		Title:     "eta_th, eta_net against p_cond",
		TitleText: append(append(append(sym("η", "th"), Run{Text: ", "}), append(sym("η", "net"), Run{Text: " against "})...), sym("p", "cond")...),
		XText:     append(sym("p", "cond"), Run{Text: " [kPa]"}),
		YText:     Text{{Text: "efficiency [%]"}},
		Series: []Series{
			{Name: "eta_th", Label: sym("η", "th"), X: x, Y: []float64{41.0, 40.4, 39.9, 39.5, 39.2}, Style: Process, Marked: true},
			{Name: "eta_net", Label: sym("η", "net"), X: x, Y: []float64{38.6, 38.1, 37.7, 37.3, 37.0}, Style: Line, Marked: true},
			{Name: "eta_min", Label: sym("η", "min"), X: []float64{4, 12}, Y: []float64{37.5, 37.5}, Style: Dashed},
		},
		PathLabels: []PathLabel{{Text: append(sym("η", "min"), Run{Text: " = 37.5 %"}), X: []float64{4, 12}, Y: []float64{37.5, 37.5}}},
	}
}

// crowdedPlot is a cycle with many states close together and isobar
// labels, for the placement of labels.
func crowdedPlot() *Plot {
	p := tsPlot(60)
	p.Title = "Crowded states (fictional plant)"
	for i := range 10 {
		f := float64(i)
		p.Points = append(p.Points, Point{Label: "b" + string(rune('0'+i)), X: 1.2 + 0.05*f, Y: 150 + 6*f})
	}
	p.PathLabels = []PathLabel{
		{Text: Plain("10 MPa"), X: []float64{liquidS(0.2), liquidS(311 / domeTc), vapourS(311 / domeTc), 6.72}, Y: []float64{41, 311, 311, 540}},
		{Text: Plain("7.4 kPa"), X: []float64{6.95, liquidS(40 / domeTc)}, Y: []float64{40, 40}},
	}
	return p
}

var goldens = []struct {
	name string
	plot func() *Plot
}{
	{"ts_cycle", func() *Plot { return tsPlot(60) }},
	{"sweep", sweepPlot},
	{"clipped", clippedPlot},
	{"escape", escapePlot},
	{"small", smallPlot},
	{"typeset", typesetPlot},
	{"crowded", crowdedPlot},
}

func TestGolden(t *testing.T) {
	for _, g := range goldens {
		t.Run(g.name, func(t *testing.T) {
			got, err := g.plot().SVG()
			if err != nil {
				t.Fatal(err)
			}
			checkWellFormed(t, got)
			if err := CheckLayout(got); err != nil {
				t.Error(err)
			}
			path := filepath.Join("testdata", g.name+".svg")
			if *update {
				if err := os.WriteFile(path, got, 0o644); err != nil {
					t.Fatal(err)
				}
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run go test ./svgplot/ -update to create it)", err)
			}
			if !bytes.Equal(got, want) {
				t.Errorf("output differs from %s; run go test ./svgplot/ -run TestGolden -update and review the diff", path)
			}
		})
	}
}

// checkWellFormed parses the SVG as XML and checks the outer element.
func checkWellFormed(t *testing.T, b []byte) {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(b))
	for {
		_, err := d.Token()
		if err != nil {
			if err.Error() != "EOF" {
				t.Fatalf("not well-formed XML: %v", err)
			}
			break
		}
	}
	if !bytes.HasPrefix(b, []byte(`<svg xmlns="http://www.w3.org/2000/svg" `)) {
		t.Errorf("output does not start with an <svg> element: %.60q", b)
	}
	for _, bad := range []string{"<?xml", "<script", "href", "url(", "@import"} {
		if bytes.Contains(b, []byte(bad)) {
			t.Errorf("output contains %q", bad)
		}
	}
}

func TestEscape(t *testing.T) {
	b, err := escapePlot().SVG()
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	for _, want := range []string{
		`aria-label="&lt;script&gt;alert(&#34;x&#34;)&lt;/script&gt; &amp; &#39;q&#39;"`,
		`>&lt;script&gt;alert(&#34;x&#34;)&lt;/script&gt; &amp; &#39;q&#39;</text>`,
		`>&#34;y&#34;</text>`,
		`>a&#34;b</text>`,
		`>&lt;b&gt;&#34;1&#34;&lt;/b&gt;</text>`,
		"&#39;q&#39; \uFFFD</title>", // NUL becomes a space, a bad byte U+FFFD
	} {
		if !strings.Contains(s, want) {
			t.Errorf("output lacks %s", want)
		}
	}
}

func TestDeterministic(t *testing.T) {
	for _, g := range goldens {
		a, err1 := g.plot().SVG()
		b, err2 := g.plot().SVG()
		if err1 != nil || err2 != nil || !bytes.Equal(a, b) {
			t.Errorf("%s: two renders differ (errors %v, %v)", g.name, err1, err2)
		}
	}
}

func TestLegend(t *testing.T) {
	tests := []struct {
		names []string
		want  bool
	}{
		{[]string{"", ""}, false},
		{[]string{"a", ""}, false},
		{[]string{"a", "b"}, true},
	}
	for _, tt := range tests {
		p := &Plot{}
		for _, n := range tt.names {
			p.Series = append(p.Series, Series{Name: n, X: []float64{0, 1}, Y: []float64{0, 1}})
		}
		b, err := p.SVG()
		if err != nil {
			t.Fatal(err)
		}
		if got := bytes.Contains(b, []byte(`class="legend"`)); got != tt.want {
			t.Errorf("names %q: legend drawn = %v, want %v", tt.names, got, tt.want)
		}
	}
}

func TestPointOutsideRangeIsLeftOut(t *testing.T) {
	p := &Plot{XMin: 0, XMax: 1, YMin: 0, YMax: 1,
		Points: []Point{{Label: "in", X: 0.5, Y: 0.5}, {Label: "out", X: 2, Y: 0.5}}}
	b, err := p.SVG()
	if err != nil {
		t.Fatal(err)
	}
	if n := bytes.Count(b, []byte("<circle")); n != 1 || bytes.Contains(b, []byte(">out<")) {
		t.Errorf("want one marker and no label for the point outside the range; got %d markers:\n%s", n, b)
	}
}

func TestStyleString(t *testing.T) {
	want := []string{"line", "dashed", "dome", "process", "markers", "branch"}
	for i, w := range want {
		if got := Style(i).String(); got != w {
			t.Errorf("Style(%d).String() = %q, want %q", i, got, w)
		}
	}
	if got := Style(9).String(); got != "style(9)" {
		t.Errorf("Style(9).String() = %q", got)
	}
}

func TestErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	line := func(x, y []float64) []Series { return []Series{{Name: "a", X: x, Y: y}} }
	one := []float64{1, 2}
	tests := []struct {
		name string
		plot Plot
		want string
	}{
		{"empty", Plot{}, "svgplot: empty plot: no series data and no points"},
		{"empty series", Plot{Series: line(nil, nil)}, "svgplot: empty plot: no series data and no points"},
		{"nan x", Plot{Series: line([]float64{1, nan}, one)}, `svgplot: series 1 ("a"): X[1] = NaN is not finite`},
		{"inf y", Plot{Series: line(one, []float64{inf, 1})}, `svgplot: series 1 ("a"): Y[0] = +Inf is not finite`},
		{"lengths", Plot{Series: line(one, []float64{1})}, `svgplot: series 1 ("a"): len(X) = 2 but len(Y) = 1`},
		{"style", Plot{Series: []Series{{X: one, Y: one, Style: 7}}}, `svgplot: series 1 (""): unknown style 7`},
		{"point", Plot{Points: []Point{{Label: "3", X: 1, Y: nan}}}, `svgplot: point 1 ("3"): y = NaN is not finite`},
		{"inverted x", Plot{Series: line(one, one), XMin: 5, XMax: 2}, "svgplot: x range: xmin = 5 is not below xmax = 2"},
		{"empty y range", Plot{Series: line(one, one), YMin: 3, YMax: 3}, "svgplot: y range: ymin = 3 is not below ymax = 3"},
		{"one end", Plot{Series: line(one, one), XMin: 1}, "svgplot: x range: xmin = 1 is not below xmax = 0"},
		{"inf range", Plot{Series: line(one, one), YMax: inf}, "svgplot: ymax = +Inf is not finite"},
		{"width", Plot{Series: line(one, one), Width: -1}, "svgplot: width = -1 is negative"},
		{"nan height", Plot{Series: line(one, one), Height: nan}, "svgplot: height = NaN is not finite"},
		{"small height", Plot{Series: line(one, one), Height: 60}, "svgplot: height = 60 leaves no room for the plot area"},
		{"small width", Plot{Series: line(one, one), Width: 60}, "svgplot: width = 60 leaves no room for the plot area"},
		{"narrow data", Plot{Series: line([]float64{1e15, 1e15 + 1}, one)},
			"svgplot: x data from 1e+15 to 1.000000000000001e+15 cannot be scaled: the span is too narrow for the magnitude or too wide"},
		{"wide range", Plot{Series: line(one, one), YMin: -math.MaxFloat64, YMax: math.MaxFloat64},
			"svgplot: y range from -1.7976931348623157e+308 to 1.7976931348623157e+308 cannot be scaled: the span is too narrow for the magnitude or too wide"},
		{"several", Plot{Series: line([]float64{nan}, []float64{1, 2}), XMin: 2, XMax: 1},
			"svgplot: x range: xmin = 2 is not below xmax = 1\n" +
				`svgplot: series 1 ("a"): len(X) = 1 but len(Y) = 2` + "\n" +
				`svgplot: series 1 ("a"): X[0] = NaN is not finite`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b, err := tt.plot.SVG()
			if err == nil {
				t.Fatalf("no error; output:\n%s", b)
			}
			if err.Error() != tt.want {
				t.Errorf("error\n got: %s\nwant: %s", err, tt.want)
			}
		})
	}
}
