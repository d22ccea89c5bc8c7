package eval

import (
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/units"

	"github.com/vouchcalc/vouch/internal/excerpt"
)

// KeyValue is one "key: value" pair of a YAML data file, as the document
// reads it.
type KeyValue struct {
	Key, Value string
	Quoted     bool // the value was written in quotes: text, not a quantity
	Line       int
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
}

func init() {
	register(&Func{Name: "yaml", Args: "\"path\"", MinArgs: 1, MaxArgs: 1,
		Doc:   "read a YAML file of key: value pairs inside the repository (12.5 MPa, 0.87, \"text\"); its keys are fields",
		Range: "paths inside the calc's repository only"})
}

// Field returns a value of the file by its key.
func (v *Values) Field(name string) (any, error) {
	if x, ok := v.fields[name]; ok {
		return x, nil
	}
	return nil, errorf("%s has no key %s; its keys are %s", v.Path, name, strings.Join(v.names, " "))
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
	v := &Values{Path: path, fields: map[string]any{}}
	for _, kv := range pairs {
		x, err := valueOf(kv, e.Ctx)
		if err != nil {
			return nil, errorf("%s:%d: %s: %v", path, kv.Line, excerpt.Cut(kv.Key), err)
		}
		v.fields[kv.Key] = x
		v.names = append(v.names, kv.Key)
	}
	sort.Strings(v.names)
	return v, nil
}

// valueOf reads one value: text in quotes, true or false, or a number with
// an optional unit.
func valueOf(kv KeyValue, ctx units.Context) (any, error) {
	if kv.Quoted {
		return kv.Value, nil
	}
	switch kv.Value {
	case "true", "false":
		return kv.Value == "true", nil
	}
	num, unit, _ := strings.Cut(strings.TrimSpace(kv.Value), " ")
	x, err := strconv.ParseFloat(num, 64)
	if err != nil || x != x || x > 1e308 || x < -1e308 {
		return nil, errorf("%s is not a number with an optional unit (write text in quotes)", excerpt.Quote(kv.Value))
	}
	if strings.TrimSpace(unit) == "" {
		return units.Num(x), nil
	}
	u, err := dataUnit(strings.TrimSpace(unit))
	if err != nil {
		return nil, err
	}
	q := u.Q(x, ctx)
	if math.IsInf(q.V, 0) {
		return nil, errorf("%s is beyond the range of numbers in SI units", excerpt.Cut(strings.TrimSpace(kv.Value)))
	}
	return q, nil
}

// String describes the file for listings.
func (v *Values) String() string {
	return "data " + v.Path + " (" + strconv.Itoa(len(v.names)) + " values)"
}
