package calcdoc

import "testing"

// TestDiffReportTypesets: the diff report's value table shows names and
// units as the package body does.
func TestDiffReportTypesets(t *testing.T) {
	for in, want := range map[string]string{
		"540 degC":    "540\u2009°C",
		"+1.5 MPa":    "+1.5\u2009MPa",
		"-3 Cdeg":     "−3\u2009Δ°C",
		"2.1 kJ/kg/K": "2.1\u2009kJ/(kg·K)",
		"0.88":        "0.88",
		"PASS":        "PASS",
		"<b> kg":      "&lt;b&gt; kg",
		"12 furlongs": "12 furlongs",
	} {
		if got := string(TypesetValue(in)); got != want {
			t.Errorf("TypesetValue(%q) = %q, want %q", in, got, want)
		}
	}
	if got, want := string(TypesetName("eta_th")), "<i>η</i><sub>th</sub>"; got != want {
		t.Errorf("TypesetName(eta_th) = %q, want %q", got, want)
	}
}
