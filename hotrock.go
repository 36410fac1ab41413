package rockheat

import (
	"fmt"
	"math"
	"slices"

	"rockheat/heatmodel"
)

// Ranges of the fracture model's inputs.
var (
	spacingRange = Ranges{Domain{Lo: 0, Hi: 10000, LoOpen: true}, Domain{Lo: 5, Hi: 500}}     // m
	pathRange    = Ranges{Domain{Lo: 0, Hi: 100000, LoOpen: true}, Domain{Lo: 100, Hi: 3000}} // m; well spacings of stimulated systems
)

// MaxReportYears bounds the report years of a hot-rock run: each is an
// output, with its summary, curve and chart.
const MaxReportYears = 100

// DefaultReportYears are the times, years, of a hot-rock run's power
// decline figures when HotRock.ReportYears is nil.
var DefaultReportYears = []float64{0, 10, 20, 30}

// HotRock is the hot-rock (heat-mining) model (heatmodel.HotRock) with its
// inputs. Field comments give the SI unit of each quantity and, in
// brackets, the input's own unit: a Quantity with a zero Unit is in that.
type HotRock struct {
	// Fluid selects the circulated water's density and heat capacity from
	// the inputs (FluidDensity, FluidHeatCapacity) or from IAPWS-IF97 at
	// FluidTemp and FluidPressure.
	Fluid heatmodel.FluidSource

	Area        Quantity // m² (km²), > 0, of the stimulated or developed volume
	SurfaceTemp Quantity // K (°C), mean surface temperature
	// Geotherm is the rock's temperature below the surface.
	Geotherm
	// MinUsefulTemp (K (°C)) is the minimum useful rock temperature, the
	// water's injection temperature.
	MinUsefulTemp     Quantity
	TopDepth          Quantity // m (km), ≥ 0, shallowest rock to mine; default 0
	MaxDepth          Quantity // m (km), > 0, maximum (drilling) depth
	RockDensity       Quantity // kg/m³, > 0
	RockHeatCapacity  Quantity // J/(kg·K), > 0
	FlowPerArea       Quantity // m³/s per m² of area (m³/s per km²), > 0
	FluidDensity      Quantity // kg/m³, > 0; with FluidFixed
	FluidHeatCapacity Quantity // J/(kg·K), > 0; with FluidFixed
	FluidTemp         Quantity // K (°C), circulated water; with FluidIF97
	FluidPressure     Quantity // Pa (MPa), > 0, circulated water; with FluidIF97
	// ConversionEfficiency is a fraction in (0, 1].
	ConversionEfficiency Quantity
	CapacityFactor       Quantity // fraction, (0, 1]
	Life                 Quantity // s (years), > 0

	// ReportYears are the times, years ≥ 0 and increasing, at which to
	// report the declining thermal power; nil means DefaultReportYears.
	ReportYears []float64

	// Decline is the model of the drawdown: the well-mixed exponential
	// decline, or water through parallel fractures, FractureSpacing
	// apart (m, > 0), each with a FlowPath (m, > 0) from injector to
	// producer, in rock of RockConductivity (W/(m·K)).
	Decline                                     heatmodel.Decline
	FractureSpacing, FlowPath, RockConductivity Quantity

	// drawFractures keeps the fracture inputs among the drawn ones with
	// the exponential decline, so that a comparison draws the same values
	// of every other input (CompareDeclines).
	drawFractures bool
}

// Kind returns heatmodel.KindHotRock.
func (*HotRock) Kind() heatmodel.Kind { return heatmodel.KindHotRock }

// Settings returns m's fluid property source; the conversion route of the
// hot-rock kind is always a conversion efficiency.
func (m *HotRock) Settings() (heatmodel.FluidSource, heatmodel.Conversion) {
	return m.Fluid, heatmodel.ConversionEfficiency
}

// Fields returns the inputs of m in its settings.
func (m *HotRock) Fields() []Field { return m.fields(&hotRockEval{}) }

func (m *HotRock) fields(e *hotRockEval) []Field {
	h := &e.h
	fs := []Field{
		required(&m.Area, &h.Area, "area", SquareKilometre, "area of the stimulated or developed volume", areaRange),
		required(&m.SurfaceTemp, &h.SurfaceTemp, "surface_temp", Celsius, "mean surface temperature", surfaceTempRange),
	}
	fs = append(fs, m.Geotherm.fields(&e.geo)...)
	fs = append(fs,
		required(&m.MinUsefulTemp, &h.MinTemp, "min_useful_temp", Celsius, "minimum useful rock temperature", minTempRange),
		defaulted(required(&m.TopDepth, &h.TopDepth, "top_depth", Kilometre, "shallowest depth to draw heat from", topDepthRange), 0),
		required(&m.MaxDepth, &h.MaxDepth, "max_depth", Kilometre, "maximum (drilling) depth", maxDepthRange),
		required(&m.RockDensity, &h.RockDensity, "rock_density", KgPerCubicMetre, "rock (grain) density", rockDensityRange),
		required(&m.RockHeatCapacity, &h.RockHeatCapacity, "rock_heat_capacity", JPerKgK, "rock specific heat capacity", rockHeatRange),
		required(&m.FlowPerArea, &h.Flux, "flow_per_area", FlowPerKm2, "circulated water flow per unit area", flowRange),
	)
	if m.Decline == heatmodel.DeclineFractures || m.drawFractures {
		fs = append(fs,
			required(&m.FractureSpacing, &h.FractureSpacing, "fracture_spacing", Metre, "spacing of the parallel fractures", spacingRange),
			required(&m.FlowPath, &h.FlowPath, "flow_path", Metre, "flow path from injector to producer along a fracture", pathRange),
			required(&m.RockConductivity, &h.RockConductivity, "rock_conductivity", WattPerMetreK, "rock thermal conductivity", conductRange))
	}
	switch m.Fluid {
	case heatmodel.FluidFixed:
		fs = append(fs,
			required(&m.FluidDensity, &h.WaterDensity, "fluid_density", KgPerCubicMetre, "fluid density", fluidDensRange),
			required(&m.FluidHeatCapacity, &h.WaterHeatCapacity, "fluid_heat_capacity", JPerKgK, "fluid specific heat capacity", fluidHeatRange))
	case heatmodel.FluidIF97:
		fs = append(fs,
			required(&m.FluidTemp, &e.fluidTemp, "fluid_temp", Celsius, "mean temperature of the circulated water", if97Temp(rockTempRange)),
			required(&m.FluidPressure, &e.fluidPressure, "fluid_pressure", Megapascal, "mean pressure of the circulated water", if97Pressure(pressureRange)))
	}
	fs = append(fs, required(&m.ConversionEfficiency, &h.ConversionEfficiency, "conversion_efficiency", Fraction,
		"heat-to-electricity conversion efficiency", efficiencyRange))
	return append(fs, plantFields(&m.CapacityFactor, &h.CapacityFactor, &m.Life, &h.Life)...)
}

// reportYears returns the report years of m.
func (m *HotRock) reportYears() []float64 {
	if m.ReportYears == nil {
		return DefaultReportYears
	}
	return m.ReportYears
}

// The inputs each hot-rock output depends on, by Field.Base. The rock's
// density and heat capacity cancel from the initial power E0/τ; the
// fractures' inputs (decline = "fractures") shape the decline only.
var (
	hotRockColumn    = slices.Concat(geothermInputs, []string{"min_useful_temp", "max_depth"})
	hotRockRock      = []string{"rock_density", "rock_heat_capacity"}
	hotRockFlow      = []string{"flow_per_area", "fluid_density", "fluid_heat_capacity", "fluid_temp", "fluid_pressure"}
	hotRockFractures = []string{"fracture_spacing", "flow_path", "rock_conductivity"}
	hotRockHeat      = slices.Concat([]string{"area"}, hotRockColumn, hotRockRock)
	hotRockTau       = slices.Concat(hotRockColumn, hotRockRock, hotRockFlow)
	hotRockInitial   = slices.Concat([]string{"area"}, hotRockColumn, hotRockFlow)
	hotRockDecline   = slices.Concat(hotRockHeat, hotRockFlow, hotRockFractures)
	hotRockMined     = slices.Concat(hotRockDecline, []string{"life"})
	hotRockPower     = slices.Concat(hotRockMined, []string{"conversion_efficiency", "capacity_factor"})
)

func (m *HotRock) outputs() []OutputSpec {
	specs := []OutputSpec{
		{Name: "heat_in_place", Unit: "J", Doc: "useful heat in place", Scale: 1, DependsOn: hotRockHeat},
		{Name: "recoverable_heat", Unit: "J", Doc: "heat mined over the life", Scale: 1, DependsOn: hotRockMined},
		{Name: "time_constant", Unit: "years", Doc: "time constant of the decline", Scale: year, DependsOn: hotRockTau},
		{Name: "initial_thermal_power", Unit: "MWth", Doc: "initial thermal power", Scale: mega, DependsOn: hotRockInitial},
	}
	for _, y := range m.reportYears() {
		dep, mirror := hotRockDecline, ""
		if y == 0 {
			// heatmodel.HotRock gives P(0) = InitialPower exactly, for
			// both declines (TestHotRockPowerAtZero).
			dep, mirror = hotRockInitial, "initial_thermal_power"
		}
		specs = append(specs, OutputSpec{Name: fmt.Sprintf("%s_%g_years", DeclineGroup, y), Unit: "MWth",
			Doc: fmt.Sprintf("thermal power at year %g", y), Scale: mega, Group: DeclineGroup, Year: y, DependsOn: dep,
			Mirror: mirror})
	}
	return append(specs,
		OutputSpec{Name: "thermal_power", Unit: "MWth", Doc: "mean thermal power over the life", Scale: mega, DependsOn: hotRockMined},
		OutputSpec{Name: "electric_power", Unit: "MWe", Doc: "electric capacity", Scale: mega, DependsOn: hotRockPower},
	)
}

func (m *HotRock) newEvaluator() evaluator {
	e := &hotRockEval{fluid: m.Fluid, years: len(m.reportYears())}
	for _, y := range m.reportYears() {
		e.h.ReportTimes = append(e.h.ReportTimes, y*year)
	}
	e.h.Decline = m.Decline
	e.freeze = m.Geotherm.prepare(&e.geo)
	e.dst = dsts(m.fields(e))
	return e
}

// hotRockEval evaluates the hot-rock model on one goroutine.
type hotRockEval struct {
	fluid                    heatmodel.FluidSource
	years                    int
	h                        heatmodel.HotRock
	geo                      heatmodel.GeothermColumns
	freeze                   bool // build the one geotherm of fixed parameters on the first batch
	fluidTemp, fluidPressure heatmodel.Column
	evalBase
}

func (e *hotRockEval) evaluate(n int, out [][]float64) (int, error) {
	if e.freeze {
		if err := e.geo.Freeze(); err != nil {
			return 0, err
		}
		e.freeze = false
	}
	h := e.h
	switch {
	case e.geo.Mode == heatmodel.GeothermGradient:
		h.Gradient = e.geo.Gradient // one gradient per trial, as before geotherms had columns
	case !e.geo.Fixed.IsZero():
		h.Geotherm = e.geo.Fixed
	default:
		h.Columns = &e.geo
	}
	if e.fluid == heatmodel.FluidIF97 {
		var err error
		if h.WaterDensity, h.WaterHeatCapacity, err = e.fs.LiquidProperties(n, e.fluidPressure, e.fluidTemp); err != nil {
			return 0, err
		}
	}
	k := e.years
	return h.Evaluate(n, heatmodel.HotRockOutputs{
		HeatInPlace: out[0], Recovered: out[1], TimeConstant: out[2], InitialPower: out[3],
		PowerAt: out[4 : 4+k], MeanPower: out[4+k], ElectricPower: out[5+k],
	}), nil
}

// check reports a geotherm given twice or not at all, bad report years,
// a fracture block that cannot hold its fractures, and a column in which
// no trial can hold useful heat.
func (m *HotRock) check(p *problems, c *checked) {
	m.checkYears(p)
	mode, ok := m.Geotherm.check(p, c, fieldOf(c.fields, &m.Gradient).label())
	if m.Decline == heatmodel.DeclineFractures {
		checkFractures(p, c, &m.Area, &m.FractureSpacing, &m.FlowPath)
	} else if !m.drawFractures {
		for _, q := range []*Quantity{&m.FractureSpacing, &m.FlowPath, &m.RockConductivity} {
			if q.Given() {
				p.setting("model", 0, "fracture inputs are given but the decline is exponential; set decline = \"fractures\", or remove them")
				break
			}
		}
	}
	if ok {
		m.checkColumn(p, c, mode)
		if _, zMax, given := c.span(&m.MaxDepth); given {
			f := fieldOf(c.fields, &m.MaxDepth)
			m.Geotherm.checkPeak(p, c, mode, f.unit().ToSI(zMax), f.label())
		}
	}
}

// checkFractures reports a block that cannot hold one fracture, or whose
// flow path is longer than the block: judged on the smallest area and the
// longest path and widest spacing any trial can meet.
func checkFractures(p *problems, c *checked, area, spacing, path *Quantity) {
	aLo, _, ok1 := c.span(area)
	_, sHi, ok2 := c.span(spacing)
	_, lHi, ok3 := c.span(path)
	if !ok1 || !ok2 || !ok3 {
		return
	}
	a := SquareKilometre.ToSI(aLo) // m²
	name := fieldOf(c.fields, path).label()
	switch {
	case lHi > math.Sqrt(a):
		p.input(name, "reaches %g m, longer than the side of the smallest block, √(%g km²) = %.4g m: the flow path runs within the block; shorten it or enlarge the area", lHi, aLo, math.Sqrt(a))
	case a < lHi*sHi:
		p.input(name, "with a spacing of up to %g m, a block of %g km² holds fewer than one fracture of %g m; narrow the spacing or enlarge the area", sHi, aLo, lHi)
	}
}

// checkYears checks the report years.
func (m *HotRock) checkYears(p *problems) {
	if m.ReportYears == nil {
		return
	}
	ys := m.ReportYears
	switch {
	case len(ys) == 0:
		p.setting("report_years", 0, "is empty; list the years to report the power at, e.g. [0, 10, 20, 30]")
		return
	case len(ys) > MaxReportYears:
		p.setting("report_years", 0, "lists %d years, more than the %d a report can show; list fewer, e.g. every 5 or 10 years", len(ys), MaxReportYears)
		return
	}
	for i, y := range ys {
		if math.IsNaN(y) || math.IsInf(y, 0) || y < 0 || (i > 0 && y <= ys[i-1]) {
			p.setting("report_years", 0, "= %v must list increasing times ≥ 0 in years, e.g. [0, 10, 20, 30]", ys)
			return
		}
	}
}

// checkColumn reports a column in which no trial can hold useful heat:
// the minimum useful temperature is reached, even in the hottest case,
// only below the maximum depth.
func (m *HotRock) checkColumn(p *problems, c *checked, mode heatmodel.GeothermMode) {
	_, tsHi, ok1 := c.span(&m.SurfaceTemp)
	tmLo, _, ok2 := c.span(&m.MinUsefulTemp)
	topLo, _, ok3 := c.span(&m.TopDepth)
	_, zMax, ok4 := c.span(&m.MaxDepth)
	prof, ok5 := m.Geotherm.hottest(c, mode)
	if !ok1 || !ok2 || !ok3 || !ok4 || !ok5 {
		return
	}
	z1 := math.Max(prof.Depth(tmLo-tsHi)/1000, topLo) // km, shallowest possible
	if z1 >= zMax {
		where := fmt.Sprintf("at %.3g km", z1)
		if math.IsInf(z1, 1) {
			where = "at no depth (the geotherm peaks below it)"
		}
		p.input(fieldOf(c.fields, &m.MaxDepth).label(), "reaches at most %g km, but even the hottest trial reaches %s only %s: no trial has useful heat; drill deeper, lower %s, or check the geotherm",
			zMax, fieldOf(c.fields, &m.MinUsefulTemp).Name(), where, fieldOf(c.fields, &m.MinUsefulTemp).Name())
	}
}
