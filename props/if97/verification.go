package if97

// Entry points for the engine's qualification report (package qualify), which
// checks the published verification values from outside this package.

// ConductivityBackground returns λ0·λ1 of IAPWS R15-11 Eq. (10) with the
// critical enhancement λ2 set to 0, in W/(m·K), at density rho (kg/m³) and
// temperature T (K). It makes no range check: the release's Table 4 includes
// states outside IAPWS-IF97. Use Conductivity for property values.
func ConductivityBackground(rho, T float64) float64 {
	return float64(lamBackground(rho/trRhoStar, T/trTStar) * trLamStar)
}

// SubregionBoundaryT returns the temperature (K) of the IAPWS SR5-05 region-3
// subregion boundary named by two letters ("ab", "cd", "ef", "gh", "ij", "jk",
// "mn", "op", "qu", "rx", "uv", "wx") at pressure p (Pa); ok is false for
// another name. No range check: these are the release's boundary equations.
func SubregionBoundaryT(name string, p float64) (T float64, ok bool) {
	f, ok := map[string]func(float64) float64{
		"ab": srT3ab, "cd": srT3cd, "ef": srT3ef, "gh": srT3gh, "ij": srT3ij, "jk": srT3jk,
		"mn": srT3mn, "op": srT3op, "qu": srT3qu, "rx": srT3rx, "uv": srT3uv, "wx": srT3wx,
	}[name]
	if !ok {
		return 0, false
	}
	return f(p / 1e6), true
}
