package qualify

import (
	"fmt"
	"math"
	"strconv"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/units"
)

// cycleChecks evaluates the embedded textbook calcs (copies of
// calcdoc/testdata/textbook) and compares each printed answer of
// textbook-answers.csv with the calc's result, to the relative tolerance
// the test suite allows. The sources are cited from memory, as the tests
// say; the report shows that with each value.
func cycleChecks(Options) ([]Check, error) {
	rows, err := readCSV("textbook-answers.csv")
	if err != nil {
		return nil, err
	}
	docs := map[string]*calcdoc.Doc{}
	var out []Check
	for i, row := range rows {
		if len(row) != 5 {
			return nil, fmt.Errorf("embedded textbook-answers.csv row %d: %d columns, want 5", i+1, len(row))
		}
		file, name := row[0], row[1]
		want, err1 := parseWant(row[2])
		rel, err2 := strconv.ParseFloat(row[3], 64)
		if err1 != nil || err2 != nil {
			return nil, fmt.Errorf("embedded textbook-answers.csv row %d: bad value or tolerance", i+1)
		}
		d, ok := docs[file]
		if !ok {
			path := "refdata/textbook/" + file + ".calc.md"
			src, err := refdata.ReadFile(path)
			if err != nil {
				return nil, fmt.Errorf("embedded textbook calc %s: %v", file, err)
			}
			d = calcdoc.Read("textbook/"+file+".calc.md", src)
			d.Evaluate()
			docs[file] = d
		}
		c := Check{Group: GroupCycle, ID: fmt.Sprintf("textbook-answers.csv:%d", i+1), Source: row[4],
			What: fmt.Sprintf("%s: %s (SI)", file, name), Expected: row[2], Unit: "SI", ExpectedV: want,
			Tolerance: float64(rel * math.Abs(want)), ToleranceS: fmt.Sprintf("±%g relative", rel)}
		got, err := result(d, name)
		out = append(out, judge(c, got, err))
	}
	return out, nil
}

// result returns the SI value of a calc's quantity, or why there is none:
// the calc's errors, a failed check, or no such name.
func result(d *calcdoc.Doc, name string) (float64, error) {
	if len(d.Errors) > 0 {
		return 0, fmt.Errorf("the calc has errors: %s", d.Errors.Format(d.Path, d.Src))
	}
	if d.Failed() {
		return 0, fmt.Errorf("a check of the calc failed")
	}
	for _, it := range d.Results() {
		if q, ok := it.Outcome.Value.(units.Quantity); ok && it.Stmt.Name == name {
			return q.V, nil
		}
	}
	return 0, fmt.Errorf("the calc has no quantity %s", name)
}
