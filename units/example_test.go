package units_test

import (
	"fmt"

	"github.com/vouchcalc/vouch/units"
)

// A quantity is a value in SI base units with its dimension; units are
// parsed from text and convert it for display. Adding quantities checks
// their dimensions, and gauge pressures use the context's atmosphere.
func Example() {
	ctx := units.StandardAtmosphere
	p := units.MustParse("bar").Q(12.5, ctx) // 12.5 bar = 1.25 MPa
	dp := units.MustParse("kPa").Q(50, ctx)
	sum, _ := units.Add(p, dp)
	mpa, _ := sum.In(units.MustParse("MPa"), ctx)
	barg, _ := sum.In(units.MustParse("barg"), ctx)
	fmt.Printf("%.4g MPa = %.4g barg\n", mpa, barg)

	_, err := units.Add(p, units.MustParse("kJ/kg").Q(1, ctx))
	fmt.Println(err)

	_, err = units.Parse("MPax")
	fmt.Println(err)
	// Output:
	// 1.3 MPa = 11.99 barg
	// cannot add pressure (MPa) and specific enthalpy (kJ/kg)
	// unknown unit MPax; did you mean MPa?
}
