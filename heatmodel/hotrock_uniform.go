package heatmodel

import "fmt"

// evaluateUniform is Evaluate for the common case of a uniform gradient
// per trial and the exponential decline: the same operations in the same
// order (UsefulTop, Profile.excess, TimeConstant, decline, HeatMined), so
// the same results bit for bit, on the columns a chunk at a time (chunks)
// rather than a trial at a time through Column.At and a Profile.
func (h *HotRock) evaluateUniform(n int, out HotRockOutputs) (zeroHeat int) {
	cols := [...]*Column{&h.Area, &h.SurfaceTemp, &h.Gradient, &h.MinTemp, &h.TopDepth, &h.MaxDepth,
		&h.RockDensity, &h.RockHeatCapacity, &h.Flux, &h.WaterDensity, &h.WaterHeatCapacity,
		&h.ConversionEfficiency, &h.CapacityFactor, &h.Life}
	var ch chunks
	var in [len(cols)][]float64
	for lo := 0; lo < n; lo += chunkTrials {
		hi := min(lo+chunkTrials, n)
		for k, c := range cols {
			in[k] = ch.span(k, *c, lo, hi)
		}
		zeroHeat += h.uniformChunk(&in, lo, out)
	}
	return zeroHeat
}

// uniformChunk evaluates the trials of one chunk, from trial lo, whose
// inputs in holds in the order of evaluateUniform's cols.
func (h *HotRock) uniformChunk(in *[14][]float64, lo int, out HotRockOutputs) (zeroHeat int) {
	area := in[0]
	m := len(area)
	ts, grad, tmin, top, zmax := in[1][:m], in[2][:m], in[3][:m], in[4][:m], in[5][:m]
	rhoR, cR, flux, rhoW, cW := in[6][:m], in[7][:m], in[8][:m], in[9][:m], in[10][:m]
	eta, capf, life := in[11][:m], in[12][:m], in[13][:m]
	e0s, taus, p0s := out.HeatInPlace[lo:lo+m], out.TimeConstant[lo:lo+m], out.InitialPower[lo:lo+m]
	rec, mean, pe := out.Recovered[lo:lo+m], out.MeanPower[lo:lo+m], out.ElectricPower[lo:lo+m]
	for i, a := range area {
		g := grad[i]
		if !(g > 0) {
			panic(fmt.Sprintf("heatmodel: UniformProfile with gradient %g K/m, want > 0", g)) // as UniformProfile
		}
		d := tmin[i] - ts[i]
		z1 := 0.0 // UsefulTop: Profile.Depth, 0 for a rise ≤ 0, then TopDepth if deeper
		if !(d <= 0) {
			z1 = uniformDepth(g, d)
		}
		z1 = max(z1, top[i])
		z2 := zmax[i]
		if z1 >= z2 {
			e0s[i], taus[i], p0s[i], rec[i], mean[i], pe[i] = 0, 0, 0, 0, 0, 0
			for _, col := range out.PowerAt {
				col[lo+i] = 0
			}
			zeroHeat++
			continue
		}
		e0 := a * (rhoR[i] * cR[i] * uniformExcess(g, d, z1, z2))
		tau := TimeConstant(z1, z2, rhoR[i], cR[i], flux[i], rhoW[i], cW[i])
		e0s[i], taus[i] = e0, tau
		p0 := e0 / tau
		p0s[i] = decline(p0, tau, 0)
		for k, t := range h.ReportTimes {
			out.PowerAt[k][lo+i] = decline(p0, tau, t)
		}
		r := HeatMined(e0, tau, life[i])
		rec[i] = r
		mp := r / life[i]
		mean[i] = mp
		pe[i] = eta[i] * mp / capf[i]
	}
	return zeroHeat
}
