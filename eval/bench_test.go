package eval

import (
	"testing"

	"github.com/vouchcalc/vouch/units"
)

// BenchmarkParseLine2000 parses the lines of a generated 2 000-line calc
// without evaluating them: the parsing share of BenchmarkEvaluate2000.
// ns/op divided by 2 000 is the time per line.
func BenchmarkParseLine2000(b *testing.B) {
	lines := generated(2000)
	b.ReportAllocs()
	for b.Loop() {
		for i, l := range lines {
			if _, errs := ParseLine(l, 0, i+1, units.StandardAtmosphere); errs != nil {
				b.Fatal(errs[0].Msg)
			}
		}
	}
}
