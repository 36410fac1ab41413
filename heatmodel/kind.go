package heatmodel

import "fmt"

// Kind is a model kind: which physics turns a trial's inputs into heat
// and power.
type Kind int

const (
	// KindReservoir is the volumetric heat in place of a reservoir block
	// (type Reservoir).
	KindReservoir Kind = iota
	// KindHotRock is the heat above a minimum useful temperature in a
	// conductive rock column, mined by a circulated water flow (type
	// HotRock).
	KindHotRock
	// KindPowerDensity is the analog method: electric capacity as area
	// times the power density of producing fields (PowerDensityCapacity).
	KindPowerDensity
)

// Kinds lists every model kind, in the order documentation lists them.
var Kinds = []Kind{KindReservoir, KindHotRock, KindPowerDensity}

// String returns the kind's name in scenario files and reports:
// "reservoir", "hot-rock" or "power-density".
func (k Kind) String() string {
	switch k {
	case KindReservoir:
		return "reservoir"
	case KindHotRock:
		return "hot-rock"
	case KindPowerDensity:
		return "power-density"
	}
	return fmt.Sprintf("Kind(%d)", int(k))
}

// FluidSource says where a model's fluid density and heat capacity come
// from.
type FluidSource int

const (
	// FluidFixed takes fluid density and heat capacity from the inputs.
	FluidFixed FluidSource = iota
	// FluidIF97 takes them from IAPWS-IF97 liquid water at the fluid's
	// temperature and pressure (LiquidProperties).
	FluidIF97
)

// FluidSources lists every fluid property source.
var FluidSources = []FluidSource{FluidFixed, FluidIF97}

// String returns the source's name in scenario files and reports: "fixed"
// or "if97".
func (f FluidSource) String() string {
	switch f {
	case FluidFixed:
		return "fixed"
	case FluidIF97:
		return "if97"
	}
	return fmt.Sprintf("FluidSource(%d)", int(f))
}

// Conversion is a route from recoverable heat to electric capacity.
type Conversion int

const (
	// ConversionEfficiency multiplies recoverable heat by a conversion
	// efficiency.
	ConversionEfficiency Conversion = iota
	// ConversionExergy multiplies the available work of the produced
	// fluid by a utilization efficiency (USGS Circular 790;
	// ExergyEfficiency).
	ConversionExergy
)

// Conversions lists every conversion route.
var Conversions = []Conversion{ConversionEfficiency, ConversionExergy}

// String returns the route's name in scenario files and reports:
// "efficiency" or "exergy".
func (c Conversion) String() string {
	switch c {
	case ConversionEfficiency:
		return "efficiency"
	case ConversionExergy:
		return "exergy"
	}
	return fmt.Sprintf("Conversion(%d)", int(c))
}
