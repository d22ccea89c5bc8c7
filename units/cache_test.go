package units

import (
	"reflect"
	"testing"
)

// TestParseCached: a cached parse equals a fresh one, the second time too,
// and an error is returned every time, not cached as a unit.
func TestParseCached(t *testing.T) {
	for _, text := range []string{"MPa", "kJ/(kg*K)", "m^3/kg", "degC", "barg", "1"} {
		want := MustParse(text)
		for i := 0; i < 2; i++ {
			got, err := ParseCached(text)
			if err != nil || !reflect.DeepEqual(got, want) {
				t.Errorf("%s (call %d): %+v %v, want %+v", text, i+1, got, err, want)
			}
		}
	}
	for i := 0; i < 2; i++ {
		if _, err := ParseCached("kJ/frob"); err == nil {
			t.Errorf("kJ/frob (call %d): no error", i+1)
		}
	}
}

// TestDefaultUnitChoices: the prefix that keeps the number at or above 1,
// and the base-unit form for a dimension without choices.
func TestDefaultUnitChoices(t *testing.T) {
	cases := []struct {
		q    Quantity
		want string
	}{
		{Quantity{V: 999, D: DimPressure}, "Pa"},
		{Quantity{V: 1000, D: DimPressure}, "kPa"},
		{Quantity{V: 16e6, D: DimPressure}, "MPa"},
		{Quantity{V: -2e9, D: DimPressure}, "GPa"},
		{Quantity{V: 0, D: DimPower}, "W"},
		{Quantity{V: 3e6, D: DimSpecificEnergy}, "kJ/kg"},
		{Quantity{V: 2, D: Dim{1, 0, -3, 0, 0, 0, 0}}, "m/s^3"},
		{Quantity{V: 2, D: Dim{1, 0, -3, 0, 0, 0, 0}}, "m/s^3"}, // the cached form
	}
	for _, c := range cases {
		if got := DefaultUnit(c.q).String(); got != c.want {
			t.Errorf("DefaultUnit(%v) = %s, want %s", c.q, got, c.want)
		}
	}
}
