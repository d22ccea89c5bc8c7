package helmholtz

import "math"

// rtsafe finds x between lo and hi with f(x) = 0, where fdf returns f and
// its derivative, f(lo) < 0 < f(hi) (lo may be the larger). It takes Newton steps
// and falls back to bisection whenever a step would leave the bracket or
// not shrink it fast enough. It stops when the step is below tol*|x| and
// reports whether it did so within the iteration limit.
func rtsafe(fdf func(float64) (float64, float64), lo, hi, x0, tol float64) (float64, bool) {
	x := x0
	if !(x > math.Min(lo, hi) && x < math.Max(lo, hi)) {
		x = 0.5 * (lo + hi)
	}
	dxOld := math.Abs(hi - lo)
	dx := dxOld
	f, df := fdf(x)
	for it := 0; it < 200; it++ {
		if ((x-hi)*df-f)*((x-lo)*df-f) > 0 || math.Abs(2*f) > math.Abs(dxOld*df) {
			dxOld, dx = dx, 0.5*(hi-lo)
			x = lo + dx
		} else {
			dxOld, dx = dx, f/df
			x -= dx
		}
		if math.Abs(dx) <= tol*math.Abs(x) || f == 0 {
			return x, true
		}
		f, df = fdf(x)
		if f < 0 {
			lo = x
		} else {
			hi = x
		}
	}
	return x, false
}

// brent finds x in [a, b] with f(x) = 0 given f(a) and f(b) of opposite
// signs (Brent's method: inverse quadratic interpolation, secant and
// bisection). It stops when the bracket is below tol*|x|.
func brent(f func(float64) float64, a, b, tol float64) (float64, bool) {
	fa, fb := f(a), f(b)
	if fa*fb > 0 {
		return 0, false
	}
	c, fc := a, fa
	d := b - a
	e := d
	for it := 0; it < 200; it++ {
		if fb*fc > 0 {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*1e-16*math.Abs(b) + 0.5*tol*math.Abs(b)
		xm := 0.5 * (c - b)
		if math.Abs(xm) <= tol1 || fb == 0 {
			return b, true
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			d, e = brentStep(a, b, c, fa, fb, fc, xm, tol1, d, e)
		} else {
			d, e = xm, xm
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else {
			b += math.Copysign(tol1, xm)
		}
		fb = f(b)
	}
	return b, false
}

// brentStep is the interpolation step of brent; it returns the new step
// and the previous one, or a bisection when interpolation is not trusted.
func brentStep(a, b, c, fa, fb, fc, xm, tol1, d, e float64) (float64, float64) {
	var p, q float64
	s := fb / fa
	if a == c {
		p, q = 2*xm*s, 1-s
	} else {
		q, r := fa/fc, fb/fc
		p = s * (2*xm*q*(q-r) - (b-a)*(r-1))
		q = (q - 1) * (r - 1) * (s - 1)
	}
	if p > 0 {
		q = -q
	}
	p = math.Abs(p)
	if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
		return p / q, d
	}
	return xm, xm
}
