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
	// Required keys must be given; others take Default.
	Required bool
	// Default is the value of an optional key that is not given.
	Default float64
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

// KeysFor returns the input keys of a model, in the order reports list them.
func KeysFor(m Model) []Key {
	var keys []Key
	switch m.Kind {
	case KindReservoir:
		keys = append(keys,
			positive("area_km2", "km²", "reservoir area"),
			positive("thickness_m", "m", "reservoir thickness"),
			temperature("reservoir_temp_c", "mean reservoir temperature"),
		)
	}
	ref := temperature("reference_temp_c", "reference (rejection, dead-state) temperature")
	ref.Required, ref.Default = false, 15
	keys = append(keys,
		ref,
		Key{Name: "porosity", Unit: "fraction", Doc: "porosity", Required: true, Lo: 0, Hi: 1, HiOpen: true},
		positive("rock_density_kg_m3", "kg/m³", "rock (grain) density"),
		positive("rock_heat_capacity_j_kgk", "J/(kg·K)", "rock specific heat capacity"),
	)
	if m.Fluid == FluidFixed {
		keys = append(keys,
			positive("fluid_density_kg_m3", "kg/m³", "pore-fluid density at reservoir conditions"),
			positive("fluid_heat_capacity_j_kgk", "J/(kg·K)", "pore-fluid specific heat capacity"),
		)
	}
	keys = append(keys, fraction("recovery_factor", "fraction of heat in place recovered at the wellhead"))
	if m.Conversion == ConversionEfficiency {
		keys = append(keys, fraction("conversion_efficiency", "heat-to-electricity conversion efficiency"))
	}
	keys = append(keys,
		fraction("capacity_factor", "fraction of the time the plant runs at full output"),
		positive("life_years", "years", "plant life"),
	)
	return keys
}
