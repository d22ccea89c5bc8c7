// Package eval parses and evaluates calc lines: NAME = EXPR,
// NAME [UNIT] = EXPR and check EXPR, with quantities, unit literals, the
// math functions and the property functions. Expressions use the syntax of
// github.com/expr-lang/expr (this package is its only importer) plus unit
// literals and ^ for powers; the tree that expr's parser builds is evaluated
// here, so values keep their units and every error keeps its position.
package eval

import (
	"strings"
	"sync/atomic"
	"unicode"
	"unicode/utf8"

	"github.com/expr-lang/expr/ast"

	"github.com/vouchcalc/vouch/units"
)

// Limits that guard the expression parser against hostile input: expr's
// parser recurses without a depth limit.
const (
	MaxLineBytes = 4096 // longest calc line accepted
	MaxNesting   = 64   // deepest bracket nesting accepted
	MaxNodes     = 2000 // most expression nodes in one line
)

// StmtKind tells a definition from a check.
type StmtKind uint8

const (
	// Def is NAME = EXPR or NAME [UNIT] = EXPR.
	Def StmtKind = iota
	// Check is check EXPR.
	Check
	// Inline is an inline value in prose: `=EXPR` or `=EXPR [UNIT]`.
	Inline
	// Corr is corr(a, b) = r: the correlation of two uncertain inputs.
	Corr
)

// Stmt is one parsed calc line. Offsets are byte offsets into the calc file.
type Stmt struct {
	Kind    StmtKind
	Line    int    // 1-based line in the calc file
	Off     int    // offset of the line's first byte
	Name    string // defined name (Def)
	NameOff int
	Unit    string // display unit as written, "" when none
	UnitOff int
	Expr    string // the expression as written
	ExprOff int
	Desc    string // the trailing // description, without its source
	// Source is the document a value comes from, written after a | at the
	// end of the description ("" when none); SourceOff is the offset of
	// the |. Only an input may have one (the reader checks that).
	Source    string
	SourceOff int

	display units.Unit
	hasUnit bool
	src     string     // Expr with literals replaced by placeholders
	tree    ast.Node   // parsed src
	syntax  Node       // tree in this package's types, for renderers
	lits    []*Literal // the unit literals; placeholder n stands for lits[n]
	deps    []string
	res     atomic.Pointer[resolution] // deps and Name as slot numbers (resolve.go)
	unc     *Uncertainty               // the ± part of an input line (uncert.go)

	corrA, corrB       string // the names of a corr line
	corrAOff, corrBOff int
	corrR              float64
}

// Literal is a number with a unit written in an expression, such as 12.5 MPa.
type Literal struct {
	Text string // as written: "12.5 MPa"
	Num  string // the number part: "12.5"
	Unit units.Unit
	Q    units.Quantity
	Off  int // offset of the literal in the calc file
}

// Deps returns the names the line reads, in order of first use.
func (s *Stmt) Deps() []string { return s.deps }

// Literal returns the unit literal a placeholder identifier stands for.
func (s *Stmt) Literal(ident string) (*Literal, bool) {
	return litOf(s.lits, ident)
}

// Literals returns the line's unit literals, in order (shared: read only).
func (s *Stmt) Literals() []*Literal { return s.lits }

// DisplayUnit returns the [UNIT] of a definition and whether it has one.
func (s *Stmt) DisplayUnit() (units.Unit, bool) { return s.display, s.hasUnit }

// ParseLine parses one calc line (without its line break) that starts at
// byte offset off of the file and is line number line. It returns nil and no
// errors for a blank or comment-only line. With errors, the statement it
// returns (if any) is not fit to run, but names what the line defines.
func ParseLine(text string, off, line int, ctx units.Context) (*Stmt, []*Error) {
	if len(text) > MaxLineBytes {
		return nil, []*Error{{Off: off, Msg: sprintf("line is %d bytes long; a calc line may be at most %d bytes", len(text), MaxLineBytes)}}
	}
	if !utf8.ValidString(text) {
		return nil, []*Error{{Off: off, Msg: "line is not valid UTF-8"}}
	}
	code, desc := splitComment(text)
	trimmed := strings.TrimSpace(code)
	if trimmed == "" {
		return nil, nil
	}
	s := &Stmt{Line: line, Off: off, Desc: desc}
	if e := s.splitSource(text, off); e != nil {
		return s, []*Error{e}
	}
	lead := len(code) - len(strings.TrimLeft(code, " \t"))
	rest := strings.TrimRight(code[lead:], " \t")
	var err *Error
	if kw, after, ok := cutKeyword(rest, "check"); ok {
		s.Kind = Check
		s.ExprOff = off + lead + len(kw) + (len(after) - len(strings.TrimLeft(after, " \t")))
		s.Expr = strings.TrimSpace(after)
	} else if isCorr(rest) {
		if err = s.parseCorr(rest, off+lead, ctx); err != nil {
			return s, []*Error{err}
		}
		return s, nil
	} else if err = s.parseHead(rest, off+lead, ctx); err != nil {
		return s, []*Error{err}
	}
	uText, uOff, err := s.splitUncertainty()
	if err != nil {
		return s, []*Error{err}
	}
	if s.Expr == "" {
		return s, []*Error{{Off: s.ExprOff, Msg: "expected an expression"}}
	}
	if err := s.compile(ctx); err != nil {
		return s, []*Error{err}
	}
	if uText != "" {
		if err := s.parseUncertainty(uText, uOff, ctx); err != nil {
			return s, []*Error{err}
		}
	}
	return s, nil
}

// isCorr reports whether a line starts corr(, a correlation line.
func isCorr(rest string) bool {
	_, after, ok := cutKeyword(rest, "corr")
	return ok && strings.HasPrefix(strings.TrimLeft(after, " \t"), "(")
}

// cutKeyword reports whether s starts with the word kw followed by a space.
func cutKeyword(s, kw string) (string, string, bool) {
	if !strings.HasPrefix(s, kw) || len(s) == len(kw) {
		return "", "", false
	}
	if c := s[len(kw)]; c != ' ' && c != '\t' && c != '(' {
		return "", "", false
	}
	return kw, s[len(kw):], true
}

// splitComment splits a line at the first // outside a string literal.
func splitComment(text string) (code, desc string) {
	i, w := indexOutsideStrings(text, "//")
	if i < 0 {
		return text, ""
	}
	return text[:i], strings.TrimSpace(text[i+w:])
}

// indexOutsideStrings returns the offset and length of the first of the
// marks that text holds outside a quoted string literal, or -1, 0.
func indexOutsideStrings(text string, marks ...string) (at, width int) {
	var quote byte
	for i := 0; i < len(text); i++ {
		c := text[i]
		switch {
		case quote != 0 && c == '\\':
			i++
		case quote != 0 && c == quote:
			quote = 0
		case quote == 0 && (c == '"' || c == '\''):
			quote = c
		case quote == 0:
			for _, m := range marks {
				if strings.HasPrefix(text[i:], m) {
					return i, len(m)
				}
			}
		}
	}
	return -1, 0
}

// splitSource moves a "| SOURCE" at the end of the description into
// Source. The | is the last one of the line, inside the description.
func (s *Stmt) splitSource(text string, off int) *Error {
	bar := strings.LastIndexByte(s.Desc, '|')
	if bar < 0 {
		return nil
	}
	s.SourceOff = off + strings.LastIndexByte(text, '|')
	s.Source = strings.TrimSpace(s.Desc[bar+1:])
	s.Desc = strings.TrimSpace(s.Desc[:bar])
	if s.Source == "" {
		return &Error{Off: s.SourceOff, Msg: "expected a source after |, such as | HB-001 rev C (the document the input comes from)"}
	}
	return nil
}

// parseHead reads NAME [UNIT] = and sets the expression that follows.
func (s *Stmt) parseHead(rest string, off int, ctx units.Context) *Error {
	n := identLen(rest)
	if n == 0 {
		return &Error{Off: off, Msg: "expected NAME = EXPR, NAME [UNIT] = EXPR or check EXPR"}
	}
	s.Name, s.NameOff = rest[:n], off
	if e := checkName(s.Name, off); e != nil {
		return e
	}
	i := skipSpace(rest, n)
	if i < len(rest) && rest[i] == '[' {
		end := strings.IndexByte(rest[i:], ']')
		if end < 0 {
			return &Error{Off: off + i, Msg: "missing ] after the display unit"}
		}
		s.Unit = strings.TrimSpace(rest[i+1 : i+end])
		s.UnitOff = off + i + 1 + (len(rest[i+1:i+end]) - len(strings.TrimLeft(rest[i+1:i+end], " ")))
		u, err := units.ParseCached(s.Unit)
		if err != nil {
			ue := unitError(err)
			return &Error{Off: s.UnitOff + ue.Off, Msg: ue.Msg}
		}
		s.display, s.hasUnit = u, true
		i = skipSpace(rest, i+end+1)
	}
	if i >= len(rest) || rest[i] != '=' || (i+1 < len(rest) && rest[i+1] == '=') {
		return &Error{Off: off + i, Msg: sprintf("expected = after %s", s.Name)}
	}
	i = skipSpace(rest, i+1)
	s.Expr, s.ExprOff = rest[i:], off+i
	return nil
}

func skipSpace(s string, i int) int {
	for i < len(s) && (s[i] == ' ' || s[i] == '\t') {
		i++
	}
	return i
}

// identLen returns the byte length of the identifier at the start of s.
func identLen(s string) int {
	n := 0
	for n < len(s) {
		r, w := utf8.DecodeRuneInString(s[n:])
		if !(r == '_' || unicode.IsLetter(r) || (n > 0 && unicode.IsDigit(r))) {
			break
		}
		n += w
	}
	return n
}

// reserved are words a calc cannot use as names: expression keywords,
// function names and constants.
var reserved = map[string]bool{
	"and": true, "or": true, "not": true, "in": true, "matches": true, "contains": true,
	"startsWith": true, "endsWith": true, "let": true, "if": true, "else": true,
	"nil": true, "true": true, "false": true, "check": true, "pi": true, "solve": true,
}

func checkName(name string, off int) *Error {
	switch {
	case name[0] == '_':
		return &Error{Off: off, Msg: sprintf("name %s may not start with _", name)}
	case reserved[name]:
		return &Error{Off: off, Msg: sprintf("%s is a reserved word and cannot be a name", name)}
	case funcs[name] != nil:
		return &Error{Off: off, Msg: sprintf("%s is a function and cannot be a name", name)}
	}
	return nil
}

// LoneLiteral returns the literal when the whole expression is one unit
// literal, such as 540 degC, else nil.
func (s *Stmt) LoneLiteral() *Literal {
	if id, ok := s.tree.(*ast.IdentifierNode); ok {
		l, _ := s.Literal(id.Value)
		return l
	}
	return nil
}

// ParseInline parses the text of an inline value after its "=": an
// expression with an optional trailing [UNIT].
func ParseInline(text string, off, line int, ctx units.Context) (*Stmt, []*Error) {
	if len(text) > MaxLineBytes {
		return nil, []*Error{{Off: off, Msg: sprintf("inline value is %d bytes long; at most %d are allowed", len(text), MaxLineBytes)}}
	}
	s := &Stmt{Kind: Inline, Line: line, Off: off - 1, Expr: text, ExprOff: off}
	body := strings.TrimRight(text, " ")
	if strings.HasSuffix(body, "]") {
		if i := strings.LastIndexByte(body, '['); i >= 0 {
			s.Unit = strings.TrimSpace(body[i+1 : len(body)-1])
			s.UnitOff = off + i + 1
			u, err := units.ParseCached(s.Unit)
			if err != nil {
				ue := unitError(err)
				return nil, []*Error{{Off: s.UnitOff + ue.Off, Msg: ue.Msg}}
			}
			s.display, s.hasUnit = u, true
			body = body[:i]
		}
	}
	lead := len(body) - len(strings.TrimLeft(body, " "))
	s.Expr, s.ExprOff = strings.TrimSpace(body), off+lead
	if s.Expr == "" {
		return nil, []*Error{{Off: off, Msg: "expected an expression after ="}}
	}
	if err := s.compile(ctx); err != nil {
		return nil, []*Error{err}
	}
	return s, nil
}

// IsLiteralInput reports whether the line defines a name as one unit
// literal shown in its own unit (p_1 = 12.5 MPa), so the value as written
// is the result.
func (s *Stmt) IsLiteralInput() bool {
	l := s.LoneLiteral()
	return l != nil && (!s.hasUnit || s.display.String() == l.Unit.String())
}

// IsLoneName reports whether the expression is one name or one field of a
// name (h_1 = st_1.h), whose substituted value is the result itself.
func (s *Stmt) IsLoneName() bool {
	switch v := s.tree.(type) {
	case *ast.IdentifierNode:
		_, lit := s.Literal(v.Value)
		return !lit
	case *ast.MemberNode:
		_, ok := v.Node.(*ast.IdentifierNode)
		return ok
	}
	return false
}

// IsPlainNumber reports whether the expression is one number without a
// unit (N_t = 12000).
func (s *Stmt) IsPlainNumber() bool {
	switch s.tree.(type) {
	case *ast.IntegerNode, *ast.FloatNode:
		return true
	}
	return false
}

// HasDisplayUnit reports whether the line names a display unit.
func (s *Stmt) HasDisplayUnit() bool { return s.hasUnit }

// IsGivenValue reports whether the expression is a value written out, the
// kind of line a sweep may vary: a number or a unit literal, either of them
// possibly negated (-5, -5 degC, -(12 MPa)), or a text in quotes. Anything
// else — a name, a call, arithmetic — is computed.
func (s *Stmt) IsGivenValue() bool {
	n := s.tree
	if u, ok := n.(*ast.UnaryNode); ok && (u.Operator == "-" || u.Operator == "+") {
		n = u.Node
		if _, isText := n.(*ast.StringNode); isText {
			return false
		}
	}
	switch v := n.(type) {
	case *ast.IntegerNode, *ast.FloatNode, *ast.StringNode:
		return true
	case *ast.IdentifierNode:
		_, lit := s.Literal(v.Value)
		return lit
	}
	return false
}
