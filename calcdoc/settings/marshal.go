package settings

import (
	"bytes"
	"strconv"

	"go.yaml.in/yaml/v3"
)

// Marshal writes the settings as a vouch.yaml that Parse reads back to the
// same values: every key, in the order of the reference, defaults included.
func (s *Settings) Marshal() ([]byte, error) {
	top := mapNode()
	if f := s.firmNode(); len(f.Content) > 0 {
		add(top, "firm", f)
	}
	add(top, "paper", str(s.Paper))
	add(top, "caution", str(s.Caution))
	add(top, "display", str(s.Display))
	add(top, "us_power", str(s.USPower))
	if len(s.FrontMatter) > 0 {
		fm := mapNode()
		for _, k := range s.FrontMatter {
			add(fm, k.Key, str(k.Label))
		}
		add(top, "front_matter", fm)
	}
	add(top, "signers", str(s.Signers))
	add(top, "roles", s.rolesNode())
	tol := mapNode()
	add(tol, "tolerance", str(strconv.FormatFloat(s.TolerancePercent, 'g', -1, 64)+" %"))
	add(top, "compare", tol)
	add(top, "templates", str(s.Templates))
	var b bytes.Buffer
	enc := yaml.NewEncoder(&b)
	enc.SetIndent(2)
	if err := enc.Encode(top); err != nil {
		return nil, err
	}
	if err := enc.Close(); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

func (s *Settings) firmNode() *yaml.Node {
	f := mapNode()
	if s.Firm.Name != "" {
		add(f, "name", str(s.Firm.Name))
	}
	if len(s.Firm.Address) > 0 {
		seq := &yaml.Node{Kind: yaml.SequenceNode}
		for _, l := range s.Firm.Address {
			seq.Content = append(seq.Content, str(l))
		}
		add(f, "address", seq)
	}
	if s.Firm.Logo != "" {
		add(f, "logo", str(s.Firm.Logo))
	}
	return f
}

func (s *Settings) rolesNode() *yaml.Node {
	att := mapNode()
	for _, r := range Roles {
		if t, ok := s.Attestation[r]; ok {
			add(att, r, str(t))
		}
	}
	roles := mapNode()
	add(roles, "attestation", att)
	if len(s.SameSigner) > 0 {
		seq := &yaml.Node{Kind: yaml.SequenceNode}
		for _, x := range s.SameSigner {
			pair := &yaml.Node{Kind: yaml.SequenceNode, Style: yaml.FlowStyle, Content: []*yaml.Node{str(x.Roles[0]), str(x.Roles[1])}}
			item := mapNode()
			add(item, "roles", pair)
			add(item, "reason", str(x.Reason))
			seq.Content = append(seq.Content, item)
		}
		add(roles, "allow_same_signer", seq)
	}
	return roles
}

func mapNode() *yaml.Node { return &yaml.Node{Kind: yaml.MappingNode} }

func str(s string) *yaml.Node { return &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: s} }

func add(m *yaml.Node, key string, v *yaml.Node) {
	m.Content = append(m.Content, str(key), v)
}
