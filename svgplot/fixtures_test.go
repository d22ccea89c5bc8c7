package svgplot

import "math"

// A made-up saturation dome shaped like that of water on a T-s diagram:
// s in kJ/(kg·K), T in °C. The numbers are illustrative only, not fluid
// properties.
const domeTc, domeSc = 374.0, 4.41

// liquidS and vapourS give s on the two sides of the dome at T = f·Tc.
func liquidS(f float64) float64 { return domeSc * (0.9*math.Pow(f, 0.75) + 0.1*f*f) }
func vapourS(f float64) float64 { return 9.16 - (9.16-domeSc)*math.Pow(f, 1.6) }

// fakeDome returns n points along the dome, liquid side up, vapour side down.
func fakeDome(n int) (s, t []float64) {
	half := n / 2
	for i := range half {
		f := float64(i) / float64(half-1)
		s, t = append(s, liquidS(f)), append(t, domeTc*f)
	}
	for i := n - half - 1; i >= 0; i-- {
		f := float64(i) / float64(n-half-1)
		s, t = append(s, vapourS(f)), append(t, domeTc*f)
	}
	return s, t
}

// fakeCycle returns the path of a simple Rankine cycle on the fake dome:
// pump, heating along the liquid line, boiling at 311 °C, superheating to
// 540 °C, expansion and condensation at 40 °C.
func fakeCycle() (s, t []float64) {
	s1, s3 := liquidS(40/domeTc), 6.72
	s, t = []float64{s1, s1 + 0.01}, []float64{40, 41}
	for T := 60.0; T <= 311; T += 25 {
		s, t = append(s, liquidS(T/domeTc)), append(t, T)
	}
	s, t = append(s, liquidS(311/domeTc), vapourS(311/domeTc), s3, 6.95, s1), append(t, 311, 311, 540, 40, 40)
	return s, t
}

// tsPlot is a T-s diagram of a simple Rankine cycle of a fictional plant.
func tsPlot(domePoints int) *Plot {
	ds, dt := fakeDome(domePoints)
	cs, ct := fakeCycle()
	s1 := liquidS(40 / domeTc)
	return &Plot{
		Title:  "T-s diagram, Unit 1 (fictional plant)",
		XLabel: "s [kJ/(kg·K)]",
		YLabel: "T [°C]",
		Series: []Series{
			{Name: "saturation", X: ds, Y: dt, Style: Dome},
			{Name: "cycle", X: cs, Y: ct, Style: Process},
		},
		Points: []Point{
			{Label: "1", X: s1, Y: 40, Title: "1: condensate, 7.4 kPa"},
			{Label: "2", X: s1 + 0.01, Y: 41, Title: "2: feed water, 10 MPa"},
			{Label: "3", X: 6.72, Y: 540, Title: "3: live steam, 10 MPa, 540 °C"},
			{Label: "4", X: 6.95, Y: 40, Title: "4: exhaust, quality 0.83"},
		},
	}
}
