package heatmodel

import (
	"fmt"

	"rockheat/heatmodel/water"
)

// Pressures for IF97 fluid properties.
const (
	// Atmosphere is the standard atmosphere, Pa.
	Atmosphere = 101325
	// Gravity is standard gravity, m/s².
	Gravity = 9.80665
	// HydrostaticDensity is the density of the water column of
	// Hydrostatic: cold water, 1000 kg/m³ (common practice for a first
	// estimate; a hot column is lighter).
	HydrostaticDensity = 1000
)

// celsiusZero is 0 °C in K, for messages.
const celsiusZero = 273.15

// Hydrostatic returns the pressure at depth z, m, under a column of cold
// water, Pa: 101 325 Pa + 1000 kg/m³ · 9.80665 m/s² · z.
func Hydrostatic(z float64) float64 { return Atmosphere + HydrostaticDensity*Gravity*z }

// HydrostaticDepth returns the depth, m, at which Hydrostatic reaches the
// pressure p, Pa: its inverse.
func HydrostaticDepth(p float64) float64 { return (p - Atmosphere) / (HydrostaticDensity * Gravity) }

// FluidScratch holds one goroutine's buffers for the fluid-property
// columns, reused batch after batch, and its count of trials whose fluid
// state was taken at saturation. The zero value is ready to use; a
// FluidScratch is not safe for concurrent use.
type FluidScratch struct {
	pressure, density, heatCapacity, efficiency []float64
	// Saturated counts the trials, since it was last reset, whose
	// pressure lay below the saturation pressure at their temperature
	// (see LiquidProperties).
	Saturated int
}

// grow returns *buf resized to n values, reallocated if too small.
func grow(buf *[]float64, n int) []float64 {
	if cap(*buf) < n {
		*buf = make([]float64, n)
	}
	return (*buf)[:n]
}

// HydrostaticColumn returns the column of Hydrostatic pressures, Pa, at
// the depths z, m, of n trials, written into s.
func (s *FluidScratch) HydrostaticColumn(n int, z Column) Column {
	return z.Map(Hydrostatic, grow(&s.pressure, n))
}

// LiquidProperties returns the density, kg/m³, and isobaric heat capacity,
// J/(kg·K), of liquid water, IAPWS-IF97 region 1, at each of n trials'
// pressure p (Pa) and temperature T (K), written into s. A trial whose
// pressure is below the saturation pressure at its temperature would be
// steam, not the liquid a liquid-dominated reservoir holds: by rockheat's
// stated rule it takes the properties of saturated liquid at T
// (boiling-point liquid), and is counted in s.Saturated. A state IF97
// region 1 cannot represent is an error naming it.
func (s *FluidScratch) LiquidProperties(n int, p, T Column) (rho, cp Column, err error) {
	if p.Values == nil && T.Values == nil {
		r, c, sat, err := liquidAt(p.Const, T.Const)
		if err != nil {
			return rho, cp, err
		}
		if sat {
			s.Saturated += n
		}
		return Const(r), Const(c), nil
	}
	d, c := grow(&s.density, n), grow(&s.heatCapacity, n)
	// A constant column is spread over the output buffer it is read
	// before: the density's for p, the heat capacity's for T.
	ps, ts := spread(p, d), spread(T, c)
	sat, bad, err := water.LiquidOrSaturatedDensityCps(ps, ts, d, c)
	if err != nil {
		return rho, cp, fluidError(p.At(bad), T.At(bad), err)
	}
	s.Saturated += sat
	return Vary(d), Vary(c), nil
}

// spread returns the values of c in buf: its own if it varies, else buf
// filled with its constant.
func spread(c Column, buf []float64) []float64 {
	if c.Values != nil {
		return c.Values[:len(buf)]
	}
	for i := range buf {
		buf[i] = c.Const
	}
	return buf
}

// liquidAt returns the density, kg/m³, and isobaric heat capacity,
// J/(kg·K), of the region 1 state at (p, T), or of saturated liquid at T
// when p is below the saturation pressure (sat true).
func liquidAt(p, T float64) (rho, cp float64, sat bool, err error) {
	rho, cp, sat, err = water.LiquidOrSaturatedDensityCp(p, T)
	if err != nil {
		return 0, 0, false, fluidError(p, T, err)
	}
	return rho, cp, sat, nil
}

// fluidError names the state, pressure p in Pa and temperature T in K,
// whose fluid properties IF97 could not give.
func fluidError(p, T float64, err error) error {
	return fmt.Errorf("fluid properties at %.4g MPa, %.2f °C: %w", p/1e6, T-celsiusZero, err)
}

// ExergyEfficiency returns, for each of n trials, the electric energy per
// joule of recoverable heat by the exergy route of USGS Circular 790,
// ηu·W/Qr, written into s: W/Qr from ExergyFraction, with the wellhead
// fluid saturated liquid at the reservoir temperature tr (IAPWS-IF97,
// through a table of it: satLiquidTable) and the dead state liquid at the
// reference temperature tref and one standard atmosphere (IAPWS-IF97),
// temperatures in K, and etaU the utilization efficiency, a fraction. A
// trial with tr ≤ tref gets 0 (it holds no heat).
func (s *FluidScratch) ExergyEfficiency(n int, etaU, tr, tref Column) (Column, error) {
	out := grow(&s.efficiency, n)
	var dead water.State
	if tref.Values == nil { // one reference temperature: one dead state
		var err error
		if dead, err = deadState(tref.Const); err != nil {
			return Column{}, err
		}
	}
	for i := 0; i < n; i++ {
		t, t0 := tr.At(i), tref.At(i)
		if t <= t0 {
			out[i] = 0
			continue
		}
		wh, ws, err := saturatedLiquidHS(t)
		if err != nil {
			return Column{}, fmt.Errorf("wellhead fluid at %.2f °C: %w", t-celsiusZero, err)
		}
		if tref.Values != nil {
			if dead, err = deadState(t0); err != nil {
				return Column{}, err
			}
		}
		out[i] = etaU.At(i) * ExergyFraction(wh, ws, dead.Enthalpy, dead.Entropy, t0)
	}
	return Vary(out), nil
}

// deadState returns the dead state: liquid at t0, K, and one atmosphere.
func deadState(t0 float64) (water.State, error) {
	st, err := water.Liquid(Atmosphere, t0)
	if err != nil {
		return st, fmt.Errorf("dead state at %.2f °C: %w", t0-celsiusZero, err)
	}
	return st, nil
}
