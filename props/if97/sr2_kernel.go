package if97

// This file holds the polynomial kernel shared by the supplementary backward equations of
// IAPWS SR2-01(2014), SR3-03(2014), SR4-04(2014) and SR5-05(2016). Each of their equations is a
// sum  Σ n_k · x^I_k · y^J_k  of shifted, reduced variables x and y, followed by a small outer
// function (identity, fourth power, reciprocal or exponential) that the caller applies.
//
// The coefficient tables are generated from testdata/sr_coefficients by gen/sr, together with
// one straight-line function per table (srSum<name> in sr*_sums.go) that performs the same
// products and additions as srTable.sum or srTable.sum1 below, in the same order, and so returns
// the same float64; the package calls those for speed, and TestSRStraightSums holds them equal
// to the table-driven sums, which stay the reference.

//go:generate go run ./gen/sr
//go:generate go run ../../internal/fpguard .

// srTerm is one term n · x^i · y^j of a supplementary-release equation.
type srTerm struct {
	i, j int8
	n    float64
}

// srTable is the coefficient table of one equation. iMin..iMax and jMin..jMax are the ranges of
// the exponents, so that the powers of x and y can be tabulated once per call.
type srTable struct {
	iMin, iMax, jMin, jMax int
	terms                  []srTerm
}

// sum returns Σ n_k x^I_k y^J_k. It builds x^iMin..x^iMax and y^jMin..y^jMax by products
// (no math.Pow) and does not allocate.
func (t *srTable) sum(x, y float64) float64 {
	var xp, yp [srPowLen]float64
	srPowers(&xp, x, t.iMin, t.iMax)
	srPowers(&yp, y, t.jMin, t.jMax)
	iMin, jMin := t.iMin, t.jMin
	// Two accumulators shorten the chain of dependent additions.
	var s0, s1 float64
	ts := t.terms
	k := 0
	for ; k+1 < len(ts); k += 2 {
		a, b := &ts[k], &ts[k+1]
		s0 += float64(a.n * xp[int(a.i)-iMin] * yp[int(a.j)-jMin])
		s1 += float64(b.n * xp[int(b.i)-iMin] * yp[int(b.j)-jMin])
	}
	if k < len(ts) {
		a := &ts[k]
		s0 += float64(a.n * xp[int(a.i)-iMin] * yp[int(a.j)-jMin])
	}
	return s0 + s1
}

// sum1 returns Σ n_k x^I_k for a table whose J exponents are all zero (the boundary
// polynomials).
func (t *srTable) sum1(x float64) float64 {
	var xp [srPowLen]float64
	srPowers(&xp, x, t.iMin, t.iMax)
	s := 0.0
	for _, a := range t.terms {
		s += float64(a.n * xp[int(a.i)-t.iMin])
	}
	return s
}

// srPowers sets p[k-lo] = x^k for lo <= k <= hi (hi-lo < srPowLen). Where the table holds
// x^0, each power is built from two lower ones, x^k = x^⌊k/2⌋ · x^⌈k/2⌉, which keeps the chain of
// dependent products short; negative powers are built the same way from 1/x.
func srPowers(p *[srPowLen]float64, x float64, lo, hi int) {
	switch {
	case lo > 0:
		p[0] = srIntPow(x, lo)
		for k := 1; k <= hi-lo; k++ {
			p[k] = float64(p[k-1] * x)
		}
	case hi < 0:
		r := 1 / x
		n := hi - lo
		p[n] = srIntPow(r, -hi)
		for k := n - 1; k >= 0; k-- {
			p[k] = float64(p[k+1] * r)
		}
	default:
		// lo <= 0 <= hi: x^0 sits at index z = -lo.
		z := -lo
		p[z] = 1
		if hi >= 1 {
			p[z+1] = x
		}
		for k := 2; k <= hi; k++ {
			p[z+k] = float64(p[z+(k>>1)] * p[z+k-(k>>1)])
		}
		if z >= 1 {
			r := 1 / x
			p[z-1] = r
			for k := 2; k <= z; k++ {
				p[z-k] = float64(p[z-(k>>1)] * p[z-k+(k>>1)])
			}
		}
	}
}

// srIntPow returns x^n for n >= 0 by repeated squaring.
func srIntPow(x float64, n int) float64 {
	r := 1.0
	for n > 0 {
		if n&1 != 0 {
			r = float64(r * x)
		}
		x = float64(x * x)
		n >>= 1
	}
	return r
}
