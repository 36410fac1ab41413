package heatmodel

import "testing"

// TestHotRockUniformChunks: Evaluate's chunked path for a uniform
// gradient per trial gives for every trial exactly what the model's
// per-trial functions give (UsefulTop, UsefulHeat, TimeConstant,
// HeatMiningPower, HeatMined: the formulas of docs/references.md §5),
// across chunk boundaries, with constant and varying columns, with a
// surface already hotter than the minimum useful temperature, a deeper
// TopDepth, and trials without useful heat.
func TestHotRockUniformChunks(t *testing.T) {
	const n = chunkTestTrials
	vary := func(x float64, step int) Column { return chunkTestColumn(x, step) }
	h := HotRock{
		Area: vary(2e6, 7), SurfaceTemp: vary(285, 5), Gradient: vary(0.03, 11),
		MinTemp: vary(380, 13), TopDepth: vary(1000, 3), MaxDepth: vary(4400, 17),
		RockDensity: Const(2650), RockHeatCapacity: vary(900, 19),
		Flux: vary(5e-7, 23), WaterDensity: Const(1000), WaterHeatCapacity: Const(4180),
		ConversionEfficiency: vary(0.12, 29), CapacityFactor: Const(0.9), Life: Const(30 * secondsPerYear),
		ReportTimes: []float64{0, 10 * secondsPerYear, 30 * secondsPerYear},
	}
	for i := 0; i < n; i += 4 {
		h.TopDepth.Values[i] = 3250 // below where the rock reaches MinTemp, 2.6–4.7 km,: z1 is TopDepth
	}
	h.MinTemp.Values[5] = 250                   // surface hotter than the minimum: z1 is TopDepth,
	h.TopDepth.Values[5] = 0                    // here the surface itself
	h.TopDepth.Values[9] = h.MaxDepth.Values[9] // z1 = z2: no rock to mine
	out := newHotRockOutputs(n, len(h.ReportTimes))
	zero := h.Evaluate(n, out)

	wantZero, surface, topped := 0, 0, 0
	for i := range n {
		ts, tmin, g := h.SurfaceTemp.At(i), h.MinTemp.At(i), h.Gradient.At(i)
		rho, c := h.RockDensity.At(i), h.RockHeatCapacity.At(i)
		p := UniformProfile(g)
		z1, z2 := UsefulTop(p, ts, tmin, h.TopDepth.At(i)), h.MaxDepth.At(i)
		if z1 == 0 {
			surface++
		}
		if z1 == 3250 {
			topped++
		}
		if z1 >= z2 {
			wantZero++
			if out.HeatInPlace[i] != 0 || out.ElectricPower[i] != 0 || out.PowerAt[2][i] != 0 {
				t.Fatalf("trial %d: no useful rock (z1 %g ≥ z2 %g) but E0 %g, Pe %g", i, z1, z2, out.HeatInPlace[i], out.ElectricPower[i])
			}
			continue
		}
		e0 := h.Area.At(i) * UsefulHeat(p, ts, tmin, z1, z2, rho, c)
		tau := TimeConstant(z1, z2, rho, c, h.Flux.At(i), h.WaterDensity.At(i), h.WaterHeatCapacity.At(i))
		rec := HeatMined(e0, tau, h.Life.At(i))
		pe := h.ConversionEfficiency.At(i) * (rec / h.Life.At(i)) / h.CapacityFactor.At(i)
		if out.HeatInPlace[i] != e0 || out.TimeConstant[i] != tau || out.InitialPower[i] != HeatMiningPower(e0, tau, 0) ||
			out.Recovered[i] != rec || out.MeanPower[i] != rec/h.Life.At(i) || out.ElectricPower[i] != pe {
			t.Fatalf("trial %d: got E0 %g, τ %g, P0 %g, Er %g, Pe %g; want %g, %g, %g, %g, %g", i,
				out.HeatInPlace[i], out.TimeConstant[i], out.InitialPower[i], out.Recovered[i], out.ElectricPower[i],
				e0, tau, HeatMiningPower(e0, tau, 0), rec, pe)
		}
		for k, tk := range h.ReportTimes {
			if want := HeatMiningPower(e0, tau, tk); out.PowerAt[k][i] != want {
				t.Fatalf("trial %d: power at %g s %g, want %g", i, tk, out.PowerAt[k][i], want)
			}
		}
	}
	if zero != wantZero || wantZero < 2 || wantZero > n/2 || surface != 1 || topped < n/16 {
		t.Errorf("trials without useful heat: %d, want %d (the test wants 2 to n/2 of them, one mined from the surface: %d, and n/16 from TopDepth: %d)",
			zero, wantZero, surface, topped)
	}
}
