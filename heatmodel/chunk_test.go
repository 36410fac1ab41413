package heatmodel

import "testing"

// chunkTestTrials is the length of the chunked models' tests: two full
// chunks and a short one.
const chunkTestTrials = 2*chunkTrials + 37

// chunkTestColumn returns chunkTestTrials values x·(1 + (i mod step)/100):
// a column that repeats every step trials, so that columns of different
// steps pair their values differently across the chunks.
func chunkTestColumn(x float64, step int) Column {
	c := make([]float64, chunkTestTrials)
	for i := range c {
		c[i] = x * (1 + float64(i%step)/100)
	}
	return Vary(c)
}

// TestChunkedModelsDoNotAllocate: the chunked models keep their chunk
// buffers on the stack. A change that lets them escape costs each batch a
// 60 kB allocation and doubles a reservoir trial's time (measured with
// BenchmarkReservoir: 6 → 14 ns).
func TestChunkedModelsDoNotAllocate(t *testing.T) {
	const n = chunkTestTrials
	r := Reservoir{
		Area: chunkTestColumn(6e6, 7), Thickness: Const(1200), ReservoirTemp: chunkTestColumn(500, 3), ReferenceTemp: Const(288),
		Porosity: Const(0.06), RockDensity: Const(2650), RockHeatCapacity: Const(900), FluidDensity: Const(850),
		FluidHeatCapacity: Const(4600), RecoveryFactor: Const(0.14), ConversionEfficiency: Const(0.11),
		CapacityFactor: Const(0.9), Life: Const(30 * julianYear),
	}
	out := newOutputs(n)
	h := HotRock{
		Area: chunkTestColumn(2e6, 7), SurfaceTemp: Const(285), Gradient: chunkTestColumn(0.03, 11), MinTemp: Const(380),
		TopDepth: Const(0), MaxDepth: Const(6000), RockDensity: Const(2650), RockHeatCapacity: Const(900),
		Flux: Const(5e-7), WaterDensity: Const(1000), WaterHeatCapacity: Const(4180),
		ConversionEfficiency: Const(0.12), CapacityFactor: Const(0.9), Life: Const(30 * secondsPerYear),
		ReportTimes: []float64{0, 10 * secondsPerYear},
	}
	hout := newHotRockOutputs(n, len(h.ReportTimes))
	for name, f := range map[string]func(){
		"Reservoir.Evaluate": func() { r.Evaluate(n, out) },
		"HotRock.Evaluate":   func() { h.Evaluate(n, hout) },
	} {
		if a := testing.AllocsPerRun(5, f); a != 0 {
			t.Errorf("%s allocates %v times a call, want 0", name, a)
		}
	}
}
