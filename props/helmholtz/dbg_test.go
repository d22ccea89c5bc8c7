package helmholtz

import "testing"

func TestDbg(t *testing.T) {
	f, _ := Lookup("R-1233zd(E)")
	for _, c := range [][2]float64{{2e6, 250e3}, {1e6, 350e3}, {1e6, 500e3}} {
		p, h := c[0], c[1]
		d, ok := f.sideFast(p, h, byH)
		t.Log("sideFast", d.Ts, d.side, ok, f.props(&d.ql).H, f.props(&d.qv).H)
		if !ok {
			continue
		}
		sat := &d.qv
		if d.side < 0 {
			sat = &d.ql
		}
		T0, r0 := f.isobarStart(sat, h, byH)
		q, ok := f.newtonPY(p, h, byH, T0, r0)
		t.Log(T0, r0, q.T, q.rho, ok, f.stableAt(&q, p, sat.rho > f.RhoC))
	}
}
