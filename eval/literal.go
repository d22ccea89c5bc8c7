package eval

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/expr-lang/expr/ast"
	"github.com/expr-lang/expr/builtin"
	"github.com/expr-lang/expr/conf"
	"github.com/expr-lang/expr/file"
	"github.com/expr-lang/expr/parser"
	"github.com/expr-lang/expr/parser/lexer"

	"github.com/vouchcalc/vouch/units"
)

// parserConfig keeps expr's node limit and turns every expr builtin off, so
// that all calls, including min and max, reach this package's own function
// table and nothing time-dependent can run.
var parserConfig = func() *conf.Config {
	c := conf.CreateNew()
	c.MaxNodes = MaxNodes
	for _, b := range builtin.Builtins {
		c.Disabled[b.Name] = true
	}
	return c
}()

// compile guards, rewrites unit literals, parses and collects dependencies.
func (s *Stmt) compile(ctx units.Context) *Error {
	if e := checkNesting(s.Expr, s.ExprOff); e != nil {
		return e
	}
	src, lits, e := rewriteLiterals(s.Expr, s.ExprOff, ctx)
	if e != nil {
		return e
	}
	s.src, s.lits = src, lits
	tree, err := parser.ParseWithConfig(src, parserConfig)
	if err != nil {
		return s.exprError(err)
	}
	s.tree = tree.Node
	skip := "" // solve reads the name it defines: not a dependency
	if s.Kind == Def {
		skip = s.Name
	}
	s.deps = collectDeps(s.tree, lits, skip)
	return nil
}

// exprError converts an expr parse error to a file position. The error is
// classified from positions and tokens, never from expr's wording: where a
// parse without the node limit gets further, it hit the limit; on a number
// token that does not fit, the number is too large; where the parser ran
// out of input, the expression is incomplete.
func (s *Stmt) exprError(err error) *Error {
	fe, ok := err.(*file.Error)
	if !ok {
		return &Error{Off: s.ExprOff, Msg: err.Error()}
	}
	off := s.offOfRune(fe.From)
	toks, lexErr := lexer.Lex(file.NewSource(s.src))
	switch {
	case lexErr != nil:
		return &Error{Off: off, Msg: fe.Message}
	case overNodeLimit(s.src, fe.From):
		return &Error{Off: off, Msg: sprintf("expression has more than %d parts", MaxNodes)}
	}
	if tk, ok := numberNear(toks, fe.From); ok {
		if msg := numberRange(tk.Value); msg != "" {
			return &Error{Off: s.offOfRune(tk.From), Msg: msg}
		}
	}
	if incomplete(s.src) {
		return &Error{Off: off, Msg: "the expression is incomplete"}
	}
	return &Error{Off: off, Msg: fe.Message}
}

// overNodeLimit reports whether a parse that failed at rune index at gets
// further without the node limit. The line's length and nesting are
// already bounded, so the second parse is too.
func overNodeLimit(src string, at int) bool {
	c := *parserConfig
	c.MaxNodes = 0
	_, err := parser.ParseWithConfig(src, &c)
	var fe *file.Error
	return err == nil || errors.As(err, &fe) && fe.From > at
}

// numberNear returns the number token at rune index at or just before it:
// expr reports a bad literal at the token that holds it or at the next.
func numberNear(toks []lexer.Token, at int) (lexer.Token, bool) {
	k := -1
	for i, tk := range toks {
		if tk.Kind != lexer.EOF && tk.From <= at {
			k = i
		}
	}
	for i := k; i >= 0 && i >= k-1; i-- {
		if toks[i].Kind == lexer.Number {
			return toks[i], true
		}
	}
	return lexer.Token{}, false
}

// numberRange says why a number token does not fit, or "" when it does: a
// float beyond ±1.8e308, or a whole number beyond int64, as expr reads
// whole numbers.
func numberRange(num string) string {
	if _, err := strconv.ParseFloat(num, 64); errors.Is(err, strconv.ErrRange) {
		return numberTooLarge(num)
	}
	if strings.Trim(num, "0123456789_") != "" {
		return ""
	}
	if _, err := strconv.ParseInt(strings.ReplaceAll(num, "_", ""), 10, 64); errors.Is(err, strconv.ErrRange) {
		return sprintf("the whole number %s is beyond the range of whole numbers (about ±9.2e18); write it with an exponent, such as %se%d", num, num[:1], len(num)-1)
	}
	return ""
}

// incomplete reports whether the parser runs out of input: with a blank
// after the expression, the error then lies at or beyond its end (without
// it, expr puts its end-of-input token on the last token).
func incomplete(src string) bool {
	_, err := parser.ParseWithConfig(src+" ", parserConfig)
	var fe *file.Error
	return errors.As(err, &fe) && fe.From >= utf8.RuneCountInString(src)
}

// numberTooLarge says that a written number does not fit in a float64.
func numberTooLarge(num string) string {
	return sprintf("the number %s is beyond the range of numbers (about ±1.8e308)", num)
}

// offOfRune converts a rune index into the rewritten expression to a file
// offset; the rewrite keeps byte lengths, so byte offsets agree.
func (s *Stmt) offOfRune(r int) int {
	b := 0
	for i := 0; i < r && b < len(s.src); i++ {
		_, w := utf8.DecodeRuneInString(s.src[b:])
		b += w
	}
	return s.ExprOff + b
}

// checkNesting refuses brackets nested deeper than MaxNesting.
func checkNesting(expr string, off int) *Error {
	depth := 0
	for i := 0; i < len(expr); i++ {
		switch expr[i] {
		case '(', '[', '{':
			depth++
			if depth > MaxNesting {
				return &Error{Off: off + i, Msg: sprintf("brackets are nested more than %d deep", MaxNesting)}
			}
		case ')', ']', '}':
			depth--
		}
	}
	return nil
}

// keywords after a number that are operators, not units.
var notUnits = map[string]bool{"and": true, "or": true, "not": true, "matches": true, "contains": true,
	"startsWith": true, "endsWith": true, "if": true, "else": true, "let": true}

// rewriteLiterals replaces each "number unit" by a placeholder identifier of
// the same byte length ("_0  ", "_1    "), so that expr's parser sees an
// identifier and every offset keeps its meaning.
func rewriteLiterals(expr string, off int, ctx units.Context) (string, []*Literal, *Error) {
	var out strings.Builder // the rewritten text up to last, once a literal is found
	var lits []*Literal
	last := 0
	for i := 0; i < len(expr); {
		c := expr[i]
		switch {
		case c == '"' || c == '\'':
			i = skipString(expr, i)
		case c == '_' || c >= 0x80 && startsLetter(expr[i:]) || isASCIILetter(c):
			i += max(identLen(expr[i:]), 1)
		case isDigit(c) || c == '.' && i+1 < len(expr) && isDigit(expr[i+1]):
			numEnd := scanNumber(expr, i)
			j := skipSpace(expr, numEnd)
			uEnd := scanUnit(expr, j)
			if uEnd == j || notUnits[expr[j:uEnd]] {
				i = numEnd
				continue
			}
			if signedStart(expr, i) {
				i-- // a minus sign that starts an operand belongs to the literal: -5 degC
			}
			lit, e := makeLiteral(expr, i, numEnd, j, uEnd, off, ctx)
			if e != nil {
				return "", nil, e
			}
			if lits == nil {
				out.Grow(len(expr))
				lits = make([]*Literal, 0, 4)
			}
			name := placeholder(len(lits))
			if len(name) > uEnd-i {
				return "", nil, &Error{Off: off + i, Msg: "too many unit literals in one line"}
			}
			lits = append(lits, lit)
			out.WriteString(expr[last:i])
			out.WriteString(name)
			for k := i + len(name); k < uEnd; k++ {
				out.WriteByte(' ')
			}
			i, last = uEnd, uEnd
		default:
			i++
		}
	}
	if lits == nil {
		return expr, nil, nil
	}
	out.WriteString(expr[last:])
	return out.String(), lits, nil
}

func makeLiteral(expr string, i, numEnd, j, uEnd, off int, ctx units.Context) (*Literal, *Error) {
	v, err := strconv.ParseFloat(expr[i:numEnd], 64)
	if errors.Is(err, strconv.ErrRange) && math.IsInf(v, 0) {
		return nil, &Error{Off: off + i, Msg: numberTooLarge(expr[i:numEnd])}
	}
	if err != nil && !errors.Is(err, strconv.ErrRange) {
		return nil, &Error{Off: off + i, Msg: sprintf("cannot read the number %s", expr[i:numEnd])}
	}
	u, err := units.ParseCached(expr[j:uEnd])
	if err != nil {
		ue := unitError(err)
		return nil, &Error{Off: off + j + ue.Off, Msg: ue.Msg}
	}
	q := u.Q(v, ctx)
	if math.IsInf(q.V, 0) {
		return nil, &Error{Off: off + i, Msg: sprintf("%s is beyond the range of numbers in SI units", expr[i:uEnd])}
	}
	return &Literal{Text: expr[i:uEnd], Num: expr[i:numEnd], Unit: u, Q: q, Off: off + i}, nil
}

// signedStart reports whether the number at i is preceded by a minus sign
// that starts an operand (not a binary minus).
func signedStart(s string, i int) bool {
	if i == 0 || s[i-1] != '-' {
		return false
	}
	j := i - 2
	for j >= 0 && s[j] == ' ' {
		j--
	}
	return j < 0 || strings.IndexByte("(,=+-*/^<>?:[!&|", s[j]) >= 0
}

// placeholder names the n-th literal: "_" and n in base 36.
func placeholder(n int) string {
	if n < len(placeholders) {
		return placeholders[n]
	}
	return "_" + strconv.FormatInt(int64(n), 36)
}

// placeholders are the names of the first 36 literals of a line.
var placeholders = func() (out [36]string) {
	for n := range out {
		out[n] = "_" + strconv.FormatInt(int64(n), 36)
	}
	return out
}()

// litOf returns the literal a placeholder name stands for: "_" and its
// number in base 36, without leading zeros.
func litOf(lits []*Literal, name string) (*Literal, bool) {
	if len(name) < 2 || name[0] != '_' || len(name) > 2 && name[1] == '0' {
		return nil, false
	}
	n := 0
	for i := 1; i < len(name); i++ {
		c := name[i]
		switch {
		case isDigit(c):
			n = n*36 + int(c-'0')
		case c >= 'a' && c <= 'z':
			n = n*36 + int(c-'a') + 10
		default:
			return nil, false
		}
		if n >= len(lits) {
			return nil, false
		}
	}
	return lits[n], true
}

func isDigit(c byte) bool       { return c >= '0' && c <= '9' }
func isASCIILetter(c byte) bool { return c|0x20 >= 'a' && c|0x20 <= 'z' }

func startsLetter(s string) bool {
	r, _ := utf8.DecodeRuneInString(s)
	return unicode.IsLetter(r)
}

func skipString(s string, i int) int {
	q := s[i]
	for i++; i < len(s); i++ {
		if s[i] == '\\' {
			i++
		} else if s[i] == q {
			return i + 1
		}
	}
	return len(s)
}

// scanNumber returns the end of the decimal number starting at i.
func scanNumber(s string, i int) int {
	for i < len(s) && isDigit(s[i]) {
		i++
	}
	if i < len(s) && s[i] == '.' && (i+1 >= len(s) || s[i+1] != '.') {
		for i++; i < len(s) && isDigit(s[i]); i++ {
		}
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		if j < len(s) && isDigit(s[j]) {
			for i = j; i < len(s) && isDigit(s[i]); i++ {
			}
		}
	}
	return i
}

// scanUnit returns the end of the unit text starting at i: a run of unit
// characters with balanced parentheses, which ends at a space, a comma, an
// unmatched ")" or any other character.
func scanUnit(s string, i int) int {
	if i >= len(s) || !(startsLetter(s[i:]) || s[i] == '%' || strings.HasPrefix(s[i:], "µ")) {
		return i
	}
	depth, end := 0, i
	for j := i; j < len(s); {
		r, w := utf8.DecodeRuneInString(s[j:])
		switch {
		case unicode.IsLetter(r) || unicode.IsDigit(r) || strings.ContainsRune("%_^*/·", r):
		case r == '-' && j > 0 && s[j-1] == '^':
		case r == '(':
			depth++
		case r == ')' && depth > 0:
			depth--
		default:
			return end
		}
		j += w
		if depth == 0 {
			end = j
		}
	}
	return end
}

// collectDeps lists the identifiers an expression reads, without function
// names, placeholders, constants and skip, in order of first use.
func collectDeps(n ast.Node, lits []*Literal, skip string) []string {
	w := depWalker{lits: lits, skip: skip}
	w.walk(n)
	return w.deps
}

// depWalker gathers a line's dependencies; seen is made only for a line
// with many names, a scan of deps being faster for a few.
type depWalker struct {
	lits []*Literal
	skip string
	deps []string
	seen map[string]bool
}

func (w *depWalker) walk(n ast.Node) {
	switch v := n.(type) {
	case *ast.IdentifierNode:
		w.add(v.Value)
	case *ast.CallNode:
		if _, ok := v.Callee.(*ast.IdentifierNode); !ok {
			w.walk(v.Callee)
		}
		for _, a := range v.Arguments {
			w.walk(a)
		}
	case *ast.UnaryNode:
		w.walk(v.Node)
	case *ast.BinaryNode:
		w.walk(v.Left)
		w.walk(v.Right)
	case *ast.ConditionalNode:
		w.walk(v.Cond)
		w.walk(v.Exp1)
		w.walk(v.Exp2)
	case *ast.MemberNode:
		w.walk(v.Node)
	}
}

func (w *depWalker) add(name string) {
	if _, lit := litOf(w.lits, name); lit || name == "pi" || name == w.skip {
		return
	}
	if w.seen == nil && len(w.deps) >= 16 {
		w.seen = make(map[string]bool, 2*len(w.deps))
		for _, d := range w.deps {
			w.seen[d] = true
		}
	}
	if w.seen != nil {
		if w.seen[name] {
			return
		}
		w.seen[name] = true
	} else if indexOf(w.deps, name) >= 0 {
		return
	}
	w.deps = append(w.deps, name)
}

// unitError returns a unit parse error with its offset in the unit text.
func unitError(err error) *units.Error {
	var ue *units.Error
	if errors.As(err, &ue) {
		return ue
	}
	return &units.Error{Msg: err.Error()}
}
