package props

import (
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// Benchmarks of a props-level state and one field read, the cost a calc
// line such as `h_1 = water(p_1, T_1).h` pays. Run with
//
//	go test ./props -run '^$' -bench . -benchmem -count 5
var benchSink any

func benchField(b *testing.B, mk func() (*State, error), field string) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		st, err := mk()
		if err != nil {
			b.Fatal(err)
		}
		v, err := st.Field(field)
		if err != nil {
			b.Fatal(err)
		}
		benchSink = v
	}
}

var (
	benchP  = units.Quantity{V: 10e6, D: units.DimPressure}
	benchP1 = units.Quantity{V: 1e6, D: units.DimPressure}
	benchT  = units.Quantity{V: 773.15, D: units.DimTemperature, T: units.Abs}
	benchTl = units.Quantity{V: 353.15, D: units.DimTemperature, T: units.Abs}
	benchTo = units.Quantity{V: 400, D: units.DimTemperature, T: units.Abs}
	benchH  = units.Quantity{V: 2.5e6, D: units.DimSpecificEnergy}
)

// BenchmarkWaterPTh: a superheated steam state (10 MPa, 500 °C) and its h.
func BenchmarkWaterPTh(b *testing.B) {
	benchField(b, func() (*State, error) { return Water(benchP, benchT) }, "h")
}

// BenchmarkWaterPTLiquidh: a compressed liquid state (10 MPa, 80 °C) and its h.
func BenchmarkWaterPTLiquidh(b *testing.B) {
	benchField(b, func() (*State, error) { return Water(benchP, benchTl) }, "h")
}

// BenchmarkWaterPHT: a wet state from (p, h) and its T.
func BenchmarkWaterPHT(b *testing.B) {
	benchField(b, func() (*State, error) { return Water(benchP1, benchH) }, "T")
}

// BenchmarkWaterPTk: a superheated steam state and its thermal conductivity.
func BenchmarkWaterPTk(b *testing.B) {
	benchField(b, func() (*State, error) { return Water(benchP, benchT) }, "k")
}

// BenchmarkFluidPTh: an organic-fluid vapour state (isopentane, 1 MPa, 400 K) and its h.
func BenchmarkFluidPTh(b *testing.B) {
	benchField(b, func() (*State, error) { return Fluid("isopentane", benchP1, benchTo) }, "h")
}
