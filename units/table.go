package units

import "sort"

// Kind tells how a unit's value relates to SI.
type Kind uint8

const (
	// Linear units convert by a factor alone.
	Linear Kind = iota
	// AbsTemp units are absolute temperature scales with an offset (degC,
	// degF). Used alone they give absolute temperatures; inside a compound
	// unit they are interval units.
	AbsTemp
	// Gauge units are pressures above the atmosphere (barg, psig, kPag).
	// They may only be used alone.
	Gauge
)

// Atom is one entry of the unit table: a symbol with its factor to SI base
// units, its offset (kelvin for 0 of the scale, AbsTemp only), its dimension
// and whether SI prefixes may precede it.
type Atom struct {
	Symbol   string  // as written in a calc: "kWh", "degC"
	Factor   float64 // SI value of one unit (interval value for AbsTemp)
	Offset   float64 // AbsTemp: SI value of the scale's zero (273.15 for degC)
	Dim      Dim     // dimension
	Kind     Kind    // Linear, AbsTemp or Gauge
	Prefix   bool    // SI prefixes allowed (k, M, m, ...)
	Name     string  // readable name for `vouch units`
	Typeset  string  // how the package prints it ("°C", "Ω"); empty: the symbol
	KelvinLk bool    // a kelvin-scale temperature (K, degR): absolute or difference as context needs
}

// Exact conversion factors. Sources: NIST SP 811 (2008) Appendix B; BIPM SI
// Brochure (9th ed.) for the SI units themselves.
const (
	footSI  = 0.3048            // ft, exact (NIST SP 811 B.9)
	inchSI  = 0.0254            // in, exact (NIST SP 811 B.9)
	poundSI = 0.45359237        // lb (avoirdupois pound mass), exact (NIST SP 811 B.9)
	gravity = 9.80665           // standard acceleration of gravity, exact (CGPM 1901)
	lbfSI   = poundSI * gravity // lbf = 4.4482216152605 N, exact (NIST SP 811 B.9)
	psiSI   = lbfSI / (inchSI * inchSI)
	btuSI   = 1055.05585262                  // BTU (International Table), exact (NIST SP 811 B.9)
	galSI   = 231 * inchSI * inchSI * inchSI // US liquid gallon = 231 in^3 = 3.785411784e-3 m^3, exact
	hpSI    = 550 * footSI * lbfSI           // hp = 550 ft*lbf/s = 745.69987158227022 W (NIST SP 811 B.9)
	atmSI   = 101325                         // standard atmosphere, exact (NIST SP 811 B.9)
	trSI    = 12000 * btuSI / 3600           // ton of refrigeration = 12 000 BTU_IT/h (NIST SP 811 B.9: 3.516853e3 W)
	rankine = 5.0 / 9.0                      // degR and degF interval in kelvin, exact
	fZeroSI = 459.67 * rankine               // 0 degF in kelvin = 255.372 K
	calorie = 4.1868                         // calorie (International Table), exact
)

// table is the unit table. See DEVELOPERS.md, "How to add a unit".
var table = []Atom{
	// SI base units and the kilogram's gram.
	{Symbol: "m", Factor: 1, Dim: DimLength, Prefix: true, Name: "metre"},
	{Symbol: "g", Factor: 1e-3, Dim: DimMass, Prefix: true, Name: "gram"},
	{Symbol: "s", Factor: 1, Dim: DimTime, Prefix: true, Name: "second"},
	{Symbol: "A", Factor: 1, Dim: Dim{0, 0, 0, 1}, Prefix: true, Name: "ampere"},
	{Symbol: "K", Factor: 1, Dim: DimTemperature, Prefix: true, Name: "kelvin", KelvinLk: true},
	{Symbol: "mol", Factor: 1, Dim: Dim{0, 0, 0, 0, 0, 1}, Prefix: true, Name: "mole"},
	{Symbol: "cd", Factor: 1, Dim: Dim{0, 0, 0, 0, 0, 0, 1}, Prefix: true, Name: "candela"},
	// SI derived units.
	{Symbol: "N", Factor: 1, Dim: DimForce, Prefix: true, Name: "newton"},
	{Symbol: "Pa", Factor: 1, Dim: DimPressure, Prefix: true, Name: "pascal"},
	{Symbol: "J", Factor: 1, Dim: DimEnergy, Prefix: true, Name: "joule"},
	{Symbol: "W", Factor: 1, Dim: DimPower, Prefix: true, Name: "watt"},
	{Symbol: "Hz", Factor: 1, Dim: Dim{0, 0, -1}, Prefix: true, Name: "hertz"},
	{Symbol: "C", Factor: 1, Dim: Dim{0, 0, 1, 1}, Prefix: true, Name: "coulomb"},
	{Symbol: "V", Factor: 1, Dim: Dim{2, 1, -3, -1}, Prefix: true, Name: "volt"},
	// Units accepted for use with the SI.
	{Symbol: "L", Factor: 1e-3, Dim: DimVolume, Prefix: true, Name: "litre"},
	{Symbol: "t", Factor: 1000, Dim: DimMass, Prefix: true, Name: "tonne"},
	{Symbol: "min", Factor: 60, Dim: DimTime, Name: "minute"},
	{Symbol: "h", Factor: 3600, Dim: DimTime, Name: "hour"},
	{Symbol: "d", Factor: 86400, Dim: DimTime, Name: "day"},
	{Symbol: "bar", Factor: 1e5, Dim: DimPressure, Prefix: true, Name: "bar (absolute)"},
	{Symbol: "atm", Factor: atmSI, Dim: DimPressure, Name: "standard atmosphere"},
	{Symbol: "Wh", Factor: 3600, Dim: DimEnergy, Prefix: true, Name: "watt hour"},
	{Symbol: "cal", Factor: calorie, Dim: DimEnergy, Prefix: true, Name: "calorie (International Table)"},
	// US customary units (NIST SP 811 Appendix B).
	{Symbol: "psi", Factor: psiSI, Dim: DimPressure, Name: "pound-force per square inch (absolute)"},
	{Symbol: "BTU", Factor: btuSI, Dim: DimEnergy, Name: "British thermal unit (International Table)"},
	{Symbol: "lb", Factor: poundSI, Dim: DimMass, Name: "pound (mass)"},
	{Symbol: "lbf", Factor: lbfSI, Dim: DimForce, Name: "pound-force"},
	{Symbol: "ft", Factor: footSI, Dim: DimLength, Name: "foot"},
	{Symbol: "in", Factor: inchSI, Dim: DimLength, Name: "inch"},
	{Symbol: "gal", Factor: galSI, Dim: DimVolume, Name: "gallon (US liquid)"},
	{Symbol: "hp", Factor: hpSI, Dim: DimPower, Name: "horsepower (550 ft*lbf/s)"},
	{Symbol: "TR", Factor: trSI, Dim: DimPower, Name: "ton of refrigeration (12 000 BTU/h)"},
	// Temperatures: absolute scales, kelvin-like scales and intervals.
	{Symbol: "degC", Factor: 1, Offset: 273.15, Dim: DimTemperature, Kind: AbsTemp, Name: "degree Celsius", Typeset: "°C"},
	{Symbol: "degF", Factor: rankine, Offset: fZeroSI, Dim: DimTemperature, Kind: AbsTemp, Name: "degree Fahrenheit", Typeset: "°F"},
	{Symbol: "degR", Factor: rankine, Dim: DimTemperature, Name: "degree Rankine", Typeset: "°R", KelvinLk: true},
	// Temperature differences, spelt as the trade has long written an
	// interval ("C deg"); typeset with a Δ before the degree sign, so a
	// checker never reads them as temperatures.
	{Symbol: "Cdeg", Factor: 1, Dim: DimTemperature, Name: "Celsius temperature difference (C deg)", Typeset: "Δ°C"},
	{Symbol: "Fdeg", Factor: rankine, Dim: DimTemperature, Name: "Fahrenheit temperature difference (F deg)", Typeset: "Δ°F"},
	// Absolute and gauge spellings of plant pressure units. NIST SP 811 §7.4
	// (cited from memory) keeps "absolute" and "gauge" out of a unit symbol;
	// plant documents write them there all the same, so the spellings are
	// accepted, with the factors of the plain units: bar = 1.0 E+05 Pa,
	// exact (NIST SP 811 B.9); psi = lbf/in² = 6.894 757 E+03 Pa (NIST SP 811
	// B.9); kPa and MPa by the SI prefixes (BIPM SI Brochure, 9th ed., Table 7).
	{Symbol: "bara", Factor: 1e5, Dim: DimPressure, Prefix: true, Name: "bar (absolute)"},
	{Symbol: "psia", Factor: psiSI, Dim: DimPressure, Name: "pound-force per square inch (absolute)"},
	{Symbol: "kPaa", Factor: 1e3, Dim: DimPressure, Name: "kilopascal (absolute)"},
	{Symbol: "MPaa", Factor: 1e6, Dim: DimPressure, Name: "megapascal (absolute)"},
	// Gauge pressures: converted to absolute with the calc's atmosphere.
	{Symbol: "barg", Factor: 1e5, Dim: DimPressure, Kind: Gauge, Name: "bar (gauge)"},
	{Symbol: "mbarg", Factor: 1e2, Dim: DimPressure, Kind: Gauge, Name: "millibar (gauge)"},
	{Symbol: "psig", Factor: psiSI, Dim: DimPressure, Kind: Gauge, Name: "pound-force per square inch (gauge)"},
	{Symbol: "kPag", Factor: 1e3, Dim: DimPressure, Kind: Gauge, Name: "kilopascal (gauge)"},
	{Symbol: "MPag", Factor: 1e6, Dim: DimPressure, Kind: Gauge, Name: "megapascal (gauge)"},
	// Ratios.
	{Symbol: "%", Factor: 1e-2, Name: "percent"},
	{Symbol: "ppm", Factor: 1e-6, Name: "part per million"},
}

// prefixes are the SI prefixes (BIPM SI Brochure, 9th ed., Table 7).
var prefixes = []struct {
	sym    string
	factor float64
}{
	{"Q", 1e30}, {"R", 1e27}, {"Y", 1e24}, {"Z", 1e21}, {"E", 1e18}, {"P", 1e15},
	{"T", 1e12}, {"G", 1e9}, {"M", 1e6}, {"k", 1e3}, {"h", 1e2}, {"da", 1e1},
	{"d", 1e-1}, {"c", 1e-2}, {"m", 1e-3}, {"u", 1e-6}, {"µ", 1e-6}, {"n", 1e-9},
	{"p", 1e-12}, {"f", 1e-15}, {"a", 1e-18}, {"z", 1e-21}, {"y", 1e-24},
	{"r", 1e-27}, {"q", 1e-30},
}

var bySymbol = func() map[string]*Atom {
	m := make(map[string]*Atom, len(table))
	for i := range table {
		m[table[i].Symbol] = &table[i]
	}
	return m
}()

// lookupAtom finds a symbol in the table, first as written, then as an SI
// prefix followed by a prefixable unit ("kJ", "MPa", "mm").
func lookupAtom(sym string) (Atom, bool) {
	if a, ok := bySymbol[sym]; ok {
		return *a, true
	}
	for _, p := range prefixes {
		rest, ok := cutPrefix(sym, p.sym)
		if !ok {
			continue
		}
		a, ok := bySymbol[rest]
		if !ok || !a.Prefix {
			continue
		}
		out := *a
		out.Symbol = sym
		out.Factor = float64(out.Factor * p.factor)
		out.Name = ""
		if a.Symbol == "g" && p.sym == "k" {
			out.Name = "kilogram"
		}
		return out, true
	}
	return Atom{}, false
}

func cutPrefix(s, p string) (string, bool) {
	if len(s) > len(p) && s[:len(p)] == p {
		return s[len(p):], true
	}
	return "", false
}

// Table returns the unit table sorted by symbol, for listings.
func Table() []Atom {
	out := append([]Atom(nil), table...)
	sort.Slice(out, func(i, j int) bool { return out[i].Symbol < out[j].Symbol })
	return out
}

// Prefixes returns the SI prefix symbols in descending order of factor.
func Prefixes() []string {
	out := make([]string, len(prefixes))
	for i, p := range prefixes {
		out[i] = p.sym
	}
	return out
}

// Symbols returns every table symbol plus the common prefixed forms used in
// suggestions (kJ, MPa, kg, ...).
func Symbols() []string {
	var out []string
	for _, a := range table {
		out = append(out, a.Symbol)
		if a.Prefix {
			for _, p := range []string{"k", "M", "G", "m", "c", "u"} {
				out = append(out, p+a.Symbol)
			}
		}
	}
	return out
}
