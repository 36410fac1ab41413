package scenarios_test

import (
	"fmt"

	"rockheat/scenarios"
)

// ExampleParse shows how every problem of a scenario is reported at once,
// each with its file, line, key and fix.
func ExampleParse() {
	src := `title = "Broken (invented)"
[inputs]
area_km2 = { dist = "uniform", min = 5, max = 2 }
porosty = 0.1
`
	_, err := scenarios.Parse("broken.toml", []byte(src))
	if ps, ok := err.(scenarios.Problems); ok {
		fmt.Println(len(ps) > 5)
		fmt.Println(ps[0])
	}
	// Output:
	// true
	// broken.toml:4: inputs.porosty: unknown input for model kind "reservoir" (did you mean "porosity"?); the inputs it takes are area_km2, thickness_m, reservoir_temp_c, surface_temp_c, top_depth_m, gradient_c_per_km, heat_flow_mw_m2, conductivity_w_mk, heat_production_uw_m3, reference_temp_c, porosity, rock_density_kg_m3, rock_heat_capacity_j_kgk, fluid_density_kg_m3, fluid_heat_capacity_j_kgk, recovery_factor, conversion_efficiency, capacity_factor, life_years
}
