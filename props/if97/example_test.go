package if97_test

import (
	"fmt"

	"github.com/vouchcalc/vouch/props/if97"
)

// Every function takes and gives SI base units (Pa, K, J/kg, J/(kg·K),
// m³/kg). The values printed are the verification values of IAPWS R7-97
// Tables 5 and 35; a state out of range is an error, never a NaN.
func Example() {
	st, _ := if97.StatePT(3e6, 300) // region 1
	fmt.Printf("region %d: v = %.8e m3/kg, h = %.8e kJ/kg, s = %.8e kJ/(kg K)\n",
		st.Region, st.V, st.H/1e3, st.S/1e3)
	ps, _ := if97.Psat(300)
	fmt.Printf("psat(300 K) = %.8e MPa\n", ps/1e6)
	_, err := if97.StatePT(120e6, 300)
	fmt.Println(err)
	// Output:
	// region 1: v = 1.00215168e-03 m3/kg, h = 1.15331273e+02 kJ/kg, s = 3.92294792e-01 kJ/(kg K)
	// psat(300 K) = 3.53658941e-03 MPa
	// if97: p is above the upper limit: the highest pressure of IAPWS-IF97
}
