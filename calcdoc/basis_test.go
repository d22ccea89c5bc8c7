package calcdoc

import (
	"path/filepath"
	"strings"
	"testing"
)

// firstError evaluates src and returns its first error as line:col: msg.
func firstError(t *testing.T, src string) string {
	t.Helper()
	d := Read("t.calc.md", []byte(src))
	d.Evaluate()
	if len(d.Errors) == 0 {
		return ""
	}
	e := d.Errors[0]
	return sprintf("%d:%d: %s", e.Pos.Line, e.Pos.Col, e.Msg)
}

// TestBasisErrors: every bad source, reference and assumption is an error
// at its line and column.
func TestBasisErrors(t *testing.T) {
	cases := []struct{ name, src, want string }{
		{"source on a check", "```calc\na = 1 m\ncheck a > 0 m // positive | HB-001\n```\n",
			"3:27: a check has no source: a source (| HB-001) belongs on an input line"},
		{"source on a result", "```calc\na = 1 m\nb = 2*a // twice | HB-001 rev C\n```\n",
			"3:18: b is computed from a, so its formula is its provenance; put the source (| HB-001 rev C) on the input lines it reads"},
		{"source on a state", "```calc\nst = water(1 bar, 400 K) // state | DS-7\n```\n",
			"2:35: st is a state, not an input; put the source (| DS-7) on input lines and make the state from them"},
		{"empty source", "```calc\na = 1 m // length |  \n```\n",
			"2:19: expected a source after |, such as | HB-001 rev C (the document the input comes from)"},
		{"reference without id", "---\nreferences:\n  - {title: Heat balance, revision: C}\n---\n",
			"3:5: a reference needs an id, such as id: HB-001"},
		{"reference without revision", "---\nreferences:\n  - id: HB-001\n    title: Heat balance\n---\n",
			"3:5: reference HB-001 needs a revision or an edition"},
		{"reference twice", "---\nreferences:\n  - {id: A, title: x, revision: 1}\n  - {id: A, title: y, revision: 2}\n---\n",
			"4:5: reference \"A\" is listed twice; give each document one entry"},
		{"reference unknown key", "---\nreferences:\n  - {id: A, title: x, rev: 1}\n---\n",
			"3:23: unknown key \"rev\" in a reference; the keys are id, title, revision, edition, date"},
		{"references not a list", "---\nreferences: HB-001\n---\n",
			"2:13: references must be a list of documents, each with id, title and revision (or edition), such as - {id: HB-001, title: Heat balance diagram, revision: C}"},
		{"assumption twice", "```assumptions\nA1 open: steady state\nA1 confirmed: no leaks | DS-3\n```\n",
			"3:1: assumption A1 is already defined on line 2; give each assumption its own id"},
		{"assumption bad status", "```assumptions\nA1 open: steady state\nA2 pending: no leaks\n```\n",
			"3:4: assumption A2 has status \"pending\"; the status is open or confirmed"},
		{"assumption without colon", "```assumptions\nA1 open steady state\n```\n",
			"2:4: missing : after the status of A1; write ID open: text, or ID confirmed: text | SOURCE"},
		{"assumption no id", "```assumptions\n  : steady\n```\n",
			"2:3: expected an assumption id (letters, digits, - _ .) then its status; write ID open: text, or ID confirmed: text | SOURCE"},
		{"confirmed without source", "```assumptions\nA1 confirmed: steady state\n```\n",
			"2:4: confirmed assumption A1 needs the document that confirms it: end the line with | SOURCE"},
		{"assumptions not closed", "# A\n\n```assumptions\nA1 open: steady state\n\nProse after it.\n",
			"3:1: calc block is not closed: add a closing fence line"},
		{"assumption without text", "```assumptions\nA1 open:\n```\n",
			"2:4: assumption A1 has no text; write ID open: text, or ID confirmed: text | SOURCE"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := firstError(t, c.src); got != c.want {
				t.Errorf("got  %s\nwant %s", got, c.want)
			}
		})
	}
}

const basisCalc = `---
title: Sourced inputs (fictional)
references:
  - {id: HB-001, title: Heat balance diagram of the fictional Unit 1, revision: C, date: 2026-03-02}
  - {id: DS-17, title: Feed pump datasheet (fictional vendor), edition: 2nd}
---
` + "```calc\n" + `p_1 = 12.5 MPa // main steam pressure | HB-001 rev C, sheet 2
T_1 = 540 degC // main steam temperature | unit log 2026-02 (fictional)
eta_p = 0.82 // pump efficiency
W = p_1 * 1 m^3 / eta_p
` + "```\n\n```assumptions\nA1 confirmed: condenser pressure from the heat balance | HB-001 rev C\nA2 open: pump efficiency until the vendor confirms it\n```\n"

// TestBasisRendered: the Source column, the reference link, the list of
// inputs without a source, and the Assumptions and References sections.
func TestBasisRendered(t *testing.T) {
	d := Read("t.calc.md", []byte(basisCalc))
	d.Evaluate()
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format("t", d.Src))
	}
	if open := d.OpenAssumptions(); len(open) != 1 || open[0].ID != "A2" || open[0].Line != 16 {
		t.Fatalf("open assumptions %+v", open)
	}
	pkg, err := d.Render(RenderOptions{Engine: "test"})
	if err != nil {
		t.Fatal(err)
	}
	out := string(pkg.HTML)
	for _, want := range []string{
		`<th>Source</th>`,
		`<td><a href="#ref-HB-001">HB-001</a> rev C, sheet 2</td>`,
		`<td>unit log 2026-02 (fictional)</td>`,
		`<strong>For the checker:</strong> inputs without a source (1 of 3): <a href="#L10"><i>η</i><sub>p</sub></a>.`,
		`<tr id="ref-HB-001"><td>HB-001</td><td>Heat balance diagram of the fictional Unit 1</td><td>C</td><td class="num">2026-03-02</td></tr>`,
		`<td>DS-17</td><td>Feed pump datasheet (fictional vendor)</td><td>2nd</td>`,
		`1 open assumption: not for construction. The package cannot be approved, and once signed reads PRELIMINARY, until it is confirmed.`,
		`<tr><td><a href="#A-A2">A2</a></td><td>pump efficiency until the vendor confirms it</td><td class="num"><a href="#L16">16</a></td></tr>`,
		`<h1>Assumptions</h1>`,
		`<span class="verdict pass">CONFIRMED</span></td><td>condenser pressure from the heat balance</td><td><a href="#ref-HB-001">HB-001</a> rev C</td>`,
		`<tr id="A-A2"><td>A2</td><td><span class="verdict open">OPEN</span>`,
	} {
		if !strings.Contains(out, want) {
			t.Errorf("package lacks %s", want)
		}
	}
	if strings.Contains(out, "```assumptions") || strings.Contains(out, "A2 open:") {
		t.Error("the assumptions fence is printed raw")
	}
}

// TestSourceNeedsWholeID: a source links only when it starts with a whole
// reference id, the longest that fits.
func TestSourceNeedsWholeID(t *testing.T) {
	d := &Doc{Front: Front{References: []Reference{{ID: "HB-1"}, {ID: "HB-10"}}}}
	for src, want := range map[string]string{
		"HB-10 rev A": `<a href="#ref-HB-10">HB-10</a> rev A`,
		"HB-1, p. 4":  `<a href="#ref-HB-1">HB-1</a>, p. 4`,
		"HB-100":      `HB-100`,
		"see <HB-1>":  `see &lt;HB-1&gt;`,
	} {
		if got := d.sourceHTML(src); got != want {
			t.Errorf("%q: got %s, want %s", src, got, want)
		}
	}
}

// TestYAMLValuesAsWritten: the values a calc reads from a YAML file are
// inputs, shown in the file's own units and digits with file and line; a
// line that is one such value shows it in the file's unit, not in SI.
func TestYAMLValuesAsWritten(t *testing.T) {
	dir := writeTree(t, map[string]string{
		"data/line.yaml": "# pipe data (fictional)\nm_out: 14 t/h\neps: 0.045 mm\nDN: 150\nunused: 3 bar\nvendor: \"Northwind (fictional)\"\n",
		"c.calc.md":      "```calc\npipe = yaml(\"data/line.yaml\") // line list\nm_out = pipe.m_out\nrough = 2 * pipe.eps\nv = pipe.vendor\nD = pipe.DN\n```\n",
	})
	d, err := ReadFile(filepath.Join(dir, "c.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format("c", d.Src))
	}
	pkg, err := d.Render(RenderOptions{Engine: "test"})
	if err != nil {
		t.Fatal(err)
	}
	out := string(pkg.HTML)
	_, inputs, _ := strings.Cut(out, "<h1>Inputs</h1>")
	inputs, _, _ = strings.Cut(inputs, "</section>")
	for _, want := range []string{
		`<td class="num">14 t/h</td><td>line list</td><td>data/line.yaml line 2</td>`,
		`<td class="num">0.045 mm</td><td>line list</td><td>data/line.yaml line 3</td>`,
		`<td class="num">150</td><td>line list</td><td>data/line.yaml line 4</td>`,
		`<td class="num">“Northwind (fictional)”</td><td>line list</td><td>data/line.yaml line 6</td>`,
	} {
		if !strings.Contains(inputs, want) {
			t.Errorf("Inputs table lacks %s", want)
		}
	}
	if strings.Contains(inputs, "3 bar") {
		t.Error("a value the calc did not read is listed as an input")
	}
	if strings.Contains(inputs, "3.889") || strings.Contains(out, "3.889") {
		t.Error("the mass flow is shown converted to SI")
	}
	if !strings.Contains(out, "<i>m</i><sub>out</sub>&#8239;=&#8239;14 t/h, <i>eps</i>&#8239;=&#8239;0.045 mm") {
		t.Error("the yaml() line does not list the file's values as written")
	}
	if it := d.itemOf("m_out"); it == nil || it.Outcome.Display.String() != "t/h" {
		t.Errorf("m_out = pipe.m_out is not shown in the file's unit: %+v", it.Outcome.Display)
	}
}

// TestCSVAppendixAndInterpRows: a CSV table is printed in the appendix as
// written, every row with its line, and an interp line shows the two rows
// it used and the fraction.
func TestCSVAppendixAndInterpRows(t *testing.T) {
	dir := writeTree(t, map[string]string{
		"data/cw.csv": "# river curve (fictional)\nT_cw [degC],p [kPa]\n10,1.2280\n15.0,1.7050\n20,2.3390\n25,3.1690\n",
		"c.calc.md":   "```calc\ncw = csv(\"data/cw.csv\")\np_c = interp(cw, \"T_cw\", 21.5 degC, \"p\")\n```\n",
	})
	d, err := ReadFile(filepath.Join(dir, "c.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format("c", d.Src))
	}
	ip := d.itemOf("p_c").Outcome.Interps
	if len(ip) != 1 || ip[0].Rows != [2]int{2, 3} || ip[0].Fraction != 0.3 {
		t.Fatalf("interpolation %+v", ip[0])
	}
	pkg, err := d.Render(RenderOptions{Engine: "test"})
	if err != nil {
		t.Fatal(err)
	}
	out := string(pkg.HTML)
	for _, want := range []string{
		`between the rows at lines 5 and 6, fraction 0.3 of the way:`,
		`<tr><td class="num">5</td><td class="num">20</td><td class="num">2.3390</td></tr><tr><td class="num">6</td><td class="num">25</td><td class="num">3.1690</td></tr>`,
		`<h2 id="data-data-cw.csv">data/cw.csv</h2>`,
		`<th>line</th><th>T_cw [degC]</th><th>p [kPa]</th>`,
		`<tr><td class="num ln">3</td><td class="num">10</td><td class="num">1.2280</td></tr>`,
		`<tr><td class="num ln">4</td><td class="num">15.0</td><td class="num">1.7050</td></tr>`,
		`data/cw.csv: 4 rows of T_cw, p, printed as written in <a href="#data-data-cw.csv">Appendix: data tables</a>`,
	} {
		if !strings.Contains(out, want) {
			t.Errorf("package lacks %s", want)
		}
	}
}
