package calcdoc

import (
	"strings"

	"github.com/vouchcalc/vouch/eval"
)

// typesetCache keeps the MathML of the names and written unit texts a
// document has already typeset: a long calc repeats a few of each on
// every line. It belongs to one Doc and is used by one render at a time.
type typesetCache struct {
	names map[string]string // calc name → nameMathML
	units map[string]string // unit text as written in a literal → unitMathML
}

// name is nameMathML(n), typeset once per document.
func (c *typesetCache) name(n string) string {
	if s, ok := c.names[n]; ok {
		return s
	}
	if c.names == nil {
		c.names = map[string]string{}
	}
	s := nameMathML(n)
	c.names[n] = s
	return s
}

// literalUnit is unitMathML(l.Unit), typeset once per unit text: a
// literal's unit was parsed from its text after the number (eval's
// makeLiteral), so the same text is the same unit.
func (c *typesetCache) literalUnit(l *eval.Literal) string {
	if !strings.HasPrefix(l.Text, l.Num) {
		return unitMathML(l.Unit)
	}
	key := l.Text[len(l.Num):]
	if s, ok := c.units[key]; ok {
		return s
	}
	if c.units == nil {
		c.units = map[string]string{}
	}
	s := unitMathML(l.Unit)
	c.units[key] = s
	return s
}
