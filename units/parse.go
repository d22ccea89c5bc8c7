package units

import (
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Unit grammar (the text inside [ ] or after a number):
//
//	unit   = term { ("*" | "·" | "/") term }
//	term   = factor [ "^" int ]
//	factor = symbol | "1" | "(" unit ")"
//	symbol = letters, "%", "_" or "µ", as listed in the unit table, with an
//	         optional SI prefix on units that take one (kJ, MPa, mm)
//	int    = [ "-" ] digits
//
// Products and quotients associate to the left: a/b*c is (a/b)*c; write
// a/(b*c) for a quotient of a product. A unit with an offset (degC, degF) or a
// gauge reference (barg, psig, kPag) keeps it only when it stands alone;
// inside a compound unit degC and degF are interval units and gauge units
// are an error.

// Unit is a parsed unit expression.
type Unit struct {
	Factor  float64 // SI value of one unit (interval value for temperatures)
	Offset  float64 // SI value of the scale's zero, for a lone absolute temperature unit
	Dim     Dim
	Kind    Kind   // Linear, AbsTemp (lone degC/degF) or Gauge (lone barg, ...)
	Kelvin  bool   // a lone kelvin-scale temperature unit (K, degR)
	factors []pow1 // symbols and powers, in order of first appearance
	wide    [7]int // the dimension while parsing, before the range check of finish
}

type pow1 struct {
	sym string
	n   int
}

// Error is a unit parse error at a byte offset into the unit text.
type Error struct {
	Off int
	Msg string
}

// Error returns the message.
func (e *Error) Error() string { return e.Msg }

// Parse reads a unit expression such as "kJ/(kg*K)" or "m^3/kg".
func Parse(text string) (Unit, error) {
	p := &parser{src: text}
	p.skipSpace()
	u, err := p.unit()
	if err != nil {
		return Unit{}, err
	}
	p.skipSpace()
	if p.pos < len(p.src) {
		r, n := utf8.DecodeRuneInString(p.src[p.pos:])
		if r == utf8.RuneError && n <= 1 {
			return Unit{}, p.errf("unit %q holds a byte that is not UTF-8 text", excerpt(text))
		}
		return Unit{}, p.errf("unexpected %q in unit %q", p.src[p.pos:p.pos+n], excerpt(text))
	}
	return finish(u, text)
}

// MustParse is Parse for units known to be valid; it panics otherwise.
func MustParse(text string) Unit {
	u, err := Parse(text)
	if err != nil {
		panic(err)
	}
	return u
}

// finish applies the offset rules to a lone unit and rejects a gauge unit
// inside a compound.
func finish(u Unit, text string) (Unit, error) {
	d, err := fromWide(u.wide)
	if err != nil {
		return Unit{}, &Error{0, "unit " + excerpt(text) + ": " + strings.Replace(err.Error(), "the result would hold", "it would hold", 1)}
	}
	u.Dim, u.wide = d, [7]int{}
	if len(u.factors) == 1 && u.factors[0].n == 1 {
		a, _ := lookupAtom(u.factors[0].sym)
		u.Kind, u.Offset, u.Kelvin = a.Kind, a.Offset, a.KelvinLk
		return u, nil
	}
	for _, f := range u.factors {
		if f.n > 12 || f.n < -12 {
			return Unit{}, &Error{0, sprintf("unit power %d of %s is out of range (at most 12)", f.n, f.sym)}
		}
	}
	if math.IsInf(u.Factor, 0) || u.Factor == 0 {
		return Unit{}, &Error{0, "unit " + excerpt(text) + " is beyond the range of numbers"}
	}
	for _, f := range u.factors {
		if a, _ := lookupAtom(f.sym); a.Kind == Gauge {
			return Unit{}, &Error{0, "gauge unit " + f.sym + " cannot be part of the compound unit " + excerpt(text) + "; convert to an absolute pressure unit"}
		}
	}
	return u, nil
}

type parser struct {
	src string
	pos int
}

func (p *parser) errf(format string, args ...any) error {
	return &Error{Off: p.pos, Msg: sprintf(format, args...)}
}

func (p *parser) skipSpace() {
	for p.pos < len(p.src) && p.src[p.pos] == ' ' {
		p.pos++
	}
}

func (p *parser) unit() (Unit, error) {
	u, err := p.term()
	if err != nil {
		return u, err
	}
	for {
		p.skipSpace()
		op, ok := p.operator()
		if !ok {
			return u, nil
		}
		p.skipSpace()
		v, err := p.term()
		if err != nil {
			return u, err
		}
		if op == '/' {
			v = v.pow(-1)
		}
		u = u.mul(v)
	}
}

func (p *parser) operator() (byte, bool) {
	switch {
	case strings.HasPrefix(p.src[p.pos:], "·"):
		p.pos += len("·")
		return '*', true
	case p.pos < len(p.src) && (p.src[p.pos] == '*' || p.src[p.pos] == '/'):
		p.pos++
		return p.src[p.pos-1], true
	}
	return 0, false
}

func (p *parser) term() (Unit, error) {
	u, err := p.factor()
	if err != nil {
		return u, err
	}
	if p.pos < len(p.src) && p.src[p.pos] == '^' {
		p.pos++
		n, err := p.integer()
		if err != nil {
			return u, err
		}
		u = u.pow(n)
	}
	return u, nil
}

func (p *parser) integer() (int, error) {
	start := p.pos
	if p.pos < len(p.src) && p.src[p.pos] == '-' {
		p.pos++
	}
	digits := p.pos
	for p.pos < len(p.src) && p.src[p.pos] >= '0' && p.src[p.pos] <= '9' {
		p.pos++
	}
	if p.pos == digits {
		p.pos = start
		return 0, p.errf("expected an integer power after ^")
	}
	written := p.src[start:p.pos]
	// Leading zeros aside, a power of more than two digits is out of range:
	// it is quoted as written, never cut to its first digits.
	n, err := strconv.Atoi(written)
	if err != nil || n > MaxPower || n < -MaxPower {
		p.pos = start
		return 0, p.errf("unit power %s is out of range (at most %d)", excerpt(written), MaxPower)
	}
	return n, nil
}

func (p *parser) factor() (Unit, error) {
	if p.pos >= len(p.src) {
		return Unit{}, p.errf("expected a unit")
	}
	switch c := p.src[p.pos]; {
	case c == '(':
		p.pos++
		p.skipSpace()
		u, err := p.unit()
		if err != nil {
			return u, err
		}
		p.skipSpace()
		if p.pos >= len(p.src) || p.src[p.pos] != ')' {
			return u, p.errf("missing ) in unit")
		}
		p.pos++
		return u, nil
	case c == '1':
		p.pos++
		return Unit{Factor: 1}, nil
	}
	return p.symbol()
}

func (p *parser) symbol() (Unit, error) {
	start := p.pos
	for p.pos < len(p.src) {
		r, n := utf8.DecodeRuneInString(p.src[p.pos:])
		if !(unicode.IsLetter(r) || r == '%' || r == '_') {
			break
		}
		p.pos += n
	}
	sym := p.src[start:p.pos]
	if sym == "" {
		return Unit{}, p.errf("expected a unit symbol")
	}
	a, ok := lookupAtom(sym)
	if !ok {
		p.pos = start
		msg := "unknown unit " + excerpt(sym)
		if s := Nearest(sym, Symbols()); s != "" {
			msg += "; did you mean " + s + "?"
		}
		return Unit{}, &Error{Off: start, Msg: msg}
	}
	u := Unit{Factor: a.Factor, factors: []pow1{{sym, 1}}}
	for i, e := range a.Dim {
		u.wide[i] = int(e)
	}
	return u, nil
}

// mul and pow combine units while parsing, in wide integers: only the
// finished unit's powers are checked (finish), so the order in which a unit
// is written, and so its canonical text, cannot matter.
func (u Unit) mul(v Unit) Unit {
	out := Unit{Factor: float64(u.Factor * v.Factor)}
	for i := range out.wide {
		out.wide[i] = u.wide[i] + v.wide[i]
	}
	out.factors = append(append([]pow1(nil), u.factors...), nil...)
	for _, f := range v.factors {
		out.factors = addFactor(out.factors, f)
	}
	return out
}

func addFactor(fs []pow1, f pow1) []pow1 {
	for i := range fs {
		if fs[i].sym == f.sym {
			fs[i].n += f.n
			if fs[i].n == 0 {
				return append(fs[:i], fs[i+1:]...)
			}
			return fs
		}
	}
	return append(fs, f)
}

func (u Unit) pow(n int) Unit {
	out := Unit{Factor: ipow(u.Factor, n)}
	for i := range out.wide {
		out.wide[i] = u.wide[i] * n
	}
	for _, f := range u.factors {
		out.factors = append(out.factors, pow1{f.sym, f.n * n})
	}
	return out
}

// excerpt cuts a long piece of a unit's text for a message: the first 64
// bytes (not splitting a character) and "…".
func excerpt(s string) string {
	const limit = 64
	if len(s) <= limit {
		return s
	}
	cut := limit
	for cut > 0 && !utf8.RuneStart(s[cut]) {
		cut--
	}
	return s[:cut] + "…"
}

// ipow raises x to an integer power exactly as repeated multiplication.
func ipow(x float64, n int) float64 {
	if n < 0 {
		return 1 / ipow(x, -n)
	}
	r := 1.0
	for i := 0; i < n; i++ {
		r = float64(r * x)
	}
	return r
}

// String returns the canonical text of the unit: numerator factors joined by
// "*", then "/" and the denominator, parenthesised when it has several
// factors: "kJ/(kg*K)". It parses back to the same unit.
func (u Unit) String() string {
	var num, den []string
	for _, f := range u.factors {
		if f.n > 0 {
			num = append(num, powText(f.sym, f.n))
		} else {
			den = append(den, powText(f.sym, -f.n))
		}
	}
	if len(num) == 0 && len(den) == 0 {
		return "1"
	}
	return joinFraction(num, den)
}

// Symbols of the unit in order with their powers, for typesetting.
func (u Unit) Symbols() (syms []string, pows []int) {
	for _, f := range u.factors {
		syms = append(syms, f.sym)
		pows = append(pows, f.n)
	}
	return syms, pows
}

// Typeset returns how the package prints a table symbol ("°C" for degC).
func Typeset(sym string) string {
	if a, ok := bySymbol[sym]; ok && a.Typeset != "" {
		return a.Typeset
	}
	if strings.HasPrefix(sym, "u") {
		if a, ok := lookupAtom(sym); ok && a.Prefix {
			return "µ" + sym[1:]
		}
	}
	return sym
}
