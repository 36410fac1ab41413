package rockheat

import (
	"fmt"
	"math"
	"strings"

	"rockheat/heatmodel"
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
	// Gradient (K/m (°C/km), > 0) is the geothermal gradient, unless
	// Layers give a piecewise geotherm.
	Gradient Quantity
	Layers   []Layer
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
}

// Layer is one layer of a piecewise geotherm: from the bottom of the layer
// above (or the surface) down to Bottom (m (km), fixed) the rock
// temperature rises at Gradient (K/m (°C/km), fixed). The last layer's
// gradient continues below its bottom.
type Layer struct {
	Bottom, Gradient Quantity
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
		alternative(required(&m.Gradient, &h.Gradient, "gradient", CelsiusPerKm, "geothermal gradient", gradientRange)),
		required(&m.MinUsefulTemp, &h.MinTemp, "min_useful_temp", Celsius, "minimum useful rock temperature", minTempRange),
		defaulted(required(&m.TopDepth, &h.TopDepth, "top_depth", Kilometre, "shallowest depth to draw heat from", topDepthRange), 0),
		required(&m.MaxDepth, &h.MaxDepth, "max_depth", Kilometre, "maximum (drilling) depth", maxDepthRange),
		required(&m.RockDensity, &h.RockDensity, "rock_density", KgPerCubicMetre, "rock (grain) density", rockDensityRange),
		required(&m.RockHeatCapacity, &h.RockHeatCapacity, "rock_heat_capacity", JPerKgK, "rock specific heat capacity", rockHeatRange),
		required(&m.FlowPerArea, &h.Flux, "flow_per_area", FlowPerKm2, "circulated water flow per unit area", flowRange),
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
// density and heat capacity cancel from the initial power E0/τ.
var (
	hotRockColumn  = []string{"surface_temp", "gradient", "min_useful_temp", "top_depth", "max_depth"}
	hotRockRock    = []string{"rock_density", "rock_heat_capacity"}
	hotRockFlow    = []string{"flow_per_area", "fluid_density", "fluid_heat_capacity", "fluid_temp", "fluid_pressure"}
	hotRockHeat    = uses([]string{"area"}, hotRockColumn, hotRockRock)
	hotRockTau     = uses(hotRockColumn, hotRockRock, hotRockFlow)
	hotRockInitial = uses([]string{"area"}, hotRockColumn, hotRockFlow)
	hotRockDecline = uses(hotRockHeat, hotRockFlow)
	hotRockMined   = uses(hotRockDecline, []string{"life"})
	hotRockPower   = uses(hotRockMined, []string{"conversion_efficiency", "capacity_factor"})
)

func (m *HotRock) outputs() []OutputSpec {
	specs := []OutputSpec{
		{Name: "heat_in_place", Unit: "J", Doc: "useful heat in place", Scale: 1, DependsOn: hotRockHeat},
		{Name: "recoverable_heat", Unit: "J", Doc: "heat mined over the life", Scale: 1, DependsOn: hotRockMined},
		{Name: "time_constant", Unit: "years", Doc: "time constant of the decline", Scale: year, DependsOn: hotRockTau},
		{Name: "initial_thermal_power", Unit: "MWth", Doc: "initial thermal power", Scale: mega, DependsOn: hotRockInitial},
	}
	for _, y := range m.reportYears() {
		dep := hotRockDecline
		if y == 0 {
			dep = hotRockInitial
		}
		specs = append(specs, OutputSpec{Name: fmt.Sprintf("%s_%g_years", DeclineGroup, y), Unit: "MWth",
			Doc: fmt.Sprintf("thermal power at year %g", y), Scale: mega, Group: DeclineGroup, Year: y, DependsOn: dep})
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
	if len(m.Layers) > 0 {
		p, err := heatmodel.NewProfile(siLayers(m.Layers))
		if err != nil {
			panic("rockheat: layers passed the checks but not heatmodel.NewProfile: " + err.Error())
		}
		e.h.Geotherm = p
	}
	e.dst = dsts(m.fields(e))
	return e
}

// siLayers returns layers as heatmodel layers, in SI units.
func siLayers(layers []Layer) []heatmodel.Layer {
	hl := make([]heatmodel.Layer, len(layers))
	for i, l := range layers {
		hl[i] = heatmodel.Layer{Bottom: layerUnit(l.Bottom, Kilometre).ToSI(l.Bottom.Dist.Quantile(0.5)),
			Gradient: layerUnit(l.Gradient, CelsiusPerKm).ToSI(l.Gradient.Dist.Quantile(0.5))}
	}
	return hl
}

// layerUnit returns the unit of a layer quantity q whose own unit is u.
func layerUnit(q Quantity, u Unit) Unit {
	if q.Unit == (Unit{}) {
		return u
	}
	return q.Unit
}

// hotRockEval evaluates the hot-rock model on one goroutine.
type hotRockEval struct {
	fluid                    heatmodel.FluidSource
	years                    int
	h                        heatmodel.HotRock
	fluidTemp, fluidPressure heatmodel.Column
	evalBase
}

func (e *hotRockEval) evaluate(n int, out [][]float64) (int, error) {
	h := e.h
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

// check reports a geotherm given twice or not at all, bad layers and
// report years, and a column in which no
// trial can hold useful heat.
func (m *HotRock) check(p *problems, c *checked) {
	gf := fieldOf(c.fields, &m.Gradient)
	switch {
	case len(m.Layers) > 0 && m.Gradient.Given():
		p.input(gf.label(), "is not used when layers give the geotherm; remove it or the layers")
	case len(m.Layers) == 0 && !m.Gradient.Given():
		p.add(&InputError{Input: gf.label(), Missing: true, Msg: fmt.Sprintf("missing: the %s (%s) is required", gf.Doc, gf.unit().Symbol)})
	}
	m.checkYears(p)
	layersOK := m.checkLayers(p)
	if layersOK {
		m.checkColumn(p, c)
	}
}

// checkLayers checks the layers of a piecewise geotherm, and reports
// whether they make one.
func (m *HotRock) checkLayers(p *problems) bool {
	if len(m.Layers) == 0 {
		return true
	}
	ok := true
	for i, l := range m.Layers {
		for _, q := range []struct {
			q    Quantity
			what string
		}{{l.Bottom, "bottom"}, {l.Gradient, "gradient"}} {
			switch {
			case !q.q.Given():
				p.setting("layers", i+1, "each layer needs its %s; give both the bottom depth and the gradient", q.what)
				ok = false
			case !q.q.IsFixed():
				p.setting("layers", i+1, "the layer's %s must be a single value", q.what)
				ok = false
			}
		}
	}
	if !ok {
		return false
	}
	if _, err := heatmodel.NewProfile(siLayers(m.Layers)); err != nil {
		for _, e := range unjoin(err) {
			msg := strings.TrimPrefix(e.Error(), "heatmodel: ")
			msg = strings.NewReplacer(" m ", " km ", " m:", " km:", "K/m", "°C/km").Replace(kmText(msg))
			p.setting("layers", 0, "%s", msg)
		}
		return false
	}
	return true
}

// kmText rewrites the metre and K/m figures of a heatmodel layer message
// in km and °C/km.
func kmText(msg string) string {
	var out []string
	words := strings.Fields(msg)
	for i, w := range words {
		if i+1 < len(words) {
			var v float64
			if _, err := fmt.Sscan(w, &v); err == nil {
				switch strings.TrimRight(words[i+1], ":,;") {
				case "m":
					w = fmt.Sprintf("%g", v/1000)
				case "K/m":
					w = fmt.Sprintf("%g", v*1000)
				}
			}
		}
		out = append(out, w)
	}
	return strings.Join(out, " ")
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
func (m *HotRock) checkColumn(p *problems, c *checked) {
	_, tsHi, ok1 := c.span(&m.SurfaceTemp)
	tmLo, _, ok2 := c.span(&m.MinUsefulTemp)
	topLo, _, ok3 := c.span(&m.TopDepth)
	_, zMax, ok4 := c.span(&m.MaxDepth)
	if !ok1 || !ok2 || !ok3 || !ok4 {
		return
	}
	var prof heatmodel.Profile
	if len(m.Layers) > 0 {
		prof, _ = heatmodel.NewProfile(siLayers(m.Layers))
	} else {
		_, gHi, ok := c.span(&m.Gradient)
		if !ok {
			return
		}
		prof = heatmodel.UniformProfile(CelsiusPerKm.ToSI(gHi))
	}
	z1 := math.Max(prof.Depth(tmLo-tsHi)/1000, topLo) // km, shallowest possible
	if z1 >= zMax {
		p.input(fieldOf(c.fields, &m.MaxDepth).label(), "reaches at most %g km, but even the hottest trial reaches %s only at %.3g km: no trial has useful heat; drill deeper, or lower %s",
			zMax, fieldOf(c.fields, &m.MinUsefulTemp).Name(), z1, fieldOf(c.fields, &m.MinUsefulTemp).Name())
	}
}
