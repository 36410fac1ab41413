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
	// PowerDensity, if not nil, gets the implied power density, W/m²
	// (numerically MWe/km²): ElectricPower / Area.
	PowerDensity []float64
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
			if out.PowerDensity != nil {
				out.PowerDensity[i] = 0
			}
			zeroHeat++
			continue
		}
		q := Block{Area: r.Area.At(i), Thickness: r.Thickness.At(i), Porosity: r.Porosity.At(i),
			RockDensity: r.RockDensity.At(i), RockHeatCapacity: r.RockHeatCapacity.At(i),
			FluidDensity: r.FluidDensity.At(i), FluidHeatCapacity: r.FluidHeatCapacity.At(i),
			ReservoirTemp: r.ReservoirTemp.At(i), ReferenceTemp: r.ReferenceTemp.At(i)}.HeatInPlace()
		qr := r.RecoveryFactor.At(i) * q
		life := r.Life.At(i)
		out.HeatInPlace[i] = q
		out.RecoverableHeat[i] = qr
		out.ThermalPower[i] = qr / life
		out.ElectricPower[i] = r.ConversionEfficiency.At(i) * qr / (r.CapacityFactor.At(i) * life)
		if out.PowerDensity != nil {
			out.PowerDensity[i] = out.ElectricPower[i] / r.Area.At(i)
		}
	}
	return zeroHeat
}

// Block is one trial of a reservoir block, in SI units.
type Block struct {
	Area              float64 // m²
	Thickness         float64 // m
	Porosity          float64 // fraction
	RockDensity       float64 // kg/m³
	RockHeatCapacity  float64 // J/(kg·K)
	FluidDensity      float64 // kg/m³
	FluidHeatCapacity float64 // J/(kg·K)
	ReservoirTemp     float64 // K (or °C, as ReferenceTemp)
	ReferenceTemp     float64 // K (or °C, as ReservoirTemp)
}

// HeatInPlace returns the heat in place of b, J, by the volumetric method
// (Muffler & Cataldi 1978; docs/references.md §1):
// A·h·[(1 − φ)·ρr·cr + φ·ρf·cf]·(Tr − Tref), or 0 if Tr ≤ Tref.
func (b Block) HeatInPlace() float64 {
	dT := b.ReservoirTemp - b.ReferenceTemp
	if dT <= 0 {
		return 0
	}
	return b.Area * b.Thickness * ((1-b.Porosity)*b.RockDensity*b.RockHeatCapacity + b.Porosity*b.FluidDensity*b.FluidHeatCapacity) * dT
}

// PowerDensityCapacity returns the electric capacity, W, of an area, m², at a
// power density, W/m² (numerically MWe/km²): the analog method that sets a
// prospect beside producing fields (Wilmarth & Stimac 2014,
// docs/references.md §3).
func PowerDensityCapacity(area, density float64) float64 { return area * density }
