package helmholtz

import "math"

// fused evaluates the residual part at one (tau, delta) with a single exp
// per term, folding the tau factor, the exp(-delta^l) factor and the
// Gaussian factor into one exponent. It gives the same sums as
// newTauPart followed by residual and is used where T changes at every
// call; lt = ln tau.
func (e *equation) fused(tau, lt, delta float64) resid {
	var pw [maxPow + 1]float64
	pw[0] = 1
	for i := 1; i <= maxPow; i++ {
		pw[i] = pw[i-1] * delta
	}
	var r resid
	terms := e.terms
	for i := 0; i < e.nPol; i++ {
		k := &terms[i]
		g := k.n * pw[k.d] * math.Exp(k.t*lt)
		r.add(g, k.t, k.t2, k.fd, k.d2)
	}
	for i := e.nPol; i < e.nPol+e.nExp; i++ {
		k := &terms[i]
		dl := pw[k.l]
		g := k.n * pw[k.d] * math.Exp(k.t*lt-dl)
		b1 := k.fd - k.fl*dl
		r.add(g, k.t, k.t2, b1, b1*b1-k.fd-k.fl*(k.fl-1)*dl)
	}
	for i := e.nPol + e.nExp; i < len(terms); i++ {
		k := &terms[i]
		d, t := float64(k.d), k.t
		dd, dt := delta-k.eps, tau-k.gamma
		g := k.n * pw[k.d] * math.Exp(t*lt-k.eta*dd*dd-k.beta*dt*dt)
		a1 := t - 2*k.beta*tau*dt
		b1 := d - 2*k.eta*delta*dd
		r.add(g, a1, a1*a1-t-2*k.beta*tau*tau, b1, b1*b1-d-2*k.eta*delta*delta)
	}
	return r
}

// add accumulates one term of value g with its scaled tau factors a1, a2
// and delta factors b1, b2.
func (r *resid) add(g, a1, a2, b1, b2 float64) {
	r.a += g
	r.d += g * b1
	r.dd += g * b2
	r.t += g * a1
	r.tt += g * a2
	r.dt += g * a1 * b1
}
