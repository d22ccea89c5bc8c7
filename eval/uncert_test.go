package eval

import (
	"math"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/units"
)

func TestParseUncertainty(t *testing.T) {
	ctx := units.StandardAtmosphere
	cases := []struct {
		line string
		kind UncKind
		u    float64 // SI
		how  string
	}{
		{"p_1 = 12.5 MPa ± 0.05 MPa // main steam | cert 1", UncStandard, 0.05e6, "standard"},
		{"p_1 = 12.5 MPa +/- 50 kPa", UncStandard, 0.05e6, "standard"},
		{"p_1 = 12.5 MPa ± 0.1 MPa (k=2)", UncExpanded, 0.05e6, "expanded, k = 2"},
		{"p_1 = 12.5 MPa ± 0.1 MPa ( k = 2.5 )", UncExpanded, 0.04e6, "expanded, k = 2.5"},
		{"T_1 = 540 degC ± 0.5 K rect", UncRect, 0.5 / math.Sqrt(3), "rectangular, half-width"},
		{"T_1 = 540 degC ± 0.9 Fdeg", UncStandard, 0.5, "standard"},
		{"eta = 0.85 ± 0.01", UncStandard, 0.01, "standard"},
		{"eta = 0.85 ± 0.01 rect", UncRect, 0.01 / math.Sqrt(3), "rectangular, half-width"},
		{"p_1 [bar] = 12.5 MPa ± 0.05 MPa", UncStandard, 0.05e6, "standard"},
	}
	for _, c := range cases {
		s, errs := ParseLine(c.line, 0, 1, ctx)
		if len(errs) > 0 {
			t.Errorf("%q: %s", c.line, errs[0].Msg)
			continue
		}
		u := s.Uncertainty()
		if u == nil || u.Kind != c.kind || math.Abs(u.U-c.u) > 1e-12*c.u || u.How() != c.how {
			t.Errorf("%q: got %+v", c.line, u)
		}
		if strings.Contains(s.Expr, "±") || strings.Contains(s.Expr, "+/-") || strings.HasSuffix(s.Expr, " ") {
			t.Errorf("%q: expression %q keeps the uncertainty", c.line, s.Expr)
		}
		if s.LoneLiteral() == nil && !s.IsPlainNumber() {
			t.Errorf("%q: no longer an input", c.line)
		}
	}
	// +- keeps its meaning: plus minus one.
	s, errs := ParseLine("p = 5 MPa +- 1 MPa", 0, 1, ctx)
	if len(errs) > 0 || s.Uncertainty() != nil {
		t.Errorf("+- was read as an uncertainty: %v", errs)
	}
}

// Errors point at the byte that is wrong.
func TestUncertaintyErrorOffsets(t *testing.T) {
	ctx := units.StandardAtmosphere
	cases := []struct {
		line, at, msg string // at: the text the error points to
	}{
		{"p_1 = 12.5 MPa ± 0 MPa", "0 MPa", "above zero"},
		{"p_1 = 12.5 MPa ± 0.1 K", "0.1 K", "the uncertainty is temperature, but p_1 is pressure: write it in MPa"},
		{"T_1 = 540 degC ± 1 degC", "1 degC", "a difference"},
		{"p_1 = 12.5 barg ± 0.1 barg", "0.1 barg", "absolute unit"},
		{"p_1 = 12.5 MPa ± 0.1 MPa (k=-2)", "(k=-2)", "k must be above zero"},
		{"p_1 = 12.5 MPa ± 0.1 MPa normal", "normal", "(k=2) (expanded) or rect"},
		{"p_1 = 12.5 MPa ±", "±", "expected an uncertainty"},
		{"q = 2 * p ± 1 MPa", "2 * p", "only an input takes an uncertainty"},
		{"check p > 1 MPa ± 1 MPa", "± 1", "belongs on an input line"},
		{"corr(a, b) = 1.5", "1.5", "from -1 to 1"},
		{"corr(a, a) = 0.5", "a) =", "with itself"},
		{"corr(a b) = 0.5", "b) =", "corr(NAME, NAME) = R"},
	}
	for _, c := range cases {
		_, errs := ParseLine(c.line, 100, 1, ctx)
		if len(errs) == 0 {
			t.Errorf("%q: no error", c.line)
			continue
		}
		e := errs[0]
		if !strings.Contains(e.Msg, c.msg) {
			t.Errorf("%q: %q, want %q", c.line, e.Msg, c.msg)
		}
		if want := 100 + strings.Index(c.line, c.at); e.Off != want {
			t.Errorf("%q: error at %d (%q), want %d (%q)", c.line, e.Off-100, c.line[e.Off-100:], want-100, c.at)
		}
	}
}
