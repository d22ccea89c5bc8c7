// Command r7 turns the IAPWS-IF97 (R7-97) coefficient tables in testdata/r7_coefficients into
// straight-line Go code for package if97.
//
// Each basic or backward equation of R7-97 is a sum Σ n_i x^I_i y^J_i of two reduced, shifted
// variables. The generator writes, for each table, a function that builds the needed integer
// powers of x and y by shared products (an addition chain: every power is the product of two
// lower ones, so no math.Pow and short dependency chains), forms each term product once, and
// then adds the weighted sums with four independent accumulators.
//
// For the basic equations it writes func name(x, y float64, want uint8, s *termSums), which
// sets the weighted sums
//
//	f  = Σ n t    x  = Σ n I t    y  = Σ n J t
//	xx = Σ n I(I-1) t    yy = Σ n J(J-1) t    xy = Σ n I J t     (t = x^I y^J)
//	yyy = Σ n J(J-1)(J-2) t
//
// only where the want mask asks for them (the other fields are left as they are); the caller divides by x, y, x², y² or xy to
// get the partial derivatives. For the backward equations it writes func name(x, y float64)
// float64 returning the plain sum. Small boundary and saturation tables become constants.
//
// Run it from the package directory: go generate (see kernel.go).
package main

import (
	"bufio"
	"bytes"
	"fmt"
	"go/format"
	"math/big"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strconv"
	"strings"
)

const dir = "testdata/r7_coefficients"

// term is one row of a coefficient table.
type term struct {
	I, J int // exponents, already multiplied by the spec's scale
	n    string
}

// table is a parsed CSV file.
type table struct {
	header []string // the '#' comment lines, without the '#'
	terms  []term
	lnN    string // region 3 only: coefficient of ln δ (row with empty I and J)
}

// spec describes one generated function.
type spec struct {
	name   string
	csv    string
	mode   string // "sums", "sums1" (univariate in y), "value", "consts"
	xDoc   string // meaning of x
	yDoc   string // meaning of y
	xScale int    // exponents I are multiplied by this (x is then x^(1/xScale))
	over   string // CSV whose rows replace rows of csv with the same i (Table 10 footnote a)
	group  string // if set, also write func group(y float64, c *[maxI+1]float64) (see genGroup)
	// variants are specialised copies of a sums function (see genSums).
	variants []variant
}

// variant is a copy of a sums function that computes a fixed set of sums, without the want
// mask and with only the powers and term products those sums use. Each sum is the same
// expression as in the full function, so it gives the same float64.
type variant struct {
	suffix string   // appended to the function name
	fields []string // termSums fields it sets
	use    string   // what it is for, for the doc comment
}

type file struct {
	name  string
	doc   string
	specs []spec
}

var files = []file{
	{"region1_gen.go", "region 1 (R7-97 Tables 2, 6, 8)", []spec{
		{name: "r1Sums", csv: "r7-97_t02_region1_gibbs.csv", mode: "sums", xDoc: "7.1 - π", yDoc: "τ - 1.222",
			variants: []variant{{"Y", []string{"y"}, "h"}, {"CurveH", []string{"y", "yy", "yyy"}, "yCurve with h"}, {"CurveS", []string{"f", "y", "yy", "yyy"}, "yCurve with s"}}},
		{name: "t1ph", csv: "r7-97_t06_region1_T_ph.csv", mode: "value", xDoc: "π", yDoc: "η + 1"},
		{name: "t1ps", csv: "r7-97_t08_region1_T_ps.csv", mode: "value", xDoc: "π", yDoc: "σ + 2"},
	}},
	{"region2_gen.go", "region 2 (R7-97 Tables 10, 11)", []spec{
		{name: "r2oSums", csv: "r7-97_t10_region2_ideal.csv", mode: "sums1", yDoc: "τ"},
		{name: "r2rSums", csv: "r7-97_t11_region2_residual.csv", mode: "sums", xDoc: "π", yDoc: "τ - 0.5",
			variants: []variant{{"Y", []string{"y"}, "h"}, {"CurveH", []string{"y", "yy", "yyy"}, "yCurve with h"}, {"CurveS", []string{"f", "y", "yy", "yyy"}, "yCurve with s"}}},
	}},
	{"region2meta_gen.go", "the metastable-vapour region, Eq. (18) (R7-97 Table 10 with footnote a, Table 16)", []spec{
		{name: "r2moSums", csv: "r7-97_t10_region2_ideal.csv", over: "r7-97_t10a_region2_ideal_metastable_n1_n2.csv", mode: "sums1", yDoc: "τ"},
		{name: "r2mrSums", csv: "r7-97_t16_region2_metastable_residual.csv", mode: "sums", xDoc: "π", yDoc: "τ - 0.5"},
	}},
	{"region2back_gen.go", "the region 2 backward equations (R7-97 Tables 20-22, 25-27)", []spec{
		{name: "t2aph", csv: "r7-97_t20_region2a_T_ph.csv", mode: "value", xDoc: "π", yDoc: "η - 2.1"},
		{name: "t2bph", csv: "r7-97_t21_region2b_T_ph.csv", mode: "value", xDoc: "π - 2", yDoc: "η - 2.6"},
		{name: "t2cph", csv: "r7-97_t22_region2c_T_ph.csv", mode: "value", xDoc: "π + 25", yDoc: "η - 1.8"},
		{name: "t2aps", csv: "r7-97_t25_region2a_T_ps.csv", mode: "value", xDoc: "π^(1/4)", yDoc: "σ - 2", xScale: 4},
		{name: "t2bps", csv: "r7-97_t26_region2b_T_ps.csv", mode: "value", xDoc: "π", yDoc: "10 - σ"},
		{name: "t2cps", csv: "r7-97_t27_region2c_T_ps.csv", mode: "value", xDoc: "π", yDoc: "2 - σ"},
	}},
	{"region3_gen.go", "region 3 (R7-97 Table 30)", []spec{
		{name: "r3Sums", csv: "r7-97_t30_region3_helmholtz.csv", mode: "sums", xDoc: "δ", yDoc: "τ", group: "r3XCoeffs"},
	}},
	{"region5_gen.go", "region 5 (R7-97 Tables 37, 38)", []spec{
		{name: "r5oSums", csv: "r7-97_t37_region5_ideal.csv", mode: "sums1", yDoc: "τ"},
		{name: "r5rSums", csv: "r7-97_t38_region5_residual.csv", mode: "sums", xDoc: "π", yDoc: "τ"},
	}},
	{"consts_gen.go", "the boundary and saturation equations (R7-97 Tables 1, 19, 34)", []spec{
		{name: "b23N", csv: "r7-97_t01_b23.csv", mode: "consts"},
		{name: "b2bcN", csv: "r7-97_t19_b2bc.csv", mode: "consts"},
		{name: "satN", csv: "r7-97_t34_region4_saturation.csv", mode: "consts"},
	}},
}

func main() {
	for _, f := range files {
		var b bytes.Buffer
		fmt.Fprintf(&b, "// Code generated by go run ./gen/r7; DO NOT EDIT.\n\n")
		fmt.Fprintf(&b, "package if97\n\n// This file holds %s,\n// generated from the CSV files in %s.\n", f.doc, dir)
		for _, s := range f.specs {
			t := read(s.csv, s.xScale)
			if s.over != "" {
				o := read(s.over, 1)
				for k, ot := range o.terms {
					t.terms[k].n = ot.n // the footnote replaces rows 1 and 2
					if t.terms[k].J != ot.J {
						fail("%s: row %d exponent mismatch", s.over, k+1)
					}
				}
				t.header = append(t.header, o.header[1])
			}
			b.WriteString("\n")
			switch s.mode {
			case "consts":
				genConsts(&b, s, t)
			case "value":
				genValue(&b, s, t)
			default:
				genSums(&b, s, t, nil)
				for _, v := range s.variants {
					genSums(&b, s, t, &v)
				}
			}
			if s.group != "" {
				genGroup(&b, s, t)
			}
		}
		src, err := format.Source(b.Bytes())
		if err != nil {
			os.WriteFile(f.name+".broken", b.Bytes(), 0o644)
			fail("%s: %v", f.name, err)
		}
		if err := os.WriteFile(f.name, src, 0o644); err != nil {
			fail("%v", err)
		}
	}
}

func fail(format string, a ...any) {
	fmt.Fprintf(os.Stderr, "gen/r7: "+format+"\n", a...)
	os.Exit(1)
}

// read parses a coefficient CSV. Columns are i,I,J,n or i,J,n or i,n.
func read(name string, xScale int) table {
	if xScale == 0 {
		xScale = 1
	}
	fh, err := os.Open(filepath.Join(dir, name))
	if err != nil {
		fail("%v", err)
	}
	defer fh.Close()
	var t table
	var cols []string
	sc := bufio.NewScanner(fh)
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		if line == "" {
			continue
		}
		if strings.HasPrefix(line, "#") {
			h := strings.TrimSpace(strings.TrimPrefix(line, "#"))
			if !strings.HasPrefix(h, "Provenance") {
				t.header = append(t.header, h)
			}
			continue
		}
		f := strings.Split(line, ",")
		if cols == nil {
			cols = f
			continue
		}
		var tm term
		for k, c := range cols {
			switch c {
			case "I":
				if f[k] == "" {
					continue
				}
				v, err := strconv.ParseFloat(f[k], 64)
				if err != nil {
					fail("%s: %v", name, err)
				}
				iv := float64(v * float64(xScale))
				if iv != float64(int(iv)) {
					fail("%s: exponent %v not a multiple of 1/%d", name, v, xScale)
				}
				tm.I = int(iv)
			case "J":
				if f[k] == "" {
					continue
				}
				v, err := strconv.Atoi(f[k])
				if err != nil {
					fail("%s: %v", name, err)
				}
				tm.J = v
			case "n":
				tm.n = f[k]
			}
		}
		if len(cols) == 4 && f[1] == "" {
			t.lnN = tm.n
			continue
		}
		t.terms = append(t.terms, tm)
	}
	return t
}

func writeHeader(b *bytes.Buffer, t table) {
	for _, h := range t.header {
		fmt.Fprintf(b, "// %s\n", h)
	}
}

// lit returns n·k as a Go float literal, rounded once from the exact product.
func lit(n string, k int) string {
	f, _, err := big.ParseFloat(n, 10, 256, big.ToNearestEven)
	if err != nil {
		fail("bad number %q: %v", n, err)
	}
	f.Mul(f, new(big.Float).SetInt64(int64(k)))
	v, _ := f.Float64()
	s := strconv.FormatFloat(v, 'g', -1, 64)
	if !strings.ContainsAny(s, ".e") {
		s += ".0"
	}
	return s
}

func genConsts(b *bytes.Buffer, s spec, t table) {
	fmt.Fprintf(b, "// %s holds n1..n%d (index 0 is unused, so that %s[i] is n_i):\n", s.name, len(t.terms), s.name)
	writeHeader(b, t)
	fmt.Fprintf(b, "var %s = [%d]float64{0,\n", s.name, len(t.terms)+1)
	for _, tm := range t.terms {
		fmt.Fprintf(b, "\t%s,\n", lit(tm.n, 1))
	}
	b.WriteString("}\n")
}

// powers emits code that defines the powers of v needed for exps and returns their names.
func powers(b *bytes.Buffer, v string, exps []int) map[int]string {
	names := map[int]string{0: "1", 1: v}
	var pos, neg []int
	seen := map[int]bool{}
	for _, e := range exps {
		if seen[e] || e == 0 || e == 1 {
			continue
		}
		seen[e] = true
		if e > 0 {
			pos = append(pos, e)
		} else {
			neg = append(neg, -e)
		}
	}
	chain(b, v, v, pos, names, 1)
	if len(neg) > 0 {
		inv := v + "i"
		fmt.Fprintf(b, "\t%s := 1 / %s\n", inv, v)
		chain(b, v+"i", inv, neg, names, -1)
	}
	return names
}

// chain emits an addition chain for the exponents in want (all > 0): every power is the
// product of two known ones, chosen to keep the dependency depth small.
func chain(b *bytes.Buffer, prefix, base string, want []int, names map[int]string, sign int) {
	sort.Ints(want)
	depth := map[int]int{1: 0}
	local := map[int]string{1: base}
	var ensure func(e int)
	ensure = func(e int) {
		if _, ok := depth[e]; ok {
			return
		}
		bestA, bestD := 0, 1<<30
		for a := range depth {
			c := e - a
			if c < a {
				continue
			}
			if dc, ok := depth[c]; ok {
				d := max(depth[a], dc)
				if d < bestD || (d == bestD && a > bestA) {
					bestA, bestD = a, d
				}
			}
		}
		if bestA == 0 {
			h := e / 2
			ensure(h)
			ensure(e - h)
			bestA, bestD = h, max(depth[h], depth[e-h])
		}
		name := fmt.Sprintf("%s%d", prefix, e)
		fmt.Fprintf(b, "\t%s := %s * %s\n", name, local[bestA], local[e-bestA])
		depth[e] = bestD + 1
		local[e] = name
	}
	for _, e := range want {
		ensure(e)
		names[sign*e] = local[e]
	}
	if sign < 0 {
		names[-1] = base
	}
}

// prod returns the expression for the term product x^I y^J.
func prod(xn, yn map[int]string, tm term) string {
	switch {
	case tm.I == 0 && tm.J == 0:
		return "1"
	case tm.I == 0:
		return yn[tm.J]
	case tm.J == 0:
		return xn[tm.I]
	}
	return xn[tm.I] + " * " + yn[tm.J]
}

func exps(t table) (is, js []int) {
	for _, tm := range t.terms {
		is = append(is, tm.I)
		js = append(js, tm.J)
	}
	return
}

func genValue(b *bytes.Buffer, s spec, t table) {
	fmt.Fprintf(b, "// %s returns Σ n_i x^I_i y^J_i with x = %s and y = %s for\n", s.name, s.xDoc, s.yDoc)
	writeHeader(b, t)
	if s.xScale > 1 {
		fmt.Fprintf(b, "// The exponents I_i are multiples of 1/%d; the function takes x = %s and uses x^(%d I_i).\n", s.xScale, s.xDoc, s.xScale)
	}
	fmt.Fprintf(b, "func %s(x, y float64) float64 {\n", s.name)
	is, js := exps(t)
	xn := powers(b, "x", is)
	yn := powers(b, "y", js)
	var parts []string
	for _, tm := range t.terms {
		p := prod(xn, yn, tm)
		if p == "1" {
			parts = append(parts, lit(tm.n, 1))
		} else {
			parts = append(parts, lit(tm.n, 1)+"*"+p)
		}
	}
	accumulate(b, "return", parts)
	b.WriteString("}\n")
}

// accumulate emits "lhs (a0+a1)+(a2+a3)" with the parts spread over four accumulators.
func accumulate(b *bytes.Buffer, lhs string, parts []string) {
	if len(parts) == 0 {
		fmt.Fprintf(b, "\t%s 0\n", lhs)
		return
	}
	const nacc = 4
	acc := make([][]string, nacc)
	for k, p := range parts {
		acc[k%nacc] = append(acc[k%nacc], p)
	}
	var used []string
	for k, a := range acc {
		if len(a) == 0 {
			continue
		}
		name := fmt.Sprintf("a%d", k)
		fmt.Fprintf(b, "\t%s := %s\n", name, joinSum(a))
		used = append(used, name)
	}
	switch len(used) {
	case 1:
		fmt.Fprintf(b, "\t%s %s\n", lhs, used[0])
	case 2:
		fmt.Fprintf(b, "\t%s %s + %s\n", lhs, used[0], used[1])
	case 3:
		fmt.Fprintf(b, "\t%s (%s + %s) + %s\n", lhs, used[0], used[1], used[2])
	default:
		fmt.Fprintf(b, "\t%s (%s + %s) + (%s + %s)\n", lhs, used[0], used[1], used[2], used[3])
	}
}

func genSums(out *bytes.Buffer, s spec, t table, v *variant) {
	uni := s.mode == "sums1"
	if v != nil {
		fmt.Fprintf(out, "\n// %s%s is %s with want = %s, for %s: the same expressions without the\n"+
			"// want tests and without the powers and products that those sums do not use.\n",
			s.name, v.suffix, s.name, wantNames(v.fields), v.use)
		fmt.Fprintf(out, "func %s%s(x, y float64, s *termSums) {\n", s.name, v.suffix)
		var body bytes.Buffer
		sumsBody(&body, s, t, v)
		out.WriteString(pruneDefs(body.String()))
		out.WriteString("}\n")
		return
	}
	b := out
	if uni {
		fmt.Fprintf(b, "// %s returns the weighted sums of the terms n_i y^J_i with y = %s for\n", s.name, s.yDoc)
	} else {
		fmt.Fprintf(b, "// %s returns the weighted sums of the terms n_i x^I_i y^J_i with x = %s and y = %s for\n", s.name, s.xDoc, s.yDoc)
	}
	writeHeader(b, t)
	b.WriteString("// Only the sums selected by want are computed and stored in s (see termSums).\n")
	if t.lnN != "" {
		fmt.Fprintf(b, "// The ln δ term (row 1, n1 = %s) is not part of the sums; see %sLnN.\n", t.lnN, s.name[:2])
	}
	if uni {
		fmt.Fprintf(b, "func %s(y float64, want uint8, s *termSums) {\n", s.name)
	} else {
		fmt.Fprintf(b, "func %s(x, y float64, want uint8, s *termSums) {\n", s.name)
	}
	sumsBody(b, s, t, nil)
	b.WriteString("}\n")
	if t.lnN != "" {
		fmt.Fprintf(b, "\n// %sLnN is n1 of R7-97 Table 30, the coefficient of ln δ in Eq. (28).\nconst %sLnN = %s\n", s.name[:2], s.name[:2], lit(t.lnN, 1))
	}
}

// sumsBody writes the statements of a sums function: powers, term products and the sums, all
// of them under want tests (v == nil) or those of the variant v without tests.
func sumsBody(b *bytes.Buffer, s spec, t table, v *variant) {
	uni := s.mode == "sums1"
	is, js := exps(t)
	xn := map[int]string{0: "1"}
	if !uni {
		xn = powers(b, "x", is)
	}
	yn := powers(b, "y", js)
	tn := make([]string, len(t.terms))
	for k, tm := range t.terms {
		p := prod(xn, yn, tm)
		if strings.Contains(p, "*") {
			tn[k] = fmt.Sprintf("t%d", k+1)
			fmt.Fprintf(b, "\t%s := %s\n", tn[k], p)
		} else {
			tn[k] = p
		}
	}
	for _, bl := range blocks {
		if uni && (bl.field == "x" || bl.field == "xx" || bl.field == "xy") {
			continue
		}
		var parts []string
		for k, tm := range t.terms {
			w := bl.w(tm)
			if w == 0 {
				continue
			}
			if tn[k] == "1" {
				parts = append(parts, lit(tm.n, w))
			} else {
				parts = append(parts, lit(tm.n, w)+"*"+tn[k])
			}
		}
		if v == nil {
			fmt.Fprintf(b, "\tif want&%s != 0 {\n", bl.bit)
			accumulate(b, "s."+bl.field+" =", parts)
			b.WriteString("\t}\n")
		} else if slices.Contains(v.fields, bl.field) {
			b.WriteString("\t{\n") // a scope for the accumulators, as the want test gives
			accumulate(b, "s."+bl.field+" =", parts)
			b.WriteString("\t}\n")
		}
	}
}

// joinSum joins terms with " + ", writing "a - b" for a negative term.
func joinSum(parts []string) string {
	var sb strings.Builder
	for k, p := range parts {
		switch {
		case k == 0:
			sb.WriteString(p)
		case strings.HasPrefix(p, "-"):
			sb.WriteString(" - " + p[1:])
		default:
			sb.WriteString(" + " + p)
		}
	}
	return sb.String()
}
