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

// BenchmarkForkExec is the engine's share of a sweep point: fork, set the
// varied input and re-run the twelve lines that read it, with no property
// calls. allocs/op is the engine's allocations per point.
func BenchmarkForkExec(b *testing.B) {
	e := NewEngine(units.StandardAtmosphere)
	src := []string{"p_1 = 16 MPa", "h_a = 3400 kJ/kg", "eta_t = 0.88", "w_0 = 0.85 MJ/kg",
		"h_2 = h_a - eta_t * (h_a - 2900 kJ/kg) * (p_1 / 16 MPa)", "h_9 = 700 kJ/kg + 0.0011 m^3/kg * (p_1 - 0.6 MPa)",
		"w_t = h_a - h_2 + (1 - 0.2) * (h_a - 2400 kJ/kg)", "w_p = h_9 - 680 kJ/kg", "q = h_a - h_9 + 3500 kJ/kg - h_2",
		"eta [%] = (w_t - w_p) / q", "T_2 = 500 K + (h_2 - 2900 kJ/kg) / 2.1 kJ/(kg*K)", "s_1 = 6.3 kJ/(kg*K) * sqrt(16 MPa / p_1)",
		"v_1 = 0.02 m^3/kg * 16 MPa / p_1", "T_s = 600 K * (p_1 / 16 MPa)^0.1", "h_1b = h_a - 1 kJ/kg * (p_1 / 1 MPa)", "check eta > 0.3"}
	var stmts []*Stmt
	for i, l := range src {
		s, errs := ParseLine(l, 0, i+1, e.Ctx)
		if errs != nil {
			b.Fatal(errs[0].Msg)
		}
		if _, err := e.Exec(s); err != nil {
			b.Fatal(msgOf(err))
		}
		stmts = append(stmts, s)
	}
	redo := map[string]bool{"p_1": true}
	for _, s := range stmts[4:] {
		redo[s.Name] = true
	}
	x := units.MustParse("MPa").Q(12, e.Ctx)
	b.ReportAllocs()
	for b.Loop() {
		f := e.Fork(redo)
		f.Set("p_1", x)
		for _, s := range stmts[4:] {
			if out, err := f.Exec(s); err != nil || s.Kind == Check && !out.Pass {
				b.Fatal(s.Expr, err)
			}
		}
	}
}
