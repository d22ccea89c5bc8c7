package calcdoc

import (
	"path/filepath"
	"strings"
	"testing"
)

// uncertReheatCalc is reheatCalc with 20 uncertain inputs: its seven
// inputs with ±, and thirteen zero corrections of the two steam
// temperatures, each with its own uncertainty, so that every input moves
// most of the chain.
func uncertReheatCalc(tb testing.TB) string {
	r := strings.NewReplacer(
		"p_1 = 16 MPa\n", "p_1 = 16 MPa ± 0.05 MPa\n",
		"T_1 = 540 degC\n", "T_1 = 540 degC ± 1 K (k=2)\n",
		"p_r = 3.5 MPa\n", "p_r = 3.5 MPa ± 0.02 MPa\n",
		"T_r = 540 degC\n", "T_r = 540 degC ± 1 K (k=2)\n",
		"p_b = 0.6 MPa\n", "p_b = 0.6 MPa ± 0.005 MPa\n",
		"p_c = 8 kPa\n", "p_c = 8 kPa ± 0.1 kPa\n",
		"eta_t = 0.88\n", "eta_t = 0.88 ± 0.01 rect\n",
		"st_1 = water(p_1, T_1)\n", "st_1 = water(p_1, T_1 + d_1 + d_2 + d_3 + d_4 + d_5 + d_6)\n",
		"st_3 = water(p_r, T_r)\n", "st_3 = water(p_r, T_r + d_7 + d_8 + d_9 + d_10 + d_11 + d_12 + d_13)\n",
	)
	src := r.Replace(reheatCalc)
	var extra strings.Builder
	for i := 1; i <= 13; i++ {
		extra.WriteString(sprintf("d_%d = 0 K ± 0.2 K rect\n", i))
	}
	src = strings.Replace(src, "eta_t = 0.88 ± 0.01 rect\n", "eta_t = 0.88 ± 0.01 rect\n"+extra.String(), 1)
	if strings.Count(src, "±") != 20 {
		tb.Fatalf("%d uncertain inputs, want 20", strings.Count(src, "±"))
	}
	return src
}

func benchEval(b *testing.B, src string) *Doc {
	dir := b.TempDir()
	var d *Doc
	b.ReportAllocs()
	for b.Loop() {
		d = Read(filepath.Join(dir, "r.calc.md"), []byte(src))
		d.Evaluate()
		if len(d.Errors) > 0 {
			b.Fatal(d.Errors[0].Msg)
		}
	}
	return d
}

// BenchmarkEvaluateReheat is one evaluation of the 20-input calc without
// its uncertainties: the unit the propagation's cost is counted in.
func BenchmarkEvaluateReheat(b *testing.B) {
	benchEval(b, strings.NewReplacer(" ± 0.05 MPa", "", " ± 1 K (k=2)", "", " ± 0.02 MPa", "", " ± 0.005 MPa", "",
		" ± 0.1 kPa", "", " ± 0.01 rect", "", " ± 0.2 K rect", "").Replace(uncertReheatCalc(b)))
}

// BenchmarkPropagateReheat20 evaluates the calc with its 20 uncertain
// inputs: the propagation to every result (4 evaluations of the dependent
// lines per input: ±h and ±h/2 for the step check) comes on top of
// BenchmarkEvaluateReheat.
func BenchmarkPropagateReheat20(b *testing.B) {
	benchEval(b, uncertReheatCalc(b))
}

// BenchmarkMonteCarloReheat100k runs the Monte Carlo check of the cycle
// efficiency with 100 000 draws of the 20 inputs.
func BenchmarkMonteCarloReheat100k(b *testing.B) {
	d := benchEval(b, uncertReheatCalc(b)+"```budget\neta mc 100000\n```\n")
	if d.Budgets[0].Entries[0].MCRes == nil {
		b.Fatal("no Monte Carlo result")
	}
}
