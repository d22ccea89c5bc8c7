package if97

import (
	"math"
	"testing"
)

// sr4Checks holds every computer-program verification value of IAPWS SR4-04(2014)
// (testdata/sr_check-values.csv). Inputs and values are in the release's units.
var sr4Checks = []srCheck{
	{src: "IAPWS SR4-04(2014) Table 5", fn: "P3HS", in1: 1700, in2: 3.8, want: "2.555703246e1"},       // h kJ/kg, s kJ/(kg K) → p MPa
	{src: "IAPWS SR4-04(2014) Table 5", fn: "P3HS", in1: 2000, in2: 4.2, want: "4.540873468e1"},       // h kJ/kg, s kJ/(kg K) → p MPa
	{src: "IAPWS SR4-04(2014) Table 5", fn: "P3HS", in1: 2100, in2: 4.3, want: "6.078123340e1"},       // h kJ/kg, s kJ/(kg K) → p MPa
	{src: "IAPWS SR4-04(2014) Table 5", fn: "P3HS", in1: 2600, in2: 5.1, want: "3.434999263e1"},       // h kJ/kg, s kJ/(kg K) → p MPa
	{src: "IAPWS SR4-04(2014) Table 5", fn: "P3HS", in1: 2400, in2: 4.7, want: "6.363924887e1"},       // h kJ/kg, s kJ/(kg K) → p MPa
	{src: "IAPWS SR4-04(2014) Table 5", fn: "P3HS", in1: 2700, in2: 5.0, want: "8.839043281e1"},       // h kJ/kg, s kJ/(kg K) → p MPa
	{src: "IAPWS SR4-04(2014) Table 11", fn: "H1SatLiqS", in1: 1.0, in2: 0, want: "3.085509647e2"},    // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 11", fn: "H1SatLiqS", in1: 2.0, in2: 0, want: "7.006304472e2"},    // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 11", fn: "H1SatLiqS", in1: 3.0, in2: 0, want: "1.198359754e3"},    // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 11", fn: "H3aSatLiqS", in1: 3.8, in2: 0, want: "1.685025565e3"},   // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 11", fn: "H3aSatLiqS", in1: 4.0, in2: 0, want: "1.816891476e3"},   // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 11", fn: "H3aSatLiqS", in1: 4.2, in2: 0, want: "1.949352563e3"},   // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 18", fn: "H2abSatVapS", in1: 7.0, in2: 0, want: "2.723729985e3"},  // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 18", fn: "H2abSatVapS", in1: 8.0, in2: 0, want: "2.599047210e3"},  // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 18", fn: "H2abSatVapS", in1: 9.0, in2: 0, want: "2.511861477e3"},  // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 18", fn: "H2c3bSatVapS", in1: 5.5, in2: 0, want: "2.687693850e3"}, // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 18", fn: "H2c3bSatVapS", in1: 5.0, in2: 0, want: "2.451623609e3"}, // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 18", fn: "H2c3bSatVapS", in1: 4.5, in2: 0, want: "2.144360448e3"}, // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 24", fn: "HB13S", in1: 3.7, in2: 0, want: "1.632525047e3"},        // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 24", fn: "HB13S", in1: 3.6, in2: 0, want: "1.593027214e3"},        // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 24", fn: "HB13S", in1: 3.5, in2: 0, want: "1.566104611e3"},        // s kJ/(kg K) → h kJ/kg
	{src: "IAPWS SR4-04(2014) Table 26", fn: "TB23HS", in1: 2600, in2: 5.1, want: "7.135259364e2"},    // h kJ/kg, s kJ/(kg K) → T K
	{src: "IAPWS SR4-04(2014) Table 26", fn: "TB23HS", in1: 2700, in2: 5.15, want: "7.685345532e2"},   // h kJ/kg, s kJ/(kg K) → T K
	{src: "IAPWS SR4-04(2014) Table 26", fn: "TB23HS", in1: 2800, in2: 5.2, want: "8.176202120e2"},    // h kJ/kg, s kJ/(kg K) → T K
	{src: "IAPWS SR4-04(2014) Table 29", fn: "TSatHS", in1: 1800, in2: 5.3, want: "3.468475498e2"},    // h kJ/kg, s kJ/(kg K) → T K
	{src: "IAPWS SR4-04(2014) Table 29", fn: "TSatHS", in1: 2400, in2: 6.0, want: "4.251373305e2"},    // h kJ/kg, s kJ/(kg K) → T K
	{src: "IAPWS SR4-04(2014) Table 29", fn: "TSatHS", in1: 2500, in2: 5.5, want: "5.225579013e2"},    // h kJ/kg, s kJ/(kg K) → T K
}

// sr4Funcs calls the SR4-04 functions in the release's units (kJ/kg, kJ/(kg·K), MPa, K).
var sr4Funcs = map[string]func(a, b float64) float64{
	"P3HS":         func(h, s float64) float64 { return P3HS(h*1e3, s*1e3) / 1e6 },
	"H1SatLiqS":    func(s, _ float64) float64 { return H1SatLiqS(s*1e3) / 1e3 },
	"H3aSatLiqS":   func(s, _ float64) float64 { return H3aSatLiqS(s*1e3) / 1e3 },
	"H2abSatVapS":  func(s, _ float64) float64 { return H2abSatVapS(s*1e3) / 1e3 },
	"H2c3bSatVapS": func(s, _ float64) float64 { return H2c3bSatVapS(s*1e3) / 1e3 },
	"HB13S":        func(s, _ float64) float64 { return HB13S(s*1e3) / 1e3 },
	"TB23HS":       func(h, s float64) float64 { return TB23HS(h*1e3, s*1e3) },
	"TSatHS":       func(h, s float64) float64 { return TSatHS(h*1e3, s*1e3) },
}

func TestSR4CheckValues(t *testing.T) { srRun(t, sr4Checks, sr4Funcs) }

func BenchmarkSR4TSatHS(b *testing.B) {
	h := []float64{1800e3, 2400e3, 2500e3, 2200e3}
	s := []float64{5.3e3, 6.0e3, 5.5e3, 6.5e3}
	var sum float64
	for i := 0; b.Loop(); i++ {
		sum += TSatHS(h[i&3], s[i&3])
	}
	srSink = sum
}

// TestSR4Joins checks where the SR4-04 equations meet each other and the critical point:
// p3(h,s) at the critical point to 0.002 % (IAPWS SR4-04(2014) Table 1;
// testdata/sr_consistency-tolerances.csv); h'3a(s_c) = h″2c3b(s_c) = hc = 2087.546845 kJ/kg
// (IAPWS SR4-04(2014) Section 4, testdata/sr_constants.csv) to half a unit of the printed last
// digit; and Tsat(h,s) at h″, s″ of 623.15 K (IAPWS SR3-03(2014) Section 4.3) to 25 mK
// (IAPWS SR4-04(2014) Table 27).
func TestSR4Joins(t *testing.T) {
	const hc = 2087.546845e3 // J/kg, SR4-04 Section 4
	for _, c := range []struct {
		name      string
		got, want float64
		tol       float64
	}{
		{"P3HS(hc, s_c)", P3HS(hc, srSc), 22.064e6, 2e-5 * 22.064e6},                        // SR4-04 Table 1: 0.002 %
		{"H3aSatLiqS(s_c)", H3aSatLiqS(srSc), hc, 0.5e-3},                                   // hc printed 2.087546845e3 kJ/kg
		{"H2c3bSatVapS(s_c)", H2c3bSatVapS(srSc), hc, 0.5e-3},                               // hc printed 2.087546845e3 kJ/kg
		{"TSatHS(h″, s″ at 623.15 K)", TSatHS(2563.592004e3, 5.210887825e3), 623.15, 25e-3}, // SR3-03 Section 4.3 end points; SR4-04 Table 27: 25 mK
	} {
		if d := c.got - c.want; !(math.Abs(d) <= c.tol) {
			t.Errorf("%s = %.10g, want %.10g ± %.2g", c.name, c.got, c.want, c.tol)
		}
	}
}
