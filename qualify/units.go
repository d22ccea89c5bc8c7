package qualify

import (
	"fmt"
	"math"
	"strconv"

	"github.com/vouchcalc/vouch/units"
)

// unitChecks checks the SI factor of each unit in unit-factors.csv (the
// rows of units' TestFactorsNIST): exact factors to 4e-16 relative, factors
// the source rounds to seven figures to half a unit of the seventh.
func unitChecks(Options) ([]Check, error) {
	rows, err := readCSV("unit-factors.csv")
	if err != nil {
		return nil, err
	}
	var out []Check
	for i, row := range rows {
		if len(row) != 4 {
			return nil, fmt.Errorf("embedded unit-factors.csv row %d: %d columns, want 4", i+1, len(row))
		}
		want, err1 := strconv.ParseFloat(row[1], 64)
		exact, err2 := strconv.ParseBool(row[2])
		if err1 != nil || err2 != nil {
			return nil, fmt.Errorf("embedded unit-factors.csv row %d: bad number or flag", i+1)
		}
		c := Check{Group: GroupUnits, ID: fmt.Sprintf("unit-factors.csv:%d", i+1), Source: row[3],
			What: "SI value of one " + row[0], Expected: row[1], Unit: "SI", ExpectedV: want,
			Tolerance: float64(5e-7 * want), ToleranceS: "±5e-7 relative (half a unit of the 7th figure)"}
		if exact {
			c.Tolerance, c.ToleranceS = float64(4e-16*want), "±4e-16 relative (an exact factor)"
		}
		u, err := units.Parse(row[0])
		out = append(out, judge(c, u.Factor, err))
	}
	return out, nil
}

// parseWant reads a value written as the tests write it: a number, or a
// number divided by a number ("3.77e5 / 3600").
func parseWant(s string) (float64, error) {
	var a, b float64
	if n, err := fmt.Sscanf(s, "%g / %g", &a, &b); err == nil && n == 2 && b != 0 {
		return a / b, nil
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(v, 0) {
		return 0, fmt.Errorf("bad value %q", s)
	}
	return v, nil
}
