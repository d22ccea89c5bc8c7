package calcdoc

import (
	"testing"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// TestTypesetCacheSame: the cache gives what typesetting afresh gives, for
// every literal of a line (each unit text met twice or more) and for
// names met twice.
func TestTypesetCacheSame(t *testing.T) {
	s, errs := eval.ParseLine("q_dot [kW] = 2 kg/s * 4.18 kJ/(kg*K) * 10 K + 3 kg/s * 4.2 kJ/(kg*K) * 1 degC - 1 kW", 0, 1, units.Context{})
	if len(errs) > 0 {
		t.Fatal(errs[0])
	}
	var c typesetCache
	lits := s.Literals()
	if len(lits) < 6 {
		t.Fatalf("%d literals read, want 6", len(lits))
	}
	for round := 0; round < 2; round++ {
		for _, l := range lits {
			if got, want := c.literalUnit(l), unitMathML(l.Unit); got != want {
				t.Errorf("round %d: unit of %q: cached %q, afresh %q", round, l.Text, got, want)
			}
		}
		for _, n := range []string{"q_dot", "eta_th", "T_1_a", "x"} {
			if got, want := c.name(n), nameMathML(n); got != want {
				t.Errorf("round %d: name %s: cached %q, afresh %q", round, n, got, want)
			}
		}
	}
	if len(c.units) != 5 { // kg/s, kJ/(kg*K), K, degC, kW
		t.Errorf("%d unit texts kept, want 5: %q", len(c.units), c.units)
	}
}
