package eval

import (
	"math"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/units"
)

// UncKind says how an input's uncertainty was stated.
type UncKind uint8

const (
	// UncStandard is a standard uncertainty: ± u.
	UncStandard UncKind = iota
	// UncExpanded is an expanded uncertainty with its coverage factor:
	// ± U (k=2), u = U/k.
	UncExpanded
	// UncRect is the half-width of a rectangular distribution: ± a rect,
	// u = a/√3.
	UncRect
)

// Uncertainty is the ± part of an input line: p_1 = 12.5 MPa ± 0.05 MPa.
type Uncertainty struct {
	Text  string         // as written after the sign: "0.1 MPa (k=2)"
	Num   string         // the number as written: "0.1"
	Unit  units.Unit     // its unit (dimensionless when none is written)
	Off   int            // offset of the number in the calc file
	Given units.Quantity // the stated figure (u, U or a) in SI units
	Kind  UncKind
	K     float64 // the coverage factor of an expanded uncertainty
	KText string  // the factor as written
	U     float64 // the standard uncertainty in SI units
}

// How says how the uncertainty was stated, for a budget table.
func (u *Uncertainty) How() string {
	switch u.Kind {
	case UncExpanded:
		return "expanded, k = " + u.KText
	case UncRect:
		return "rectangular, half-width"
	}
	return "standard"
}

// Uncertainty returns the ± part of an input line, or nil.
func (s *Stmt) Uncertainty() *Uncertainty { return s.unc }

// Corr returns the two names and the coefficient of a corr(a, b) = r line.
func (s *Stmt) Corr() (a, b string, aOff, bOff int, r float64) {
	return s.corrA, s.corrB, s.corrAOff, s.corrBOff, s.corrR
}

// cutUncertainty finds a ± or +/- outside strings in an expression and
// returns the expression before it and the offset of the sign within expr.
func cutUncertainty(expr string) (before string, at, width int) {
	at, width = indexOutsideStrings(expr, "±", "+/-")
	if at < 0 {
		return expr, -1, 0
	}
	return expr[:at], at, width
}

// splitUncertainty takes the ± part off a definition's expression, keeping
// every offset a file offset. It returns the uncertainty's text and offset.
func (s *Stmt) splitUncertainty() (text string, off int, e *Error) {
	before, at, w := cutUncertainty(s.Expr)
	if at < 0 {
		return "", 0, nil
	}
	if s.Kind != Def {
		return "", 0, &Error{Off: s.ExprOff + at, Msg: "an uncertainty belongs on an input line: NAME = VALUE UNIT ± U UNIT"}
	}
	after := s.Expr[at+w:]
	lead := len(after) - len(strings.TrimLeft(after, " \t"))
	text, off = strings.TrimSpace(after), s.ExprOff+at+w+lead
	s.Expr = strings.TrimRight(before, " \t")
	if text == "" {
		return "", 0, &Error{Off: s.ExprOff + at, Msg: "expected an uncertainty after ±: NAME = 12.5 MPa ± 0.05 MPa"}
	}
	return text, off, nil
}

// parseUncertainty reads the ± part once the expression is compiled: the
// line must be an input (one number, with or without a unit), and the
// uncertainty a positive number in a unit of the input's dimension,
// optionally followed by (k=K) or rect.
func (s *Stmt) parseUncertainty(text string, off int, ctx units.Context) *Error {
	var in units.Quantity
	switch l := s.LoneLiteral(); {
	case l != nil:
		in = l.Q
	case s.IsPlainNumber():
		in = units.Num(0)
	default:
		return &Error{Off: s.ExprOff, Msg: sprintf("only an input takes an uncertainty: %s = %s is computed; its uncertainty is propagated from its inputs", s.Name, s.Expr)}
	}
	u := &Uncertainty{Text: text, Off: off}
	numEnd := scanNumber(text, 0)
	if numEnd == 0 {
		return &Error{Off: off, Msg: sprintf("expected a positive number after ±, such as ± 0.05 %s", unitHint(s))}
	}
	u.Num = text[:numEnd]
	v, err := strconv.ParseFloat(u.Num, 64)
	if err != nil || math.IsInf(v, 0) {
		return &Error{Off: off, Msg: sprintf("cannot read the number %s", u.Num)}
	}
	if v <= 0 {
		return &Error{Off: off, Msg: "an uncertainty must be above zero; leave the ± part out for an exact value"}
	}
	i := skipSpace(text, numEnd)
	if j := scanUnit(text, i); j > i && text[i:j] != "rect" {
		unit, err := units.ParseCached(text[i:j])
		if err != nil {
			ue := unitError(err)
			return &Error{Off: off + i + ue.Off, Msg: ue.Msg}
		}
		u.Unit = unit
		i = skipSpace(text, j)
	}
	if e := u.checkUnit(in, s, off, ctx, v); e != nil {
		return e
	}
	if e := u.readKind(text, i, off); e != nil {
		return e
	}
	s.unc = u
	return nil
}

// checkUnit holds the uncertainty to the input's dimension: a difference,
// never an absolute temperature or a gauge pressure.
func (u *Uncertainty) checkUnit(in units.Quantity, s *Stmt, off int, ctx units.Context, v float64) *Error {
	switch {
	case u.Unit.Kind == units.AbsTemp:
		return &Error{Off: off, Msg: sprintf("the uncertainty of a temperature is a difference: write it in K or Cdeg (Fdeg), not %s", u.Unit)}
	case u.Unit.Kind == units.Gauge:
		return &Error{Off: off, Msg: sprintf("the uncertainty of a pressure is a difference: write it in an absolute unit (kPa, bar, MPa), not %s", u.Unit)}
	case u.Unit.Dim != in.D:
		return &Error{Off: off, Msg: sprintf("the uncertainty is %s, but %s is %s: write it in %s", dimText(u.Unit.Dim), s.Name, dimText(in.D), unitHint(s))}
	}
	u.Given = units.Num(v)
	if u.Unit.Factor != 0 {
		u.Given = u.Unit.Q(v, ctx)
	}
	if !(u.Given.V > 0) || math.IsInf(u.Given.V, 0) {
		return &Error{Off: off, Msg: sprintf("%s is beyond the range of numbers in SI units", u.Text)}
	}
	return nil
}

// readKind reads what follows the uncertainty's unit: nothing, (k=K) or rect.
func (u *Uncertainty) readKind(text string, i, off int) *Error {
	rest := strings.TrimSpace(text[i:])
	switch {
	case rest == "":
		u.Kind, u.U = UncStandard, u.Given.V
	case rest == "rect":
		u.Kind, u.U = UncRect, u.Given.V/math.Sqrt(3)
	case strings.HasPrefix(rest, "(") && strings.HasSuffix(rest, ")"):
		inner := strings.ReplaceAll(rest[1:len(rest)-1], " ", "")
		kt, ok := strings.CutPrefix(inner, "k=")
		k, err := strconv.ParseFloat(kt, 64)
		if !ok || err != nil || math.IsInf(k, 0) || math.IsNaN(k) {
			return &Error{Off: off + i, Msg: sprintf("expected a coverage factor (k=2) after the uncertainty, not %s", rest)}
		}
		if k <= 0 {
			return &Error{Off: off + i, Msg: sprintf("the coverage factor k must be above zero, not %s", kt)}
		}
		u.Kind, u.K, u.KText, u.U = UncExpanded, k, kt, u.Given.V/k
	default:
		return &Error{Off: off + i, Msg: sprintf("after the uncertainty write nothing (standard), (k=2) (expanded) or rect (rectangular half-width), not %s", rest)}
	}
	return nil
}

// unitHint names the unit of an input line for messages.
func unitHint(s *Stmt) string {
	if l := s.LoneLiteral(); l != nil {
		if t := l.Unit.String(); t != "1" {
			if l.Unit.Kind == units.AbsTemp {
				return "K"
			}
			return t
		}
	}
	return "the same unit (none for a plain number)"
}

// dimText names a dimension; "dimensionless" for a plain number.
func dimText(d units.Dim) string {
	return d.Name()
}

// parseCorr reads corr(a, b) = r, a correlation coefficient between two
// inputs with uncertainties.
func (s *Stmt) parseCorr(rest string, off int, ctx units.Context) *Error {
	s.Kind = Corr
	const form = "write corr(NAME, NAME) = R, with R from -1 to 1"
	i := skipSpace(rest, len("corr"))
	if i >= len(rest) || rest[i] != '(' {
		return &Error{Off: off + i, Msg: form}
	}
	var names [2]string
	var offs [2]int
	for k := range names {
		i = skipSpace(rest, i+1)
		n := identLen(rest[i:])
		if n == 0 {
			return &Error{Off: off + i, Msg: form}
		}
		names[k], offs[k] = rest[i:i+n], off+i
		i = skipSpace(rest, i+n)
		want := byte(',')
		if k == 1 {
			want = ')'
		}
		if i >= len(rest) || rest[i] != want {
			return &Error{Off: off + i, Msg: form}
		}
	}
	if names[0] == names[1] {
		return &Error{Off: offs[1], Msg: sprintf("corr(%s, %s): a name is fully correlated with itself; name two inputs", names[0], names[1])}
	}
	i = skipSpace(rest, i+1)
	if i >= len(rest) || rest[i] != '=' {
		return &Error{Off: off + i, Msg: form}
	}
	i = skipSpace(rest, i+1)
	s.Expr, s.ExprOff = rest[i:], off+i
	s.corrA, s.corrB, s.corrAOff, s.corrBOff = names[0], names[1], offs[0], offs[1]
	r, err := strconv.ParseFloat(strings.TrimSpace(s.Expr), 64)
	if s.Expr == "" || err != nil {
		return &Error{Off: s.ExprOff, Msg: form}
	}
	if r < -1 || r > 1 {
		return &Error{Off: s.ExprOff, Msg: sprintf("a correlation coefficient lies from -1 to 1, not %s", s.Expr)}
	}
	s.corrR = r
	if e := s.compile(ctx); e != nil {
		return e
	}
	s.deps = []string{names[0], names[1]}
	return nil
}

// execCorr checks that both names of a corr line are inputs with an
// uncertainty defined above it.
func (e *Engine) execCorr(s *Stmt) (*Outcome, error) {
	out := e.newOutcome(s)
	for k, n := range []string{s.corrA, s.corrB} {
		off := []int{s.corrAOff, s.corrBOff}[k]
		sl := e.lookup(n)
		switch {
		case sl != nil && sl.failed:
			out.Skipped = true
			return out, nil
		case sl == nil || !sl.has:
			return nil, &Error{Off: off, Msg: sprintf("corr(%s, %s): the calc does not define %s above this line", s.corrA, s.corrB, n)}
		case sl.def != nil && sl.def.unc == nil:
			return nil, &Error{Off: off, Msg: sprintf("corr(%s, %s): %s has no uncertainty; write %s = VALUE ± U", s.corrA, s.corrB, n, n)}
		}
	}
	out.Value = units.Num(s.corrR)
	return out, nil
}
