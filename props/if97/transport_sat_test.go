package if97

import (
	"bufio"
	"fmt"
	"math"
	"os"
	"os/exec"
	"strconv"
	"strings"
	"testing"
)

// satTransportStates returns n saturated liquid (x = 0) or vapour (x = 1) states at
// temperatures spread evenly over 273.16 K to 647.09 K, the end points included.
func satTransportStates(t *testing.T, n int, x float64) []Props {
	t.Helper()
	out := make([]Props, n)
	for i := range out {
		T := 273.16 + float64(i)*(647.09-273.16)/float64(n-1)
		st, err := StateTX(T, x)
		if err != nil {
			t.Fatalf("StateTX(%g, %g): %v", T, x, err)
		}
		out[i] = st
	}
	return out
}

// TestSaturatedConductivityDefined: the conductivity and viscosity of saturated liquid and
// vapour exist and are finite and positive at 2,000 states of each over 273.16 K to 647.09 K.
// Regression: Conductivity(rho, T) found the state again from (T, 1/rho), and rounding put a
// quarter of the saturated densities (almost all above 623.15 K) inside the two-phase region,
// so water(1 MPa, 1).k had no value. ConductivityOf takes the state as it is.
func TestSaturatedConductivityDefined(t *testing.T) {
	for _, x := range []float64{0, 1} {
		for _, st := range satTransportStates(t, 2000, x) {
			k, err := ConductivityOf(&st)
			if err != nil || !(k > 0) || math.IsInf(k, 0) {
				t.Fatalf("x = %g, T = %.17g K, rho = %.17g: k = %g, %v", x, st.T, st.Rho, k, err)
			}
			mu, err := ViscosityOf(&st)
			if err != nil || !(mu > 0) || math.IsInf(mu, 0) {
				t.Fatalf("x = %g, T = %.17g K: mu = %g, %v", x, st.T, mu, err)
			}
		}
	}
}

// TestConductivityOfSinglePhase: for single-phase states ConductivityOf gives what
// Conductivity gives at the state's (rho, T) (which solves for the state again), to rounding,
// and refuses a two-phase mixture and a temperature above the range of R15-11.
func TestConductivityOfSinglePhase(t *testing.T) {
	for _, c := range [][2]float64{{1e5, 300}, {10e6, 773.15}, {25e6, 650}, {30e6, 700}, {1e6, 1100}, {50e6, 400}} {
		st, err := StatePT(c[0], c[1])
		if err != nil {
			t.Fatal(err)
		}
		want, err := Conductivity(st.Rho, st.T)
		if err != nil {
			t.Fatal(err)
		}
		got, err := ConductivityOf(&st)
		if err != nil || math.Abs(got/want-1) > 1e-12 {
			t.Errorf("p = %g, T = %g: ConductivityOf = %.17g, %v; Conductivity = %.17g", c[0], c[1], got, err, want)
		}
	}
	wet, _ := StatePX(1e6, 0.5)
	if _, err := ConductivityOf(&wet); err == nil {
		t.Error("a two-phase mixture has a conductivity")
	}
	if _, err := ViscosityOf(&wet); err == nil {
		t.Error("a two-phase mixture has a viscosity")
	}
	hot, _ := StatePT(1e6, 1500)
	var re *RangeError
	if _, err := ConductivityOf(&hot); err == nil || !asRange(err, &re) || re.Input != "T" {
		t.Errorf("1500 K: %v, want a RangeError on T", err)
	}
}

func asRange(err error, re **RangeError) bool {
	r, ok := err.(*RangeError)
	*re = r
	return ok
}

// TestSaturatedConductivityPythonIAPWS compares ConductivityOf at the 4,000 saturated states of
// TestSaturatedConductivityDefined with Debian's python3-iapws (version 1.5.2 when written):
// _ThCond, IAPWS R15-11 in its industrial form, fed with python3-iapws's own IF97 cp, cv and
// (∂ρ/∂p)_T at the same (ρ, T) (region 3) or (p, T) (regions 1 and 2) and its own viscosity.
// It runs testdata/r15_crosscheck.py with /usr/bin/python3; without the module the test is
// skipped, unless CI is set, where it fails.
//
// Tolerance: 1e-9 relative. Both sides evaluate the same equations; near the critical point
// the enhancement λ2 amplifies rounding in (∂ρ/∂p)_T by up to cp/cv (2e4 at 647.09 K), which
// the tolerance covers.
func TestSaturatedConductivityPythonIAPWS(t *testing.T) {
	const py = "/usr/bin/python3"
	if err := exec.Command(py, "-c", "import iapws").Run(); err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("CI is set but %s cannot import iapws (apt-get install python3-iapws): %v", py, err)
		}
		t.Skipf("%s cannot import iapws: %v", py, err)
	}
	var pts []Props
	var in strings.Builder
	for _, x := range []float64{0, 1} {
		for _, st := range satTransportStates(t, 2000, x) {
			region := 3
			if st.T <= T13 {
				region = 1 + int(x)
			}
			fmt.Fprintf(&in, "%.17g %.17g %.17g %d\n", st.T, st.Rho, st.P, region)
			pts = append(pts, st)
		}
	}
	cmd := exec.Command(py, "testdata/r15_crosscheck.py")
	cmd.Stdin = strings.NewReader(in.String())
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("python3-iapws: %v", err)
	}
	sc := bufio.NewScanner(strings.NewReader(string(out)))
	n, worst := 0, 0.0
	for ; sc.Scan(); n++ {
		st := pts[n]
		want, err := strconv.ParseFloat(sc.Text(), 64)
		if err != nil || math.IsNaN(want) {
			t.Fatalf("python3-iapws gave %q at T = %.17g, x = %g", sc.Text(), st.T, st.X)
		}
		got, err := ConductivityOf(&st)
		if err != nil {
			t.Fatal(err)
		}
		r := math.Abs(got/want - 1)
		worst = math.Max(worst, r)
		if r > 1e-9 {
			t.Errorf("T = %.17g K, x = %g: k = %.17g, python3-iapws %.17g (rel %.2g)", st.T, st.X, got, want, r)
		}
	}
	if n != len(pts) {
		t.Fatalf("python3-iapws answered %d of %d states", n, len(pts))
	}
	t.Logf("%d saturated states; largest relative difference %.2g", n, worst)
}
