package main

import (
	"bytes"
	"fmt"
	"strings"
)

// This file writes each coefficient table a second time, as straight-line Go code: a function
// that performs exactly the multiplications and additions of srTable.sum (or srTable.sum1) in
// package if97, in the same order, so that it returns the same float64 bit for bit, without the
// loops, the index arithmetic and the power tables. The tables themselves stay the reference;
// a test in package if97 compares both forms.

// powNode is one power of a variable: its Go name and the expression that defines it.
type powNode struct {
	name, expr string
	deps       []int // indexes of the nodes the expression uses
}

// powers replays srPowers(p, v, lo, hi) of package if97 symbolically. It returns the nodes in
// the order srPowers computes them and, for each exponent lo..hi, the index of its node
// (-1 for the exact 1 of x^0, -2 for v itself).
type powers struct {
	v     string
	nodes []powNode
	names map[string]bool
}

const (
	nodeOne = -1 // the exact constant 1
	nodeVar = -2 // the variable itself
)

func (p *powers) name(idx int) string {
	switch idx {
	case nodeOne:
		return "1"
	case nodeVar:
		return p.v
	}
	return p.nodes[idx].name
}

// add appends the node a·b (or 1/a when b is nodeDiv) and returns its index.
func (p *powers) add(label string, a, b int, div bool) int {
	name := p.v + label
	for k := 2; p.names[name]; k++ {
		name = fmt.Sprintf("%s%s_%d", p.v, label, k)
	}
	p.names[name] = true
	n := powNode{name: name}
	if div {
		n.expr = "1 / " + p.name(a)
		n.deps = []int{a}
	} else {
		n.expr = p.name(a) + " * " + p.name(b)
		n.deps = []int{a, b}
	}
	p.nodes = append(p.nodes, n)
	return len(p.nodes) - 1
}

// intPow replays srIntPow(base, n): r = 1; while n > 0 { if n&1 { r *= x }; x *= x; n >>= 1 }.
// The multiplication 1·x is exact, so r starts as x itself; the last squaring is unused and
// left out.
func (p *powers) intPow(base int, n int, label func(e int) string) int {
	r, x, e, xe := nodeOne, base, 0, 1
	for n > 0 {
		if n&1 != 0 {
			if r == nodeOne {
				r = x
			} else {
				r = p.add(label(e+xe), r, x, false)
			}
			e += xe
		}
		n >>= 1
		if n > 0 {
			x = p.add(label(2*xe), x, x, false)
			xe *= 2
		}
	}
	return r
}

// replay returns, for lo <= k <= hi, the node index of v^k as srPowers computes it.
func (p *powers) replay(lo, hi int) map[int]int {
	pos := func(e int) string { return fmt.Sprint(e) }
	neg := func(e int) string { return fmt.Sprintf("i%d", e) }
	at := map[int]int{}
	switch {
	case lo > 0:
		at[lo] = p.intPow(nodeVar, lo, pos)
		for k := lo + 1; k <= hi; k++ {
			at[k] = p.add(pos(k), at[k-1], nodeVar, false)
		}
	case hi < 0:
		r := p.add("i", nodeVar, 0, true)
		at[hi] = p.intPow(r, -hi, neg)
		for k := hi - 1; k >= lo; k-- {
			at[k] = p.add(neg(-k), at[k+1], r, false)
		}
	default:
		at[0] = nodeOne
		if hi >= 1 {
			at[1] = nodeVar
		}
		for k := 2; k <= hi; k++ {
			at[k] = p.add(pos(k), at[k>>1], at[k-k>>1], false)
		}
		if lo <= -1 {
			at[-1] = p.add("i", nodeVar, 0, true)
			for k := 2; k <= -lo; k++ {
				at[-k] = p.add(neg(k), at[-(k>>1)], at[-k+(k>>1)], false)
			}
		}
	}
	return at
}

// emit writes the definitions of the nodes that the exponents in use need, in replay order.
func (p *powers) emit(b *bytes.Buffer, at map[int]int, use []int) {
	need := make([]bool, len(p.nodes))
	var mark func(i int)
	mark = func(i int) {
		if i < 0 || need[i] {
			return
		}
		need[i] = true
		for _, d := range p.nodes[i].deps {
			mark(d)
		}
	}
	for _, e := range use {
		mark(at[e])
	}
	for i, n := range p.nodes {
		if need[i] {
			fmt.Fprintf(b, "\t%s := %s\n", n.name, n.expr)
		}
	}
}

// product returns n·x^i·y^j as srTable.sum forms it, (n·x^i)·y^j, leaving out the exact
// factors 1.
func product(n, xn, yn string) string {
	s := n
	if xn != "1" {
		s += "*" + xn
	}
	if yn != "1" {
		s += "*" + yn
	}
	return s
}

// chainSum joins the terms left to right; a term with a negative coefficient is written as a
// subtraction, which gives the same float64 (a + (-b) = a - b, and (-n)·x = -(n·x) exactly).
func chainSum(ts []string) string {
	var sb strings.Builder
	for k, t := range ts {
		switch {
		case k == 0:
			sb.WriteString(t)
		case strings.HasPrefix(t, "-"):
			sb.WriteString(" - " + t[1:])
		default:
			sb.WriteString(" + " + t)
		}
	}
	return sb.String()
}

// writeStraight writes func fn, the straight-line form of srTable.sum (two variables) or
// srTable.sum1 (uni) for the terms ts, and returns the number of (0,0) terms it saw.
func writeStraight(b *bytes.Buffer, fn, table string, ts []term, uni bool) {
	iMin, iMax, jMin, jMax := ranges(ts)
	zero := 0
	for _, t := range ts {
		if t.i == 0 && t.j == 0 {
			zero++
		}
	}
	if zero > 1 {
		panic(fn + ": more than one constant term")
	}
	method := "sum"
	if uni {
		method = "sum1"
	}
	fmt.Fprintf(b, "// %s is %s.%s as straight-line code: the same products and additions in the\n"+
		"// same order, hence the same result bit for bit.\n", fn, table, method)
	xp := &powers{v: "x", names: map[string]bool{}}
	xat := xp.replay(iMin, iMax)
	var is, js []int
	for _, t := range ts {
		is = append(is, t.i)
		js = append(js, t.j)
	}
	if uni {
		fmt.Fprintf(b, "func %s(x float64) float64 {\n", fn)
		xp.emit(b, xat, is)
		var parts []string
		for _, t := range ts {
			parts = append(parts, product(t.n, xp.name(xat[t.i]), "1"))
		}
		fmt.Fprintf(b, "\treturn %s\n}\n\n", chainSum(parts))
		return
	}
	yp := &powers{v: "y", names: map[string]bool{}}
	yat := yp.replay(jMin, jMax)
	fmt.Fprintf(b, "func %s(x, y float64) float64 {\n", fn)
	xp.emit(b, xat, is)
	yp.emit(b, yat, js)
	// srTable.sum: two accumulators, terms 0, 2, 4, ... in s0 and 1, 3, 5, ... in s1.
	var s0, s1 []string
	for k, t := range ts {
		pr := product(t.n, xp.name(xat[t.i]), yp.name(yat[t.j]))
		if k%2 == 0 {
			s0 = append(s0, pr)
		} else {
			s1 = append(s1, pr)
		}
	}
	fmt.Fprintf(b, "\ts0 := %s\n", chainSum(s0))
	if len(s1) == 0 {
		b.WriteString("\treturn s0\n}\n\n")
		return
	}
	fmt.Fprintf(b, "\ts1 := %s\n\treturn s0 + s1\n}\n\n", chainSum(s1))
}
