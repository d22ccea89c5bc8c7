package props

import "strings"

// normalName folds a fluid name for lookup: lower case, no hyphens or spaces.
func normalName(s string) string {
	return strings.NewReplacer("-", "", " ", "", "_", "").Replace(strings.ToLower(s))
}

// fluidSatFunc, fluidSatAtP and fluidStateTS serve the organic fluids.
func fluidSatFunc(fluid string) (func(T float64) (numSat, error), float64, float64, error) {
	return nil, 0, 0, errUnknownFluid(fluid)
}

func fluidSatAtP(fluid string, p float64) (float64, float64, bool) { return 0, 0, false }

func fluidStateTS(fluid string, p, h float64) (float64, float64, error) {
	return 0, 0, errUnknownFluid(fluid)
}
