package eval

import (
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// TestIsGivenValue: which lines a sweep may vary.
func TestIsGivenValue(t *testing.T) {
	cases := map[string]bool{
		"x = 12":                 true,
		"x = 1.5e3":              true,
		"x = -5":                 true,
		"x = 12.5 MPa":           true,
		"x [kPa] = 12.5 MPa":     true,
		"x = -5 degC":            true,
		"x = -(5 degC)":          true,
		"x = (12 MPa)":           true,
		"x = \"isopentane\"":     true,
		"x = -\"isopentane\"":    false,
		"x = 2 * 3 MPa":          false,
		"x = 1 MPa + 2 MPa":      false,
		"x = y":                  false,
		"x = -y":                 false,
		"x = st.T":               false,
		"x = water_sat(1 MPa).T": false,
		"x = true":               false,
	}
	for line, want := range cases {
		s, errs := ParseLine(line, 0, 1, units.StandardAtmosphere)
		if len(errs) > 0 {
			t.Fatalf("%s: %v", line, errs[0].Msg)
		}
		if got := s.IsGivenValue(); got != want {
			t.Errorf("%s: given %v, want %v", line, got, want)
		}
	}
}
