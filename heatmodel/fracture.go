package heatmodel

import (
	"errors"
	"fmt"
	"math"
)

// FractureFlow is the parallel-fracture model of heat extraction of
// Gringarten, Witherspoon & Ohnishi (1975, J. Geophys. Res. 80(8)): water
// flows through N parallel vertical fractures, each of height H and flow
// path L from injector to producer, spaced 2D apart (D half the spacing),
// in rock that starts uniformly at T0; water enters every fracture at
// T_in. Heat
// reaches the fractures by conduction in the rock normal to them only, and
// the water in a fracture stores no heat. With q = Q/(N·H) the flow per
// fracture per unit height (m²/s) and α = k/(ρr·cr), the outlet cooling
// ratio R = (T0 − T_out)/(T0 − T_in) has the Laplace transform (variable p)
//
//	R(p) = (1/p)·exp(−(2·k·L/(ρw·cw·q))·√(p/α)·tanh(D·√(p/α))).
//
// The methods invert it numerically (see fracture_laplace.go: the fixed
// Talbot contour of Abate & Valkó 2004 with 32 nodes for SpacingNumber
// λ ≤ 15, the trapezoid rule on the Bromwich line through the saddle point
// above).
// Against arbitrary-precision inversion (mpmath, testdata) the outlet
// ratio R, and so the power P/P0 = 1 − R, is within 1.3e-11 absolute and
// the heat mined within 6.4e-12 relative, for SpacingNumber 0.01–200 and
// times 0.01τ–10τ; above λ = 15 within 5e-15 and 1e-15.
//
// Two limits bound the model. For wide spacing (D → ∞) the rock beside
// each fracture is a half-space: R = erfc(k·L/(ρw·cw·q·√(α·t))). For narrow
// spacing (SpacingNumber → ∞) the rock keeps up with the water: a sharp
// thermal front reaches the producer at t = τ, the TimeConstant, so the
// power stays at P0 until τ and then falls to zero. This is not the
// well-mixed exponential decline of HeatMiningPower, which shares τ, P0
// and the heat in place but lets the water leave at the rock's mean
// temperature.
//
// The fields are SI. Every length, the flow and the rock and water
// properties must be finite and > 0; the methods panic otherwise (check
// user input first, with Validate). The temperatures may be any finite
// values; with T_in < T0 the rock is cooled.
type FractureFlow struct {
	Fractures         float64 // N, the number of fractures, > 0 (it need not be whole when derived, e.g. as width/(2D))
	HalfSpacing       float64 // D, m, half the distance between neighbouring fractures
	Length            float64 // L, m, the flow path from injector to producer along each fracture
	Height            float64 // H, m, the extent of each fracture across the flow
	Flow              float64 // Q, m³/s, the water circulated through all the fractures together
	RockConductivity  float64 // k, W/(m·K)
	RockDensity       float64 // ρr, kg/m³
	RockHeatCapacity  float64 // cr, J/(kg·K)
	WaterDensity      float64 // ρw, kg/m³
	WaterHeatCapacity float64 // cw, J/(kg·K)
	RockTemp          float64 // T0, K, the rock's initial temperature
	InjectionTemp     float64 // T_in, K, the water's temperature entering the fractures
}

// fractureField is a field of FractureFlow with its name and unit.
type fractureField struct {
	name, unit string
	v          float64
}

// positiveFields returns the fields of f that must be finite and > 0.
func (f *FractureFlow) positiveFields() [10]fractureField {
	return [10]fractureField{
		{"Fractures", "", f.Fractures}, {"HalfSpacing", "m", f.HalfSpacing},
		{"Length", "m", f.Length}, {"Height", "m", f.Height}, {"Flow", "m³/s", f.Flow},
		{"RockConductivity", "W/(m·K)", f.RockConductivity}, {"RockDensity", "kg/m³", f.RockDensity},
		{"RockHeatCapacity", "J/(kg·K)", f.RockHeatCapacity}, {"WaterDensity", "kg/m³", f.WaterDensity},
		{"WaterHeatCapacity", "J/(kg·K)", f.WaterHeatCapacity},
	}
}

// Validate reports every field of f out of its domain, in one error joined
// by errors.Join, or nil.
func (f FractureFlow) Validate() error {
	var errs []error
	for _, x := range f.positiveFields() {
		if !positive(x.v) {
			errs = append(errs, fmt.Errorf("heatmodel: fracture flow: %s %g %s is not finite and > 0", x.name, x.v, x.unit))
		}
	}
	for _, x := range [2]fractureField{{"RockTemp", "K", f.RockTemp}, {"InjectionTemp", "K", f.InjectionTemp}} {
		if math.IsNaN(x.v) || math.IsInf(x.v, 0) {
			errs = append(errs, fmt.Errorf("heatmodel: fracture flow: %s %g %s is not finite", x.name, x.v, x.unit))
		}
	}
	return errors.Join(errs...)
}

// mustValid panics if f is not valid.
func (f *FractureFlow) mustValid() {
	ok := !math.IsNaN(f.RockTemp) && !math.IsInf(f.RockTemp, 0) && !math.IsNaN(f.InjectionTemp) && !math.IsInf(f.InjectionTemp, 0)
	for _, x := range f.positiveFields() {
		ok = ok && positive(x.v)
	}
	if !ok {
		panic(f.Validate())
	}
}

// diffusivity returns α = k/(ρr·cr), m²/s.
func (f *FractureFlow) diffusivity() float64 {
	return f.RockConductivity / (f.RockDensity * f.RockHeatCapacity)
}

// SpacingNumber returns λ = 2·k·L/(ρw·cw·q·D) = τ·α/D², dimensionless:
// the TimeConstant over the time D²/α of conduction across a half-spacing.
// Large λ (narrow spacing) gives a sharp thermal front at t = τ; small λ
// (wide spacing) an early, gradual cooling of the outlet.
func (f FractureFlow) SpacingNumber() float64 {
	f.mustValid()
	q := f.Flow / (f.Fractures * f.Height)
	return 2 * f.RockConductivity * f.Length / (f.WaterDensity * f.WaterHeatCapacity * q * f.HalfSpacing)
}

// TimeConstant returns τ = ρr·cr·V/(ρw·cw·Q), s, with V = N·L·2D·H the
// rock between the fractures: the heat in place over the initial power,
// and the arrival time of the thermal front for narrow spacing.
func (f FractureFlow) TimeConstant() float64 {
	f.mustValid()
	v := f.Fractures * f.Length * 2 * f.HalfSpacing * f.Height
	return f.RockDensity * f.RockHeatCapacity * v / (f.WaterDensity * f.WaterHeatCapacity * f.Flow)
}

// HeatInPlace returns the heat of the rock between the fractures above the
// injection temperature, J: A·H·ρr·cr·(T0 − T_in) with A = N·L·2D the plan
// area. It is the heat mined as t → ∞.
func (f FractureFlow) HeatInPlace() float64 {
	f.mustValid()
	area := f.Fractures * f.Length * 2 * f.HalfSpacing
	return area * f.Height * f.RockDensity * f.RockHeatCapacity * (f.RockTemp - f.InjectionTemp)
}

// InitialPower returns P0 = ρw·cw·Q·(T0 − T_in), W: the thermal power while
// the water still leaves at T0.
func (f FractureFlow) InitialPower() float64 {
	f.mustValid()
	return f.WaterDensity * f.WaterHeatCapacity * f.Flow * (f.RockTemp - f.InjectionTemp)
}

// invert returns R, Q = 1 − R and M, dimensionless, at time t ≥ 0 s
// (+Inf allowed), and the conduction time D²/α, s.
func (f *FractureFlow) invert(t float64) (r, q, m, tc float64) {
	if !(t >= 0) {
		panic(fmt.Sprintf("heatmodel: fracture flow at time %g s, want ≥ 0", t))
	}
	tc = f.HalfSpacing * f.HalfSpacing / f.diffusivity()
	r, q, m = gwoInvert(f.SpacingNumber(), t/tc)
	return r, q, m, tc
}

// OutletRatio returns the outlet cooling ratio R = (T0 − T_out)/(T0 − T_in)
// at time t ≥ 0 s: 0 at t = 0, rising to 1 as t → ∞ (t = +Inf is allowed).
func (f FractureFlow) OutletRatio(t float64) float64 {
	r, _, _, _ := f.invert(t)
	return r
}

// OutletTemp returns the temperature of the water leaving the fractures at
// time t ≥ 0 s, K: T0 − (T0 − T_in)·R(t), computed as T_in + (T0 − T_in)·(1 − R)
// once R > ½, with 1 − R inverted on its own.
func (f FractureFlow) OutletTemp(t float64) float64 {
	r, q, _, _ := f.invert(t)
	if r <= 0.5 {
		return f.RockTemp - (f.RockTemp-f.InjectionTemp)*r
	}
	return f.InjectionTemp + (f.RockTemp-f.InjectionTemp)*q
}

// Power returns the thermal power at time t ≥ 0 s, W:
// P(t) = ρw·cw·Q·(T_out − T_in) = P0·(1 − R(t)), with 1 − R inverted from
// its own transform, so that P keeps its relative accuracy as it falls.
func (f FractureFlow) Power(t float64) float64 {
	p, _ := f.PowerAndHeatMined(t)
	return p
}

// HeatMined returns the heat extracted by time t ≥ 0 s, J: ∫_0^t P dt,
// inverted from its own transform, P0·(D²/α)·(1 − e^(−λ·g))/p², not by
// quadrature of P. It tends to HeatInPlace as t → ∞.
func (f FractureFlow) HeatMined(t float64) float64 {
	_, e := f.PowerAndHeatMined(t)
	return e
}

// PowerAndHeatMined returns Power(t), W, and HeatMined(t), J, at the cost
// of one inversion.
func (f FractureFlow) PowerAndHeatMined(t float64) (power, mined float64) {
	_, q, m, tc := f.invert(t)
	p0 := f.InitialPower()
	return p0 * q, p0 * tc * m
}
