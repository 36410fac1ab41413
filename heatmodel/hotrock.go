package heatmodel

import (
	"fmt"
	"math"
)

// exponentialTrial evaluates trial i by the exponential decline of a
// well-mixed block (Armstead & Tester 1987): the useful heat E0, τ, the
// power at the report times and the heat mined over the life. z1 is
// UsefulTop's, and z1 < z2.
func (h *HotRock) exponentialTrial(i int, p Profile, z1, z2 float64, out HotRockOutputs) {
	ts, tmin := h.SurfaceTemp.At(i), h.MinTemp.At(i)
	rhoR, cR := h.RockDensity.At(i), h.RockHeatCapacity.At(i)
	e0 := h.Area.At(i) * (rhoR * cR * p.excess(tmin-ts, z1, z2)) // UsefulHeat, z1 being already useful
	tau := TimeConstant(z1, z2, rhoR, cR, h.Flux.At(i), h.WaterDensity.At(i), h.WaterHeatCapacity.At(i))
	out.HeatInPlace[i] = e0
	out.TimeConstant[i] = tau
	p0 := e0 / tau
	out.InitialPower[i] = decline(p0, tau, 0)
	for k, t := range h.ReportTimes {
		out.PowerAt[k][i] = decline(p0, tau, t)
	}
	out.Recovered[i] = HeatMined(e0, tau, h.Life.At(i))
}

// Fractures returns the parallel-fracture model of trial i of h, whose
// mined interval is z1–z2 under profile p: the interval's plan area A holds
// N = A/(L·S) fractures of flow path L and spacing S, each spanning the
// interval's height H = z2 − z1, sharing the circulated flow Q = flux·A;
// the rock starts at the interval's mean temperature T0 and water enters
// at the minimum useful temperature (the stated simplification: the
// interval's temperature profile is replaced by its mean, which keeps its
// useful heat, A·H·ρr·cr·(T0 − Tmin)).
func (h *HotRock) Fractures(i int, p Profile, z1, z2 float64) FractureFlow {
	area, spacing, path := h.Area.At(i), h.FractureSpacing.At(i), h.FlowPath.At(i)
	return FractureFlow{
		Fractures: area / (path * spacing), HalfSpacing: spacing / 2, Length: path, Height: z2 - z1,
		Flow: h.Flux.At(i) * area, RockConductivity: h.RockConductivity.At(i),
		RockDensity: h.RockDensity.At(i), RockHeatCapacity: h.RockHeatCapacity.At(i),
		WaterDensity: h.WaterDensity.At(i), WaterHeatCapacity: h.WaterHeatCapacity.At(i),
		RockTemp: h.SurfaceTemp.At(i) + p.MeanRise(z1, z2), InjectionTemp: h.MinTemp.At(i),
	}
}

// fractureTrial evaluates trial i by the parallel-fracture drawdown of
// Gringarten, Witherspoon & Ohnishi (1975).
func (h *HotRock) fractureTrial(i int, p Profile, z1, z2 float64, out HotRockOutputs) {
	f := h.Fractures(i, p, z1, z2)
	out.HeatInPlace[i] = f.HeatInPlace()
	out.TimeConstant[i] = f.TimeConstant()
	out.InitialPower[i] = f.InitialPower()
	// One inversion gives both the power and the heat mined at a time:
	// the heat mined over the life comes with a report time equal to it.
	life, mined := h.Life.At(i), math.NaN()
	for k, t := range h.ReportTimes {
		var m float64
		out.PowerAt[k][i], m = f.PowerAndHeatMined(t)
		if t == life {
			mined = m
		}
	}
	if mined != mined {
		mined = f.HeatMined(life)
	}
	out.Recovered[i] = mined
}

// Decline is the model of a hot-rock block's thermal drawdown.
type Decline int

const (
	// DeclineExponential is the well-mixed block of the heat-mining model:
	// P(t) = (E0/τ)·e^(−t/τ).
	DeclineExponential Decline = iota
	// DeclineFractures is water through parallel fractures
	// (FractureFlow).
	DeclineFractures
)

// Declines lists the decline models.
var Declines = []Decline{DeclineExponential, DeclineFractures}

// String returns the decline's name in scenario files: "exponential" or
// "fractures".
func (d Decline) String() string {
	switch d {
	case DeclineExponential:
		return "exponential"
	case DeclineFractures:
		return "fractures"
	}
	return fmt.Sprintf("Decline(%d)", int(d))
}

// UsefulTop returns z1, m: the depth at which the rock of profile p under
// a surface at ts, K, reaches the minimum useful temperature tmin, K, or
// top, m, if that is deeper. It is 0 if tmin ≤ ts and top ≤ 0.
func UsefulTop(p Profile, ts, tmin, top float64) float64 {
	return max(p.Depth(tmin-ts), top)
}

// UsefulHeat returns the useful heat per unit area between depths z1 and
// z2, m, J/m²: E0/A = ρr·cr·∫_{z1}^{z2} (T(z) − Tmin) dz, with T(z) =
// ts + p.Rise(z), temperatures ts and tmin in K, rock density ρr in kg/m³
// and heat capacity cr in J/(kg·K). Rock colder than tmin adds nothing:
// z1 is first moved down to the depth where T = tmin if that is deeper.
// The integral is exact for the piecewise-linear profile; for a uniform
// gradient G with T(z1) = tmin it is ρr·cr·G·(z2 − z1)²/2 (the
// heat-mining model of Armstead & Tester 1987, "Heat Mining", as given in
// renewable-energy textbooks). It returns 0 if z1 ≥ z2.
func UsefulHeat(p Profile, ts, tmin, z1, z2, rockDensity, rockHeatCapacity float64) float64 {
	z1 = UsefulTop(p, ts, tmin, z1)
	if z1 >= z2 {
		return 0
	}
	return rockDensity * rockHeatCapacity * p.excess(tmin-ts, z1, z2)
}

// TimeConstant returns τ, s, the e-folding time of heat mining from the
// rock between depths z1 < z2, m, by water circulated at flux, m³/s per m²
// of area (m/s): τ = ρr·cr·(z2 − z1) / (flux·ρw·cw), with rock density ρr
// and water density ρw in kg/m³, and heat capacities cr and cw in
// J/(kg·K) (Armstead & Tester 1987, "Heat Mining"; renewable-energy
// textbooks). The model takes the rock column as one well-mixed body that
// the water leaves at the rock's mean temperature.
func TimeConstant(z1, z2, rockDensity, rockHeatCapacity, flux, waterDensity, waterHeatCapacity float64) float64 {
	return rockDensity * rockHeatCapacity * (z2 - z1) / (flux * waterDensity * waterHeatCapacity)
}

// HeatMiningPower returns the thermal power at time t, s, of heat mining
// from useful heat e0 with time constant tau, s: P(t) = (e0/τ)·e^(−t/τ)
// (Armstead & Tester 1987, "Heat Mining"; renewable-energy textbooks).
// The unit is that of e0 per second: W for e0 in J, W/m² for J/m².
func HeatMiningPower(e0, tau, t float64) float64 { return decline(e0/tau, tau, t) }

// decline is HeatMiningPower from the initial power p0 = e0/τ, so that a
// trial's powers at several times divide once: p0·e^(−t/τ), the same
// operations.
func decline(p0, tau, t float64) float64 {
	if t == 0 && tau != 0 { // (at τ = 0 the formula gives NaN, kept)
		return p0 // e^(−0) = 1 exactly: the same value, without the exponential
	}
	return p0 * math.Exp(-t/tau)
}

// HeatMined returns the heat extracted by time t, s, from useful heat e0
// with time constant tau, s: e0·(1 − e^(−t/τ)), the integral of
// HeatMiningPower from 0 to t, in the unit of e0.
func HeatMined(e0, tau, t float64) float64 {
	return -e0 * math.Expm1(-t/tau)
}

// HotRock holds the inputs of the hot-rock (heat-mining) model, one column
// per input, in SI units: an engineered system that circulates water
// through hot, dry, conductive rock and mines the rock's stored heat.
//
// The rock temperature is T(z) = Ts + Rise(z) under a per-trial surface
// temperature: a uniform gradient per trial (Gradient), a profile fixed
// for all trials (Geotherm), or a geotherm per trial (Columns). The useful rock lies from z1, where
// T = MinTemp or TopDepth if deeper, down to z2 = MaxDepth. With Area A
// and the heat-mining model of Armstead & Tester (1987, "Heat Mining"),
// as given in renewable-energy textbooks:
//
//	E0 = A·ρr·cr·∫_{z1}^{z2} (T(z) − Tmin) dz     useful heat, J
//	τ  = ρr·cr·(z2 − z1) / (q·ρw·cw)              time constant, s
//	P(t) = (E0/τ)·e^(−t/τ)                        thermal power, W
//	Er = E0·(1 − e^(−L/τ))                        heat recovered over life L, J
//	Pth = Er / L                                  mean thermal power, W
//	Pe = η·Pth / F                                electric capacity, W
//
// with q the circulated water flux (m³/s per m² of area), η conversion
// efficiency and F capacity factor. For a uniform gradient G and no
// deeper TopDepth, z1 = (Tmin − Ts)/G and E0 = A·ρr·cr·G·(z2 − z1)²/2.
// If Tmin ≤ Ts, z1 is TopDepth (the surface for 0). The model cools the
// whole column z1–z2 as one well-mixed body, so τ and P(t) hold for a
// layered geotherm too, with E0 from its exact piecewise integral. With
// Decline = DeclineFractures, P(t) and Er come instead from water through
// parallel fractures (Fractures, FractureFlow), from the same E0 and
// initial power E0/τ.
type HotRock struct {
	Area        Column // m², > 0
	SurfaceTemp Column // K, Ts
	// Gradient is the uniform gradient of each trial, K/m, > 0; it is not
	// read when Geotherm is not zero.
	Gradient Column
	// Geotherm, unless zero, is the geotherm's shape for every trial
	// (usually layered, from NewProfile) under the trial's SurfaceTemp.
	// The zero Profile selects a uniform gradient from the Gradient column.
	Geotherm             Profile
	MinTemp              Column    // K, Tmin, the minimum useful rock temperature: the water's injection temperature
	TopDepth             Column    // m, ≥ 0, shallowest rock to be mined (0: no limit)
	MaxDepth             Column    // m, > 0, z2, the drilling limit
	RockDensity          Column    // kg/m³, > 0
	RockHeatCapacity     Column    // J/(kg·K), > 0
	Flux                 Column    // m³/s of circulated water per m² of area (m/s), > 0
	WaterDensity         Column    // kg/m³, > 0
	WaterHeatCapacity    Column    // J/(kg·K), > 0
	ConversionEfficiency Column    // fraction, (0, 1]
	CapacityFactor       Column    // fraction, (0, 1]
	Life                 Column    // s, > 0
	ReportTimes          []float64 // s, ≥ 0, times at which PowerAt reports P(t)
	// Columns, when not nil, gives each trial's geotherm; Gradient and
	// Geotherm are then not read.
	Columns *GeothermColumns
	// Decline selects the drawdown; DeclineFractures reads the fracture
	// spacing S and flow path L, m, and the rock's conductivity, W/(m·K).
	Decline                                     Decline
	FractureSpacing, FlowPath, RockConductivity Column
}

// HotRockOutputs holds the outputs of the hot-rock model, one value per
// trial, as totals over the area. Every slice must have at least the
// batch's length, and PowerAt one slice per report time.
type HotRockOutputs struct {
	HeatInPlace   []float64   // J, useful heat E0 above MinTemp between z1 and z2
	TimeConstant  []float64   // s, τ
	InitialPower  []float64   // W, P(0) = E0/τ
	PowerAt       [][]float64 // W, PowerAt[k][i] = P(ReportTimes[k]) of trial i
	Recovered     []float64   // J, heat mined over the life: E0·(1 − e^(−L/τ)), or the fractures' integral
	MeanPower     []float64   // W, mean thermal power over the life
	ElectricPower []float64   // W, electric capacity
}

// Evaluate computes the n trials of h into out, and returns the number of
// trials with no useful heat: those with no rock at or above MinTemp
// between TopDepth and MaxDepth (z1 ≥ z2), for which every output is 0.
// It panics if an output is shorter than n, if len(out.PowerAt) ≠
// len(h.ReportTimes), if a uniform gradient is ≤ 0, if Columns give a
// geotherm that is not one, or (DeclineFractures) if a trial's fractures
// are not a valid FractureFlow.
func (h *HotRock) Evaluate(n int, out HotRockOutputs) (zeroHeat int) {
	if len(out.HeatInPlace) < n || len(out.TimeConstant) < n || len(out.InitialPower) < n ||
		len(out.Recovered) < n || len(out.MeanPower) < n || len(out.ElectricPower) < n {
		panic(fmt.Sprintf("heatmodel: HotRock.Evaluate with outputs shorter than n = %d", n))
	}
	if len(out.PowerAt) != len(h.ReportTimes) {
		panic(fmt.Sprintf("heatmodel: HotRock.Evaluate with %d PowerAt columns for %d report times", len(out.PowerAt), len(h.ReportTimes)))
	}
	for k, col := range out.PowerAt {
		if len(col) < n {
			panic(fmt.Sprintf("heatmodel: HotRock.Evaluate with PowerAt[%d] shorter than n = %d", k, n))
		}
	}
	if h.Columns == nil && h.Geotherm.IsZero() && h.Decline != DeclineFractures {
		return h.evaluateUniform(n, out)
	}
	fixed := !h.Geotherm.IsZero()
	p := h.Geotherm
	for i := 0; i < n; i++ {
		switch {
		case h.Columns != nil:
			var err error
			if p, err = h.Columns.At(i); err != nil {
				panic("heatmodel: HotRock.Evaluate with a geotherm that is not one: " + err.Error())
			}
		case !fixed:
			p = UniformProfile(h.Gradient.At(i))
		}
		ts, tmin := h.SurfaceTemp.At(i), h.MinTemp.At(i)
		z1, z2 := UsefulTop(p, ts, tmin, h.TopDepth.At(i)), h.MaxDepth.At(i)
		if z1 >= z2 {
			out.HeatInPlace[i], out.TimeConstant[i], out.InitialPower[i] = 0, 0, 0
			out.Recovered[i], out.MeanPower[i], out.ElectricPower[i] = 0, 0, 0
			for _, col := range out.PowerAt {
				col[i] = 0
			}
			zeroHeat++
			continue
		}
		if h.Decline == DeclineFractures {
			h.fractureTrial(i, p, z1, z2, out)
		} else {
			h.exponentialTrial(i, p, z1, z2, out)
		}
		mean := out.Recovered[i] / h.Life.At(i)
		out.MeanPower[i] = mean
		out.ElectricPower[i] = h.ConversionEfficiency.At(i) * mean / h.CapacityFactor.At(i)
	}
	return zeroHeat
}
