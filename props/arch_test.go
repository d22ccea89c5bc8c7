package props

import (
	"fmt"
	"strconv"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/internal/archtest"
	"github.com/vouchcalc/vouch/units"
)

// stateLine formats every numeric field of a state (or the error) so that
// equal text means equal bits.
func stateLine(label string, s *State, err error) string {
	if err != nil {
		return label + " error " + err.Error()
	}
	var b strings.Builder
	b.WriteString(label + " " + s.Phase)
	for _, name := range stateFields {
		if v, err := s.Field(name); err == nil {
			if q, ok := v.(units.Quantity); ok {
				b.WriteString(" " + name + "=" + strconv.FormatFloat(q.V, 'g', -1, 64))
			}
		}
	}
	return b.String()
}

// satLine formats every field of a saturation point (or the error).
func satLine(label string, s *Sat, err error) string {
	if err != nil {
		return label + " error " + err.Error()
	}
	var b strings.Builder
	b.WriteString(label)
	for _, name := range satFields {
		if v, err := s.Field(name); err == nil {
			b.WriteString(" " + name + "=" + strconv.FormatFloat(v.(units.Quantity).V, 'g', -1, 64))
		}
	}
	return b.String()
}

// propsLines evaluates water over a (p, T) grid across all IF97 regions,
// the inverse pairs (p, h), (p, s) and (h, s) at the same states, the
// saturation line, and every fluid over a (p, T) grid and its saturation
// line: the same calls the check-value tests make, over a wider range.
func propsLines(t *testing.T) []string {
	var lines []string
	for _, p := range []float64{0.001, 0.1, 1, 5, 16.5, 22, 25, 40, 80} { // MPa
		for _, T := range []float64{275, 300, 373.15, 450, 600, 640, 650, 700, 900, 1200, 1800} { // K
			label := fmt.Sprintf("water p=%g MPa T=%g K", p, T)
			s, err := Water(q(p, "MPa"), q(T, "K"))
			lines = append(lines, stateLine(label, s, err))
			if err != nil {
				continue
			}
			for _, f := range []string{"h", "s"} {
				v, _ := s.Field(f)
				inv, err := Water(q(p, "MPa"), v.(units.Quantity))
				lines = append(lines, stateLine(label+" via "+f, inv, err))
			}
			h, _ := s.Field("h")
			en, _ := s.Field("s")
			inv, err := Water(h.(units.Quantity), en.(units.Quantity))
			lines = append(lines, stateLine(label+" via h,s", inv, err))
		}
	}
	for _, T := range []float64{273.16, 300, 400, 500, 600, 640, 647} {
		sat, err := WaterSat(q(T, "K"))
		lines = append(lines, satLine(fmt.Sprintf("water sat T=%g K", T), sat, err))
	}
	for _, fl := range Fluids() {
		for _, p := range []float64{0.05, 0.5, 2, 5} {
			for _, T := range []float64{250, 300, 350, 400, 450, 500} {
				s, err := Fluid(fl.Name, q(p, "MPa"), q(T, "K"))
				lines = append(lines, stateLine(fmt.Sprintf("%s p=%g MPa T=%g K", fl.Name, p, T), s, err))
			}
		}
		for _, T := range []float64{260, 300, 340, 380} {
			sat, err := FluidSat(fl.Name, q(T, "K"))
			lines = append(lines, satLine(fmt.Sprintf("%s sat T=%g K", fl.Name, T), sat, err))
		}
	}
	return lines
}

// TestResultsDump writes propsLines for TestSameBitsOnArm64 when it runs
// this test binary on arm64.
func TestResultsDump(t *testing.T) { archtest.Dump(t, propsLines) }

// TestSameBitsOnArm64: water and every fluid give the same bits on arm64
// (under qemu-user) as here.
func TestSameBitsOnArm64(t *testing.T) { archtest.SameOnArm64(t, propsLines) }
