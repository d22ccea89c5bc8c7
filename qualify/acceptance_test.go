package qualify

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// pumpCalc is a small acceptance calc of a fictional firm: the feed pump
// work and the saturation temperature at 75 kPa.
const pumpCalc = "---\ntitle: Feed pump work (fictional acceptance case)\n---\n" +
	"```calc\n" +
	"p_1 = 75 kPa             // condenser pressure\n" +
	"p_2 = 3 MPa              // boiler pressure\n" +
	"st_1 = water(p_1, 0)     // saturated liquid\n" +
	"w_p [kJ/kg] = st_1.v * (p_2 - p_1) // isentropic pump work\n" +
	"T_1 [degC] = st_1.T      // saturation temperature\n" +
	"check w_p > 0 kJ/kg\n" +
	"```\n"

func writeCase(t *testing.T, dir, name, calc, expect string) {
	t.Helper()
	if calc != "" {
		if err := os.WriteFile(filepath.Join(dir, name+".calc.md"), []byte(calc), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	if expect != "" {
		if err := os.WriteFile(filepath.Join(dir, name+ExpectSuffix), []byte(expect), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// TestWithCases: one case that holds and one that does not; both are
// reported beside the built-in checks, the failure first.
func TestWithCases(t *testing.T) {
	dir := t.TempDir()
	// Steam-table values (IAPWS-IF97 to the figures shown): Tsat(75 kPa) = 91.76 °C,
	// v' = 0.001037 m³/kg, so w_p = 0.001037 × 2925 kPa = 3.03 kJ/kg (Çengel & Boles
	// 7th ed., Example 10-1, from memory, as in calcdoc's textbook test).
	writeCase(t, dir, "pump-ok", pumpCalc, `# fictional firm, acceptance case AT-1
- name: w_p
  expect: 3.03 kJ/kg
  tolerance: 0.01 kJ/kg
  source: Cengel & Boles 7th ed., Example 10-1 (from memory)
- name: T_1
  expect: 91.76 degC
  tolerance: 0.01 K
  source: IAPWS-IF97 saturation temperature at 75 kPa, to four figures
`)
	writeCase(t, dir, "pump-wrong", pumpCalc, `- name: w_p
  expect: 3.5 kJ/kg
  relative: 0.001
  source: a deliberately wrong value, so the case fails
`)
	r := run(t, Options{With: dir})
	var firm []Check
	for _, c := range r.Checks {
		if c.Group == GroupFirm {
			firm = append(firm, c)
		}
	}
	if len(firm) != 5 { // two calcs × one check line, and three expectations
		t.Fatalf("%d acceptance checks, want 5: %+v", len(firm), firm)
	}
	if r.Passed() || r.Summary.Failed != 1 {
		t.Fatalf("%d failures, want 1", r.Summary.Failed)
	}
	first := r.Checks[0]
	if first.Verdict != Fail || first.ID != "pump-wrong.calc.md:w_p" || first.Computed == nil || *first.Computed < 3 || *first.Computed > 3.06 {
		t.Errorf("first check %+v, want the failed pump-wrong w_p near 3.03", first)
	}
	for _, c := range firm[1:] {
		if c.Verdict != Pass {
			t.Errorf("%s: %s, want PASS (%s)", c.ID, c.Verdict, c.Note)
		}
	}
}

// TestWithErrors: cases that do not parse are errors at their lines, not
// skips.
func TestWithErrors(t *testing.T) {
	cases := []struct {
		name, calc, expect, want string
	}{
		{"unknown-key", pumpCalc, "- name: w_p\n  expect: 3.03 kJ/kg\n  tol: 0.01 kJ/kg\n  source: x\n", `unknown-key.expect.yaml:3:3: unknown key "tol"`},
		{"no-tolerance", pumpCalc, "- name: w_p\n  expect: 3.03 kJ/kg\n  source: x\n", "no-tolerance.expect.yaml:1:3: give exactly one of tolerance"},
		{"bad-unit", pumpCalc, "- name: w_p\n  expect: 3.03 kJ/kgg\n  relative: 0.01\n  source: x\n", "bad-unit.expect.yaml:2:11: unit"},
		{"wrong-kind", pumpCalc, "- name: w_p\n  expect: 3.03 kPa\n  relative: 0.01\n  source: x\n", "wrong-kind.expect.yaml:1:3: w_p is"},
		{"no-name", pumpCalc, "- name: w_q\n  expect: 3.03 kJ/kg\n  relative: 0.01\n  source: x\n", "no-name.expect.yaml:1:3: no-name.calc.md has no quantity w_q"},
		{"tol-kind", pumpCalc, "- name: w_p\n  expect: 3.03 kJ/kg\n  tolerance: 0.01 kPa\n  source: x\n", "tol-kind.expect.yaml:3:14: tolerance must be"},
		{"not-a-list", pumpCalc, "name: w_p\n", "not-a-list.expect.yaml:1:1: expected a list of cases"},
		{"bad-yaml", pumpCalc, "- name: [w_p\n", "bad-yaml.expect.yaml: yaml"},
		{"no-expect", pumpCalc, "", "no-expect.calc.md: no expected results"},
		{"no-calc", "", "- name: w_p\n", "no-calc.expect.yaml: no calc no-calc.calc.md"},
		{"calc-error", "```calc\nx = 1 +\n```\n", "- name: x\n  expect: 1\n  relative: 0.1\n  source: x\n", "calc-error.calc.md:2:"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := t.TempDir()
			writeCase(t, dir, c.name, c.calc, c.expect)
			if c.calc == "" {
				writeCase(t, dir, "other", pumpCalc, "- name: w_p\n  expect: 3.03 kJ/kg\n  relative: 0.01\n  source: x\n")
			}
			_, err := Run(Options{With: dir, Ident: fixedIdent})
			if err == nil {
				t.Fatal("no error")
			}
			msg := strings.ReplaceAll(err.Error(), dir+string(filepath.Separator), "")
			if !strings.Contains(msg, c.want) {
				t.Errorf("error %q, want %q", msg, c.want)
			}
		})
	}
	if _, err := Run(Options{With: t.TempDir(), Ident: fixedIdent}); err == nil || !strings.Contains(err.Error(), "no acceptance cases") {
		t.Errorf("an empty folder gave %v", err)
	}
}
