package svgplot

import (
	"bytes"
	"encoding/xml"
	"io"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

// randomValues returns n values: clustered, spread, constant or with
// outliers far beyond the rest.
func randomValues(r *rand.Rand, n int) []float64 {
	centre := (r.Float64() - 0.5) * math.Pow(10, float64(r.IntN(8)-3))
	scale := math.Pow(10, float64(r.IntN(8)-4))
	kind := r.IntN(4)
	out := make([]float64, n)
	for i := range out {
		switch kind {
		case 0:
			out[i] = centre + scale*r.NormFloat64()
		case 1:
			out[i] = centre + scale*(r.Float64()-0.5)*100
		case 2:
			out[i] = centre
		default:
			out[i] = centre + scale*r.NormFloat64()
			if r.IntN(5) == 0 {
				out[i] *= 1e6 * (r.Float64() - 0.5)
			}
		}
	}
	return out
}

// randomPlot builds a plot of random series, points, ranges and size.
func randomPlot(r *rand.Rand) *Plot {
	p := &Plot{Title: "random", XLabel: "x", YLabel: "y"}
	for range r.IntN(5) {
		n := r.IntN(40)
		p.Series = append(p.Series, Series{
			Name: strconv.Itoa(r.IntN(3)), X: randomValues(r, n), Y: randomValues(r, n), Style: Style(r.IntN(6)),
		})
	}
	xs, ys := randomValues(r, 8), randomValues(r, 8)
	for i := range r.IntN(8) {
		p.Points = append(p.Points, Point{Label: strconv.Itoa(i + 1), X: xs[i], Y: ys[i]})
	}
	if r.IntN(2) == 0 {
		p.XMin = (r.Float64() - 0.5) * 10
		p.XMax = p.XMin + r.Float64()*10 + 1e-3
		p.YMin = (r.Float64() - 0.5) * 10
		p.YMax = p.YMin + r.Float64()*10 + 1e-3
	}
	if r.IntN(2) == 0 {
		p.Width, p.Height = 300+600*r.Float64(), 250+400*r.Float64()
	}
	return p
}

// TestInsideBox renders random plots and checks that every drawn data
// vertex, marker and state label lies inside the plot frame.
func TestInsideBox(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 97))
	rendered, checked := 0, 0
	for i := range 600 {
		p := randomPlot(r)
		b, err := p.SVG()
		if err != nil {
			if strings.Contains(err.Error(), "cannot be scaled") || strings.Contains(err.Error(), "empty plot") {
				continue
			}
			t.Fatalf("plot %d: %v", i, err)
		}
		rendered++
		checked += checkInside(t, i, b)
	}
	t.Logf("%d plots rendered, %d coordinates checked", rendered, checked)
	if rendered < 400 || checked < 10000 {
		t.Errorf("only %d plots rendered and %d coordinates checked; the generator has drifted", rendered, checked)
	}
}

// checkInside walks the SVG, checks the data coordinates against the
// frame and returns how many it checked.
func checkInside(t *testing.T, i int, b []byte) int {
	t.Helper()
	const eps = 0.006 // coordinates are written with two decimals
	frame := findFrame(t, b)
	var group string
	n := 0
	in := func(x, y float64, what string) {
		n++
		if x < frame.x0-eps || x > frame.x1+eps || y < frame.y0-eps || y > frame.y1+eps {
			t.Errorf("plot %d: %s at (%g, %g) outside the frame %+v", i, what, x, y, frame)
		}
	}
	d := xml.NewDecoder(bytes.NewReader(b))
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return n
		}
		if err != nil {
			t.Fatalf("plot %d: %v", i, err)
		}
		se, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		a := attrMap(se)
		switch {
		case se.Name.Local == "g":
			group = a["class"]
		case !isDataGroup(group):
		case se.Name.Local == "polyline":
			for _, pt := range strings.Fields(a["points"]) {
				x, y, _ := strings.Cut(pt, ",")
				in(f(x), f(y), group+" vertex")
			}
		case se.Name.Local == "circle":
			in(f(a["cx"]), f(a["cy"]), group+" marker")
		case se.Name.Local == "text":
			in(f(a["x"]), f(a["y"]), group+" label")
		}
	}
}

// findFrame returns the box of the frame rectangle.
func findFrame(t *testing.T, b []byte) rect {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(b))
	for {
		tok, err := d.Token()
		if err != nil {
			t.Fatalf("no frame: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok && se.Name.Local == "rect" {
			if a := attrMap(se); a["class"] == "frame" {
				return rect{f(a["x"]), f(a["y"]), f(a["x"]) + f(a["width"]), f(a["y"]) + f(a["height"])}
			}
		}
	}
}

func isDataGroup(class string) bool {
	return strings.HasPrefix(class, "series ") || class == "points" || class == "point-labels"
}

func attrMap(se xml.StartElement) map[string]string {
	m := make(map[string]string, len(se.Attr))
	for _, a := range se.Attr {
		m[a.Name.Local] = a.Value
	}
	return m
}

func f(s string) float64 {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return math.NaN()
	}
	return v
}

// TestClipSegment checks the joins and ends of clipped segments.
func TestClipSegment(t *testing.T) {
	b := bounds{0, 10, 0, 10}
	tests := []struct {
		a, c, wantA, wantC vec
		ok                 bool
	}{
		{vec{1, 1}, vec{9, 9}, vec{1, 1}, vec{9, 9}, true},
		{vec{-5, 5}, vec{5, 5}, vec{0, 5}, vec{5, 5}, true},
		{vec{-5, -5}, vec{15, 15}, vec{0, 0}, vec{10, 10}, true},
		{vec{-5, 11}, vec{15, 11}, vec{}, vec{}, false},
		{vec{-1, 5}, vec{5, 17}, vec{0, 7}, vec{1.5, 10}, true},
		{vec{5, 5}, vec{5, 5}, vec{5, 5}, vec{5, 5}, true},
	}
	for _, tt := range tests {
		a, c, ok := clipSegment(tt.a, tt.c, b)
		if ok != tt.ok || ok && (a != tt.wantA || c != tt.wantC) {
			t.Errorf("clipSegment(%v, %v) = %v, %v, %v; want %v, %v, %v", tt.a, tt.c, a, c, ok, tt.wantA, tt.wantC, tt.ok)
		}
	}
}

func TestClipPolylineSplits(t *testing.T) {
	pts := []vec{{1, 1}, {5, 5}, {20, 5}, {20, 6}, {5, 6}, {2, 2}}
	got := clipPolyline(pts, bounds{0, 10, 0, 10})
	if len(got) != 2 || len(got[0]) != 3 || len(got[1]) != 3 {
		t.Fatalf("clipPolyline = %v, want two pieces of three vertices", got)
	}
	if got[0][2] != (vec{10, 5}) || got[1][0] != (vec{10, 6}) {
		t.Errorf("clipPolyline = %v: pieces should leave and re-enter at x = 10", got)
	}
}

// TestLayoutRandom renders random plots, with state points and path
// labels, and checks with CheckLayout that every point and label lies
// inside the frame and that no two labels overlap.
func TestLayoutRandom(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 2026))
	rendered, labels := 0, 0
	for i := range 500 {
		p := randomPlot(r)
		if r.IntN(3) == 0 {
			addCluster(r, p)
		}
		for k := range r.IntN(4) {
			n := 2 + r.IntN(30)
			p.PathLabels = append(p.PathLabels, PathLabel{Text: Text{{Text: "p", Italic: true}, {Text: strconv.Itoa(k), Sub: true}, {Text: " = 1.5 MPa"}}, X: randomValues(r, n), Y: randomValues(r, n)})
		}
		b, err := p.SVG()
		if err != nil {
			if strings.Contains(err.Error(), "cannot be scaled") || strings.Contains(err.Error(), "empty plot") {
				continue
			}
			t.Fatalf("plot %d: %v", i, err)
		}
		rendered++
		labels += countLabels(b)
		if err := CheckLayout(b); err != nil {
			t.Errorf("plot %d: %v", i, err)
		}
	}
	t.Logf("%d plots rendered, %d labels checked", rendered, labels)
	if rendered < 300 || labels < 800 {
		t.Errorf("only %d plots rendered and %d labels checked; the generator has drifted", rendered, labels)
	}
}

// countLabels counts the state and path labels of an SVG.
func countLabels(b []byte) int {
	n := 0
	for _, g := range []string{`class="point-labels"`, `class="path-labels"`} {
		if _, rest, ok := bytes.Cut(b, []byte(g)); ok {
			group, _, _ := bytes.Cut(rest, []byte("</g>"))
			n += bytes.Count(group, []byte("<text "))
		}
	}
	return n
}

// TestCheckLayoutCatches checks that CheckLayout finds a label moved out
// of the frame, two labels on top of each other and a marker outside.
func TestCheckLayoutCatches(t *testing.T) {
	p := tsPlot(40)
	p.PathLabels = []PathLabel{{Text: Plain("10 MPa"), X: []float64{1, 3, 5}, Y: []float64{311, 311, 311}}}
	b, err := p.SVG()
	if err != nil {
		t.Fatal(err)
	}
	if err := CheckLayout(b); err != nil {
		t.Fatalf("the good plot fails: %v", err)
	}
	if n := countLabels(b); n != 5 {
		t.Fatalf("%d labels drawn, want 4 states and 1 path label", n)
	}
	s := string(b)
	i := strings.Index(s, `class="point-labels"`)
	j := i + strings.Index(s[i:], "<text ")
	k := j + strings.Index(s[j:], "</text>") + len("</text>")
	first := s[j:k]
	cases := map[string]string{
		"overlap":      s[:k] + "\n" + first + s[k:],
		"outside":      s[:j] + `<text x="-50" y="5">1</text>` + s[k:],
		"marker":       insertAfter(s, `class="points"`, `<circle cx="2" cy="2" r="3"/>`),
		"path outside": insertAfter(s, `class="path-labels"`, `<text x="1000" y="50">far</text>`),
	}
	for _, name := range []string{"overlap", "outside", "marker", "path outside"} {
		if cases[name] == s {
			t.Fatalf("%s: the mutation did not apply", name)
		}
		if err := CheckLayout([]byte(cases[name])); err == nil {
			t.Errorf("%s: CheckLayout found nothing wrong", name)
		}
	}
}

// insertAfter inserts add after the end of the start tag that holds mark.
func insertAfter(s, mark, add string) string {
	i := strings.Index(s, mark)
	if i < 0 {
		return s
	}
	i += strings.Index(s[i:], ">") + 1
	return s[:i] + add + s[i:]
}

// addCluster adds up to 12 states close together (within a few per cent
// of the data's spread, or all at one place), with labels of one to three
// characters, as the feed heaters of a cycle crowd the liquid line.
func addCluster(r *rand.Rand, p *Plot) {
	if len(p.Points) == 0 {
		return
	}
	c := p.Points[0]
	dx, dy := 0.02*(1+math.Abs(c.X)), 0.02*(1+math.Abs(c.Y))
	if r.IntN(4) == 0 {
		dx, dy = 0, 0
	}
	for i := range r.IntN(12) + 1 {
		label := strconv.Itoa(i) + strings.Repeat("b", r.IntN(3))
		p.Points = append(p.Points, Point{Label: label, X: c.X + dx*r.NormFloat64(), Y: c.Y + dy*r.NormFloat64()})
	}
}
