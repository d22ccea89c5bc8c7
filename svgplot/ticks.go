package svgplot

import (
	"math"
	"strconv"
	"strings"

	"github.com/vouchcalc/vouch/internal/fpmath"
)

// maxTickCount bounds the maxTicks argument of NiceTicks, so that tick
// indices stay exact integers.
const maxTickCount = 1000

// maxRelSpan is the largest ratio of an end's magnitude to the span for
// which ticks are made; beyond it float64 cannot tell the ticks apart.
const maxRelSpan = 1e12

// NiceTicks returns the multiples of a "nice" step that lie in [lo, hi],
// ascending. The step is the smallest of the form 1, 2 or 5 × 10^k that
// gives at most maxTicks ticks (maxTicks above 1000 counts as 1000); with
// maxTicks >= 2 there is at least one tick. Each tick is the float64
// nearest to its decimal value, so a step of 0.1 yields 0.3 rather than
// 0.30000000000000004, and zero is never -0. If lo equals hi the result is
// that one value. It returns nil for non-finite or inverted bounds, for
// maxTicks < 2, and for a span too small for float64 to tell ticks apart
// (an end more than 10^12 spans from zero).
func NiceTicks(lo, hi float64, maxTicks int) []float64 {
	if lo == hi && isFinite(lo) && maxTicks >= 2 {
		return []float64{lo}
	}
	s, ok := chooseStep(lo, hi, maxTicks)
	if !ok {
		return nil
	}
	return s.ticks(lo, hi)
}

// step is a tick step m × 10^exp with m one of 1, 2 or 5.
type step struct {
	m   int64
	exp int
}

// value returns the step as the float64 nearest to m × 10^exp.
func (s step) value() float64 { return decimal(s.m, s.exp) }

// next returns the next larger nice step.
func (s step) next() step {
	switch s.m {
	case 1:
		return step{2, s.exp}
	case 2:
		return step{5, s.exp}
	}
	return step{1, s.exp + 1}
}

// at returns the k-th multiple of the step.
func (s step) at(k float64) float64 { return decimal(int64(k)*s.m, s.exp) }

// ticks returns the multiples of the step in [lo, hi].
func (s step) ticks(lo, hi float64) []float64 {
	k0, k1 := s.inside(lo, hi)
	out := make([]float64, 0, int(k1-k0+1))
	for k := k0; k <= k1; k++ {
		out = append(out, s.at(k))
	}
	return out
}

// inside returns the first and last index k with k × step in [lo, hi].
func (s step) inside(lo, hi float64) (k0, k1 float64) {
	v := s.value()
	k0, k1 = math.Ceil(lo/v), math.Floor(hi/v)
	if s.at(k0-1) >= lo {
		k0--
	} else if s.at(k0) < lo {
		k0++
	}
	if s.at(k1+1) <= hi {
		k1++
	} else if s.at(k1) > hi {
		k1--
	}
	return k0, k1
}

// outside returns the index range of the smallest whole-step range holding [lo, hi].
func (s step) outside(lo, hi float64) (k0, k1 float64) {
	v := s.value()
	k0, k1 = math.Floor(lo/v), math.Ceil(hi/v)
	if s.at(k0) > lo {
		k0--
	}
	if s.at(k1) < hi {
		k1++
	}
	return k0, k1
}

// decimal returns the float64 nearest to n × 10^exp.
func decimal(n int64, exp int) float64 {
	v, _ := strconv.ParseFloat(strconv.FormatInt(n, 10)+"e"+strconv.Itoa(exp), 64)
	return v
}

// spanOK reports whether ticks can be made for [lo, hi].
func spanOK(lo, hi float64, maxTicks int) bool {
	span := hi - lo
	return isFinite(lo) && isFinite(hi) && lo < hi && maxTicks >= 2 &&
		isFinite(span) && max(math.Abs(lo), math.Abs(hi)) <= float64(maxRelSpan*span)
}

// firstStep returns a step no larger than any step that could fit.
func firstStep(lo, hi float64, maxTicks int) step {
	raw := (hi - lo) / float64(max(maxTicks, 2)-1)
	return step{1, int(math.Floor(fpmath.Log10(raw))) - 1}
}

// chooseStep returns the smallest nice step giving at most maxTicks ticks in [lo, hi].
func chooseStep(lo, hi float64, maxTicks int) (step, bool) {
	maxTicks = min(maxTicks, maxTickCount)
	if !spanOK(lo, hi, maxTicks) {
		return step{}, false
	}
	s := firstStep(lo, hi, maxTicks)
	for {
		k0, k1 := s.inside(lo, hi)
		if k1-k0+1 <= float64(maxTicks) {
			return s, true
		}
		s = s.next()
	}
}

// autoRange widens [lo, hi] to whole multiples of the smallest nice step
// for which the widened range holds at most maxTicks ticks (maxTicks >= 2).
func autoRange(lo, hi float64, maxTicks int) (nlo, nhi float64, s step, ok bool) {
	if lo == hi {
		d := math.Abs(lo) / 10
		if d == 0 {
			d = 1
		}
		lo, hi = lo-d, hi+d
	}
	if !spanOK(lo, hi, maxTicks) {
		return 0, 0, step{}, false
	}
	for s = firstStep(lo, hi, maxTicks); ; s = s.next() {
		k0, k1 := s.outside(lo, hi)
		if k1-k0+1 <= float64(maxTicks) {
			return s.at(k0), s.at(k1), s, true
		}
	}
}

// tickLabels formats ticks made with step s compactly: zero as "0", others
// with as many decimals as the step needs, or in e-notation for very large
// or small steps.
func tickLabels(ticks []float64, s step) []string {
	out := make([]string, len(ticks))
	sci := s.exp > 5 || s.exp < -4
	prec := max(0, -s.exp)
	if sci {
		prec = max(0, maxExp(ticks)-s.exp)
	}
	for i, v := range ticks {
		if v == 0 {
			out[i] = "0"
		} else if sci {
			out[i] = sciLabel(v, prec)
		} else {
			out[i] = noNegZero(strconv.FormatFloat(v, 'f', prec, 64))
		}
	}
	return out
}

// maxExp returns the decimal exponent of the largest magnitude among ticks.
func maxExp(ticks []float64) int {
	m := 0.0
	for _, v := range ticks {
		m = max(m, math.Abs(v))
	}
	if m == 0 {
		return 0
	}
	return int(math.Floor(fpmath.Log10(m)))
}

// sciLabel formats v as "1.5e7" or "-2e-5".
func sciLabel(v float64, prec int) string {
	s := strconv.FormatFloat(v, 'e', prec, 64)
	mant, exp, _ := strings.Cut(s, "e")
	e, _ := strconv.Atoi(exp)
	return noNegZero(mant) + "e" + strconv.Itoa(e)
}

// noNegZero turns "-0", "-0.00" and the like into their unsigned form.
func noNegZero(s string) string {
	if strings.HasPrefix(s, "-") && strings.Trim(s[1:], "0.") == "" {
		return s[1:]
	}
	return s
}
