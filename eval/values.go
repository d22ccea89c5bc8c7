package eval

import (
	"math"
	"sort"
	"strconv"
	"strings"
	"sync/atomic"

	"github.com/vouchcalc/vouch/units"

	"github.com/vouchcalc/vouch/internal/excerpt"
)

// KeyValue is one "key: value" pair of a YAML data file, as the document
// reads it.
type KeyValue struct {
	Key, Value string
	Quoted     bool // the value was written in quotes: text, not a quantity
	Line       int
	Comment    string // the comment at the end of the line, without its #
}

// ValuesReader reads the key: value pairs of a YAML data file; the document
// supplies it, with the same path rules and hashes as csv().
type ValuesReader func(path string) ([]KeyValue, error)

// Values is a YAML data file read by yaml(): named numbers, quantities and
// texts, read as fields: design.p_main.
type Values struct {
	Path   string
	fields map[string]any
	names  []string
	pairs  []KeyValue     // as written, in file order
	units  []units.Unit   // the unit each pair is written in (Factor 0: none)
	index  map[string]int // key → position in pairs
	read   []atomic.Bool  // whether the calc read the pair (Field)
}

func init() {
	register(&Func{Name: "yaml", Args: "\"path\"", MinArgs: 1, MaxArgs: 1,
		Doc:   "read a YAML file of key: value pairs inside the repository (12.5 MPa, 0.87, \"text\"); its keys are fields",
		Range: "paths inside the calc's repository only"})
}

// Field returns a value of the file by its key, and notes that the calc
// read it (Read).
func (v *Values) Field(name string) (any, error) {
	if x, ok := v.fields[name]; ok {
		v.read[v.index[name]].Store(true)
		return x, nil
	}
	return nil, errorf("%s has no key %s; its keys are %s", v.Path, name, strings.Join(v.names, " "))
}

// Pairs returns the file's key: value pairs as written, in file order.
func (v *Values) Pairs() []KeyValue { return v.pairs }

// Read returns the pairs the calc has read so far (through Field), as
// written, in file order.
func (v *Values) Read() []KeyValue {
	var out []KeyValue
	for i, kv := range v.pairs {
		if v.read[i].Load() {
			out = append(out, kv)
		}
	}
	return out
}

// WrittenUnit returns the unit a key's value is written in, if any.
func (v *Values) WrittenUnit(key string) (units.Unit, bool) {
	i, ok := v.index[key]
	if !ok || v.units[i].Factor == 0 {
		return units.Unit{}, false
	}
	return v.units[i], true
}

// FieldNames lists the keys, sorted.
func (v *Values) FieldNames() []string { return v.names }

// readValues runs yaml(path) through the engine's reader.
func (e *Engine) readValues(args []any) (any, error) {
	path, ok := args[0].(string)
	if !ok {
		return nil, errorf("yaml needs a file path in quotes, not %s", kindOf(args[0]))
	}
	if e.YAML == nil {
		return nil, errorf("yaml(%s): this calc cannot read data files", excerpt.Quote(path))
	}
	pairs, err := e.YAML(path)
	if err != nil {
		return nil, errorf("yaml(%s): %v", excerpt.Quote(path), err)
	}
	v := &Values{Path: path, fields: map[string]any{}, index: map[string]int{}, pairs: pairs, read: make([]atomic.Bool, len(pairs))}
	for i, kv := range pairs {
		x, u, err := valueOf(kv, e.Ctx)
		if err != nil {
			return nil, errorf("%s:%d: %s: %v", path, kv.Line, excerpt.Cut(kv.Key), err)
		}
		v.fields[kv.Key] = x
		v.names = append(v.names, kv.Key)
		v.units = append(v.units, u)
		v.index[kv.Key] = i
	}
	sort.Strings(v.names)
	return v, nil
}

// valueOf reads one value: text in quotes, true or false, or a number with
// an optional unit. It returns the unit written (Factor 0 when none).
func valueOf(kv KeyValue, ctx units.Context) (any, units.Unit, error) {
	none := units.Unit{}
	if kv.Quoted {
		return kv.Value, none, nil
	}
	switch kv.Value {
	case "true", "false":
		return kv.Value == "true", none, nil
	}
	num, unit, _ := strings.Cut(strings.TrimSpace(kv.Value), " ")
	x, err := strconv.ParseFloat(num, 64)
	if err != nil || x != x || x > 1e308 || x < -1e308 {
		return nil, none, errorf("%s is not a number with an optional unit (write text in quotes)", excerpt.Quote(kv.Value))
	}
	if strings.TrimSpace(unit) == "" {
		return units.Num(x), none, nil
	}
	u, err := dataUnit(strings.TrimSpace(unit))
	if err != nil {
		return nil, none, err
	}
	q := u.Q(x, ctx)
	if math.IsInf(q.V, 0) {
		return nil, none, errorf("%s is beyond the range of numbers in SI units", excerpt.Cut(strings.TrimSpace(kv.Value)))
	}
	return q, u, nil
}

// String describes the file for listings.
func (v *Values) String() string {
	return "data " + v.Path + " (" + strconv.Itoa(len(v.names)) + " values)"
}
