package helmholtz

// init attaches to each equation the data derived from it by TestDerived
// (derived_gen.go): its critical point, its highest valid density and its
// ancillary fits.
func init() {
	for _, f := range allFluids {
		a, ok := derivedTable[f.Name+"/"+f.Key]
		if !ok {
			continue
		}
		f.anc = a
		f.Tc, f.Pc, f.RhoC, f.RhoMax = a.Tc, a.Pc, a.RhoC, a.RhoMax
	}
}
