package heatmodel

import "fmt"

// Reservoir holds the inputs of the volumetric reservoir model, one column
// per input, in SI units.
type Reservoir struct {
	Area                 Column // m², > 0
	Thickness            Column // m, > 0
	ReservoirTemp        Column // K
	ReferenceTemp        Column // K
	Porosity             Column // fraction, [0, 1)
	RockDensity          Column // kg/m³, > 0
	RockHeatCapacity     Column // J/(kg·K), > 0
	FluidDensity         Column // kg/m³, > 0
	FluidHeatCapacity    Column // J/(kg·K), > 0
	RecoveryFactor       Column // fraction, (0, 1]
	ConversionEfficiency Column // fraction, (0, 1]
	CapacityFactor       Column // fraction, (0, 1]
	Life                 Column // s, > 0
}

// ReservoirOutputs holds the outputs of the reservoir model, one value per
// trial. Every slice must have the batch's length.
type ReservoirOutputs struct {
	HeatInPlace     []float64 // J
	RecoverableHeat []float64 // J
	ThermalPower    []float64 // W, mean thermal power over the life
	ElectricPower   []float64 // W, electric capacity
}

// Evaluate computes the n trials of r into out, and returns the number of
// trials with no heat: those whose reservoir temperature is at or below
// the reference temperature, for which every output is 0.
func (r *Reservoir) Evaluate(n int, out ReservoirOutputs) (zeroHeat int) {
	if len(out.HeatInPlace) < n || len(out.RecoverableHeat) < n || len(out.ThermalPower) < n || len(out.ElectricPower) < n {
		panic(fmt.Sprintf("heatmodel: Reservoir.Evaluate with outputs shorter than n = %d", n))
	}
	for i := 0; i < n; i++ {
		if r.ReservoirTemp.At(i) <= r.ReferenceTemp.At(i) {
			out.HeatInPlace[i], out.RecoverableHeat[i], out.ThermalPower[i], out.ElectricPower[i] = 0, 0, 0, 0
			zeroHeat++
			continue
		}
		q := VolumetricHeat(r.Area.At(i), r.Thickness.At(i), r.Porosity.At(i), r.RockDensity.At(i), r.RockHeatCapacity.At(i),
			r.FluidDensity.At(i), r.FluidHeatCapacity.At(i), r.ReservoirTemp.At(i), r.ReferenceTemp.At(i))
		qr := r.RecoveryFactor.At(i) * q
		life := r.Life.At(i)
		out.HeatInPlace[i] = q
		out.RecoverableHeat[i] = qr
		out.ThermalPower[i] = qr / life
		out.ElectricPower[i] = r.ConversionEfficiency.At(i) * qr / (r.CapacityFactor.At(i) * life)
	}
	return zeroHeat
}

// VolumetricHeat returns the heat in place of one block, J:
// A·h·[(1 − φ)·ρr·cr + φ·ρf·cf]·(Tr − Tref), or 0 if Tr ≤ Tref.
// Units: area m², thickness m, temperatures K (or both °C), densities
// kg/m³, heat capacities J/(kg·K).
func VolumetricHeat(area, thickness, porosity, rockDensity, rockHeatCapacity, fluidDensity, fluidHeatCapacity, reservoirTemp, referenceTemp float64) float64 {
	dT := reservoirTemp - referenceTemp
	if dT <= 0 {
		return 0
	}
	return area * thickness * ((1-porosity)*rockDensity*rockHeatCapacity + porosity*fluidDensity*fluidHeatCapacity) * dT
}
