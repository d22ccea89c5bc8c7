package main

import (
	"bytes"
	"fmt"
	"regexp"
	"strings"
)

// This file holds the parts of the generator beyond the plain sums functions: the table of
// weighted sums (blocks), the specialised variants' pruning, and the grouped coefficients of
// genGroup.

// block is one weighted sum of termSums: its want bit, field and weight.
type block struct {
	bit, field string
	w          func(tm term) int
}

var blocks = []block{
	{"wantF", "f", func(tm term) int { return 1 }},
	{"wantX", "x", func(tm term) int { return tm.I }},
	{"wantY", "y", func(tm term) int { return tm.J }},
	{"wantXX", "xx", func(tm term) int { return tm.I * (tm.I - 1) }},
	{"wantYY", "yy", func(tm term) int { return tm.J * (tm.J - 1) }},
	{"wantXY", "xy", func(tm term) int { return tm.I * tm.J }},
	{"wantYYY", "yyy", func(tm term) int { return tm.J * (tm.J - 1) * (tm.J - 2) }},
}

// wantNames returns the want bits of fields joined by |.
func wantNames(fields []string) string {
	var ns []string
	for _, f := range fields {
		for _, bl := range blocks {
			if bl.field == f {
				ns = append(ns, bl.bit)
			}
		}
	}
	return strings.Join(ns, "|")
}

// pruneDefs removes from a function body the definitions "name := ..." whose name no other
// line uses, repeatedly, so that a variant keeps only the powers and products it needs.
func pruneDefs(body string) string {
	lines := strings.Split(strings.TrimSuffix(body, "\n"), "\n")
	def := regexp.MustCompile(`^\t(\w+) := `)
	for changed := true; changed; {
		changed = false
		for i, l := range lines {
			m := def.FindStringSubmatch(l)
			if m == nil {
				continue
			}
			use := regexp.MustCompile(`\b` + m[1] + `\b`)
			used := false
			for j, o := range lines {
				if j != i && use.MatchString(o) {
					used = true
					break
				}
			}
			if !used {
				lines = append(lines[:i], lines[i+1:]...)
				changed = true
				break
			}
		}
	}
	return strings.Join(lines, "\n") + "\n"
}

// genGroup writes func group(y float64, c *[maxI+1]float64), which sets c[I] = Σ I n_i y^J_i
// over the terms with exponent I_i = I >= 1. At fixed y the sums x = Σ n I x^I y^J and
// xx = Σ n I(I-1) x^I y^J of the sums function are then Σ c[I] x^I and Σ (I-1) c[I] x^I:
// polynomials in x alone, for Newton steps in x at fixed y.
func genGroup(b *bytes.Buffer, s spec, t table) {
	maxI := 0
	var js []int
	for _, tm := range t.terms {
		maxI = max(maxI, tm.I)
		if tm.I > 0 {
			js = append(js, tm.J)
		}
	}
	fmt.Fprintf(b, "\n// %s sets c[I] = Σ I n_i y^J_i over the terms of %s with exponent I_i = I >= 1\n", s.group, s.name)
	fmt.Fprintf(b, "// (c[0] = 0), for y = %s. At fixed y the sums x and xx of %s are then Σ c[I] x^I and\n", s.yDoc, s.name)
	b.WriteString("// Σ (I-1) c[I] x^I, polynomials in x alone. The grouping changes the order of the additions, so\n")
	b.WriteString("// the results agree with those sums to rounding, not bit for bit.\n")
	fmt.Fprintf(b, "func %s(y float64, c *[%d]float64) {\n", s.group, maxI+1)
	yn := powers(b, "y", js)
	b.WriteString("\tc[0] = 0\n")
	for i := 1; i <= maxI; i++ {
		var parts []string
		for _, tm := range t.terms {
			if tm.I != i {
				continue
			}
			if p := yn[tm.J]; p == "1" {
				parts = append(parts, lit(tm.n, i))
			} else {
				parts = append(parts, lit(tm.n, i)+"*"+p)
			}
		}
		if len(parts) == 0 {
			fmt.Fprintf(b, "\tc[%d] = 0\n", i)
			continue
		}
		fmt.Fprintf(b, "\tc[%d] = %s\n", i, joinSum(parts))
	}
	b.WriteString("}\n")
}
