package helmholtz

import (
	"math"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// Limits of the kernel's fixed-size work arrays; gen checks every table
// against them.
const (
	maxTerms = 24 // residual terms per equation
	maxPow   = 10 // highest density exponent d or l
)

// term is one residual term
//
//	n delta^d tau^t exp(-delta^l) exp(-eta (delta-eps)^2 - beta (tau-gamma)^2)
//
// with l = 0 meaning no exp(-delta^l) factor and eta = beta = 0 meaning no
// Gaussian factor. Polynomial terms have l = 0 and no Gaussian factor.
type term struct {
	n, t                  float64
	d, l                  int
	eta, beta, gamma, eps float64
	// Filled in by init (derived.go): float d and l, t(t-1), d(d-1),
	// l(l-1), t d, 2 eta, 2 beta, and for a polynomial term with t a whole
	// number from 1 to 4, that number (else 0).
	fd, fl, t2, d2, l2, td, eta2, beta2 float64
	ti                                  int
}

// powTerm is an ideal-gas term n tau^t (integration constants and the
// integrated cp0 polynomial).
type powTerm struct{ n, t float64 }

// idealTerm is an ideal-gas term with coefficient n and a characteristic
// temperature reduced by Tred.
type idealTerm struct{ n, theta float64 }

// equation holds one equation of state in reduced form. Residual terms are
// sorted polynomial, exponential, Gaussian; nPol and nExp count the first
// two kinds.
type equation struct {
	tRed, rhoRed float64
	nPol, nExp   int
	terms        []term

	// expAt lists the terms whose tau factor fused takes from an exp (all
	// but the polynomial terms with ti > 0); filled in by init.
	expAt []int

	logTau float64     // alpha0 += logTau ln tau
	pow    []powTerm   // alpha0 += n tau^t
	pe     []idealTerm // alpha0 += n ln(1 - exp(-theta tau))
	sinh   []idealTerm // alpha0 += n ln sinh(theta tau)
	cosh   []idealTerm // alpha0 -= n ln cosh(theta tau)
}

// tauPart holds everything of the residual part that depends on tau only:
// for term i, A = n tau^t exp(-beta (tau-gamma)^2), a1 = tau A'/A and
// a2 = tau^2 A”/A. Solvers that hold T fixed compute it once.
type tauPart struct {
	tau        float64
	A, a1, a2  [maxTerms]float64
	ideal      idealTau
	idealValid bool
}

// idealTau is the ideal-gas part without its ln delta term: alpha0 - ln
// delta, tau alpha0_tau and tau^2 alpha0_tautau.
type idealTau struct{ a, t, tt float64 }

// resid holds alphar and its scaled derivatives:
// d = delta ar_delta, dd = delta^2 ar_deltadelta, t = tau ar_tau,
// tt = tau^2 ar_tautau, dt = delta tau ar_deltatau.
type resid struct{ a, d, dd, t, tt, dt float64 }

// newTauPart evaluates the tau factors of every residual term (one exp
// each) and, if withIdeal, the ideal-gas part.
func (e *equation) newTauPart(tau float64, withIdeal bool, tp *tauPart) {
	tp.tau = tau
	lt := fpmath.Log(tau)
	for i := range e.terms {
		k := &e.terms[i]
		if k.beta == 0 {
			tp.A[i] = float64(k.n * fpmath.Exp(float64(k.t*lt)))
			tp.a1[i] = k.t
			tp.a2[i] = float64(k.t * (k.t - 1))
			continue
		}
		dt := tau - k.gamma
		tp.A[i] = float64(k.n * fpmath.Exp(float64(k.t*lt)-float64(k.beta*dt*dt)))
		a1 := k.t - float64(2*k.beta*tau*dt)
		tp.a1[i] = a1
		tp.a2[i] = float64(a1*a1) - k.t - float64(2*k.beta*tau*tau)
	}
	tp.idealValid = withIdeal
	if withIdeal {
		tp.ideal = e.idealAt(tau, lt)
	}
}

// residual sums the residual terms at delta, given their tau factors.
// The sums are six named variables, which the compiler keeps in
// registers.
func (e *equation) residual(tp *tauPart, delta float64) resid {
	var pw [maxPow + 1]float64
	pw[0] = 1
	for i := 1; i <= maxPow; i++ {
		pw[i] = float64(pw[i-1] * delta)
	}
	var sa, sd, sdd, st, stt, sdt float64
	terms := e.terms
	np, ne := e.nPol, e.nPol+e.nExp
	for i := range terms[:np] {
		k := &terms[i]
		g := float64(tp.A[i] * pw[k.d])
		a1 := tp.a1[i]
		sa += g
		sd += float64(g * k.fd)
		sdd += float64(g * k.d2)
		st += float64(g * a1)
		stt += float64(g * tp.a2[i])
		sdt += float64(g * a1 * k.fd)
	}
	var el [maxPow + 1]float64 // exp(-delta^l), computed once per l
	for i := np; i < ne; i++ {
		if l := terms[i].l; el[l] == 0 {
			el[l] = fpmath.Exp(-pw[l])
		}
	}
	var gs [maxTerms]float64 // the Gaussian factors in delta
	for i := ne; i < len(terms); i++ {
		k := &terms[i]
		dd := delta - k.eps
		gs[i] = fpmath.Exp(float64(-k.eta * dd * dd))
	}
	for i := np; i < ne; i++ {
		k := &terms[i]
		g, a1, dl := float64(tp.A[i]*(pw[k.d]*el[k.l])), tp.a1[i], pw[k.l]
		b1 := k.fd - float64(k.fl*dl)
		sa += g
		sd += float64(g * b1)
		sdd += float64(g * (float64(b1*b1) - k.fd - float64(k.l2*dl)))
		st += float64(g * a1)
		stt += float64(g * tp.a2[i])
		sdt += float64(g * a1 * b1)
	}
	for i := ne; i < len(terms); i++ {
		k := &terms[i]
		g, a1 := float64(tp.A[i]*(pw[k.d]*gs[i])), tp.a1[i]
		b1 := k.fd - float64(2*k.eta*delta*(delta-k.eps))
		sa += g
		sd += float64(g * b1)
		sdd += float64(g * (float64(b1*b1) - k.fd - float64(2*k.eta*delta*delta)))
		st += float64(g * a1)
		stt += float64(g * tp.a2[i])
		sdt += float64(g * a1 * b1)
	}
	return resid{a: sa, d: sd, dd: sdd, t: st, tt: stt, dt: sdt}
}

// idealAt evaluates the ideal-gas part without ln delta; lt = ln tau.
func (e *equation) idealAt(tau, lt float64) idealTau {
	v := idealTau{a: float64(e.logTau * lt), t: e.logTau, tt: -e.logTau}
	for _, p := range e.pow {
		x := p.n
		switch p.t {
		case 0:
		case 1:
			x = float64(x * tau)
		default:
			x = float64(x * fpmath.Exp(float64(p.t*lt)))
		}
		v.a += x
		v.t += float64(p.t * x)
		v.tt += float64(p.t * (p.t - 1) * x)
	}
	for _, p := range e.pe {
		x := float64(p.theta * tau)
		em := fpmath.Exp(-x)
		q := 1 - em
		v.a += float64(p.n * fpmath.Log1p(-em))
		v.t += p.n * x * em / q
		v.tt -= p.n * x * x * em / (q * q)
	}
	for _, p := range e.sinh {
		x := float64(p.theta * tau)
		em := fpmath.Exp(float64(-2 * x))
		q := 1 - em
		v.a += float64(p.n * (x - math.Ln2 + fpmath.Log1p(-em)))
		v.t += p.n * x * (1 + em) / q
		v.tt -= p.n * 4 * x * x * em / (q * q)
	}
	for _, p := range e.cosh {
		x := float64(p.theta * tau)
		em := fpmath.Exp(float64(-2 * x))
		q := 1 + em
		v.a -= float64(p.n * (x - math.Ln2 + fpmath.Log1p(em)))
		v.t -= p.n * x * (1 - em) / q
		v.tt -= p.n * 4 * x * x * em / (q * q)
	}
	return v
}

// Reduced holds the reduced Helmholtz energy and its partial derivatives at
// one (tau, delta): the ideal-gas part A0 and the residual part Ar, with
// suffixes naming the variables of differentiation (d for delta, t for
// tau). A0d = 1/delta and A0dd = -1/delta^2 are omitted.
type Reduced struct {
	A0, A0t, A0tt                  float64
	Ar, Ard, Ardd, Art, Artt, Ardt float64
}

// Alpha evaluates the reduced Helmholtz energy and its derivatives at
// tau = Tred/T and delta = rho/RhoRed, without any range check. It is the
// kernel the properties are built from, exported for tests and for callers
// that need derivatives the Props type does not carry.
func (f *Fluid) Alpha(tau, delta float64) Reduced {
	var tp tauPart
	f.eos.newTauPart(tau, true, &tp)
	r := f.eos.residual(&tp, delta)
	i := tp.ideal
	return Reduced{
		A0: i.a + fpmath.Log(delta), A0t: i.t / tau, A0tt: i.tt / (tau * tau),
		Ar: r.a, Ard: r.d / delta, Ardd: r.dd / (delta * delta),
		Art: r.t / tau, Artt: r.tt / (tau * tau), Ardt: r.dt / (delta * tau),
	}
}
