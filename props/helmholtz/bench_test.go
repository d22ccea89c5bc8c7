package helmholtz

import "testing"

// The benchmarks use R-1233zd(E) (Akasaka & Lemmon 2022), the 18-term
// equation with eight Gaussian terms, at an ORC turbine-inlet-like state.
func benchFluid(b *testing.B) *Fluid {
	f, ok := Lookup("R-1233zd(E)")
	if !ok {
		b.Fatal("no R-1233zd(E)")
	}
	return f
}

// BenchmarkProps is the kernel: every property at (T, rho) with no phase
// check (target 300 ns).
func BenchmarkProps(b *testing.B) {
	f := benchFluid(b)
	b.ReportAllocs()
	var s float64
	for b.Loop() {
		q := f.eval(400, 50)
		s += f.props(&q).W
	}
	_ = s
}

func BenchmarkStateTRho(b *testing.B) {
	f := benchFluid(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := f.StateTRho(400, 50); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkStatePTVapour(b *testing.B) { benchPT(b, 1e6, 400) }
func BenchmarkStatePTLiquid(b *testing.B) { benchPT(b, 2e6, 320) }

func benchPT(b *testing.B, p, T float64) {
	f := benchFluid(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := f.StatePT(p, T); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkStatePHVapour(b *testing.B)   { benchPH(b, 1e6, 500e3) }
func BenchmarkStatePHLiquid(b *testing.B)   { benchPH(b, 2e6, 250e3) }
func BenchmarkStatePHTwoPhase(b *testing.B) { benchPH(b, 1e6, 350e3) }

func benchPH(b *testing.B, p, h float64) {
	f := benchFluid(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := f.StatePH(p, h); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSatT(b *testing.B) {
	f := benchFluid(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := f.SatT(380); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSatP(b *testing.B) {
	f := benchFluid(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := f.SatP(1e6); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkStateHS(b *testing.B) {
	f := benchFluid(b)
	st, _ := f.StatePT(1e6, 400)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := f.StateHS(st.H, st.S); err != nil {
			b.Fatal(err)
		}
	}
}
