package calcdoc

import (
	"html"
	"html/template"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/units"
)

// TypesetName typesets a calc name for the diff report as the package body
// does (η with subscript th); it returns escaped HTML.
func TypesetName(name string) template.HTML {
	return template.HTML(nameText(name)) // NameText escapes every part of the name
}

// TypesetValue typesets a value of the diff report, "540 degC" or "+1.5 MPa",
// with its unit as the package shows units (540 °C); text that is not a
// number followed by a known unit is only escaped.
func TypesetValue(s string) template.HTML {
	num, unit, ok := strings.Cut(s, " ")
	if !ok {
		return template.HTML(html.EscapeString(s))
	}
	if _, err := strconv.ParseFloat(num, 64); err != nil {
		return template.HTML(html.EscapeString(s))
	}
	u, err := units.Parse(unit)
	if err != nil {
		return template.HTML(html.EscapeString(s))
	}
	num = strings.Replace(num, "-", "−", 1)
	if t := unitText(u); t != "" {
		num += "\u2009" + t
	}
	return template.HTML(html.EscapeString(num))
}
