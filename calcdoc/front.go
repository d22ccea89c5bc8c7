package calcdoc

import (
	"bytes"
	"fmt"
	"net/mail"
	"sort"
	"strings"

	"go.yaml.in/yaml/v3"

	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/internal/excerpt"
	"github.com/vouchcalc/vouch/units"
)

// Front is the calc file's front matter.
type Front struct {
	Title      string
	Number     string
	Project    string
	Revision   string
	Digits     int    // significant figures shown (default 4)
	Atmosphere string // as written; Ctx holds the value
	People     People
	Summary    []string
	// Compare maps this calc's names onto those of the calc it is an
	// alternate calculation of, and sets tolerances (comparefront.go).
	Compare Compare
	// SummaryLine is the file line of the summary key (0 when absent).
	SummaryLine int
	// References are the documents the calc cites (key references).
	References []Reference
	// Paper, Display and USPower are the calc's own choices ("" when the
	// front matter leaves them to the settings).
	Paper, Display, USPower string
	// Extra are the firm's extra keys the calc sets, in file order.
	Extra []ExtraField
	// Revisions are the revisions the front matter describes (revisions.go).
	Revisions []RevisionNote

	Ctx   units.Context
	house *settings.Settings // the settings the front matter is read with
}

// ExtraField is one of the firm's extra front-matter keys (vouch.yaml's
// front_matter) as a calc sets it, with the label the cover prints.
type ExtraField struct {
	Key, Label, Value string
}

// People names who prepared, checked and approved the calc.
type People struct {
	Preparer Person
	Checker  Person
	Approver Person
}

// Person is a name and an e-mail address, "P. Writer <p@example.com>".
type Person struct {
	Name  string
	Email string
	Text  string // as written
}

// frontKeys are the front-matter keys; any other key is an error.
var frontKeys = []string{"title", "number", "project", "revision", "digits", "atmosphere", "people", "summary", "compare", "paper", "display", "us_power", "references", "revisions"}

// peopleKeys are the roles under people.
var peopleKeys = []string{"preparer", "checker", "approver"}

// DefaultDigits is the number of significant figures shown by default.
const DefaultDigits = 4

// splitFront finds YAML front matter between --- lines at the start of src.
// It returns the YAML text, the byte offset where it starts, and the end of
// the closing --- line (0 when there is no front matter).
// A byte-order mark before the first --- is read past, and spaces or tabs
// after --- are allowed, so neither hides the front matter.
func splitFront(src []byte) (yamlText []byte, start, end int, err *frontErr) {
	first, _, _ := bytes.Cut(src[bomLen(src):], []byte("\n"))
	if strings.TrimRight(string(first), " \t\r") != "---" {
		return nil, 0, 0, nil
	}
	start = bytes.IndexByte(src, '\n') + 1
	for i := start; i < len(src); {
		j := bytes.IndexByte(src[i:], '\n')
		lineEnd := len(src)
		if j >= 0 {
			lineEnd = i + j
		}
		line := strings.TrimRight(string(src[i:lineEnd]), " \t\r")
		if line == "---" || line == "..." {
			return src[start:i], start, min(lineEnd+1, len(src)), nil
		}
		i = lineEnd + 1
	}
	return nil, 0, 0, &frontErr{off: 0, msg: "front matter is not closed: add a line --- after it"}
}

type frontErr struct {
	off  int // byte offset, when line is 0
	line int // 1-based line within the YAML text
	col  int
	msg  string
	// refLine, when set, is a line of the YAML text the message names: msg
	// holds a NUL byte where its line in the file goes (user text in a
	// message is quoted with control characters escaped, so it holds none).
	refLine int
}

// parseFront decodes and checks the front matter. Errors carry positions
// relative to the YAML text.
func parseFront(text []byte, s *settings.Settings) (Front, []*frontErr) {
	f := Front{Digits: DefaultDigits, Ctx: units.StandardAtmosphere, house: s}
	var root yaml.Node
	if err := yaml.Unmarshal(text, &root); err != nil {
		return f, []*frontErr{{line: 1, col: 1, msg: "front matter is not valid YAML: " + strings.TrimPrefix(err.Error(), "yaml: ")}}
	}
	if len(root.Content) == 0 {
		return f, nil
	}
	m := root.Content[0]
	if m.Kind != yaml.MappingNode {
		return f, []*frontErr{{line: m.Line, col: m.Column, msg: "front matter must be a list of key: value lines"}}
	}
	errs := dropRepeatedKeys(m)
	for i := 0; i+1 < len(m.Content); i += 2 {
		k, v := m.Content[i], m.Content[i+1]
		if e := f.set(k, v); e != nil {
			errs = append(errs, e...)
		}
	}
	return f, errs
}

// dropRepeatedKeys reports every key given twice in one mapping, at any
// depth of n and in file order, at the line of its second use, and removes
// the repeats so that the first one counts and nothing is silently
// overridden.
func dropRepeatedKeys(n *yaml.Node) []*frontErr {
	if n.Kind != yaml.MappingNode {
		var errs []*frontErr
		for _, c := range n.Content {
			errs = append(errs, dropRepeatedKeys(c)...)
		}
		return errs
	}
	var errs []*frontErr
	first := map[string]int{}
	kept := n.Content[:0:0]
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		if line, dup := first[k.Value]; dup && k.Kind == yaml.ScalarNode {
			e := nodeErr(k, "%s is already given on line \x00; give each key once", excerpt.Cut(k.Value))
			e[0].refLine = line
			errs = append(errs, e...)
			continue
		}
		if k.Kind == yaml.ScalarNode {
			first[k.Value] = k.Line
		}
		kept = append(kept, k, v)
		errs = append(errs, dropRepeatedKeys(v)...)
	}
	n.Content = kept
	return errs
}

func nodeErr(n *yaml.Node, format string, args ...any) []*frontErr {
	return []*frontErr{{line: n.Line, col: n.Column, msg: fmt.Sprintf(format, args...)}}
}

// set applies one front-matter key.
func (f *Front) set(k, v *yaml.Node) []*frontErr {
	switch k.Value {
	case "title", "number", "project", "revision":
		s, e := scalar(k, v)
		if e != nil {
			return e
		}
		*map[string]*string{"title": &f.Title, "number": &f.Number, "project": &f.Project, "revision": &f.Revision}[k.Value] = s
	case "digits":
		return f.setDigits(v)
	case "atmosphere":
		return f.setAtmosphere(k, v)
	case "people":
		return f.setPeople(v)
	case "summary":
		return f.setSummary(v)
	case "compare":
		return f.setCompare(v)
	case "references":
		return f.setReferences(v)
	case "paper", "display", "us_power":
		return f.setChoice(k, v)
	case "revisions":
		return f.setRevisions(v)
	default:
		return f.setExtra(k, v)
	}
	return nil
}

func sorted(s []string) []string {
	out := append([]string(nil), s...)
	sort.Strings(out)
	return out
}

func scalar(k, v *yaml.Node) (string, []*frontErr) {
	if v.Kind != yaml.ScalarNode {
		return "", nodeErr(v, "%s must be a single value", k.Value)
	}
	return v.Value, nil
}

func (f *Front) setDigits(v *yaml.Node) []*frontErr {
	var n int
	if v.Kind != yaml.ScalarNode || v.Decode(&n) != nil || n < 2 || n > 15 {
		return nodeErr(v, "digits must be a whole number from 2 to 15, not %s", excerpt.Quote(v.Value))
	}
	f.Digits = n
	return nil
}

func (f *Front) setAtmosphere(k, v *yaml.Node) []*frontErr {
	s, e := scalar(k, v)
	if e != nil {
		return e
	}
	num, unit, ok := strings.Cut(strings.TrimSpace(s), " ")
	var x float64
	if _, err := fmt.Sscan(num, &x); !ok || err != nil {
		return nodeErr(v, "atmosphere must be a pressure such as 101.325 kPa, not %s", excerpt.Quote(s))
	}
	u, err := units.Parse(strings.TrimSpace(unit))
	if err != nil || u.Dim != units.DimPressure || u.Kind == units.Gauge || x <= 0 {
		return nodeErr(v, "atmosphere must be a positive absolute pressure such as 101.325 kPa, not %s", excerpt.Quote(s))
	}
	f.Atmosphere = s
	f.Ctx = units.Context{Atmosphere: u.Q(x, units.Context{}).V}
	return nil
}

func (f *Front) setPeople(v *yaml.Node) []*frontErr {
	if v.Kind != yaml.MappingNode {
		return nodeErr(v, "people must list preparer, checker and approver")
	}
	var errs []*frontErr
	for i := 0; i+1 < len(v.Content); i += 2 {
		k, p := v.Content[i], v.Content[i+1]
		dst := map[string]*Person{"preparer": &f.People.Preparer, "checker": &f.People.Checker, "approver": &f.People.Approver}[k.Value]
		if dst == nil {
			errs = append(errs, nodeErr(k, "unknown role %s under people; the roles are %s", excerpt.Quote(k.Value), strings.Join(peopleKeys, ", "))...)
			continue
		}
		s, e := scalar(k, p)
		if e != nil {
			errs = append(errs, e...)
			continue
		}
		addr, err := mail.ParseAddress(s)
		if err != nil {
			errs = append(errs, nodeErr(p, "%s must be written Name <email>, not %s", k.Value, excerpt.Quote(s))...)
			continue
		}
		*dst = Person{Name: addr.Name, Email: addr.Address, Text: s}
	}
	return errs
}

func (f *Front) setSummary(v *yaml.Node) []*frontErr {
	if v.Kind != yaml.SequenceNode {
		return nodeErr(v, "summary must be a list of names, such as [eta_th, W_net]")
	}
	f.SummaryLine = v.Line
	for _, n := range v.Content {
		if n.Kind != yaml.ScalarNode {
			return nodeErr(n, "summary must be a list of names")
		}
		f.Summary = append(f.Summary, n.Value)
	}
	return nil
}

// choices are the values of the front-matter keys that pick from a list.
var choices = map[string][]string{
	"paper":    {settings.A4, settings.Letter},
	"display":  {settings.SI, settings.US},
	"us_power": {settings.PowerHP, settings.PowerKW},
}

// setChoice sets paper, display or us_power, each one of a few values.
func (f *Front) setChoice(k, v *yaml.Node) []*frontErr {
	s, e := scalar(k, v)
	if e != nil {
		return e
	}
	ok := choices[k.Value]
	if !contains(ok, s) {
		return nodeErr(v, "%s must be %s, not %q", k.Value, strings.Join(ok, " or "), s)
	}
	*map[string]*string{"paper": &f.Paper, "display": &f.Display, "us_power": &f.USPower}[k.Value] = s
	return nil
}

// setExtra sets one of the firm's extra keys; any other key is an error
// that lists the known keys, the firm's among them.
func (f *Front) setExtra(k, v *yaml.Node) []*frontErr {
	label, ok := f.house.Label(k.Value)
	if !ok {
		known := append([]string(nil), frontKeys...)
		for _, x := range f.house.FrontMatter {
			known = append(known, x.Key)
		}
		msg := fmt.Sprintf("unknown front-matter key %s; known keys are %s", excerpt.Quote(k.Value), strings.Join(sorted(known), ", "))
		if len(f.house.FrontMatter) == 0 {
			msg += " (a firm declares its own keys under front_matter in vouch.yaml)"
		}
		return nodeErr(k, "%s", msg)
	}
	s, e := scalar(k, v)
	if e != nil {
		return e
	}
	f.Extra = append(f.Extra, ExtraField{Key: k.Value, Label: label, Value: s})
	return nil
}
