package units

import (
	"math"
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
		"MPaa":   "unknown unit MPaa; did you mean MPa?",
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
		err.Error() != "a temperature difference cannot be shown in degC; use K or delta_degC" {
		t.Errorf("difference shown in degC: %v", err)
	}
	if v, _ := d.In(MustParse("delta_degF"), StandardAtmosphere); math.Abs(v-178.2) > 1e-12 {
		t.Errorf("99 K = %g delta_degF, want 178.2", v) // 99 × 9/5 = 178.2, exact arithmetic
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
