package helmholtz

// fused evaluates the residual part at one (tau, delta) with at most one
// exp per term (none for a polynomial term with t a whole number),
// folding the tau factor, the exp(-delta^l) factor and the Gaussian
// factor into one exponent. It gives the same sums as newTauPart followed
// by residual (to round-off) and is used where T changes at every call;
// lt = ln tau.
//
// It works in three passes: the exponents of all terms, then their exps
// (fastExp) in a loop that holds nothing else live across the calls, then
// the sums, which stay in registers.
func (e *equation) fused(tau, lt, delta float64) resid {
	var pw [maxPow + 1]float64
	pw[0] = 1
	for i := 1; i <= maxPow; i++ {
		pw[i] = float64(pw[i-1] * delta)
	}
	terms := e.terms
	np, ne := e.nPol, e.nPol+e.nExp
	var xs [maxTerms]float64
	x := xs[:len(terms)]
	tw := [5]float64{1, tau, float64(tau * tau), float64(tau * tau * tau), float64(tau * tau * tau * tau)}
	for i := range terms[:np] {
		if k := &terms[i]; k.ti > 0 {
			x[i] = tw[k.ti] // tau^t for whole t: no exp
		} else {
			x[i] = float64(k.t * lt)
		}
	}
	for i := np; i < ne; i++ {
		k := &terms[i]
		x[i] = float64(k.t*lt) - pw[k.l]
	}
	for i := ne; i < len(terms); i++ {
		k := &terms[i]
		dd, dt := delta-k.eps, tau-k.gamma
		x[i] = float64(k.t*lt) - float64(k.eta*dd*dd) - float64(k.beta*dt*dt)
	}
	for _, i := range e.expAt {
		x[i] = fastExp(x[i])
	}
	// Six named sums rather than a resid: the compiler keeps them in
	// registers (a struct of more than four fields stays in memory).
	var sa, sd, sdd, st, stt, sdt float64
	for i := range terms[:np] {
		k := &terms[i]
		g := float64(k.n * pw[k.d] * x[i])
		sa += g
		sd += float64(g * k.fd)
		sdd += float64(g * k.d2)
		st += float64(g * k.t)
		stt += float64(g * k.t2)
		sdt += float64(g * k.td)
	}
	for i := np; i < ne; i++ {
		k := &terms[i]
		g, dl := float64(k.n*pw[k.d]*x[i]), pw[k.l]
		b1 := k.fd - float64(k.fl*dl)
		sa += g
		sd += float64(g * b1)
		sdd += float64(g * (float64(b1*b1) - k.fd - float64(k.l2*dl)))
		st += float64(g * k.t)
		stt += float64(g * k.t2)
		sdt += float64(g * k.t * b1)
	}
	for i := ne; i < len(terms); i++ {
		k := &terms[i]
		g, t, d := float64(k.n*pw[k.d]*x[i]), k.t, k.fd
		bt, ed := float64(k.beta2*tau), float64(k.eta2*delta)
		a1 := t - float64(bt*(tau-k.gamma))
		b1 := d - float64(ed*(delta-k.eps))
		sa += g
		sd += float64(g * b1)
		sdd += float64(g * (float64(b1*b1) - d - float64(ed*delta)))
		st += float64(g * a1)
		stt += float64(g * (float64(a1*a1) - t - float64(bt*tau)))
		sdt += float64(g * a1 * b1)
	}
	return resid{a: sa, d: sd, dd: sdd, t: st, tt: stt, dt: sdt}
}
