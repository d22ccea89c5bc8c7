package svgplot

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// checkEps is the tolerance of CheckLayout, in px: coordinates are written
// with two decimals.
const checkEps = 0.011

// CheckLayout reads an SVG written by [Plot.SVG] and reports every data
// vertex, marker, state label or path label that lies outside the plot
// frame, and every two labels whose boxes overlap. Label boxes are
// estimated from their text as the placement estimates them. It is meant
// for the tests of callers that draw plots, such as the diagrams of every
// example calc.
func CheckLayout(svg []byte) error {
	frame, found := rect{}, false
	var errs []error
	var labels []rect
	var group string
	d := xml.NewDecoder(bytes.NewReader(svg))
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return err
		}
		se, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		a := attrs(se)
		switch {
		case se.Name.Local == "rect" && a["class"] == "frame":
			frame, found = rect{fnum(a["x"]), fnum(a["y"]), fnum(a["x"]) + fnum(a["width"]), fnum(a["y"]) + fnum(a["height"])}, true
		case se.Name.Local == "g":
			group = a["class"]
		case !found:
		case se.Name.Local == "text" && (group == "point-labels" || group == "path-labels"):
			r, err := labelBox(d, a, group)
			if err != nil {
				return err
			}
			labels = append(labels, r)
		case strings.HasPrefix(group, "series ") || group == "points" || group == "leaders":
			for _, v := range dataCoords(se.Name.Local, a) {
				if !inside(frame, rect{v.x, v.y, v.x, v.y}) {
					errs = append(errs, fmt.Errorf("%s %s at (%g, %g) lies outside the frame", group, se.Name.Local, v.x, v.y))
				}
			}
		}
	}
	if !found {
		return errors.New("svgplot: no frame")
	}
	return errors.Join(append(errs, labelErrors(frame, labels)...)...)
}

// labelErrors reports labels outside the frame and overlapping labels.
func labelErrors(frame rect, labels []rect) []error {
	var errs []error
	for i, r := range labels {
		if !inside(frame, r) {
			errs = append(errs, fmt.Errorf("label %d %+v leaves the frame %+v", i+1, r, frame))
		}
		for j := range i {
			o := labels[j]
			if min(r.x1, o.x1)-max(r.x0, o.x0) > checkEps && min(r.y1, o.y1)-max(r.y0, o.y0) > checkEps {
				errs = append(errs, fmt.Errorf("labels %d %+v and %d %+v overlap", j+1, o, i+1, r))
			}
		}
	}
	return errs
}

// inside reports whether r lies in frame, within checkEps.
func inside(frame, r rect) bool {
	return r.x0 >= frame.x0-checkEps && r.x1 <= frame.x1+checkEps && r.y0 >= frame.y0-checkEps && r.y1 <= frame.y1+checkEps
}

// labelBox reads the rest of a label's <text> element and returns its
// estimated box: centred on x, standing on the baseline y, reaching below
// it when it holds a subscript.
func labelBox(d *xml.Decoder, a map[string]string, group string) (rect, error) {
	fs, em := float64(fontLabel), boldEm
	if group == "path-labels" {
		fs, em = fontPath, 1
	}
	w, drop, scale := 0.0, 0.0, []float64{1}
	for depth := 1; depth > 0; {
		tok, err := d.Token()
		if err != nil {
			return rect{}, err
		}
		switch t := tok.(type) {
		case xml.StartElement:
			s := 1.0
			if attrs(t)["baseline-shift"] == "sub" {
				s, drop = subScale, float64(subDrop*fs)
			}
			scale, depth = append(scale, s), depth+1
		case xml.EndElement:
			scale, depth = scale[:len(scale)-1], depth-1
		case xml.CharData:
			w += float64(em * charEm * fs * scale[len(scale)-1] * float64(utf8.RuneCount(t)))
		}
	}
	x, y := fnum(a["x"]), fnum(a["y"])
	return rect{x - float64(w/2), y - float64(ascent*fs), x + float64(w/2), y + drop}, nil
}

// dataCoords returns the px coordinates an element draws at.
func dataCoords(name string, a map[string]string) []vec {
	switch name {
	case "polyline":
		var out []vec
		for _, pt := range strings.Fields(a["points"]) {
			x, y, _ := strings.Cut(pt, ",")
			out = append(out, vec{fnum(x), fnum(y)})
		}
		return out
	case "circle":
		return []vec{{fnum(a["cx"]), fnum(a["cy"])}}
	case "line":
		return []vec{{fnum(a["x1"]), fnum(a["y1"])}, {fnum(a["x2"]), fnum(a["y2"])}}
	}
	return nil
}

func attrs(se xml.StartElement) map[string]string {
	m := make(map[string]string, len(se.Attr))
	for _, a := range se.Attr {
		m[a.Name.Local] = a.Value
	}
	return m
}

// fnum parses a coordinate; a malformed one is NaN, which no check passes.
func fnum(s string) float64 {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return math.NaN()
	}
	return v
}
