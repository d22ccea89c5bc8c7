package props_test

import (
	"fmt"

	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/units"
)

// Water reads which two properties it is given from their dimensions, so
// the same call takes (p, T), (p, h), (h, s) and the other pairs; fields
// are quantities. The values are those of IAPWS R7-97 Table 5 (region 1).
func Example() {
	ctx := units.StandardAtmosphere
	p := units.MustParse("MPa").Q(3, ctx)
	T := units.MustParse("K").Q(300, ctx)
	st, err := props.Water(p, T)
	if err != nil {
		fmt.Println(err)
		return
	}
	h, _ := st.Quantity("h")
	hk, _ := h.In(units.MustParse("kJ/kg"), ctx)
	fmt.Printf("%s, region %d, %s: h = %.8e kJ/kg\n", st.Formulation, st.Region, st.Phase, hk)

	back, _ := props.Water(p, h) // the same state from (p, h)
	Tb, _ := back.Quantity("T")
	fmt.Printf("T from (p, h) = %.4f K\n", Tb.V)

	_, err = props.Water(p, units.MustParse("m").Q(1, ctx))
	fmt.Println(err)
	// Output:
	// IAPWS-IF97, region 1, liquid: h = 1.15331273e+02 kJ/kg
	// T from (p, h) = 300.0000 K
	// water: the second argument is length, which is none of pressure, temperature, specific enthalpy, specific entropy, specific volume, density or quality
}
