package scenarios

import "math"

// Key describes one input key a model kind accepts.
type Key struct {
	// Name is the key as written in [inputs], e.g. "area_km2".
	Name string
	// Unit is the unit of the values, as shown to users.
	Unit string
	// Doc says what the quantity is, in a few words.
	Doc string
	// Required keys must be given; others take Default, or are left out
	// when Optional.
	Required bool
	// Default is the value of a key that is neither required nor given.
	Default float64
	// Optional keys that are not given are left out of the scenario
	// (they stand in for another key, as depth_m for a pressure).
	Optional bool
	// Lo and Hi bound the physical domain; LoOpen and HiOpen exclude the
	// limit itself (for a fixed value; a continuous distribution may
	// reach an open limit, which it does with probability zero).
	Lo, Hi         float64
	LoOpen, HiOpen bool
}

// absoluteZeroC is 0 K in °C.
const absoluteZeroC = -273.15

var inf = math.Inf(1)

func positive(name, unit, doc string) Key {
	return Key{Name: name, Unit: unit, Doc: doc, Required: true, Lo: 0, Hi: inf, LoOpen: true}
}

func fraction(name, doc string) Key {
	return Key{Name: name, Unit: "fraction", Doc: doc, Required: true, Lo: 0, Hi: 1, LoOpen: true}
}

func temperature(name, doc string) Key {
	return Key{Name: name, Unit: "°C", Doc: doc, Required: true, Lo: absoluteZeroC, Hi: inf, LoOpen: true}
}

func optional(k Key) Key { k.Required, k.Optional = false, true; return k }

func withDefault(k Key, v float64) Key { k.Required, k.Default = false, v; return k }

// KeysFor returns the input keys of a model, in the order reports list them.
func KeysFor(m Model) []Key {
	rock := []Key{
		positive("rock_density_kg_m3", "kg/m³", "rock (grain) density"),
		positive("rock_heat_capacity_j_kgk", "J/(kg·K)", "rock specific heat capacity"),
	}
	plant := []Key{
		fraction("capacity_factor", "fraction of the time the plant runs at full output"),
		positive("life_years", "years", "plant life"),
	}
	fixedFluid := []Key{
		positive("fluid_density_kg_m3", "kg/m³", "fluid density"),
		positive("fluid_heat_capacity_j_kgk", "J/(kg·K)", "fluid specific heat capacity"),
	}
	var keys []Key
	switch m.Kind {
	case KindReservoir:
		keys = append(keys,
			positive("area_km2", "km²", "reservoir area"),
			positive("thickness_m", "m", "reservoir thickness"),
			temperature("reservoir_temp_c", "mean reservoir temperature"),
			withDefault(temperature("reference_temp_c", "reference (rejection, dead-state) temperature"), 15),
			Key{Name: "porosity", Unit: "fraction", Doc: "porosity", Required: true, Lo: 0, Hi: 1, HiOpen: true},
		)
		keys = append(keys, rock...)
		switch m.Fluid {
		case FluidFixed:
			keys = append(keys, fixedFluid...)
		case FluidIF97:
			keys = append(keys,
				optional(positive("reservoir_pressure_mpa", "MPa", "reservoir fluid pressure")),
				optional(positive("depth_m", "m", "depth of the reservoir's middle, for a hydrostatic pressure")),
			)
		}
		keys = append(keys, fraction("recovery_factor", "fraction of heat in place recovered at the wellhead"))
		switch m.Conversion {
		case ConversionEfficiency:
			keys = append(keys, fraction("conversion_efficiency", "heat-to-electricity conversion efficiency"))
		case ConversionExergy:
			keys = append(keys, fraction("utilization_efficiency", "utilization efficiency of the available work"))
		}
	case KindHotRock:
		keys = append(keys,
			positive("area_km2", "km²", "area of the stimulated or developed volume"),
			temperature("surface_temp_c", "mean surface temperature"),
		)
		if !m.Layered {
			keys = append(keys, positive("gradient_c_per_km", "°C/km", "geothermal gradient"))
		}
		keys = append(keys,
			temperature("min_useful_temp_c", "minimum useful rock temperature"),
			withDefault(Key{Name: "top_depth_km", Unit: "km", Doc: "shallowest depth to draw heat from", Lo: 0, Hi: inf}, 0),
			positive("max_depth_km", "km", "maximum (drilling) depth"),
		)
		keys = append(keys, rock...)
		keys = append(keys, positive("flow_per_area_m3_s_km2", "m³/s per km²", "circulated water flow per unit area"))
		switch m.Fluid {
		case FluidFixed:
			keys = append(keys, fixedFluid...)
		case FluidIF97:
			keys = append(keys,
				temperature("fluid_temp_c", "mean temperature of the circulated water"),
				positive("fluid_pressure_mpa", "MPa", "mean pressure of the circulated water"),
			)
		}
		keys = append(keys, fraction("conversion_efficiency", "heat-to-electricity conversion efficiency"))
	}
	return append(keys, plant...)
}
