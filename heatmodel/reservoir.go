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
	cols := [...]*Column{&r.Area, &r.Thickness, &r.ReservoirTemp, &r.ReferenceTemp, &r.Porosity,
		&r.RockDensity, &r.RockHeatCapacity, &r.FluidDensity, &r.FluidHeatCapacity,
		&r.RecoveryFactor, &r.ConversionEfficiency, &r.CapacityFactor, &r.Life}
	var ch chunks
	var in [len(cols)][]float64
	for lo := 0; lo < n; lo += chunkTrials {
		hi := min(lo+chunkTrials, n)
		for k, c := range cols {
			in[k] = ch.span(k, *c, lo, hi)
		}
		pd := ch.scratch[:hi-lo]
		if out.PowerDensity != nil {
			pd = out.PowerDensity[lo:hi]
		}
		zeroHeat += reservoirChunk(&in, out.HeatInPlace[lo:hi], out.RecoverableHeat[lo:hi],
			out.ThermalPower[lo:hi], out.ElectricPower[lo:hi], pd)
	}
	return zeroHeat
}

// reservoirChunk is Evaluate on the trials of one chunk: in holds their
// inputs in the order of Evaluate's cols, and every slice the chunk's
// length. It returns the number of trials with no heat.
func reservoirChunk(in *[13][]float64, q, qr, pt, pe, pd []float64) (zeroHeat int) {
	area := in[0]
	thick, tr, tref := in[1][:len(area)], in[2][:len(area)], in[3][:len(area)]
	phi, rhoR, cr := in[4][:len(area)], in[5][:len(area)], in[6][:len(area)]
	rhoF, cf := in[7][:len(area)], in[8][:len(area)]
	rf, eta, capf, life := in[9][:len(area)], in[10][:len(area)], in[11][:len(area)], in[12][:len(area)]
	q, qr, pt, pe, pd = q[:len(area)], qr[:len(area)], pt[:len(area)], pe[:len(area)], pd[:len(area)]
	for i, a := range area {
		if tr[i] <= tref[i] {
			q[i], qr[i], pt[i], pe[i], pd[i] = 0, 0, 0, 0, 0
			zeroHeat++
			continue
		}
		h := Block{Area: a, Thickness: thick[i], Porosity: phi[i], RockDensity: rhoR[i], RockHeatCapacity: cr[i],
			FluidDensity: rhoF[i], FluidHeatCapacity: cf[i], ReservoirTemp: tr[i], ReferenceTemp: tref[i]}.HeatInPlace()
		r := rf[i] * h
		q[i] = h
		qr[i] = r
		pt[i] = r / life[i]
		pe[i] = eta[i] * r / (capf[i] * life[i])
		pd[i] = pe[i] / a
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
