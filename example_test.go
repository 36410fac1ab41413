package rockheat_test

import (
	"fmt"

	"rockheat"
	"rockheat/sampler"
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
	res, err := rockheat.Estimate(&s.Run, rockheat.Options{})
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
	// P90 23.8, P50 40.1, P10 65.0 MWe
}

// ExampleEstimate_inGo builds a run in Go, without a scenario file: each
// input is a Quantity, a distribution in a named unit (a zero Unit would
// mean the unit scenario files use). Estimate checks it exactly as it
// checks a file, so a missing input is an error, not a zero.
func ExampleEstimate_inGo() {
	area, _ := sampler.NewTriangular(2, 4, 8)     // km²
	temp, _ := sampler.NewUniform(200, 240)       // °C
	recovery, _ := sampler.NewUniform(0.08, 0.20) // fraction
	m := &rockheat.Reservoir{
		Area:                 rockheat.Uncertain(area, rockheat.SquareKilometre),
		Thickness:            rockheat.Fixed(1000, rockheat.Metre),
		ReservoirTemp:        rockheat.Uncertain(temp, rockheat.Celsius),
		Porosity:             rockheat.Fixed(0.05, rockheat.Fraction),
		RockDensity:          rockheat.Fixed(2650, rockheat.KgPerCubicMetre),
		RockHeatCapacity:     rockheat.Fixed(900, rockheat.JPerKgK),
		FluidDensity:         rockheat.Fixed(850, rockheat.KgPerCubicMetre),
		FluidHeatCapacity:    rockheat.Fixed(4600, rockheat.JPerKgK),
		RecoveryFactor:       rockheat.Uncertain(recovery, rockheat.Fraction),
		ConversionEfficiency: rockheat.Fixed(0.11, rockheat.Fraction),
		CapacityFactor:       rockheat.Fixed(0.9, rockheat.Fraction),
		Life:                 rockheat.Fixed(30, rockheat.Year),
	}
	run := &rockheat.Run{Title: "Example prospect (invented)", Trials: 20000, Seed: 7, Model: m}
	res, err := rockheat.Estimate(run, rockheat.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	mwe := res.Outputs[3]
	fmt.Printf("%s: P90 %.1f, P50 %.1f, P10 %.1f %s\n", mwe.Spec.Name, mwe.Summary.P90, mwe.Summary.P50, mwe.Summary.P10, mwe.Spec.Unit)

	m.Thickness = rockheat.Quantity{} // forgotten
	_, err = rockheat.Estimate(run, rockheat.Options{})
	fmt.Println(err)
	// Output:
	// electric_power: P90 23.8, P50 40.1, P10 65.0 MWe
	// thickness_m: missing: the reservoir thickness (m) is required
}
