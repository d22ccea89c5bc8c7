package calcdoc

import (
	"strconv"
	"strings"

	"go.yaml.in/yaml/v3"
)

// Compare is the front-matter key compare of an alternate calculation:
//
//	compare: {maps: {eta: eta_th}, tolerances: {W_net: 1 %}}
//
// maps pairs a name of this calc (the key) with the name the original
// calc gives the same result (the value); tolerances sets the relative
// tolerance of a result, by either of its names, in percent.
type Compare struct {
	Maps       []NamePair
	Tolerances []Tolerance
}

// NamePair is one mapping: Name in this calc is Other in the original.
type NamePair struct {
	Name, Other string
	Line        int // the calc file line of the entry
}

// Tolerance is a relative tolerance for one result.
type Tolerance struct {
	Name string
	Rel  float64 // as a fraction: 1 % is 0.01
	Text string  // as written
	Line int     // the calc file line of the entry
}

// compareKeys are the keys under compare.
var compareKeys = []string{"maps", "tolerances"}

func (f *Front) setCompare(v *yaml.Node) []*frontErr {
	if v.Kind != yaml.MappingNode {
		return nodeErr(v, "compare must hold maps and tolerances, such as {maps: {eta: eta_th}, tolerances: {W_net: 1 %%}}")
	}
	var errs []*frontErr
	for i := 0; i+1 < len(v.Content); i += 2 {
		k, m := v.Content[i], v.Content[i+1]
		if k.Value != "maps" && k.Value != "tolerances" {
			errs = append(errs, nodeErr(k, "unknown key %q under compare; the keys are %s", k.Value, strings.Join(compareKeys, ", "))...)
			continue
		}
		if m.Kind != yaml.MappingNode {
			errs = append(errs, nodeErr(m, "compare %s must be a set of NAME: VALUE entries", k.Value)...)
			continue
		}
		for j := 0; j+1 < len(m.Content); j += 2 {
			errs = append(errs, f.compareEntry(k.Value, m.Content[j], m.Content[j+1])...)
		}
	}
	return errs
}

// compareEntry reads one entry of maps or tolerances.
func (f *Front) compareEntry(kind string, k, v *yaml.Node) []*frontErr {
	if k.Kind != yaml.ScalarNode || v.Kind != yaml.ScalarNode || k.Value == "" || v.Value == "" {
		return nodeErr(k, "compare %s: each entry is NAME: VALUE", kind)
	}
	if kind == "maps" {
		f.Compare.Maps = append(f.Compare.Maps, NamePair{Name: k.Value, Other: v.Value, Line: k.Line + 1})
		return nil
	}
	num, ok := strings.CutSuffix(strings.TrimSpace(v.Value), "%")
	x, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
	if !ok || err != nil || !(x > 0 && x < 100) {
		return nodeErr(v, "tolerance of %s must be a percentage above 0 and below 100, such as 1 %%, not %q", k.Value, v.Value)
	}
	f.Compare.Tolerances = append(f.Compare.Tolerances, Tolerance{Name: k.Value, Rel: x / 100, Text: v.Value, Line: v.Line + 1})
	return nil
}
