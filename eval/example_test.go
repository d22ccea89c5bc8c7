package eval_test

import (
	"fmt"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/units"
)

// Calc lines are parsed one at a time, with their byte offset and line
// number in the file, and run in order by an engine that keeps the names
// they define. A check gives PASS or FAIL; an error carries the offset of
// the part of the line that caused it.
func Example() {
	ctx := units.StandardAtmosphere
	eng := eval.NewEngine(ctx)
	lines := []string{
		"m_dot = 213.2 kg/s          // feedwater flow (fictional plant)",
		"w_p [kJ/kg] = 15.6 kJ/kg",
		"P_pump [MW] = m_dot * w_p",
		"check P_pump < 5 MW",
		"x = P_pump + m_dot",
	}
	off := 0
	for i, text := range lines {
		st, errs := eval.ParseLine(text, off, i+1, ctx)
		off += len(text) + 1
		if len(errs) > 0 {
			fmt.Println("parse:", errs[0])
			continue
		}
		out, err := eng.Exec(st)
		switch {
		case err != nil:
			fmt.Printf("line %d: %v\n", i+1, err)
		case st.Kind == eval.Check:
			fmt.Printf("line %d: check %v\n", i+1, out.Pass)
		default:
			v, _ := out.Value.(units.Quantity).In(out.Display, ctx)
			fmt.Printf("line %d: %s = %.4g %s\n", i+1, st.Name, v, out.Display)
		}
	}
	// Output:
	// line 1: m_dot = 213.2 kg/s
	// line 2: w_p = 15.6 kJ/kg
	// line 3: P_pump = 3.326 MW
	// line 4: check true
	// line 5: cannot add power (MW) and mass flow (kg/s)
}
