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
	if pe, sat, ok := liquidPressure(p, T); ok {
		rho, cp = region1DensityCp(pe, T)
		return rho, cp, sat, nil
	}
	_, err = Liquid(p, T)
	return 0, 0, false, err
}

// liquidPressure returns the pressure at which LiquidOrSaturated takes
// the state at (p, T): p, or the saturation pressure p_s(T) when p is
// below it (saturated), and false when (p, T) is outside region 1's
// range of temperatures or IF97's of pressures.
func liquidPressure(p, T float64) (pe float64, saturated, ok bool) {
	if !(p > 0 && p <= MaxPressure && T >= MinTemperature && T <= Region1MaxTemperature) {
		return 0, false, false
	}
	if p >= saturationBound(T) { // certainly liquid: Eq. 30 would say so
		return p, false, true
	}
	if ps := saturationPressure(T); p < ps {
		return ps, true, true
	}
	return p, false, true
}

// LiquidOrSaturatedDensityCps sets rho[i] and cp[i] to what
// LiquidOrSaturatedDensityCp gives at (p[i], T[i]), the same bits, for
// each i below len(rho), and returns how many of the states were taken at
// saturation; p, T and cp must be at least as long as rho. It takes the
// states two at a time, at about 0.7 of the cost of one by one (see
// powers1Pair). At the first state outside region 1 it stops and returns
// its index and LiquidOrSaturatedDensityCp's error; bad is −1 otherwise.
// rho may be p, and cp may be T: each state is read before its results
// are written.
func LiquidOrSaturatedDensityCps(p, T, rho, cp []float64) (saturated, bad int, err error) {
	n := len(rho)
	p, T, cp = p[:n], T[:n], cp[:n]
	i := 0
	for ; i+1 < n; i += 2 {
		pa, sa, oka := liquidPressure(p[i], T[i])
		pb, sb, okb := liquidPressure(p[i+1], T[i+1])
		if !oka || !okb {
			break // one of them is the error, found below
		}
		rho[i], cp[i], rho[i+1], cp[i+1] = region1DensityCpPair(pa, T[i], pb, T[i+1])
		saturated += count(sa) + count(sb)
	}
	for ; i < n; i++ {
		r, c, sat, err := LiquidOrSaturatedDensityCp(p[i], T[i])
		if err != nil {
			return saturated, i, err
		}
		rho[i], cp[i] = r, c
		saturated += count(sat)
	}
	return saturated, -1, nil
}

// count returns 1 for true and 0 for false.
func count(b bool) int {
	if b {
		return 1
	}
	return 0
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
