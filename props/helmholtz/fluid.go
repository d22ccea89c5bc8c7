package helmholtz

// Fluid is one working fluid described by one equation of state. The
// exported fields are data for callers; the coefficients are unexported.
// All values are SI: M in kg/mol, R in J/(kg K), temperatures in K,
// pressures in Pa, densities in kg/m3.
type Fluid struct {
	Name      string   // canonical name, e.g. "isopentane", "R-245fa"
	Aliases   []string // other accepted names, e.g. the ASHRAE 34 designation "R-601a"
	Key       string   // equation key, e.g. "lemmon-span-2006"
	IsDefault bool     // whether Lookup returns this equation for Name
	Equation  string   // short citation, e.g. "Lemmon & Span (2006)"
	Citation  string   // full citation with doi
	Reference string   // reference state for h, s and u
	Status    string   // how the coefficients were verified

	M      float64 // molar mass, kg/mol
	Rmolar float64 // molar gas constant used by the paper, J/(mol K)
	R      float64 // specific gas constant Rmolar/M, J/(kg K)
	Tred   float64 // reducing temperature (the paper's critical temperature), K
	RhoRed float64 // reducing density (the paper's critical density), kg/m3

	// Tc, Pc and RhoC are the critical point of the equation itself, where
	// the saturation curve it defines ends. They agree with Tred and RhoRed
	// to the precision the papers fix them.
	Tc, Pc, RhoC float64

	Ttriple float64 // triple-point temperature, K
	Tmin    float64 // lowest valid temperature (the triple point unless the paper says otherwise), K
	Tmax    float64 // highest valid temperature, K
	Pmax    float64 // highest valid pressure, Pa
	RhoMax  float64 // highest valid density: the liquid at (Tmin, Pmax), kg/m3

	eos equation
	anc ancillary
}

// Lookup returns the default equation for a fluid name. Names are matched
// as written in the fluid list or by their ASHRAE 34 designations (R-601a,
// R-601, R-600a, R-600), ignoring case, hyphens, spaces and parentheses.
func Lookup(name string) (*Fluid, bool) {
	k := fold(name)
	for _, f := range allFluids {
		if f.IsDefault && f.matches(k) {
			return f, true
		}
	}
	return nil, false
}

// LookupEquation returns a fluid's equation by its key (as in Equations),
// for the alternates that Lookup does not return.
func LookupEquation(name, key string) (*Fluid, bool) {
	k := fold(name)
	for _, f := range allFluids {
		if f.Key == key && f.matches(k) {
			return f, true
		}
	}
	return nil, false
}

// Equations lists the equation keys available for a fluid, the default
// first; it is empty for an unknown name.
func Equations(name string) []string {
	d, ok := Lookup(name)
	if !ok {
		return nil
	}
	keys := []string{d.Key}
	for _, f := range allFluids {
		if f.Name == d.Name && f != d {
			keys = append(keys, f.Key)
		}
	}
	return keys
}

// Names returns the canonical fluid names, sorted without regard to case.
func Names() []string {
	var out []string
	for _, f := range allFluids {
		if f.IsDefault {
			out = append(out, f.Name)
		}
	}
	for i := 1; i < len(out); i++ { // insertion sort: no sort import
		for j := i; j > 0 && fold(out[j]) < fold(out[j-1]); j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	return out
}

// Nearest returns the known name (canonical or alias) closest to name by
// edit distance, for a "did you mean" message.
func Nearest(name string) string {
	k := fold(name)
	best, bestD := "", 1<<30
	for _, f := range allFluids {
		if !f.IsDefault {
			continue
		}
		for _, n := range append([]string{f.Name}, f.Aliases...) {
			if d := editDistance(k, fold(n)); d < bestD {
				best, bestD = n, d
			}
		}
	}
	return best
}

func (f *Fluid) matches(folded string) bool {
	if fold(f.Name) == folded {
		return true
	}
	for _, a := range f.Aliases {
		if fold(a) == folded {
			return true
		}
	}
	return false
}

// fold lowercases ASCII letters and drops hyphens, spaces, underscores and
// parentheses, so "R-1233zd(E)", "r1233zde" and "R 1233ZD E" match.
func fold(s string) string {
	b := make([]byte, 0, len(s))
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '-' || c == ' ' || c == '_' || c == '(' || c == ')':
		case 'A' <= c && c <= 'Z':
			b = append(b, c+'a'-'A')
		default:
			b = append(b, c)
		}
	}
	return string(b)
}

// editDistance is the Levenshtein distance between a and b (bytes): the
// numerics import only math, so this is a copy of internal/editdist.Bytes.
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
