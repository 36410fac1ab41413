package heatmodel

import (
	"errors"
	"fmt"
	"math"
)

// Layer is one layer of a layered geotherm: from the bottom of the layer
// above (or the surface) down to Bottom the temperature rises at Gradient.
type Layer struct {
	Bottom   float64 // m below the surface, > 0, deeper than the layer above
	Gradient float64 // K/m, > 0
}

// Profile is the shape of a conductive geotherm below the surface: the
// rise of the rock temperature above the surface temperature as a
// function of depth, piecewise linear and increasing. The surface
// temperature is not part of it, so one Profile serves trials of
// different surface temperatures: T(z) = Ts + p.Rise(z).
//
// A Profile is either uniform (UniformProfile: T = Ts + G·z) or layered
// (NewProfile). Below the bottom of a layered profile's last layer, the
// last layer's gradient continues without end. The zero Profile has no
// shape (IsZero); HotRock reads it as "no fixed geotherm given".
type Profile struct {
	g      float64   // K/m, the gradient of a uniform profile (layers nil)
	layers []Layer   // layered profile, bottoms increasing
	rise   []float64 // K, rise at the top of each layer; rise[0] = 0
}

// UniformProfile returns the profile of a single gradient g, K/m, with
// constraint g > 0: Rise(z) = g·z. It panics if g ≤ 0 or is NaN; a
// scenario's gradient range must be checked before sampling.
func UniformProfile(g float64) Profile {
	if !(g > 0) {
		panic(fmt.Sprintf("heatmodel: UniformProfile with gradient %g K/m, want > 0", g))
	}
	return Profile{g: g}
}

// NewProfile returns the layered profile of layers, listed from the surface
// down. Constraints: at least one layer; bottoms (m) finite, > 0 and
// strictly increasing; gradients (K/m) finite and > 0. Below the last
// bottom the last gradient continues. Every problem found is reported, in
// one error joined by errors.Join; layers are numbered from 1 at the
// surface. NewProfile copies layers.
func NewProfile(layers []Layer) (Profile, error) {
	if len(layers) == 0 {
		return Profile{}, errors.New("heatmodel: layered profile has no layers: give at least one layer (bottom depth and gradient)")
	}
	var errs []error
	prev := 0.0
	for k, l := range layers {
		switch {
		case math.IsNaN(l.Bottom) || math.IsInf(l.Bottom, 0):
			errs = append(errs, fmt.Errorf("heatmodel: layer %d: bottom %g m is not a finite depth: give the depth of the layer's base in metres", k+1, l.Bottom))
		case k == 0 && l.Bottom <= 0:
			errs = append(errs, fmt.Errorf("heatmodel: layer 1: bottom %g m is not below the surface: give a depth > 0 m", l.Bottom))
		case k > 0 && l.Bottom <= prev:
			errs = append(errs, fmt.Errorf("heatmodel: layer %d: bottom %g m is not below layer %d's bottom %g m: list layers from the surface down with increasing bottom depths", k+1, l.Bottom, k, prev))
		}
		if !(l.Gradient > 0) || math.IsInf(l.Gradient, 0) {
			errs = append(errs, fmt.Errorf("heatmodel: layer %d: gradient %g K/m is not finite and > 0: give the rise of temperature with depth, > 0", k+1, l.Gradient))
		}
		if !math.IsNaN(l.Bottom) {
			prev = l.Bottom
		}
	}
	if len(errs) > 0 {
		return Profile{}, errors.Join(errs...)
	}
	p := Profile{layers: append([]Layer(nil), layers...), rise: make([]float64, len(layers))}
	top := 0.0
	for k, l := range p.layers[:len(p.layers)-1] {
		p.rise[k+1] = p.rise[k] + l.Gradient*(l.Bottom-top)
		top = l.Bottom
	}
	return p, nil
}

// IsZero reports whether p is the zero Profile, which has no shape.
func (p Profile) IsZero() bool { return p.layers == nil && p.g == 0 }

// Layers returns a copy of the layers of a layered profile, or nil for a
// uniform or zero profile.
func (p Profile) Layers() []Layer {
	if p.layers == nil {
		return nil
	}
	return append([]Layer(nil), p.layers...)
}

// Rise returns the rise of the rock temperature above the surface
// temperature at depth z, K, for z ≥ 0 m.
func (p Profile) Rise(z float64) float64 {
	if p.layers == nil {
		return p.g * z
	}
	top := 0.0
	last := len(p.layers) - 1
	for k, l := range p.layers {
		if z <= l.Bottom || k == last {
			return p.rise[k] + l.Gradient*(z-top)
		}
		top = l.Bottom
	}
	panic("unreachable")
}

// Temperature returns the rock temperature at depth z ≥ 0 m, K, under a
// surface at ts, K: ts + p.Rise(z).
func (p Profile) Temperature(ts, z float64) float64 { return ts + p.Rise(z) }

// Depth returns the depth, m, at which the rock temperature has risen by
// rise, K, above the surface temperature: the inverse of Rise, and 0 for
// rise ≤ 0 (the surface is already that hot).
func (p Profile) Depth(rise float64) float64 {
	if rise <= 0 {
		return 0
	}
	if p.layers == nil {
		return rise / p.g
	}
	top := 0.0
	last := len(p.layers) - 1
	for k, l := range p.layers {
		if k == last || rise <= p.rise[k]+l.Gradient*(l.Bottom-top) {
			return top + (rise-p.rise[k])/l.Gradient
		}
		top = l.Bottom
	}
	panic("unreachable")
}

// excess returns ∫_a^b (Rise(z) − d) dz, K·m, for 0 ≤ a ≤ b, integrating
// each linear segment exactly (trapezoid rule on a straight line).
func (p Profile) excess(d, a, b float64) float64 {
	if p.layers == nil {
		return (p.g*a - d + p.g*b - d) / 2 * (b - a)
	}
	sum, top := 0.0, 0.0
	last := len(p.layers) - 1
	for k, l := range p.layers {
		bottom := l.Bottom
		if k == last {
			bottom = math.Inf(1)
		}
		if lo, hi := max(a, top), min(b, bottom); hi > lo {
			elo := p.rise[k] + l.Gradient*(lo-top) - d
			ehi := p.rise[k] + l.Gradient*(hi-top) - d
			sum += (elo + ehi) / 2 * (hi - lo)
		}
		if bottom >= b {
			break
		}
		top = bottom
	}
	return sum
}
