package helmholtz

import "math"

// rtsafe finds x between lo and hi with f(x) = 0, where fdf returns f and
// its derivative, f(lo) < 0 < f(hi) (lo may be the larger). It takes Newton steps
// and falls back to bisection whenever a step would leave the bracket or
// not shrink it fast enough. It stops when the step is below tol*|x|, or
// when two Newton steps in a row show quadratic convergence that puts the
// next step below round-off (quadDone), and reports whether it did so
// within the iteration limit.
func rtsafe(fdf func(float64) (float64, float64), lo, hi, x0, tol float64) (float64, bool) {
	x := x0
	if !(x > math.Min(lo, hi) && x < math.Max(lo, hi)) {
		x = float64(0.5 * (lo + hi))
	}
	f, df := fdf(x)
	return rtsafeFrom(fdf, lo, hi, x, f, df, tol)
}

// rtsafeFrom is rtsafe from a point x within the bracket where f and its
// derivative df are already known.
func rtsafeFrom(fdf func(float64) (float64, float64), lo, hi, x, f, df, tol float64) (float64, bool) {
	dxOld := math.Abs(hi - lo)
	dx := dxOld
	prev := 0.0 // the previous step, if it was a Newton step
	for it := 0; it < 200; it++ {
		newton := false
		if float64((float64((x-hi)*df)-f)*(float64((x-lo)*df)-f)) > 0 || math.Abs(float64(2*f)) > math.Abs(float64(dxOld*df)) {
			dxOld, dx = dx, float64(0.5*(hi-lo))
			x = lo + dx
		} else {
			dxOld, dx = dx, f/df
			x -= dx
			newton = true
		}
		if math.Abs(dx) <= float64(tol*math.Abs(x)) || f == 0 || (newton && quadDone(dx, prev, x)) {
			return x, true
		}
		prev = 0
		if newton {
			prev = dx
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

// quadDone reports whether a Newton step dx after the Newton step prev
// (0 if there was none) has left x at the root to round-off: with
// quadratic convergence the next step is about dx^3/prev^2. It asks for
// a small, shrinking step, so that convergence is in its asymptotic
// phase.
func quadDone(dx, prev, x float64) bool {
	a, b := math.Abs(dx), math.Abs(prev)
	return prev != 0 && a <= float64(1e-6*math.Abs(x)) && a < b && float64(a*a*a) <= float64(0x1p-53*math.Abs(x)*b*b)
}

// brent finds x in [a, b] with f(x) = 0 given f(a) and f(b) of opposite
// signs (Brent's method: inverse quadratic interpolation, secant and
// bisection). It stops when the bracket is below tol*|x|.
func brent(f func(float64) float64, a, b, tol float64) (float64, bool) {
	fa, fb := f(a), f(b)
	if float64(fa*fb) > 0 {
		return 0, false
	}
	c, fc := a, fa
	d := b - a
	e := d
	for it := 0; it < 200; it++ {
		if float64(fb*fc) > 0 {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := float64(2*1e-16*math.Abs(b)) + float64(0.5*tol*math.Abs(b))
		xm := float64(0.5 * (c - b))
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
		p, q = float64(2*xm*s), 1-s
	} else {
		var r float64
		q, r = fa/fc, fb/fc
		p = float64(s * (float64(2*xm*q*(q-r)) - float64((b-a)*(r-1))))
		q = float64((q - 1) * (r - 1) * (s - 1))
	}
	if p > 0 {
		q = -q
	}
	p = math.Abs(p)
	if float64(2*p) < math.Min(float64(3*xm*q)-math.Abs(float64(tol1*q)), math.Abs(float64(e*q))) {
		return p / q, d
	}
	return xm, xm
}
