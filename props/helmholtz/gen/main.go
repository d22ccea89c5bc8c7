// Command gen turns the equation-of-state coefficient files in
// props/helmholtz/testdata/eos into the Go tables of package helmholtz.
//
// Run it from props/helmholtz with "go generate" (see doc.go). It reads
// every testdata/eos/*.csv file, checks that each term fits the kernel
// (integer density exponents), reduces the ideal-gas terms to the forms the
// kernel evaluates, and writes tables_gen.go. The output is committed; the
// package itself never reads a file.
package main

import (
	"bufio"
	"bytes"
	"fmt"
	"go/format"
	"log"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// meta is what the generator adds to a coefficient file: the names a user
// may type, the short equation label, whether it is the default equation for
// its fluid, and integration constants where the file has none.
type meta struct {
	name      string   // canonical fluid name
	aliases   []string // other accepted names
	equation  string   // short citation shown to users
	isDefault bool
	a1, a2    float64 // integration constants when the file gives none
	ref       string  // reference state: IIR, NBP or OTO
}

// refText describes the reference states (README section 6).
var refText = map[string]string{
	"IIR": "IIR: h = 200 kJ/kg and s = 1 kJ/(kg K) for saturated liquid at 273.15 K",
	"NBP": "NBP: h = 0 and s = 0 for saturated liquid at the normal boiling point (0.101325 MPa)",
	"OTO": "OTO: h = 0 at 298.15 K and s = 0 at 298.15 K and 0.101325 MPa for the ideal gas",
}

// extra lists, for each file, what the file itself does not say. The
// derived integration constants are those of README section 6 of the
// reference folder ("derived constants ... from the throwaway evaluator");
// the package tests check that they give the stated reference state.
var extra = map[string]meta{
	"isopentane__lemmon-span-2006": {name: "isopentane", aliases: []string{"R-601a", "2-methylbutane"},
		equation: "Lemmon & Span (2006)", isDefault: true, ref: "NBP"},
	"n-pentane__span-wagner-2003": {name: "n-pentane", aliases: []string{"R-601", "pentane"},
		equation: "Span & Wagner (2003)", isDefault: true, ref: "OTO", a1: 28.5873441190, a2: -96.2653395707},
	"r245fa__akasaka-2015": {name: "R-245fa", aliases: []string{"HFC-245fa"},
		equation: "Akasaka, Zhou & Lemmon (2015)", isDefault: true, ref: "IIR"},
	"r245fa__lemmon-span-2006": {name: "R-245fa", equation: "Lemmon & Span (2006)", ref: "IIR"},
	"r1233zde__akasaka-lemmon-2022": {name: "R-1233zd(E)", aliases: []string{"HCFO-1233zd(E)"},
		equation: "Akasaka & Lemmon (2022)", isDefault: true, ref: "IIR"},
	"r1233zde__mondejar-2015": {name: "R-1233zd(E)", equation: "Mondéjar, McLinden & Lemmon (2015)",
		ref: "IIR", a1: -16.4560148636, a2: 10.0958641935},
	"toluene__lemmon-span-2006": {name: "toluene", aliases: []string{"methylbenzene"},
		equation: "Lemmon & Span (2006)", isDefault: true, ref: "NBP"},
	"mm__thol-2016": {name: "MM", aliases: []string{"hexamethyldisiloxane"},
		equation: "Thol et al. (2016)", isDefault: true, ref: "NBP"},
	"mm__colonna-2006": {name: "MM", equation: "Colonna et al. (2006)",
		ref: "NBP", a1: 27.1903995187, a2: -7.3982398876},
	"cyclopentane__gedanitz-2015": {name: "cyclopentane",
		equation: "Gedanitz, Davila & Lemmon (2015)", isDefault: true, ref: "NBP"},
	"isobutane__span-wagner-2003": {name: "isobutane", aliases: []string{"R-600a", "2-methylpropane"},
		equation: "Span & Wagner (2003)", isDefault: true, ref: "OTO", a1: 20.4137376697, a2: -94.4676233775},
	"n-butane__span-wagner-2003": {name: "n-butane", aliases: []string{"R-600", "butane"},
		equation: "Span & Wagner (2003)", isDefault: true, ref: "OTO", a1: 20.8841550265, a2: -91.6384812313},
	"r134a__tillner-roth-baehr-1994": {name: "R-134a", aliases: []string{"HFC-134a"},
		equation: "Tillner-Roth & Baehr (1994)", isDefault: true, ref: "IIR"},
	"r134a__span-wagner-2003": {name: "R-134a", equation: "Span & Wagner (2003)",
		ref: "IIR", a1: -1.0301010378, a2: 9.0550318471},
}

// file is one parsed coefficient file.
type file struct {
	id     string
	header map[string]string
	rows   []map[string]string
}

func main() {
	files, err := filepath.Glob("testdata/eos/*.csv")
	if err != nil || len(files) == 0 {
		log.Fatalf("gen: no coefficient files in testdata/eos (run from props/helmholtz): %v", err)
	}
	sort.Strings(files)
	// Default equations go to tables_gen.go, alternates to
	// tables_alt_gen.go, to keep each file short.
	var def, alt bytes.Buffer
	var ids []string
	for _, path := range files {
		f, err := parse(path)
		if err != nil {
			log.Fatalf("gen: %s: %v", path, err)
		}
		src, err := emit(f)
		if err != nil {
			log.Fatalf("gen: %s: %v", path, err)
		}
		if extra[f.id].isDefault {
			def.WriteString(src)
		} else {
			alt.WriteString(src)
		}
		ids = append(ids, f.id)
	}
	def.WriteString("// allFluids lists every equation in the tables, defaults and alternates.\nvar allFluids = []*Fluid{\n")
	for _, id := range ids {
		fmt.Fprintf(&def, "\t&%s,\n", varName(id))
	}
	def.WriteString("}\n")
	write("tables_gen.go", def.Bytes())
	write("tables_alt_gen.go", alt.Bytes())
}

// write formats and writes one generated file.
func write(name string, body []byte) {
	var out bytes.Buffer
	out.WriteString("// Code generated by props/helmholtz/gen from testdata/eos/*.csv; DO NOT EDIT.\n\npackage helmholtz\n\n")
	out.Write(body)
	src, err := format.Source(out.Bytes())
	if err != nil {
		log.Fatalf("gen: format %s: %v", name, err)
	}
	if err := os.WriteFile(name, src, 0o644); err != nil {
		log.Fatal(err)
	}
}

// parse reads the "# key: value" header, then the CSV rows.
func parse(path string) (*file, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	f := &file{id: strings.TrimSuffix(filepath.Base(path), ".csv"), header: map[string]string{}}
	var cols []string
	sc := bufio.NewScanner(bytes.NewReader(data))
	last := ""
	for sc.Scan() {
		line := sc.Text()
		switch {
		case strings.HasPrefix(line, "#   ") && last != "":
			f.header[last] += " " + strings.TrimSpace(line[1:])
		case strings.HasPrefix(line, "# "):
			k, v, ok := strings.Cut(line[2:], ":")
			if ok {
				last = strings.TrimSpace(k)
				f.header[last] = strings.TrimSpace(v)
			}
		case strings.TrimSpace(line) == "":
		case cols == nil:
			cols = strings.Split(line, ",")
		default:
			fields := splitCSV(line)
			row := map[string]string{}
			for i, c := range cols {
				if i < len(fields) {
					row[c] = fields[i]
				}
			}
			f.rows = append(f.rows, row)
		}
	}
	return f, sc.Err()
}

// splitCSV splits one line, honouring double quotes.
func splitCSV(line string) []string {
	var out []string
	var cur strings.Builder
	quoted := false
	for _, r := range line {
		switch {
		case r == '"':
			quoted = !quoted
		case r == ',' && !quoted:
			out = append(out, cur.String())
			cur.Reset()
		default:
			cur.WriteRune(r)
		}
	}
	return append(out, cur.String())
}

func num(s string) float64 {
	if s == "" {
		return 0
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		log.Fatalf("gen: bad number %q", s)
	}
	return v
}

func (f *file) num(key string) float64 {
	v, ok := f.header[key]
	if !ok {
		return 0
	}
	return num(strings.Fields(v)[0])
}

func lit(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// varName turns "r245fa__akasaka-2015" into "eosR245faAkasaka2015".
func varName(id string) string {
	var b strings.Builder
	b.WriteString("eos")
	up := true
	for _, r := range id {
		if r == '-' || r == '_' {
			up = true
			continue
		}
		if up && 'a' <= r && r <= 'z' {
			r -= 'a' - 'A'
		}
		up = false
		b.WriteRune(r)
	}
	return b.String()
}

// emit writes one Fluid literal.
func emit(f *file) (string, error) {
	m, ok := extra[f.id]
	if !ok {
		return "", fmt.Errorf("no entry in gen's extra table")
	}
	mg := f.header["M_g_mol"]
	R := f.num("R_J_molK")
	tRed := f.num("T_red_K")
	rhoRed := lit(f.num("rho_red_kg_m3"))
	if v := f.num("rho_red_mol_dm3"); v != 0 {
		rhoRed = fmt.Sprintf("%s * %s", lit(v), mg) // mol/dm3 times g/mol
	}
	tMin := f.num("T_min_K")
	if tMin == 0 {
		tMin = f.num("T_triple_K")
	}
	terms, err := residual(f)
	if err != nil {
		return "", err
	}
	logTau, pow, rest, gotConst := idealPart(f, R, tRed)
	if gotConst && m.a1 != 0 { // gen's constants replace the file's
		if len(pow) < 2 || !strings.HasSuffix(pow[0], ", 0}") || !strings.HasSuffix(pow[1], ", 1}") {
			return "", fmt.Errorf("integration constants are not the first two ideal rows")
		}
		pow = pow[2:]
		gotConst = false
	}
	if !gotConst {
		if m.a1 == 0 && m.a2 == 0 {
			return "", fmt.Errorf("no integration constants in file or gen table")
		}
		pow = append([]string{fmt.Sprintf("{%s, 0}", lit(m.a1)), fmt.Sprintf("{%s, 1}", lit(m.a2))}, pow...)
	}
	ideal := fmt.Sprintf("\t\tlogTau: %s,\n\t\tpow: []powTerm{%s},\n%s", lit(logTau), strings.Join(pow, ", "), rest)
	ref, ok := refText[m.ref]
	if !ok {
		return "", fmt.Errorf("unknown reference state %q", m.ref)
	}
	if !gotConst {
		ref += " (integration constants derived for this convention, not taken from the paper)"
	}
	var b strings.Builder
	fmt.Fprintf(&b, "// %s: %s\n// %s\nvar %s = Fluid{\n", varName(f.id), f.header["fluid"], f.header["paper"], varName(f.id))
	fmt.Fprintf(&b, "\tName: %q,\n\tAliases: %#v,\n\tKey: %q,\n\tIsDefault: %v,\n", m.name, nilIfEmpty(m.aliases), strings.SplitN(f.id, "__", 2)[1], m.isDefault)
	fmt.Fprintf(&b, "\tEquation: %q,\n\tCitation: %q,\n\tReference: %q,\n\tStatus: %q,\n", m.equation, f.header["paper"], ref, f.header["status"])
	fmt.Fprintf(&b, "\tM: %se-3,\n\tRmolar: %s,\n\tR: %s / %se-3,\n", mg, lit(R), lit(R), mg)
	fmt.Fprintf(&b, "\tTred: %s,\n\tRhoRed: %s,\n", lit(tRed), rhoRed)
	fmt.Fprintf(&b, "\tTtriple: %s,\n\tTmin: %s,\n\tTmax: %s,\n\tPmax: %s,\n", lit(f.num("T_triple_K")), lit(tMin), lit(f.num("T_max_K")), lit(float64(f.num("p_max_MPa")*1e6)))
	fmt.Fprintf(&b, "\teos: equation{\n\t\ttRed: %s,\n\t\trhoRed: %s,\n%s%s\t},\n}\n\n", lit(tRed), rhoRed, terms, ideal)
	return b.String(), nil
}

func nilIfEmpty(s []string) []string {
	if len(s) == 0 {
		return nil
	}
	return s
}

// residual writes the residual terms, sorted pol, exp, gauss, with counts.
func residual(f *file) (string, error) {
	var pol, exp, gau []string
	for _, r := range f.rows {
		if r["part"] != "residual" {
			continue
		}
		d, l := num(r["d"]), num(r["l"])
		if d != math.Trunc(d) || l != math.Trunc(l) || d < 1 || d > maxPow || l > maxPow {
			return "", fmt.Errorf("term %s: d = %v, l = %v must be whole numbers in [1, %d]", r["i"], d, l, maxPow)
		}
		t := fmt.Sprintf("{n: %s, t: %s, d: %d", lit(num(r["n"])), lit(num(r["t"])), int(d))
		switch r["kind"] {
		case "pol":
			pol = append(pol, t+"}")
		case "exp":
			exp = append(exp, t+fmt.Sprintf(", l: %d}", int(l)))
		case "gauss":
			gau = append(gau, t+fmt.Sprintf(", eta: %s, beta: %s, gamma: %s, eps: %s}",
				lit(num(r["eta"])), lit(num(r["beta"])), lit(num(r["gamma"])), lit(num(r["epsilon"]))))
		default:
			return "", fmt.Errorf("unknown residual kind %q", r["kind"])
		}
	}
	all := append(append(append([]string{}, pol...), exp...), gau...)
	if len(all) > maxTerms {
		return "", fmt.Errorf("%d terms; the kernel holds %d", len(all), maxTerms)
	}
	return fmt.Sprintf("\t\tnPol: %d,\n\t\tnExp: %d,\n\t\tterms: []term{\n\t\t\t%s,\n\t\t},\n", len(pol), len(exp), strings.Join(all, ",\n\t\t\t")), nil
}

const (
	maxPow   = 10 // must match the kernel's power table
	maxTerms = 24 // must match the kernel's term arrays
)

// idealPart reduces the ideal-gas rows to the kernel's forms: a ln(tau)
// coefficient, power terms n tau^t (integration constants and the
// integrated cp0 polynomial), and Planck-Einstein, sinh and cosh terms with
// their temperatures reduced by T_red. It reports whether the file gave the
// integration constants.
func idealPart(f *file, R, tRed float64) (logTau float64, pow []string, rest string, gotConst bool) {
	hasCp0 := false
	var pe, sh, ch []string
	for _, r := range f.rows {
		if r["part"] != "ideal" {
			continue
		}
		n, t := num(r["n"]), num(r["t"])
		switch r["kind"] {
		case "cp0_const":
			logTau += n
			hasCp0 = true
		case "cp0_poly_molar":
			hasCp0 = true
			if t == 0 {
				logTau += n / R
				continue
			}
			// cp0 += n T^k integrates to alpha0 += -(n/R) Tred^k tau^-k / (k (k+1)).
			pow = append(pow, fmt.Sprintf("{%s, %s}", lit(-n/R*fpmath.Pow(tRed, t)/(t*(t+1))), lit(-t)))
		case "cp0_pe":
			hasCp0 = true
			pe = append(pe, fmt.Sprintf("{%s, %s / %s}", lit(n), lit(t), lit(tRed)))
		case "cp0_sinh":
			hasCp0 = true
			sh = append(sh, fmt.Sprintf("{%s, %s / %s}", lit(n), lit(t), lit(tRed)))
		case "cp0_cosh":
			hasCp0 = true
			ch = append(ch, fmt.Sprintf("{%s, %s / %s}", lit(n), lit(t), lit(tRed)))
		case "a0_pow":
			if t == 0 || t == 1 {
				gotConst = true
			}
			pow = append(pow, fmt.Sprintf("{%s, %s}", lit(n), lit(t)))
		case "a0_logtau":
			logTau += n
		default:
			log.Fatalf("gen: %s: unknown ideal kind %q", f.id, r["kind"])
		}
	}
	if hasCp0 {
		logTau-- // cp0/R = c0 gives alpha0 += (c0 - 1) ln tau
	}
	var b strings.Builder
	list := func(name string, xs []string) {
		if len(xs) > 0 {
			fmt.Fprintf(&b, "\t\t%s: []idealTerm{%s},\n", name, strings.Join(xs, ", "))
		}
	}
	list("pe", pe)
	list("sinh", sh)
	list("cosh", ch)
	return logTau, pow, b.String(), gotConst
}
