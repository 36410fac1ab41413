package water

// Liquid returns the state of compressed liquid water at pressure p in Pa
// and temperature T in K, from IF97 region 1. It is the function a
// reservoir model calls once per trial to get the pore-fluid density and
// heat capacity.
//
// Constraints: 273.15 K ≤ T ≤ 623.15 K and p_s(T) ≤ p ≤ 100 MPa. When p is
// below the saturation pressure p_s(T) the water at (p, T) is steam, and
// Liquid returns a *StateError with Region 2 that says so and how to fix
// the input; above 623.15 K the error names the region the state lies in
// (2, 3 or 5).
func Liquid(p, T float64) (State, error) {
	// The common case first: one range test and one saturation pressure.
	if p > 0 && p <= MaxPressure && T >= MinTemperature && T <= Region1MaxTemperature {
		ps := saturationPressure(T)
		if p >= ps {
			return region1(p, T), nil
		}
		return State{}, steamErr(p, T, ps)
	}
	if err := checkDomain(p, T); err != nil {
		return State{}, err
	}
	return State{}, aboveRegion1Err(p, T, "keep the reservoir temperature ≤ 623.15 K (350 °C)")
}

// LiquidOrSaturated returns the region 1 state at (p, T), or, when p is
// below the saturation pressure p_s(T), so that the state would be steam,
// the saturated liquid at T (as SaturatedLiquid) and saturated true.
// Outside region 1 it returns Liquid's error. Unlike Liquid followed by
// SaturatedLiquid on its error, it builds no error for a steam-side state.
func LiquidOrSaturated(p, T float64) (st State, saturated bool, err error) {
	if p > 0 && p <= MaxPressure && T >= MinTemperature && T <= Region1MaxTemperature {
		ps := saturationPressure(T)
		if p >= ps {
			return region1(p, T), false, nil
		}
		return region1(ps, T), true, nil
	}
	st, err = Liquid(p, T)
	return st, false, err
}

// LiquidOrSaturatedDensityCp returns the density, kg/m³, and isobaric heat
// capacity, J/(kg·K), of LiquidOrSaturated's state at (p, T), with the
// same saturated flag and error: the same bits as its State's Density and
// Cp, at two thirds of the cost, for a model that needs only those two.
func LiquidOrSaturatedDensityCp(p, T float64) (rho, cp float64, saturated bool, err error) {
	if p > 0 && p <= MaxPressure && T >= MinTemperature && T <= Region1MaxTemperature {
		ps := saturationPressure(T)
		if p >= ps {
			rho, cp = region1DensityCp(p, T)
			return rho, cp, false, nil
		}
		rho, cp = region1DensityCp(ps, T)
		return rho, cp, true, nil
	}
	_, err = Liquid(p, T)
	return 0, 0, false, err
}

// steamErr is Liquid's error for a state on the steam side of saturation,
// p < ps = p_s(T).
func steamErr(p, T, ps float64) error {
	if p < minSaturationPressure {
		return stateErr(p, T, 2,
			"is steam, not liquid: p is below the saturation pressure p_s(T) = %s, and below 611.213 Pa water is "+
				"vapour at every temperature of IF97; raise the reservoir pressure above p_s(T) (give it in Pa, 1 MPa = 1e6 Pa)",
			fmtPressure(ps))
	}
	return stateErr(p, T, 2,
		"is steam, not liquid: p is below the saturation pressure p_s(T) = %s (at this p water boils at T_s(p) = %.6g K); "+
			"raise the reservoir pressure above p_s(T), or use a liquid state with T below T_s(p)",
		fmtPressure(ps), saturationTemperature(p))
}
