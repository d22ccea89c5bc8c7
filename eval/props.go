package eval

import (
	"github.com/vouchcalc/vouch/props"
	"github.com/vouchcalc/vouch/units"
)

// The property functions: water and steam (IAPWS-IF97) and the organic
// working fluids (Helmholtz-energy equations of state).
func init() {
	register(&Func{Name: "water", Args: "A, B", MinArgs: 2, MaxArgs: 2,
		Doc:   "water/steam state from two of p, T, h, s, v or rho, x (IAPWS-IF97); fields p T h s u v rho cp cv w x mu k phase region",
		Range: "273.15 K to 1073.15 K at p <= 100 MPa; to 2273.15 K at p <= 50 MPa",
		Call: func(a []any) (any, error) {
			x, y, err := twoQuantities("water", a)
			if err != nil {
				return nil, err
			}
			return props.Water(x, y)
		}})
	register(&Func{Name: "water_sat", Args: "p or T", MinArgs: 1, MaxArgs: 1,
		Doc:   "saturation line of water at a pressure or temperature (IAPWS-IF97); fields p T hf hg hfg sf sg sfg vf vg",
		Range: "273.15 K to 647.096 K; 611.213 Pa to 22.064 MPa",
		Call: func(a []any) (any, error) {
			x, err := quantityArg(a, 0)
			if err != nil {
				return nil, err
			}
			return props.WaterSat(x)
		}})
}

func init() {
	register(&Func{Name: "fluid", Args: "\"NAME\", A, B", MinArgs: 3, MaxArgs: 3,
		Doc:   "state of a working fluid (organic fluids by their Helmholtz equations; \"water\" by IAPWS-IF97) from two of p, T, h, s, v or rho, x",
		Range: "each equation's own range; the end of `vouch functions` lists them",
		Call: func(a []any) (any, error) {
			name, ok := a[0].(string)
			if !ok {
				return nil, errorf("fluid needs the fluid's name in quotes first, such as fluid(\"isopentane\", p, T)")
			}
			x, y, err := twoQuantities("fluid", a)
			if err != nil {
				return nil, err
			}
			return props.Fluid(name, x, y)
		}})
	register(&Func{Name: "fluid_sat", Args: "\"NAME\", p or T", MinArgs: 2, MaxArgs: 2,
		Doc: "saturation line of a working fluid at a pressure or temperature; fields p T hf hg hfg sf sg sfg vf vg",
		Call: func(a []any) (any, error) {
			name, ok := a[0].(string)
			if !ok {
				return nil, errorf("fluid_sat needs the fluid's name in quotes first, such as fluid_sat(\"isopentane\", T)")
			}
			x, err := quantityArg(a, 1)
			if err != nil {
				return nil, err
			}
			return props.FluidSat(name, x)
		}})
}

func init() {
	register(&Func{Name: "fluid_crit", Args: "\"NAME\"", MinArgs: 1, MaxArgs: 1,
		Doc: "critical point and range of a fluid's formulation; fields T p rho Tmin Tmax pmax",
		Call: func(a []any) (any, error) {
			name, ok := a[0].(string)
			if !ok {
				return nil, errorf("fluid_crit needs the fluid's name in quotes, such as fluid_crit(\"isopentane\")")
			}
			return props.FluidCrit(name)
		}})
}

func twoQuantities(fn string, a []any) (units.Quantity, units.Quantity, error) {
	x, err := quantityArg(a, len(a)-2)
	if err != nil {
		return x, x, errorf("%s: %v", fn, err)
	}
	y, err := quantityArg(a, len(a)-1)
	if err != nil {
		return x, y, errorf("%s: %v", fn, err)
	}
	return x, y, nil
}
