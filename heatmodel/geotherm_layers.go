package heatmodel

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Layer is one layer of a layered geotherm given by its gradient: from the
// bottom of the layer above (or the surface) down to Bottom the
// temperature rises at Gradient.
type Layer struct {
	Bottom   float64 // m below the surface, > 0, deeper than the layer above
	Gradient float64 // K/m, > 0
}

// ConductiveLayer is one layer of a conductive geotherm: from the bottom of
// the layer above (or the surface) down to Bottom, rock of uniform thermal
// conductivity and radiogenic heat production.
type ConductiveLayer struct {
	Bottom         float64 // m below the surface, > 0, deeper than the layer above
	Conductivity   float64 // W/(m·K), > 0
	HeatProduction float64 // W/m³, ≥ 0
}

// LayerField names the value of a layered geotherm that a LayerError
// rejects.
type LayerField string

// The values a LayerError can reject, with their SI units.
const (
	FieldBottom         LayerField = "bottom"          // Layer.Bottom, ConductiveLayer.Bottom: m
	FieldGradient       LayerField = "gradient"        // Layer.Gradient: K/m
	FieldConductivity   LayerField = "conductivity"    // ConductiveLayer.Conductivity: W/(m·K)
	FieldHeatProduction LayerField = "heat_production" // ConductiveLayer.HeatProduction: W/m³
	FieldHeatFlow       LayerField = "heat_flow"       // the surface heat flow: W/m²
)

// Unit returns the SI unit of f's values, such as "W/(m·K)".
func (f LayerField) Unit() string {
	switch f {
	case FieldBottom:
		return "m"
	case FieldGradient:
		return "K/m"
	case FieldConductivity:
		return "W/(m·K)"
	case FieldHeatProduction:
		return "W/m³"
	case FieldHeatFlow:
		return "W/m²"
	}
	return ""
}

// LayerError is one problem of the layers of a geotherm, as reported by
// NewProfile, NewConductiveProfile, SetLayers and SetConductive. The
// fields let a caller word the problem in its own units; Error words it in
// SI.
type LayerError struct {
	Layer  int        // the layer, numbered from 1 at the surface; 0 for the surface heat flow
	Field  LayerField // the rejected value
	Value  float64    // the rejected value, SI (the unit of Field.Unit)
	Reason string     // why it is rejected and how to fix it, in words without numbers
}

// Error returns e in readable English, in SI units.
func (e *LayerError) Error() string {
	what := strings.ReplaceAll(string(e.Field), "_", " ")
	if e.Layer == 0 {
		return fmt.Sprintf("heatmodel: surface %s %g %s %s", what, e.Value, e.Field.Unit(), e.Reason)
	}
	return fmt.Sprintf("heatmodel: layer %d: %s %g %s %s", e.Layer, what, e.Value, e.Field.Unit(), e.Reason)
}

// ErrNoLayers is the error of a layered geotherm given no layers.
var ErrNoLayers = errors.New("heatmodel: layered profile has no layers: give at least one layer")

// The reasons of a LayerError.
const (
	reasonNotFinite  = "is not a finite depth: give the depth of the layer's base"
	reasonAtSurface  = "is not below the surface: give a depth > 0"
	reasonNotBelow   = "is not below the bottom of the layer above: list layers from the surface down with increasing bottom depths"
	reasonGradient   = "is not finite and > 0: give the rise of temperature with depth, > 0"
	reasonConduct    = "is not finite and > 0: give the rock's thermal conductivity, > 0"
	reasonProduction = "is not finite and ≥ 0: give the rock's radiogenic heat production, ≥ 0 (0 for none)"
	reasonHeatFlow   = "is not finite and > 0: give the heat flow out of the surface, > 0"
)

// positive reports whether x is finite and > 0.
func positive(x float64) bool { return x > 0 && !math.IsInf(x, 1) }

// bottoms reports the problems of layer bottoms, given one by one from the
// surface down through check, into errs, which stays nil if there are none.
type bottoms struct {
	prev float64
	errs []error
}

func (b *bottoms) check(layer int, bottom float64) {
	var reason string
	switch {
	case math.IsNaN(bottom) || math.IsInf(bottom, 0):
		reason = reasonNotFinite
	case layer == 1 && bottom <= 0:
		reason = reasonAtSurface
	case layer > 1 && bottom <= b.prev:
		reason = reasonNotBelow
	}
	if reason != "" {
		b.errs = append(b.errs, &LayerError{Layer: layer, Field: FieldBottom, Value: bottom, Reason: reason})
	}
	if !math.IsNaN(bottom) {
		b.prev = bottom
	}
}

func (b *bottoms) add(layer int, f LayerField, v float64, reason string) {
	b.errs = append(b.errs, &LayerError{Layer: layer, Field: f, Value: v, Reason: reason})
}

// NewProfile returns the layered profile of layers of given gradients,
// listed from the surface down. Constraints: at least one layer; bottoms
// (m) finite, > 0 and strictly increasing; gradients (K/m) finite and > 0.
// Below the last bottom the last gradient continues. Every problem found
// is reported, in one error joined by errors.Join: ErrNoLayers, or a
// *LayerError per problem. NewProfile copies layers.
func NewProfile(layers []Layer) (Profile, error) {
	var p Profile
	if err := p.SetLayers(layers); err != nil {
		return Profile{}, err
	}
	return p, nil
}

// NewConductiveProfile returns the steady conductive profile under the
// surface heat flow q0, W/m², of layers of rock listed from the surface
// down, each of uniform conductivity and heat production: quadratic in
// each layer with the heat flow continuous across boundaries (see
// Profile). Constraints: q0 finite and > 0; at least one layer; bottoms
// (m) finite, > 0 and strictly increasing; conductivities (W/(m·K))
// finite and > 0; heat productions (W/m³) finite and ≥ 0. The last layer
// continues below its bottom. Every problem found is reported, in one
// error joined by errors.Join: ErrNoLayers, or a *LayerError per problem
// (Layer 0 for q0). NewConductiveProfile copies layers.
func NewConductiveProfile(q0 float64, layers []ConductiveLayer) (Profile, error) {
	var p Profile
	if err := p.SetConductive(q0, layers); err != nil {
		return Profile{}, err
	}
	return p, nil
}

// SetLayers makes p the profile that NewProfile(layers) returns, reusing
// p's storage: once p has held as many layers, it does not allocate, for
// building a profile per trial. On error p is unchanged. Every copy of p
// shares that storage and changes with it: rebuild only a Profile that no
// one else holds (one per goroutine).
func (p *Profile) SetLayers(layers []Layer) error {
	if len(layers) == 0 {
		return errors.Join(ErrNoLayers)
	}
	var b bottoms
	for i, l := range layers {
		b.check(i+1, l.Bottom)
		if !positive(l.Gradient) {
			b.add(i+1, FieldGradient, l.Gradient, reasonGradient)
		}
	}
	if b.errs != nil {
		return errors.Join(b.errs...)
	}
	segs := p.segs[:0]
	top, rise := 0.0, 0.0
	for i, l := range layers {
		s := segment{top: top, bottom: l.Bottom, rise: rise, grad: l.Gradient}
		s.setRiseMax(i == len(layers)-1)
		segs = append(segs, s)
		rise = s.at(s.bottom)
		top = l.Bottom
	}
	*p = Profile{segs: segs}
	return nil
}

// SetConductive makes p the profile that NewConductiveProfile(q0, layers)
// returns, reusing p's storage: once p has held as many layers, it does
// not allocate, for building a profile per trial. On error p is
// unchanged. Every copy of p shares that storage and changes with it:
// rebuild only a Profile that no one else holds (one per goroutine).
func (p *Profile) SetConductive(q0 float64, layers []ConductiveLayer) error {
	var b bottoms
	if !positive(q0) {
		b.add(0, FieldHeatFlow, q0, reasonHeatFlow)
	}
	if len(layers) == 0 {
		return errors.Join(append(b.errs, ErrNoLayers)...)
	}
	for i, l := range layers {
		b.check(i+1, l.Bottom)
		if !positive(l.Conductivity) {
			b.add(i+1, FieldConductivity, l.Conductivity, reasonConduct)
		}
		if !(l.HeatProduction >= 0) || math.IsInf(l.HeatProduction, 1) {
			b.add(i+1, FieldHeatProduction, l.HeatProduction, reasonProduction)
		}
	}
	if b.errs != nil {
		return errors.Join(b.errs...)
	}
	segs := p.segs[:0]
	top, rise, q := 0.0, 0.0, q0
	for i, l := range layers {
		k, a := l.Conductivity, l.HeatProduction
		s := segment{top: top, bottom: l.Bottom, rise: rise, grad: q / k, curv: a / (2 * k), k: k}
		s.setRiseMax(i == len(layers)-1)
		segs = append(segs, s)
		rise = s.at(s.bottom)
		q -= a * (l.Bottom - top)
		top = l.Bottom
	}
	*p = Profile{segs: segs}
	return nil
}
