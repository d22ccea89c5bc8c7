package calcdoc

import (
	"path/filepath"
	"testing"

	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/props/if97"
	"github.com/vouchcalc/vouch/units"
)

// sweepPoints10000 is the number of points of the sweep benchmarks.
const sweepPoints10000 = 10000

// BenchmarkSweepReheatRegen runs a 10 000-point sweep of the main steam
// pressure over reheatCalc, a reheat-regenerative cycle; set beside
// BenchmarkSweepFloor, it measures what the engine adds to the property
// calls. allocs/op divided by 10 000 is the allocations per point.
func BenchmarkSweepReheatRegen(b *testing.B) {
	src := reheatCalc + "```sweep\nvary p_1 from 8 MPa to 20 MPa in 9999 steps\nshow eta [%]\n```\n"
	dir := b.TempDir()
	b.ReportAllocs()
	for b.Loop() {
		d := Read(filepath.Join(dir, "r.calc.md"), []byte(src))
		d.Evaluate()
		if len(d.Errors) > 0 {
			b.Fatal(d.Errors[0].Msg)
		}
		if n := len(d.Sweeps[0].Rows); n != sweepPoints10000 {
			b.Fatalf("%d points", n)
		}
	}
}

// BenchmarkSweepFloor makes the property calls of BenchmarkSweepReheatRegen
// that depend on p_1, with the same inputs, directly against props: the
// floor no sweep engine can beat. The arithmetic between the calls is done
// in float64 only to give the calls their inputs.
func BenchmarkSweepFloor(b *testing.B) {
	mpa, degC := units.MustParse("MPa"), units.MustParse("degC")
	ctx := units.StandardAtmosphere
	pr := mpa.Q(3.5, ctx)
	t1 := degC.Q(540, ctx)
	satb, err := props.WaterSat(mpa.Q(0.6, ctx))
	if err != nil {
		b.Fatal(err)
	}
	tSatb := must(b, satb, "T")
	b.ReportAllocs()
	var sink float64
	for b.Loop() {
		for i := range sweepPoints10000 {
			p1 := units.Quantity{V: 8e6 + float64(i)/(sweepPoints10000-1)*12e6, D: units.DimPressure}
			sink += floorPoint(b, p1, t1, pr, tSatb)
		}
	}
	if sink == 0 {
		b.Fatal("no result")
	}
}

// floorPoint makes the seven property calls of one sweep point: st_1, the
// isentropic HP exhaust, T_2, s_1, v_1, T_sat1 and h_1b.
func floorPoint(b *testing.B, p1, t1, pr, tSatb units.Quantity) float64 {
	st1 := water(b, p1, t1)
	h1, s1 := must(b, st1, "h"), must(b, st1, "s")
	h2s := must(b, water(b, pr, s1), "h")
	h2 := units.Quantity{V: h1.V - 0.88*(h1.V-h2s.V), D: h1.D}
	t2 := must(b, water(b, pr, h2), "T")
	s := must(b, water(b, p1, t1), "s")
	v := must(b, water(b, p1, t1), "v")
	sat1, err := props.WaterSat(p1)
	if err != nil {
		b.Fatal(err)
	}
	ts := must(b, sat1, "T")
	h1b := must(b, water(b, p1, tSatb), "h")
	return t2.V + s.V + v.V + ts.V + h1b.V
}

func water(b *testing.B, x, y units.Quantity) *props.State {
	st, err := props.Water(x, y)
	if err != nil {
		b.Fatal(err)
	}
	return st
}

// must reads a quantity field of a state or saturation point.
func must(b *testing.B, r interface{ Field(string) (any, error) }, name string) units.Quantity {
	v, err := r.Field(name)
	if err != nil {
		b.Fatal(err)
	}
	return v.(units.Quantity)
}

// BenchmarkSweepFloorIF97 is BenchmarkSweepFloor against the numerics of
// props/if97 alone: no quantities, no fields by name and no transport
// properties. It shows the floor once props computes transport properties
// only when a calc reads them.
func BenchmarkSweepFloorIF97(b *testing.B) {
	satb, err := if97.SatP(0.6e6)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	var sink float64
	for b.Loop() {
		for i := range sweepPoints10000 {
			p1 := 8e6 + float64(i)/(sweepPoints10000-1)*12e6
			sink += floorPointIF97(b, p1, 813.15, 3.5e6, satb.T)
		}
	}
	if sink == 0 {
		b.Fatal("no result")
	}
}

func floorPointIF97(b *testing.B, p1, t1, pr, tSatb float64) float64 {
	st := func(p if97.Props, err error) if97.Props {
		if err != nil {
			b.Fatal(err)
		}
		return p
	}
	st1 := st(if97.StatePT(p1, t1))
	h2s := st(if97.StatePS(pr, st1.S)).H
	h2 := st1.H - 0.88*(st1.H-h2s)
	t2 := st(if97.StatePH(pr, h2)).T
	s := st(if97.StatePT(p1, t1)).S
	v := st(if97.StatePT(p1, t1)).V
	sat1, err := if97.SatP(p1)
	if err != nil {
		b.Fatal(err)
	}
	h1b := st(if97.StatePT(p1, tSatb)).H
	return t2 + s + v + sat1.T + h1b
}
