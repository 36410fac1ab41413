package rockheat_test

import (
	"fmt"

	"rockheat"
	"rockheat/scenarios"
)

// ExampleEstimate runs a small invented scenario and prints its P90, P50
// and P10 electric capacity. The same seed gives the same figures on any
// number of workers.
func ExampleEstimate() {
	src := `
title = "Example prospect (invented)"
[run]
trials = 20000
seed = 7
[inputs]
area_km2 = { dist = "triangular", min = 2, mode = 4, max = 8 }
thickness_m = 1000
reservoir_temp_c = { dist = "uniform", min = 200, max = 240 }
porosity = 0.05
rock_density_kg_m3 = 2650
rock_heat_capacity_j_kgk = 900
fluid_density_kg_m3 = 850
fluid_heat_capacity_j_kgk = 4600
recovery_factor = { dist = "uniform", min = 0.08, max = 0.2 }
conversion_efficiency = 0.11
capacity_factor = 0.9
life_years = 30
`
	s, err := scenarios.Parse("example.toml", []byte(src))
	if err != nil {
		fmt.Println(err)
		return
	}
	res, err := rockheat.Estimate(s, rockheat.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, o := range res.Outputs {
		if o.Spec.Name == "electric_power" {
			fmt.Printf("P90 %.1f, P50 %.1f, P10 %.1f %s\n", o.Summary.P90, o.Summary.P50, o.Summary.P10, o.Spec.Unit)
		}
	}
	// Output:
	// P90 23.6, P50 40.3, P10 65.2 MWe
}
