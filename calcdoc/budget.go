package calcdoc

import (
	"strconv"
	"strings"

	gast "github.com/yuin/goldmark/ast"

	"github.com/vouchcalc/vouch/units"
)

// Budget is a `budget` block: an uncertainty budget per named result, and
// sensitivity tables.
//
//	NAME                 the budget of NAME, U with k = 2
//	NAME k=2             the coverage factor stated
//	NAME mc 100000       with a Monte Carlo check (JCGM 101)
//	sensitivity NAME     c_i and (∂y/y)/(∂x/x) of every input, sorted
type Budget struct {
	Line, Off int
	Entries   []*BudgetEntry
}

// BudgetEntry is one line of a budget block and, once evaluated, its table.
type BudgetEntry struct {
	Name  string
	Off   int
	K     float64 // the coverage factor of U
	KText string
	MC    int  // Monte Carlo draws; 0 for none
	Sens  bool // a sensitivity table rather than a budget
	line  int

	Y       units.Quantity // the result
	Display units.Unit
	Rows    []BudgetRow
	Uc      float64 // combined standard uncertainty, SI
	CovFrac float64 // share of u_c² from the correlation terms
	MCRes   *MCResult
}

// BudgetRow is one input of a budget or sensitivity table.
type BudgetRow struct {
	In     *UncInput
	Coef   Coef
	CU     float64 // c_i·u(x_i), SI units of the result
	Share  float64 // c_i²u²(x_i)/u_c², as a fraction
	Rel    float64 // (∂y/y)/(∂x/x)
	HasRel bool
}

// MaxMCDraws bounds the draws of a Monte Carlo check.
const MaxMCDraws = 1000000

// readBudget parses a budget block's lines.
func (d *Doc) readBudget(b *gast.FencedCodeBlock) {
	d.checkClosed(b)
	bg := &Budget{Off: b.Info.Segment.Start, Line: d.lines.pos(d.Src, b.Info.Segment.Start).Line}
	d.Budgets = append(d.Budgets, bg)
	for _, l := range d.directives(b) {
		if e := d.budgetLine(l.text, l.off); e != nil {
			e.line = d.lines.pos(d.Src, l.off).Line
			bg.Entries = append(bg.Entries, e)
		}
	}
	if len(bg.Entries) == 0 {
		d.errorf(bg.Off, "a budget block needs a line: NAME, NAME k=2, NAME mc 100000 or sensitivity NAME")
	}
}

// budgetLine reads NAME [k=K] [mc N] or sensitivity NAME.
func (d *Doc) budgetLine(text string, off int) *BudgetEntry {
	words := strings.Fields(text)
	offs := make([]int, len(words))
	at := 0
	for i, w := range words {
		at += strings.Index(text[at:], w)
		offs[i] = off + at
		at += len(w)
	}
	e := &BudgetEntry{K: 2, KText: "2"}
	if words[0] == "sensitivity" {
		if len(words) != 2 {
			d.errorf(off, "write: sensitivity NAME")
			return nil
		}
		e.Sens, e.Name, e.Off = true, words[1], offs[1]
		return e
	}
	e.Name, e.Off = words[0], offs[0]
	for i := 1; i < len(words); i++ {
		switch w := words[i]; {
		case strings.HasPrefix(w, "k="):
			k, err := strconv.ParseFloat(w[2:], 64)
			if err != nil || !(k > 0) || k > 1e3 {
				d.errorf(offs[i], "the coverage factor k must be a number above zero, such as k=2, not %s", w)
				return nil
			}
			e.K, e.KText = k, w[2:]
		case w == "mc" && i+1 < len(words):
			n, err := strconv.Atoi(words[i+1])
			if err != nil || n < 1000 {
				d.errorf(offs[i+1], "mc takes a whole number of draws from 1000 to %d, such as mc 100000, not %s", MaxMCDraws, words[i+1])
				return nil
			}
			if n > MaxMCDraws {
				d.errorf(offs[i+1], "mc %d: at most %d draws are allowed", n, MaxMCDraws)
				return nil
			}
			e.MC = n
			i++
		default:
			d.errorf(offs[i], "write: %s, %s k=2, %s mc 100000 or sensitivity %s", e.Name, e.Name, e.Name, e.Name)
			return nil
		}
	}
	return e
}
