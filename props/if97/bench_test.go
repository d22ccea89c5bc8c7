package if97

import "testing"

// Benchmarks of the hot paths: go test -bench . -benchmem -benchtime=200ms ./props/if97/

var sink float64

func BenchmarkH1(b *testing.B) { // region 1 h(p, T), kernel only
	for i := 0; i < b.N; i++ {
		sink += h1(3e6, 300+float64(i&7))
	}
}

func BenchmarkH2(b *testing.B) { // region 2 h(p, T), kernel only
	for i := 0; i < b.N; i++ {
		sink += h2(1e6, 700+float64(i&7))
	}
}

func BenchmarkHPTRegion1(b *testing.B) { // checked h(p, T), region 1 (with Psat for the region)
	for i := 0; i < b.N; i++ {
		h, _ := HPT(3e6, 300+float64(i&7))
		sink += h
	}
}

func BenchmarkHPTRegion2(b *testing.B) { // checked h(p, T), region 2
	for i := 0; i < b.N; i++ {
		h, _ := HPT(1e6, 700+float64(i&7))
		sink += h
	}
}

func BenchmarkPsat(b *testing.B) {
	for i := 0; i < b.N; i++ {
		p, _ := Psat(400 + float64(i&7))
		sink += p
	}
}

func BenchmarkTsat(b *testing.B) {
	for i := 0; i < b.N; i++ {
		T, _ := Tsat(1e6 + float64(i&7))
		sink += T
	}
}

func benchState(b *testing.B, f func(a, c float64) (Props, error), a, c float64) {
	for i := 0; i < b.N; i++ {
		st, _ := f(a, c+float64(i&7)*1e-3)
		sink += st.H
	}
}

func BenchmarkStatePTRegion1(b *testing.B)  { benchState(b, StatePT, 3e6, 400) }
func BenchmarkStatePTRegion2(b *testing.B)  { benchState(b, StatePT, 1e6, 700) }
func BenchmarkStatePTRegion3(b *testing.B)  { benchState(b, StatePT, 25e6, 650) }
func BenchmarkStatePTRegion5(b *testing.B)  { benchState(b, StatePT, 1e6, 1500) }
func BenchmarkStatePHRegion1(b *testing.B)  { benchState(b, StatePH, 3e6, 500e3) }
func BenchmarkStatePHRegion2(b *testing.B)  { benchState(b, StatePH, 1e6, 3200e3) }
func BenchmarkStatePHTwoPhase(b *testing.B) { benchState(b, StatePH, 1e6, 2000e3) }
func BenchmarkStatePSRegion1(b *testing.B)  { benchState(b, StatePS, 3e6, 1500) }
func BenchmarkStatePSRegion2(b *testing.B)  { benchState(b, StatePS, 1e6, 7000) }
func BenchmarkStatePHRegion3(b *testing.B)  { benchState(b, StatePH, 25e6, 2000e3) }
func BenchmarkStateHSRegion2(b *testing.B)  { benchState(b, StateHS, 3200e3, 7000) }

// BenchmarkConductivityOf: the conductivity of a known region-2 state (10 MPa, 773.15 K), the
// path props takes when .k is read.
func BenchmarkConductivityOf(b *testing.B) {
	st, _ := StatePT(10e6, 773.15)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		k, _ := ConductivityOf(&st)
		sink += k
	}
}

// BenchmarkConductivity: the same conductivity from (rho, T), which solves for the state again.
func BenchmarkConductivity(b *testing.B) {
	st, _ := StatePT(10e6, 773.15)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		k, _ := Conductivity(st.Rho, st.T)
		sink += k
	}
}
