package units

import (
	"errors"
	"math"
	"math/rand"
	"strings"
	"testing"
)

// Conversion factors from NIST SP 811 (2008) Appendix B.8/B.9. Values marked
// exact are exact by definition; the others are NIST's 7-figure roundings.
func TestFactorsNIST(t *testing.T) {
	cases := []struct {
		unit  string
		si    float64
		exact bool
	}{
		{"psi", 6.894757e3, false},      // NIST SP 811 B.9: psi = 6.894 757 E+03 Pa
		{"BTU", 1.05505585262e3, true},  // NIST SP 811 B.9: Btu_IT = 1.055 055 852 62 E+03 J (exact)
		{"lb", 4.5359237e-1, true},      // NIST SP 811 B.9: lb (avoirdupois) = 4.535 923 7 E-01 kg (exact)
		{"lbf", 4.4482216152605, true},  // NIST SP 811 B.9: lbf = 4.448 222 E+00 N (exact: 0.45359237 kg × 9.80665 m/s²)
		{"ft", 3.048e-1, true},          // NIST SP 811 B.9: ft = 3.048 E-01 m (exact)
		{"in", 2.54e-2, true},           // NIST SP 811 B.9: in = 2.54 E-02 m (exact)
		{"gal", 3.785411784e-3, true},   // NIST SP 811 B.9: gal (US) = 3.785 412 E-03 m³ (exact: 231 in³)
		{"hp", 7.456999e2, false},       // NIST SP 811 B.9: hp (550 ft·lbf/s) = 7.456 999 E+02 W
		{"atm", 1.01325e5, true},        // NIST SP 811 B.9: atm (standard) = 1.013 25 E+05 Pa (exact)
		{"kWh", 3.6e6, true},            // NIST SP 811 B.9: kW·h = 3.6 E+06 J (exact)
		{"TR", 3.516853e3, false},       // NIST SP 811 B.9: ton of refrigeration (12 000 Btu_IT/h) = 3.516 853 E+03 W
		{"bar", 1e5, true},              // NIST SP 811 B.9: bar = 1.0 E+05 Pa (exact)
		{"bara", 1e5, true},             // NIST SP 811 B.9: bar = 1.0 E+05 Pa (exact); "a" marks absolute
		{"mbara", 1e2, true},            // NIST SP 811 B.9: bar = 1.0 E+05 Pa (exact); SI prefix m = 10⁻³
		{"psia", 6.894757e3, false},     // NIST SP 811 B.9: psi = 6.894 757 E+03 Pa; "a" marks absolute
		{"kPaa", 1e3, true},             // SI prefix k = 10³ (BIPM SI Brochure Table 7); "a" marks absolute
		{"MPaa", 1e6, true},             // SI prefix M = 10⁶ (BIPM SI Brochure Table 7); "a" marks absolute
		{"barg", 1e5, true},             // NIST SP 811 B.9: bar = 1.0 E+05 Pa (exact); gauge: the interval factor
		{"mbarg", 1e2, true},            // NIST SP 811 B.9 and SI prefix m = 10⁻³; gauge: the interval factor
		{"psig", 6.894757e3, false},     // NIST SP 811 B.9: psi = 6.894 757 E+03 Pa; gauge: the interval factor
		{"kPag", 1e3, true},             // SI prefix k = 10³ (BIPM SI Brochure Table 7); gauge: the interval factor
		{"MPag", 1e6, true},             // SI prefix M = 10⁶ (BIPM SI Brochure Table 7); gauge: the interval factor
		{"L", 1e-3, true},               // NIST SP 811 B.9: L = 1.0 E-03 m³ (exact)
		{"kJ/(kg*K)", 1e3, true},        // SI prefix k = 10³ (BIPM SI Brochure Table 7)
		{"MPa", 1e6, true},              // SI prefix M = 10⁶ (BIPM SI Brochure Table 7)
		{"BTU/(lb*degF)", 4186.8, true}, // NIST SP 811 B.9: Btu_IT/(lb·°F) = 4.1868 E+03 J/(kg·K) (exact)
		{"BTU/lb", 2326, true},          // NIST SP 811 B.9: Btu_IT/lb = 2.326 E+03 J/kg (exact)
	}
	for _, c := range cases {
		t.Run(c.unit, func(t *testing.T) {
			u, err := Parse(c.unit)
			if err != nil {
				t.Fatal(err)
			}
			tol := 5e-7 * c.si // half a unit in the 7th figure
			if c.exact {
				tol = 4e-16 * c.si
			}
			if math.Abs(u.Factor-c.si) > tol {
				t.Errorf("%s = %.15g SI, want %.15g", c.unit, u.Factor, c.si)
			}
		})
	}
}

func TestParseFormatRoundTrip(t *testing.T) {
	cases := map[string]string{
		"kJ/(kg*K)":     "kJ/(kg*K)",
		"m^3/kg":        "m^3/kg",
		"kg/s":          "kg/s",
		"W/(m^2*K)":     "W/(m^2*K)",
		"kJ/kg":         "kJ/kg",
		"kJ/kg/K":       "kJ/(kg*K)",
		"m*m":           "m^2",
		"1/s":           "1/s",
		"kg·m/s^2":      "kg*m/s^2",
		"(m/s)^2":       "m^2/s^2",
		"kW*h":          "kW*h",
		"%":             "%",
		"m/m":           "1",
		" kJ / kg ":     "kJ/kg",
		"BTU/(lb*degF)": "BTU/(lb*degF)",
	}
	for in, want := range cases {
		u, err := Parse(in)
		if err != nil {
			t.Fatalf("%q: %v", in, err)
		}
		if got := u.String(); got != want {
			t.Errorf("Parse(%q).String() = %q, want %q", in, got, want)
		}
		v, err := Parse(u.String())
		if err != nil || v.Factor != u.Factor || v.Dim != u.Dim {
			t.Errorf("%q does not round-trip: %v %v", in, v, err)
		}
	}
}

func TestParseErrors(t *testing.T) {
	cases := map[string]string{
		"kJ/kgg": "unknown unit kgg; did you mean kg?",
		"MPax":   "unknown unit MPax; did you mean MPa?",
		"m^":     "expected an integer power after ^",
		"(kg*K":  "missing ) in unit",
		"barg/s": "gauge unit barg cannot be part of the compound unit barg/s; convert to an absolute pressure unit",
		"m^99":   "unit power 99 is out of range (at most 12)",
		// Found by FuzzParse: powers that build up past 12 parsed, and their text did not
		// parse back; past 127 the exponent wrapped round. Only the finished unit is checked,
		// so d/J/%/A/%/W/%/C/W/C/W/C/C/W (s^-2 at the end) parses, and so does its canonical
		// text, whose denominator alone reaches s^-14.
		"A*A*A*A*1*A*A*A*A*1*A*A*1*A*A*A": "unit A*A*A*A*1*A*A*A*A*1*A*A*1*A*A*A: it would hold A^13; the power of a base unit is at most 12",
		"(m^12)^12":                       "unit (m^12)^12: it would hold m^144; the power of a base unit is at most 12",
		"%*%*%*%*%*%*%*%*%*%*%*%*%":       "unit power 13 of % is out of range (at most 12)",
		"Ym^12*Yg^12":                     "unit Ym^12*Yg^12 is beyond the range of numbers",
		"":                                "expected a unit",
		"kg)":                             `unexpected ")" in unit "kg)"`,
	}
	for in, want := range cases {
		_, err := Parse(in)
		if err == nil || err.Error() != want {
			t.Errorf("Parse(%q) error = %v, want %q", in, err, want)
		}
	}
}

func q(t *testing.T, v float64, unit string) Quantity {
	t.Helper()
	return MustParse(unit).Q(v, StandardAtmosphere)
}

func TestTemperatureRules(t *testing.T) {
	// 100 °C − 1 °C = 99 K (a difference): the affine rule of PRODUCT.md §2.
	d, err := Sub(q(t, 100, "degC"), q(t, 1, "degC"))
	if err != nil || math.Abs(d.V-99) > 1e-12 || d.T != Rel {
		t.Fatalf("100 degC - 1 degC = %+v, %v; want 99 K difference", d, err)
	}
	if _, err := d.In(MustParse("degC"), StandardAtmosphere); err == nil ||
		err.Error() != "a temperature difference cannot be shown in degC; use K or Cdeg" {
		t.Errorf("difference shown in degC: %v", err)
	}
	if v, _ := d.In(MustParse("Fdeg"), StandardAtmosphere); math.Abs(v-178.2) > 1e-12 {
		t.Errorf("99 K = %g Fdeg, want 178.2", v) // 99 × 9/5 = 178.2, exact arithmetic
	}
	if _, err := Add(q(t, 20, "degC"), q(t, 30, "degC")); err == nil || !strings.HasPrefix(err.Error(), "cannot add two absolute temperatures") {
		t.Errorf("degC + degC: %v", err)
	}
	// 212 °F = 100 °C: definition of the Fahrenheit scale (NIST SP 811 B.8).
	if v, _ := q(t, 212, "degF").In(MustParse("degC"), StandardAtmosphere); math.Abs(v-100) > 1e-12 {
		t.Errorf("212 degF = %g degC", v)
	}
	// Absolute plus a difference is absolute; a kelvin literal can serve as a difference.
	s, err := Add(q(t, 20, "degC"), q(t, 5, "K"))
	if err != nil || s.T != Abs || math.Abs(s.V-298.15) > 1e-12 {
		t.Errorf("20 degC + 5 K = %+v %v", s, err)
	}
	// Multiplying uses the kelvin value: 2 × 0 °C = 546.3 K.
	if m, _ := Mul(Num(2), q(t, 0, "degC")); math.Abs(m.V-546.3) > 1e-12 || m.T == Abs {
		t.Errorf("2 * 0 degC = %+v", m)
	}
	if _, err := Sub(d, q(t, 20, "degC")); err == nil {
		t.Error("difference minus absolute must fail")
	}
	if _, err := Compare(q(t, 20, "degC"), d); err == nil {
		t.Error("comparing an absolute temperature with a difference must fail")
	}
}

func TestGauge(t *testing.T) {
	// 10 barg with the standard atmosphere (101.325 kPa, exact) is 11.01325 bar absolute.
	p := q(t, 10, "barg")
	if v, _ := p.In(MustParse("bar"), StandardAtmosphere); math.Abs(v-11.01325) > 1e-12 {
		t.Errorf("10 barg = %g bar", v)
	}
	if v, _ := p.In(MustParse("barg"), StandardAtmosphere); math.Abs(v-10) > 1e-12 {
		t.Errorf("10 barg back = %g barg", v)
	}
	ctx := Context{Atmosphere: 95e3}
	if v := MustParse("kPag").Q(0, ctx).V; v != 95e3 {
		t.Errorf("0 kPag at 95 kPa = %g Pa", v)
	}
}

func TestDimErrorNamesBothSides(t *testing.T) {
	_, err := Add(q(t, 1, "MPa"), q(t, 1, "kJ/kg"))
	want := "cannot add pressure (MPa) and specific enthalpy (kJ/kg)"
	if err == nil || err.Error() != want {
		t.Errorf("got %v, want %q", err, want)
	}
}

func TestFormatSig(t *testing.T) {
	cases := []struct {
		v    float64
		d    int
		want string
	}{
		{3449.2, 4, "3449"}, {12.5, 4, "12.50"}, {0.87, 4, "0.8700"}, {0, 4, "0.000"},
		{1.25e7, 4, "1.250e7"}, {2.5e-5, 3, "2.50e-5"}, {999.96, 4, "1000"}, {-0.0012345, 3, "-0.00123"},
	}
	for _, c := range cases {
		if got := FormatSig(c.v, c.d); got != c.want {
			t.Errorf("FormatSig(%g, %d) = %q, want %q", c.v, c.d, got, c.want)
		}
	}
}

func TestDefaultUnit(t *testing.T) {
	cases := map[string]string{"12.5 MPa": "MPa", "3449 kJ/kg": "kJ/kg", "350 W": "W", "6.5 kJ/(kg*K)": "kJ/(kg*K)", "2 m^2": "m^2"}
	for in, want := range cases {
		num, unit, _ := strings.Cut(in, " ")
		v := map[string]float64{"12.5": 12.5, "3449": 3449, "350": 350, "6.5": 6.5, "2": 2}[num]
		if got := DefaultUnit(q(t, v, unit)).String(); got != want {
			t.Errorf("DefaultUnit(%s) = %s, want %s", in, got, want)
		}
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{"kJ/(kg*K)", "m^3/kg", "kg/s", "W/(m^2*K)", "degC", "barg", "1/s", "(m/s)^2", "%"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		u, err := Parse(s)
		if err != nil {
			return
		}
		v, err := Parse(u.String())
		if err != nil {
			t.Fatalf("%q formats as %q which does not parse: %v", s, u.String(), err)
		}
		if v.Dim != u.Dim || math.Abs(v.Factor-u.Factor) > 1e-12*math.Abs(u.Factor) {
			t.Fatalf("%q → %q changes the unit", s, u.String())
		}
	})
}

// TestInOverflow: a value that does not fit in the unit asked for is an
// error, never an infinite number to print.
func TestInOverflow(t *testing.T) {
	p := Quantity{V: 1e306, D: DimPressure}
	_, err := p.In(MustParse("uPa"), StandardAtmosphere)
	if err == nil || err.Error() != "1e+297 GPa is beyond the range of numbers in uPa; choose a larger unit" {
		t.Errorf("1e306 Pa in uPa: %v", err)
	}
	if v, err := p.In(MustParse("GPa"), StandardAtmosphere); err != nil || v != 1e297 {
		t.Errorf("1e306 Pa in GPa = %g, %v", v, err)
	}
}

// Issue 11 item 23: the absolute and gauge spellings plant documents use.
// Absolute spellings read as the plain unit; gauge spellings add the
// atmosphere (101 325 Pa, exact: NIST SP 811 B.9) and are gauge only alone.
func TestPlantPressureSpellings(t *testing.T) {
	abs := map[string]float64{"bara": 1e5, "mbara": 1e2, "kPaa": 1e3, "MPaa": 1e6, "psia": psiSI}
	for sym, f := range abs {
		u := MustParse(sym)
		if u.Kind != Linear {
			t.Errorf("%s: kind %v, want linear (absolute)", sym, u.Kind)
		}
		if p := u.Q(2, StandardAtmosphere); p.V != 2*f || p.P != AnyP {
			t.Errorf("2 %s = %+v, want %g Pa, absolute", sym, p, 2*f)
		}
	}
	gauge := map[string]float64{"barg": 1e5, "mbarg": 1e2, "kPag": 1e3, "MPag": 1e6, "psig": psiSI}
	for sym, f := range gauge {
		u := MustParse(sym)
		p := u.Q(2, StandardAtmosphere)
		if u.Kind != Gauge || p.V != 2*f+101325 || p.P != GaugeP {
			t.Errorf("2 %s = %+v (kind %v), want %g Pa absolute from a gauge unit", sym, p, u.Kind, 2*f+101325)
		}
		if _, err := Parse(sym + "/s"); err == nil {
			t.Errorf("%s/s parsed; a gauge unit stands alone", sym)
		}
	}
	// 1 MPag at the standard atmosphere is 1.101325 MPa absolute (exact).
	if v, _ := q(t, 1, "MPag").In(MustParse("MPaa"), StandardAtmosphere); math.Abs(v-1.101325) > 1e-15 {
		t.Errorf("1 MPag = %.17g MPaa, want 1.101325", v)
	}
}

// Issue 11 item 4: 1 barg + 1 barg gave 3.013 barg, the atmosphere counted
// twice.
func TestGaugePlusGauge(t *testing.T) {
	_, err := Add(q(t, 1, "barg"), q(t, 1, "barg"))
	if err == nil || !strings.HasPrefix(err.Error(), "cannot add two gauge pressures") {
		t.Fatalf("1 barg + 1 barg: error %v, want cannot add two gauge pressures", err)
	}
	if _, err := Add(q(t, 1, "psig"), q(t, 1, "kPag")); err == nil {
		t.Error("psig + kPag must fail as barg + barg does")
	}
}

// The class of gauge plus gauge: every operation on gauge pressures follows
// the temperature rules, a gauge pressure in the place of an absolute
// temperature. Values are exact arithmetic on exact factors (bar = 1e5 Pa,
// atm = 101 325 Pa: NIST SP 811 B.9).
func TestGaugeRules(t *testing.T) {
	ctx := StandardAtmosphere
	barg, bar := MustParse("barg"), MustParse("bar")
	show := func(x Quantity, u Unit) float64 {
		t.Helper()
		v, err := x.In(u, ctx)
		if err != nil {
			t.Fatalf("%+v in %s: %v", x, u, err)
		}
		return v
	}
	near := func(what string, got, want float64) {
		t.Helper()
		if math.Abs(got-want) > 1e-12*math.Max(1, math.Abs(want)) {
			t.Errorf("%s = %.15g, want %.15g", what, got, want)
		}
	}
	// Gauge + any pressure is gauge, either way round: 1 barg + 0.5 bar = 1.5 barg.
	for _, s := range []func() (Quantity, error){
		func() (Quantity, error) { return Add(q(t, 1, "barg"), q(t, 0.5, "bar")) },
		func() (Quantity, error) { return Add(q(t, 0.5, "bar"), q(t, 1, "barg")) },
	} {
		r, err := s()
		if err != nil || r.P != GaugeP {
			t.Fatalf("barg + bar = %+v, %v; want gauge", r, err)
		}
		near("1 barg + 0.5 bar in barg", show(r, barg), 1.5)
	}
	// Gauge − gauge is a difference: 5 barg − 2 barg = 3 bar, and it cannot be shown in barg.
	d, err := Sub(q(t, 5, "barg"), q(t, 2, "barg"))
	if err != nil || d.P != DiffP {
		t.Fatalf("5 barg - 2 barg = %+v, %v; want a difference", d, err)
	}
	near("5 barg - 2 barg in bar", show(d, bar), 3)
	if _, err := d.In(barg, ctx); err == nil || !strings.Contains(err.Error(), "cannot be shown in barg") || !strings.Contains(err.Error(), "use bar") {
		t.Errorf("a difference shown in barg: %v", err)
	}
	if _, err := d.In(MustParse("psig"), ctx); err == nil || !strings.Contains(err.Error(), "use psi") {
		t.Errorf("a difference shown in psig: %v", err)
	}
	// Gauge + difference is gauge: 2 barg + (5 barg − 2 barg) = 5 barg.
	g, err := Add(q(t, 2, "barg"), d)
	if err != nil || g.P != GaugeP {
		t.Fatalf("barg + difference = %+v, %v", g, err)
	}
	near("2 barg + 3 bar difference in barg", show(g, barg), 5)
	// Gauge − any is gauge: 5 barg − 0.5 bar = 4.5 barg.
	if r, err := Sub(q(t, 5, "barg"), q(t, 0.5, "bar")); err != nil || r.P != GaugeP {
		t.Errorf("barg - bar = %+v, %v", r, err)
	} else {
		near("5 barg - 0.5 bar in barg", show(r, barg), 4.5)
	}
	// Absolute − gauge is a difference: 5 bar − 1 barg = 5 − 2.01325 = 2.98675 bar.
	if r, err := Sub(q(t, 5, "bar"), q(t, 1, "barg")); err != nil || r.P != DiffP {
		t.Errorf("bar - barg = %+v, %v", r, err)
	} else {
		near("5 bar - 1 barg in bar", show(r, bar), 2.98675)
	}
	// A difference minus a gauge pressure has no meaning.
	if _, err := Sub(d, q(t, 1, "barg")); err == nil || err.Error() != "cannot subtract a gauge pressure from a pressure difference" {
		t.Errorf("difference - barg: %v", err)
	}
	// Comparing (and so min and max): gauge with absolute is fine, gauge with a difference is not.
	if k, err := Compare(q(t, 1, "barg"), q(t, 2, "bar")); err != nil || k != 1 {
		t.Errorf("1 barg vs 2 bar = %d, %v; want +1 (2.01325 bar > 2 bar)", k, err)
	}
	if _, err := Compare(q(t, 1, "barg"), d); err == nil || !strings.Contains(err.Error(), "gauge pressure with a pressure difference") {
		t.Errorf("barg vs difference: %v", err)
	}
	if _, err := Compare(d, q(t, 1, "barg")); err == nil {
		t.Error("difference vs barg must fail")
	}
}

// Negation, abs and products of gauge pressures and of gauge differences:
// the second half of the gauge rules (TestGaugeRules has the sums,
// differences and comparisons).
func TestGaugeNegationAndProducts(t *testing.T) {
	d, err := Sub(q(t, 5, "barg"), q(t, 2, "barg"))
	if err != nil || d.P != DiffP {
		t.Fatalf("5 barg - 2 barg = %+v, %v; want a difference", d, err)
	}
	// Negation and abs of a gauge reading are refused; of a difference they keep it a difference.
	if _, err := Neg(q(t, 1, "barg")); err == nil || !strings.HasPrefix(err.Error(), "cannot negate a gauge pressure") {
		t.Errorf("-(1 barg): %v", err)
	}
	if _, err := AbsValue(q(t, -0.5, "barg")); err == nil || !strings.HasPrefix(err.Error(), "cannot take abs of a gauge pressure") {
		t.Errorf("abs(-0.5 barg): %v", err)
	}
	if n, err := Neg(d); err != nil || n.P != DiffP || n.V != -3e5 {
		t.Errorf("-(difference) = %+v, %v", n, err)
	}
	if a, err := AbsValue(Quantity{V: -3e5, D: DimPressure, P: DiffP}); err != nil || a.P != DiffP || a.V != 3e5 {
		t.Errorf("abs(difference) = %+v, %v", a, err)
	}
	// Products use the absolute pressure: 2 × 1 barg = 4.0265 bar, no longer gauge;
	// a difference times a number stays a difference.
	if m, err := Mul(Num(2), q(t, 1, "barg")); err != nil || m.P != AnyP || math.Abs(m.V-4.0265e5) > 1e-9 {
		t.Errorf("2 * 1 barg = %+v, %v; want 4.0265 bar absolute", m, err)
	}
	if m, err := Div(d, Num(2)); err != nil || m.P != DiffP {
		t.Errorf("difference / 2 = %+v, %v; want a difference", m, err)
	}
	if m, err := Pow(q(t, 1, "barg"), Num(1)); err != nil || m.P != AnyP {
		t.Errorf("(1 barg)^1 = %+v, %v; want absolute", m, err)
	}
	// Absolute pressures add: Dalton's law of partial pressures.
	if s, err := Add(q(t, 1, "bara"), q(t, 2, "bar")); err != nil || s.P != AnyP || s.V != 3e5 {
		t.Errorf("1 bara + 2 bar = %+v, %v", s, err)
	}
}

// -(20 degC) gave -566.3 degC: the negation of the kelvin value shown on the
// Celsius scale. The same class as gauge plus gauge.
func TestNegAbsoluteTemperature(t *testing.T) {
	if _, err := Neg(q(t, 20, "degC")); err == nil || !strings.HasPrefix(err.Error(), "cannot negate an absolute temperature") {
		t.Errorf("-(20 degC): %v", err)
	}
	if _, err := AbsValue(q(t, -20, "degC")); err == nil || !strings.HasPrefix(err.Error(), "cannot take abs of an absolute temperature") {
		t.Errorf("abs(-20 degC): %v", err)
	}
	d, _ := Sub(q(t, 20, "degC"), q(t, 30, "degC"))
	if n, err := Neg(d); err != nil || n.T != Rel || n.V != 10 {
		t.Errorf("-(20 degC - 30 degC) = %+v, %v; want a 10 K difference", n, err)
	}
	if n, err := Neg(q(t, 5, "K")); err != nil || n.T != Scale || n.V != -5 {
		t.Errorf("-(5 K) = %+v, %v", n, err)
	}
}

// Issue 11 item 22: m^1000 was reported as "unit power 100": the parser read
// three digits and quoted those. The power is quoted as written.
func TestUnitPowerQuotedAsWritten(t *testing.T) {
	cases := map[string]string{
		"m^1000":                        "unit power 1000 is out of range (at most 12)",
		"m^-1000":                       "unit power -1000 is out of range (at most 12)",
		"m^13":                          "unit power 13 is out of range (at most 12)",
		"kg*m^99999999999999999999":     "unit power 99999999999999999999 is out of range (at most 12)",
		"m^" + strings.Repeat("9", 100): "unit power " + strings.Repeat("9", 64) + "… is out of range (at most 12)",
		// The same class: a character is quoted whole, not as its first byte.
		"m²": `unexpected "²" in unit "m²"`,
	}
	for in, want := range cases {
		_, err := Parse(in)
		if err == nil || err.Error() != want {
			t.Errorf("Parse(%q) error = %v, want %q", in, err, want)
		}
	}
	if u, err := Parse("m^0012"); err != nil || u.Dim[Length] != 12 {
		t.Errorf("m^0012 = %v, %v; want m^12", u, err)
	}
}

// The property behind the gauge rules: every sum, difference and comparison
// of pressures that is allowed gives a number that does not depend on the
// calc's atmosphere, shown in the unit its kind calls for (gauge in barg,
// a difference in bar); the atmosphere enters only where a gauge reading
// and an absolute pressure meet. Readings and atmospheres are random.
func TestGaugeResultsIndependentOfAtmosphere(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	barg, bar := MustParse("barg"), MustParse("bar")
	for i := 0; i < 2000; i++ {
		a, b, x := rng.Float64()*200-0.9, rng.Float64()*200-0.9, rng.Float64()*10
		var got [2][3]float64
		var cmp [2]int
		for j, atm := range []float64{101325, 60e3 + rng.Float64()*50e3} {
			ctx := Context{Atmosphere: atm}
			ga, gb, dx := barg.Q(a, ctx), barg.Q(b, ctx), bar.Q(x, ctx)
			sum, err1 := Add(ga, dx)      // gauge + absolute unit: gauge
			diff, err2 := Sub(ga, gb)     // gauge − gauge: difference
			back, err3 := Add(gb, diff)   // gauge + difference: gauge, = a
			k, err4 := Compare(sum, back) // gauge with gauge
			if err := errors.Join(err1, err2, err3, err4); err != nil {
				t.Fatalf("a=%g b=%g x=%g atm=%g: %v", a, b, x, atm, err)
			}
			v1, _ := sum.In(barg, ctx)
			v2, _ := diff.In(bar, ctx)
			v3, _ := back.In(barg, ctx)
			got[j] = [3]float64{v1, v2, v3}
			cmp[j] = k
			if _, err := Add(ga, gb); err == nil {
				t.Fatalf("%g barg + %g barg was allowed", a, b)
			}
			if _, err := diff.In(barg, ctx); err == nil {
				t.Fatalf("%g barg - %g barg was shown in barg", a, b)
			}
		}
		want := [3]float64{a + x, a - b, a}
		for j := range got {
			for n := range want {
				if math.Abs(got[j][n]-want[n]) > 1e-9*math.Max(1, math.Abs(want[n])) {
					t.Fatalf("a=%g b=%g x=%g: result %d = %.15g at atmosphere %d, want %.15g", a, b, x, n, got[j][n], j, want[n])
				}
			}
		}
		if cmp[0] != cmp[1] {
			t.Fatalf("a=%g b=%g x=%g: comparison depends on the atmosphere", a, b, x)
		}
	}
}

// Issue 17 item 8: the temperature differences are spelt Cdeg and Fdeg, as
// the trade writes an interval ("C deg"); the old spellings are unknown.
// 1 Fdeg = 5/9 K, exact by the definition of the Fahrenheit scale (NIST SP
// 811 B.9).
func TestTemperatureDifferenceSpelling(t *testing.T) {
	if u := MustParse("Cdeg"); u.Factor != 1 || u.Dim != DimTemperature || u.Kind != Linear || u.Kelvin {
		t.Errorf("Cdeg = %+v", u)
	}
	if u := MustParse("Fdeg"); u.Factor != 5.0/9.0 || u.Kind != Linear {
		t.Errorf("Fdeg = %+v", u)
	}
	if q := q(t, 10, "Cdeg"); q.T != Rel {
		t.Errorf("10 Cdeg is %v, want a difference", q.T)
	}
	for _, old := range []string{"delta_degC", "delta_degF"} {
		if _, err := Parse(old); err == nil || !strings.HasPrefix(err.Error(), "unknown unit "+old) {
			t.Errorf("Parse(%q) = %v; want unknown unit", old, err)
		}
	}
	if Typeset("Cdeg") != "Δ°C" || Typeset("Fdeg") != "Δ°F" {
		t.Errorf("typeset %s, %s; want Δ°C, Δ°F", Typeset("Cdeg"), Typeset("Fdeg"))
	}
	d, _ := Sub(q(t, 50, "degF"), q(t, 40, "degF"))
	if _, err := d.In(MustParse("degF"), StandardAtmosphere); err == nil || err.Error() != "a temperature difference cannot be shown in degF; use K or Fdeg" {
		t.Errorf("difference shown in degF: %v", err)
	}
}
