// Command sr turns the coefficient CSV files of the IAPWS-IF97 supplementary releases
// (SR2-01, SR3-03, SR4-04, SR5-05) into the Go tables of package if97.
//
// Run it from the package directory:
//
//	cd props/if97 && go run ./gen/sr
//
// It reads testdata/sr_coefficients/*.csv and writes sr2_tables.go, sr3_tables.go,
// sr4_tables.go, sr5_tables_3a3j.go, sr5_tables_3k3t.go, sr5_tables_3u3z.go and
// sr2_tables_index_test.go. The coefficients are written exactly
// as printed (mantissa and power of ten), so the Go literals are the release's numbers.
//
// Each table is also written as a straight-line function (srSum<name> in sr2_sums.go,
// sr3_sums.go, sr4_sums.go and sr5_sums_*.go, indexed in sr2_sums_index_test.go) that computes
// the same sum as the table with the same operations in the same order (see straight.go).
package main

import (
	"bytes"
	"encoding/csv"
	"flag"
	"fmt"
	"go/format"
	"log"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
)

// table names one coefficient table and the Go variable it becomes.
type table struct {
	file string // CSV file name in the input directory
	name string // Go variable name
	out  string // output file
	what string // short description for the doc comment
}

// ijTables are the tables with columns i,I,J,n (or i,n for the simple polynomials).
var ijTables = []table{
	{"sr2-01_t02_region1_p_hs.csv", "srTabP1HS", "sr2_tables.go", "p1(h,s)"},
	{"sr2-01_t05_h2ab_s.csv", "srTabH2abS", "sr2_tables.go", "h2ab(s)"},
	{"sr2-01_t06_region2a_p_hs.csv", "srTabP2aHS", "sr2_tables.go", "p2a(h,s)"},
	{"sr2-01_t07_region2b_p_hs.csv", "srTabP2bHS", "sr2_tables.go", "p2b(h,s)"},
	{"sr2-01_t08_region2c_p_hs.csv", "srTabP2cHS", "sr2_tables.go", "p2c(h,s)"},

	{"sr3-03_t02_h3ab_p.csv", "srTabH3abP", "sr3_tables.go", "h3ab(p)"},
	{"sr3-03_t03_region3a_T_ph.csv", "srTabT3aPH", "sr3_tables.go", "T3a(p,h)"},
	{"sr3-03_t04_region3b_T_ph.csv", "srTabT3bPH", "sr3_tables.go", "T3b(p,h)"},
	{"sr3-03_t06_region3a_v_ph.csv", "srTabV3aPH", "sr3_tables.go", "v3a(p,h)"},
	{"sr3-03_t07_region3b_v_ph.csv", "srTabV3bPH", "sr3_tables.go", "v3b(p,h)"},
	{"sr3-03_t10_region3a_T_ps.csv", "srTabT3aPS", "sr3_tables.go", "T3a(p,s)"},
	{"sr3-03_t11_region3b_T_ps.csv", "srTabT3bPS", "sr3_tables.go", "T3b(p,s)"},
	{"sr3-03_t13_region3a_v_ps.csv", "srTabV3aPS", "sr3_tables.go", "v3a(p,s)"},
	{"sr3-03_t14_region3b_v_ps.csv", "srTabV3bPS", "sr3_tables.go", "v3b(p,s)"},
	{"sr3-03_t17_p3sat_h.csv", "srTabP3SatH", "sr3_tables.go", "p3sat(h)"},
	{"sr3-03_t19_p3sat_s.csv", "srTabP3SatS", "sr3_tables.go", "p3sat(s)"},

	{"sr4-04_t03_region3a_p_hs.csv", "srTabP3aHS", "sr4_tables.go", "p3a(h,s)"},
	{"sr4-04_t04_region3b_p_hs.csv", "srTabP3bHS", "sr4_tables.go", "p3b(h,s)"},
	{"sr4-04_t09_h1_sat_liquid_s.csv", "srTabH1SatLiqS", "sr4_tables.go", "h'1(s)"},
	{"sr4-04_t10_h3a_sat_liquid_s.csv", "srTabH3aSatLiqS", "sr4_tables.go", "h'3a(s)"},
	{"sr4-04_t16_h2ab_sat_vapour_s.csv", "srTabH2abSatVapS", "sr4_tables.go", "h''2ab(s)"},
	{"sr4-04_t17_h2c3b_sat_vapour_s.csv", "srTabH2c3bSatVapS", "sr4_tables.go", "h''2c3b(s)"},
	{"sr4-04_t23_hB13_s.csv", "srTabHB13S", "sr4_tables.go", "hB13(s)"},
	{"sr4-04_t25_TB23_hs.csv", "srTabTB23HS", "sr4_tables.go", "TB23(h,s)"},
	{"sr4-04_t28_Tsat_hs.csv", "srTabTSatHS", "sr4_tables.go", "Tsat(h,s)"},

	{"r7-97_t34_region4_saturation.csv", "srTabSat", "sr5_tables_3u3z.go", "the saturation equation (n1..n10 as I = i-1)"},
}

const (
	mainParams = "sr5-05_t04_subregion_parameters.csv"
	auxParams  = "sr5-05_t12_auxiliary_subregion_parameters.csv"
	mainBounds = "sr5-05_t01_subregion_boundaries.csv"
	auxBounds  = "sr5-05_t09_auxiliary_boundaries_uv_wx.csv"
)

type term struct {
	i, j int
	n    string
}

type parsed struct {
	header []string // '#' lines without the leading "# "
	terms  []term
	uni    bool // columns i,n: a polynomial in one variable (srTable.sum1)
}

func main() {
	in := flag.String("in", "testdata/sr_coefficients", "directory with the coefficient CSV files")
	outDir := flag.String("out", ".", "directory to write the Go files to")
	flag.Parse()

	files := map[string]*bytes.Buffer{}
	buf := func(name string) *bytes.Buffer {
		if b, ok := files[name]; ok {
			return b
		}
		b := &bytes.Buffer{}
		files[name] = b
		return b
	}
	maxLen := 0
	var index, straight []string
	for _, t := range ijTables {
		p := readIJ(filepath.Join(*in, t.file))
		b := buf(t.out)
		writeDoc(b, t.name, t.what, p.header)
		n := writeTable(b, t.name, p.terms)
		if n > maxLen {
			maxLen = n
		}
		index = append(index, fmt.Sprintf("%q: &%s,", t.file, t.name))
		if t.name != "srTabSat" { // srTs reads the coefficients directly
			fn := "srSum" + strings.TrimPrefix(t.name, "srTab")
			writeStraight(buf(sumsFile(t.out)), fn, t.name, p.terms, p.uni)
			straight = append(straight, straightEntry(t.name, fn, p.uni))
		}
	}

	// SR5-05: the v(p,T) equations of subregions 3a to 3z with their parameters, one variable
	// per subregion, spread over three files to keep each file short.
	sub := readParams(filepath.Join(*in, mainParams))
	aux := readParams(filepath.Join(*in, auxParams))
	letters := "abcdefghijklmnopqrstuvwxyz"
	var elems []string
	for k, l := range letters {
		var pr []string
		var pat, out, ptab string
		switch {
		case k < 10:
			pr, out, ptab = sub[string(l)], "sr5_tables_3a3j.go", "Table 4"
		case k < 20:
			pr, out, ptab = sub[string(l)], "sr5_tables_3k3t.go", "Table 4"
		default:
			pr, out, ptab = aux[string(l)], "sr5_tables_3u3z.go", "Table 12"
		}
		if k < 20 {
			pat = fmt.Sprintf("sr5-05_tA1.%02d_region3%c_v_pT.csv", k+1, l)
		} else {
			pat = fmt.Sprintf("sr5-05_tA2.%d_region3%c_v_pT_auxiliary.csv", k-19, l)
		}
		if pr == nil {
			log.Fatalf("no parameters for subregion 3%c", l)
		}
		p := readIJ(filepath.Join(*in, pat))
		if n := rangeLen(p.terms); n > maxLen {
			maxLen = n
		}
		c, d, e, eq := pr[6], pr[7], pr[8], "Eq. (4)"
		if c == "" { // 3n: exp form, Eq. (5)
			c, d, e, eq = "1", "1", "0", "Eq. (5), exp form (e = 0 marks it)"
		}
		name := fmt.Sprintf("srV3%c", l)
		b := buf(out)
		fmt.Fprintf(b, "// %s holds v3%c(p,T), %s: parameters from %s,\n// %s,\n// %s.\n",
			name, l, eq, ptab, docTitle(p.header[0]), p.header[1])
		fn := fmt.Sprintf("srSumV3%c", l)
		fmt.Fprintf(b, "var %s = srSubregion{vStar: %s, pStar: %s, tStar: %s, a: %s, b: %s, c: %s, d: %s, e: %s, sum: %s,\n\ttab: %s}\n\n",
			name, pr[0], pr[1], pr[2], pr[4], pr[5], c, d, e, fn, tableLiteral(p.terms))
		writeStraight(buf(sumsFile(out)), fn, name+".tab", p.terms, false)
		straight = append(straight, straightEntry(name+".tab", fn, false))
		elems = append(elems, name)
		index = append(index, fmt.Sprintf("%q: &%s.tab,", pat, name))
		if got, want := len(p.terms), atoi(pr[3]); got != want {
			log.Fatalf("3%c: %d terms, parameter table says N = %d", l, got, want)
		}
	}
	b := buf("sr5_tables_3u3z.go")
	fmt.Fprintf(b, "// srV3PT holds the v(p,T) equations of IAPWS SR5-05(2016), subregions 3a to 3t and the\n"+
		"// auxiliary subregions 3u to 3z, indexed by subregion letter minus 'a'.\n"+
		"var srV3PT = [26]*srSubregion{%s}\n\n", "&"+strings.Join(elems, ", &"))

	// SR5-05 Tables 1 and 9: the boundary equations T3xy(p).
	for _, f := range []string{mainBounds, auxBounds} {
		for _, bd := range readBounds(filepath.Join(*in, f)) {
			name := "srTab" + bd.name
			writeDoc(b, name, bd.name+"(p), "+bd.form, bd.header)
			writeTable(b, name, bd.terms)
			index = append(index, fmt.Sprintf("%q: &%s,", f+"#"+bd.name, name))
			fn := "srSum" + bd.name
			writeStraight(buf(sumsFile("sr5_tables_3u3z.go")), fn, name, bd.terms, true)
			straight = append(straight, straightEntry(name, fn, true))
		}
	}

	fmt.Fprintf(buf("sr2_tables.go"), "// srPowLen is the longest run of exponents (max - min + 1) in any table above or in\n"+
		"// sr3_tables.go, sr4_tables.go and sr5_tables_*.go; it sizes the power tables of srTable.sum.\n"+
		"const srPowLen = %d\n", maxLen)

	idx := buf("sr2_tables_index_test.go")
	sort.Strings(index)
	fmt.Fprintf(idx, "// srTableIndex maps each coefficient CSV file in testdata/sr_coefficients (with\n"+
		"// \"#T3xy\" for one boundary equation of a multi-equation file) to its generated table.\n"+
		"var srTableIndex = map[string]*srTable{\n%s\n}\n", strings.Join(index, "\n"))

	st := buf("sr2_sums_index_test.go")
	fmt.Fprintf(st, "// srStraightIndex pairs each coefficient table with its straight-line sum (sr*_sums.go).\n"+
		"var srStraightIndex = []srStraight{\n%s\n}\n", strings.Join(straight, "\n"))

	for name, b := range files {
		src := []byte("// Code generated by go run ./gen/sr; DO NOT EDIT.\n\npackage if97\n\n")
		src = append(src, b.Bytes()...)
		out, err := format.Source(src)
		if err != nil {
			log.Fatalf("%s: %v\n%s", name, err, src)
		}
		if err := os.WriteFile(filepath.Join(*outDir, name), out, 0o644); err != nil {
			log.Fatal(err)
		}
	}
}

// sumsFile names the file of the straight-line sums that belong to a tables file.
func sumsFile(tables string) string { return strings.Replace(tables, "_tables", "_sums", 1) }

// straightEntry is one element of srStraightIndex.
func straightEntry(tab, fn string, uni bool) string {
	if uni {
		return fmt.Sprintf("{%q, &%s, nil, %s},", tab, tab, fn)
	}
	return fmt.Sprintf("{%q, &%s, %s, nil},", tab, tab, fn)
}

// writeDoc writes the doc comment of a table from the CSV's header lines.
func writeDoc(b *bytes.Buffer, name, what string, header []string) {
	fmt.Fprintf(b, "// %s holds %s:\n// %s,\n// %s.\n", name, what, docTitle(header[0]), header[1])
	for _, h := range header[2:4] {
		fmt.Fprintf(b, "// %s\n", h)
	}
}

// docTitle shortens "IAPWS SR2-01(2014), Revised Supplementary ..." to "IAPWS SR2-01(2014)".
func docTitle(h string) string {
	if i := strings.Index(h, ","); i > 0 {
		return h[:i]
	}
	return h
}

func writeTable(b *bytes.Buffer, name string, ts []term) int {
	fmt.Fprintf(b, "var %s = %s\n\n", name, tableLiteral(ts))
	return rangeLen(ts)
}

func rangeLen(ts []term) int {
	iMin, iMax, jMin, jMax := ranges(ts)
	return max(iMax-iMin+1, jMax-jMin+1)
}

func ranges(ts []term) (iMin, iMax, jMin, jMax int) {
	iMin, iMax, jMin, jMax = ts[0].i, ts[0].i, ts[0].j, ts[0].j
	for _, t := range ts {
		iMin, iMax = min(iMin, t.i), max(iMax, t.i)
		jMin, jMax = min(jMin, t.j), max(jMax, t.j)
	}
	return
}

func tableLiteral(ts []term) string {
	iMin, iMax, jMin, jMax := ranges(ts)
	var s strings.Builder
	fmt.Fprintf(&s, "srTable{iMin: %d, iMax: %d, jMin: %d, jMax: %d, terms: []srTerm{\n", iMin, iMax, jMin, jMax)
	for _, t := range ts {
		fmt.Fprintf(&s, "{%d, %d, %s},\n", t.i, t.j, t.n)
	}
	s.WriteString("}}")
	return s.String()
}

// readIJ reads a file with columns i,I,J,n, or i,n (then I = i-1 and J = 0).
func readIJ(path string) parsed {
	header, rows := readCSV(path)
	var p parsed
	p.header = header
	cols := rows[0]
	for _, r := range rows[1:] {
		switch strings.Join(cols, ",") {
		case "i,I,J,n":
			p.terms = append(p.terms, term{atoi(r[1]), atoi(r[2]), checkNum(r[3])})
		case "i,n":
			p.uni = true
			p.terms = append(p.terms, term{atoi(r[0]) - 1, 0, checkNum(r[1])})
		default:
			log.Fatalf("%s: unexpected columns %v", path, cols)
		}
	}
	return p
}

type bound struct {
	name, form string
	header     []string
	terms      []term
}

// readBounds reads a file with columns equation,form,i,I,n.
func readBounds(path string) []bound {
	header, rows := readCSV(path)
	var out []bound
	for _, r := range rows[1:] {
		if len(out) == 0 || out[len(out)-1].name != r[0] {
			form := "Eq. (1), theta = sum n_i pi^I_i"
			if r[1] == "Eq2_ln" {
				form = "Eq. (2), theta = sum n_i (ln pi)^I_i"
			}
			out = append(out, bound{name: r[0], form: form, header: header})
		}
		b := &out[len(out)-1]
		b.terms = append(b.terms, term{atoi(r[3]), 0, checkNum(r[4])})
	}
	return out
}

// readParams reads a subregion parameter table keyed by subregion letter.
func readParams(path string) map[string][]string {
	_, rows := readCSV(path)
	m := map[string][]string{}
	for _, r := range rows[1:] {
		m[strings.TrimPrefix(r[0], "3")] = r[1:]
	}
	return m
}

func readCSV(path string) (header []string, rows [][]string) {
	data, err := os.ReadFile(path)
	if err != nil {
		log.Fatal(err)
	}
	var body []string
	for _, line := range strings.Split(string(data), "\n") {
		if strings.HasPrefix(line, "#") {
			header = append(header, strings.TrimSpace(strings.TrimPrefix(line, "#")))
		} else if strings.TrimSpace(line) != "" {
			body = append(body, line)
		}
	}
	r := csv.NewReader(strings.NewReader(strings.Join(body, "\n")))
	rows, err = r.ReadAll()
	if err != nil {
		log.Fatalf("%s: %v", path, err)
	}
	if len(header) < 4 {
		log.Fatalf("%s: expected at least 4 header lines", path)
	}
	return header, rows
}

func atoi(s string) int {
	n, err := strconv.Atoi(strings.TrimSpace(s))
	if err != nil {
		log.Fatal(err)
	}
	return n
}

func checkNum(s string) string {
	s = strings.TrimSpace(s)
	if _, err := strconv.ParseFloat(s, 64); err != nil {
		log.Fatal(err)
	}
	return s
}
