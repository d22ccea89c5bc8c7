package eval

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode"

	"github.com/vouchcalc/vouch/units"

	"github.com/vouchcalc/vouch/internal/excerpt"
)

// DataReader reads a data file named in a calc. The document supplies it:
// it resolves the path, refuses paths that leave the repository and records
// the file's hash.
type DataReader func(path string) ([]byte, error)

// Table is a data file read by csv(): columns of quantities in SI.
type Table struct {
	Path  string
	Names []string
	Units []units.Unit
	Cols  [][]units.Quantity
	Text  [][]string // the values as written, column by column
	// Header is the header row as written; Lines the file line of each
	// row of data.
	Header []string
	Lines  []int
}

// Interpolation is how interp found a value: the two rows of the table
// that bracket x (0-based data rows) and the fraction of the way from the
// first to the second.
type Interpolation struct {
	Table    *Table
	X, Y     int // column indexes
	Rows     [2]int
	Fraction float64
}

// MaxTableRows bounds a data table.
const MaxTableRows = 100000

func init() {
	register(&Func{Name: "csv", Args: "\"path\"", MinArgs: 1, MaxArgs: 1,
		Doc:   "read a CSV table inside the repository; the header names each column with its unit: T_cw [degC]",
		Range: "paths inside the calc's repository only"})
	register(&Func{Name: "interp", Args: "table, \"x column\", x, \"y column\"", MinArgs: 4, MaxArgs: 4,
		Doc:   "linear interpolation in a table; the x column must be strictly monotonic",
		Range: "x within the table's range; never extrapolates", Call: callInterp})
}

// readTable runs csv(path) through the engine's data reader.
func (e *Engine) readTable(args []any) (any, error) {
	path, ok := args[0].(string)
	if !ok {
		return nil, errorf("csv needs a file path in quotes, not %s", kindOf(args[0]))
	}
	if e.Data == nil {
		return nil, errorf("csv(%s): this calc cannot read data files", excerpt.Quote(path))
	}
	raw, err := e.Data(path)
	if err != nil {
		return nil, errorf("csv(%s): %v", excerpt.Quote(path), err)
	}
	return parseTable(path, raw, e.Ctx)
}

// parseTable reads a CSV whose header names each column with its unit.
func parseTable(path string, raw []byte, ctx units.Context) (*Table, error) {
	r := csv.NewReader(bytes.NewReader(raw))
	r.Comment = '#'
	head, err := r.Read()
	if err != nil {
		return nil, errorf("%s: cannot read the header row: %v", path, err)
	}
	t := &Table{Path: path, Cols: make([][]units.Quantity, len(head)), Text: make([][]string, len(head)), Header: head}
	for i, h := range head {
		name, u, err := parseHeader(h)
		if err != nil {
			return nil, errorf("%s:1: column %d: %v", path, i+1, err)
		}
		t.Names, t.Units = append(t.Names, name), append(t.Units, u)
	}
	for row := 2; ; row++ {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, errorf("%s: %v", path, err)
		}
		if row > MaxTableRows {
			return nil, errorf("%s: more than %d rows", path, MaxTableRows)
		}
		line, _ := r.FieldPos(0)
		if err := t.addRow(rec, ctx); err != nil {
			return nil, errorf("%s:%d: %v", path, line, err)
		}
		t.Lines = append(t.Lines, line)
	}
	if len(t.Cols[0]) < 2 {
		return nil, errorf("%s: a table needs at least two rows of data", path)
	}
	return t, nil
}

// dataUnit parses a unit written in a data file; a unit text too long to
// be one is refused with an excerpt, so no message carries a whole field.
func dataUnit(text string) (units.Unit, error) {
	if len(text) > excerpt.Max {
		return units.Unit{}, errorf("%s is not a unit", excerpt.Quote(text))
	}
	return units.ParseCached(text)
}

func parseHeader(h string) (string, units.Unit, error) {
	name, unit, ok := strings.Cut(strings.TrimSpace(h), "[")
	name = strings.TrimSpace(name)
	if name == "" {
		return "", units.Unit{}, errorf("a column needs a name, such as T_cw [degC]")
	}
	if strings.IndexFunc(name, unicode.IsControl) >= 0 {
		return "", units.Unit{}, errorf("column name %s holds a control character", excerpt.Quote(name))
	}
	if len(name) > excerpt.Max {
		return "", units.Unit{}, errorf("column name %s is longer than %d bytes", excerpt.Quote(name), excerpt.Max)
	}
	if !ok {
		return name, units.Unit{Factor: 1}, nil
	}
	u, err := dataUnit(strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(unit), "]")))
	if err != nil {
		return "", units.Unit{}, err
	}
	return name, u, nil
}

func (t *Table) addRow(rec []string, ctx units.Context) error {
	if len(rec) != len(t.Names) {
		return errorf("%d values in a row of %d columns", len(rec), len(t.Names))
	}
	for i, s := range rec {
		v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return errorf("column %s: %s is not a number", excerpt.Cut(t.Names[i]), excerpt.Quote(s))
		}
		q := t.Units[i].Q(v, ctx)
		if math.IsInf(q.V, 0) {
			return errorf("column %s: %s in its unit is beyond the range of numbers", t.Names[i], excerpt.Cut(strings.TrimSpace(s)))
		}
		t.Cols[i] = append(t.Cols[i], q)
		t.Text[i] = append(t.Text[i], strings.TrimSpace(s))
	}
	return nil
}

func (t *Table) column(name string) ([]units.Quantity, error) {
	for i, n := range t.Names {
		if n == name {
			return t.Cols[i], nil
		}
	}
	return nil, errorf("%s has no column %s; its columns are %s", excerpt.Cut(t.Path), excerpt.Quote(name), excerpt.Cut(strings.Join(t.Names, ", ")))
}

// callInterp interpolates linearly: interp(table, "x", x, "y").
func callInterp(args []any) (any, error) {
	y, _, err := interpDetail(args)
	return y, err
}

// interpDetail interpolates and says between which rows.
func interpDetail(args []any) (units.Quantity, *Interpolation, error) {
	t, ok := args[0].(*Table)
	none := units.Quantity{}
	if !ok {
		return none, nil, errorf("interp needs a table read with csv(...) first, not %s", kindOf(args[0]))
	}
	xn, ok1 := args[1].(string)
	yn, ok2 := args[3].(string)
	x, ok3 := args[2].(units.Quantity)
	if !ok1 || !ok2 || !ok3 {
		return none, nil, errorf("write interp(table, \"x column\", x, \"y column\")")
	}
	xs, err := t.column(xn)
	if err != nil {
		return none, nil, err
	}
	ys, err := t.column(yn)
	if err != nil {
		return none, nil, err
	}
	if xs[0].D != x.D {
		return none, nil, errorf("interp: column %s is %s, but x is %s", xn, xs[0].D.Name(), x.D.Name())
	}
	y, i, f, err := interpolate(t, xn, xs, ys, x, t.Units[t.index(xn)])
	if err != nil {
		return none, nil, err
	}
	return y, &Interpolation{Table: t, X: t.index(xn), Y: t.index(yn), Rows: [2]int{i - 1, i}, Fraction: f}, nil
}

func (t *Table) index(name string) int {
	for i, n := range t.Names {
		if n == name {
			return i
		}
	}
	return -1
}

// interpolate returns y at x, the row i such that rows i-1 and i bracket
// x, and the fraction of the way from row i-1 to row i.
func interpolate(t *Table, xn string, xs, ys []units.Quantity, x units.Quantity, xu units.Unit) (units.Quantity, int, float64, error) {
	show := func(q units.Quantity) string {
		s, err := q.Text(xu, 4, units.StandardAtmosphere)
		if err != nil {
			return quantityText(q)
		}
		return s
	}
	sign := math.Copysign(1, xs[1].V-xs[0].V)
	for i := 1; i < len(xs); i++ {
		if float64((xs[i].V-xs[i-1].V)*sign) <= 0 {
			return units.Quantity{}, 0, 0, errorf("interp: column %s of %s is not strictly increasing or decreasing at row %d", xn, t.Path, i+2)
		}
	}
	lo, hi := xs[0], xs[len(xs)-1]
	if sign < 0 {
		lo, hi = hi, lo
	}
	if x.V < lo.V || x.V > hi.V {
		return units.Quantity{}, 0, 0, errorf("interp: %s = %s is outside the table's range %s to %s (%s); a table is never extrapolated",
			xn, show(x), show(lo), show(hi), t.Path)
	}
	i := 1
	for i < len(xs)-1 && float64((xs[i].V-x.V)*sign) < 0 {
		i++
	}
	y := ys[i-1]
	f := fraction(xs[i-1].V, xs[i].V, x.V)
	y.V = lerp(ys[i-1].V, ys[i].V, f)
	return y, i, f, nil
}

// fraction is (x - a)/(b - a), computed in halves when b - a would
// overflow (values near the largest float64).
func fraction(a, b, x float64) float64 {
	if d := b - a; !math.IsInf(d, 0) {
		return (x - a) / d
	}
	return (float64(x/2) - float64(a/2)) / (float64(b/2) - float64(a/2))
}

// lerp is a + f(b - a) for f in [0, 1], or (1 - f)a + fb when b - a would
// overflow; either stays between a and b.
func lerp(a, b, f float64) float64 {
	if d := b - a; !math.IsInf(d, 0) {
		return a + float64(f*d)
	}
	return float64((1-f)*a) + float64(f*b)
}

// String describes a table for listings.
func (t *Table) String() string { return fmt.Sprintf("table %s (%d rows)", t.Path, len(t.Cols[0])) }
