package rockheat

import (
	"errors"
	"fmt"

	"rockheat/heatmodel"
	"rockheat/heatmodel/water"
)

// Pressures for IF97 fluid properties.
const (
	atmosphere = 101325  // Pa, standard atmosphere
	gravity    = 9.80665 // m/s², standard gravity
	// hydrostaticDensity is the density of the water column used for a
	// hydrostatic pressure from depth_m: cold water, 1000 kg/m³ (common
	// practice for a first estimate; a hot column is lighter).
	hydrostaticDensity = 1000
)

// hydrostatic returns the pressure at depth z, m, under a column of cold
// water: 101 325 Pa + 1000 kg/m³ · 9.80665 m/s² · z.
func hydrostatic(z float64) float64 { return atmosphere + hydrostaticDensity*gravity*z }

// liquidProps returns the density and isobaric heat capacity of liquid
// water, IAPWS-IF97 region 1, at each trial's pressure p (Pa) and
// temperature T (K). A trial whose pressure is below the saturation
// pressure at its temperature would be steam, not the liquid a
// liquid-dominated reservoir holds: by rockheat's stated rule it takes the
// properties of saturated liquid at T (boiling-point liquid), and is
// counted in s.saturated for a warning.
func liquidProps(n int, p, T heatmodel.Column, s *scratch) (rho, cp heatmodel.Column, err error) {
	if p.Values == nil && T.Values == nil {
		st, sat, err := liquidAt(p.Const, T.Const)
		if err != nil {
			return rho, cp, err
		}
		if sat {
			s.saturated += n
		}
		return heatmodel.Const(st.Density), heatmodel.Const(st.Cp), nil
	}
	d, c := s.buf(20, n), s.buf(21, n)
	for i := 0; i < n; i++ {
		st, sat, err := liquidAt(p.At(i), T.At(i))
		if err != nil {
			return rho, cp, err
		}
		if sat {
			s.saturated++
		}
		d[i], c[i] = st.Density, st.Cp
	}
	return heatmodel.Vary(d), heatmodel.Vary(c), nil
}

// liquidAt returns the region 1 state at (p, T), or saturated liquid at T
// when p is below the saturation pressure (sat true).
func liquidAt(p, T float64) (water.State, bool, error) {
	st, err := water.Liquid(p, T)
	if err == nil {
		return st, false, nil
	}
	var se *water.StateError
	if errors.As(err, &se) && se.Region == 2 {
		st, err = water.SaturatedLiquid(T)
		if err == nil {
			return st, true, nil
		}
	}
	return st, false, fmt.Errorf("fluid properties at %.4g MPa, %.2f °C: %w", p/1e6, T-celsiusZero, err)
}

// exergyEfficiency returns, per trial, the electric energy per joule of
// recoverable heat by the exergy route of USGS Circular 790:
// ηu·W/Qr, with W/Qr from heatmodel.ExergyFraction, the wellhead fluid
// saturated liquid at the reservoir temperature tr and the dead state
// liquid at the reference temperature tref and one standard atmosphere
// (IAPWS-IF97), temperatures in K.
func exergyEfficiency(n int, etaU, tr, tref heatmodel.Column, s *scratch) (heatmodel.Column, error) {
	out := s.buf(22, n)
	deadAt := func(t0 float64) (water.State, error) {
		st, err := water.Liquid(atmosphere, t0)
		if err != nil {
			return st, fmt.Errorf("dead state at %.2f °C: %w", t0-celsiusZero, err)
		}
		return st, nil
	}
	var dead water.State
	if tref.Values == nil { // one reference temperature: one dead state
		var err error
		if dead, err = deadAt(tref.Const); err != nil {
			return heatmodel.Column{}, err
		}
	}
	for i := 0; i < n; i++ {
		t, t0 := tr.At(i), tref.At(i)
		if t <= t0 {
			out[i] = 0 // no heat; the trial is counted as zero heat
			continue
		}
		wh, err := water.SaturatedLiquid(t)
		if err != nil {
			return heatmodel.Column{}, fmt.Errorf("wellhead fluid at %.2f °C: %w", t-celsiusZero, err)
		}
		if tref.Values != nil {
			if dead, err = deadAt(t0); err != nil {
				return heatmodel.Column{}, err
			}
		}
		out[i] = etaU.At(i) * heatmodel.ExergyFraction(wh.Enthalpy, wh.Entropy, dead.Enthalpy, dead.Entropy, t0)
	}
	return heatmodel.Vary(out), nil
}
