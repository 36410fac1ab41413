package rockheat

import (
	"fmt"
	"math"
	"slices"

	"rockheat/heatmodel"
)

// Reservoir is the volumetric reservoir model (heatmodel.Reservoir) with
// its inputs. Field comments give the SI unit of each quantity and, in
// brackets, the input's own unit: a Quantity with a zero Unit is in that.
type Reservoir struct {
	// Fluid selects fluid density and heat capacity from the inputs
	// (FluidDensity, FluidHeatCapacity) or from IAPWS-IF97 at the
	// reservoir temperature and ReservoirPressure or Depth.
	Fluid heatmodel.FluidSource
	// Conversion selects the route to electric capacity: a
	// ConversionEfficiency, or the exergy route with a
	// UtilizationEfficiency.
	Conversion heatmodel.Conversion

	Area      Quantity // m² (km²), > 0
	Thickness Quantity // m, > 0
	// ReservoirTemp (K (°C)) is the mean reservoir temperature; or leave
	// it out and give the SurfaceTemp (K (°C)), the TopDepth (m) of the
	// reservoir and the Geotherm: the reservoir's temperature is then the
	// exact mean of the geotherm over the reservoir's thickness.
	ReservoirTemp Quantity
	SurfaceTemp   Quantity
	TopDepth      Quantity
	Geotherm
	ReferenceTemp     Quantity // K (°C), reference temperature; default 15 °C
	Porosity          Quantity // fraction, [0, 1)
	RockDensity       Quantity // kg/m³, > 0
	RockHeatCapacity  Quantity // J/(kg·K), > 0
	FluidDensity      Quantity // kg/m³, > 0; with FluidFixed
	FluidHeatCapacity Quantity // J/(kg·K), > 0; with FluidFixed
	// ReservoirPressure (Pa (MPa), > 0) or Depth (m, > 0, for a
	// hydrostatic pressure, heatmodel.Hydrostatic): one of them with
	// FluidIF97; with a geotherm, leave both out for the hydrostatic
	// pressure at the reservoir's middle, TopDepth + Thickness/2.
	ReservoirPressure     Quantity
	Depth                 Quantity
	RecoveryFactor        Quantity // fraction, (0, 1]
	ConversionEfficiency  Quantity // fraction, (0, 1]; with ConversionEfficiency
	UtilizationEfficiency Quantity // fraction, (0, 1]; with ConversionExergy
	CapacityFactor        Quantity // fraction, (0, 1]
	Life                  Quantity // s (years), > 0
}

// Kind returns heatmodel.KindReservoir.
func (*Reservoir) Kind() heatmodel.Kind { return heatmodel.KindReservoir }

// Settings returns m's fluid property source and conversion route.
func (m *Reservoir) Settings() (heatmodel.FluidSource, heatmodel.Conversion) {
	return m.Fluid, m.Conversion
}

// Fields returns the inputs of m in its settings.
func (m *Reservoir) Fields() []Field { return m.fields(&reservoirEval{}) }

// fields lists m's inputs, their SI columns bound to those of e.
func (m *Reservoir) fields(e *reservoirEval) []Field {
	r := &e.r
	fs := []Field{
		required(&m.Area, &r.Area, "area", SquareKilometre, "reservoir area", areaRange),
		required(&m.Thickness, &r.Thickness, "thickness", Metre, "reservoir thickness", thicknessRange),
		alternative(required(&m.ReservoirTemp, &r.ReservoirTemp, "reservoir_temp", Celsius, "mean reservoir temperature", m.tempRange())),
		alternative(required(&m.SurfaceTemp, &e.surface, "surface_temp", Celsius, "mean surface temperature", surfaceTempRange)),
		alternative(required(&m.TopDepth, &e.top, "top_depth", Metre, "depth of the reservoir's top", Ranges{Domain{Lo: 0, Hi: 20000}, Domain{Lo: 0, Hi: 10000}})),
	}
	fs = append(fs, m.Geotherm.fields(&e.geo)...)
	fs = append(fs,
		defaulted(required(&m.ReferenceTemp, &r.ReferenceTemp, "reference_temp", Celsius,
			"reference (rejection, dead-state) temperature", refTempRange), 15),
		required(&m.Porosity, &r.Porosity, "porosity", Fraction, "porosity", porosityRange),
		required(&m.RockDensity, &r.RockDensity, "rock_density", KgPerCubicMetre, "rock (grain) density", rockDensityRange),
		required(&m.RockHeatCapacity, &r.RockHeatCapacity, "rock_heat_capacity", JPerKgK, "rock specific heat capacity", rockHeatRange),
	)
	switch m.Fluid {
	case heatmodel.FluidFixed:
		fs = append(fs,
			required(&m.FluidDensity, &r.FluidDensity, "fluid_density", KgPerCubicMetre, "fluid density", fluidDensRange),
			required(&m.FluidHeatCapacity, &r.FluidHeatCapacity, "fluid_heat_capacity", JPerKgK, "fluid specific heat capacity", fluidHeatRange))
	case heatmodel.FluidIF97:
		fs = append(fs,
			alternative(required(&m.ReservoirPressure, &e.pressure, "reservoir_pressure", Megapascal, "reservoir fluid pressure", m.pressureRange())),
			alternative(required(&m.Depth, &e.depth, "depth", Metre,
				"depth of the reservoir's middle, for a hydrostatic pressure", m.depthRange())))
	}
	fs = append(fs, required(&m.RecoveryFactor, &r.RecoveryFactor, "recovery_factor", Fraction,
		"fraction of heat in place recovered at the wellhead", recoveryRange))
	switch m.Conversion {
	case heatmodel.ConversionEfficiency:
		fs = append(fs, required(&m.ConversionEfficiency, &r.ConversionEfficiency, "conversion_efficiency", Fraction,
			"heat-to-electricity conversion efficiency", efficiencyRange))
	case heatmodel.ConversionExergy:
		fs = append(fs, required(&m.UtilizationEfficiency, &e.utilization, "utilization_efficiency", Fraction,
			"utilization efficiency of the available work", utilizationRange))
	}
	return append(fs, plantFields(&m.CapacityFactor, &r.CapacityFactor, &m.Life, &r.Life)...)
}

// plantFields are the plant inputs every kind ends with.
func plantFields(cf *Quantity, cfDst *heatmodel.Column, life *Quantity, lifeDst *heatmodel.Column) []Field {
	return []Field{
		required(cf, cfDst, "capacity_factor", Fraction, "fraction of the time the plant runs at full output", capacityRange),
		required(life, lifeDst, "life", Year, "plant life", lifeRange),
	}
}

// The inputs each reservoir output depends on, by Field.Base.
var (
	reservoirHeat = slices.Concat([]string{"area"}, reservoirTemp, []string{"reference_temp", "porosity", "rock_density",
		"rock_heat_capacity", "fluid_density", "fluid_heat_capacity", "reservoir_pressure", "depth"})
	// The reservoir's mean temperature: given, or from the geotherm.
	reservoirTemp        = slices.Concat([]string{"thickness", "reservoir_temp"}, geothermInputs)
	reservoirRecoverable = slices.Concat(reservoirHeat, []string{"recovery_factor"})
	reservoirThermal     = slices.Concat(reservoirRecoverable, []string{"life"})
	reservoirElectric    = slices.Concat(reservoirThermal, []string{"conversion_efficiency", "utilization_efficiency", "capacity_factor"})
	// The power density Pe/A does not depend on the area, which cancels.
	reservoirDensity = reservoirElectric[1:]
)

func (m *Reservoir) outputs() []OutputSpec {
	specs := []OutputSpec{
		{Name: "heat_in_place", Unit: "J", Doc: "heat in place", Scale: 1, DependsOn: reservoirHeat},
		{Name: "recoverable_heat", Unit: "J", Doc: "recoverable heat", Scale: 1, DependsOn: reservoirRecoverable},
		{Name: "thermal_power", Unit: "MWth", Doc: "mean thermal power over the life", Scale: mega, DependsOn: reservoirThermal},
		{Name: "electric_power", Unit: "MWe", Doc: "electric capacity", Scale: mega, DependsOn: reservoirElectric},
		{Name: "power_density", Unit: "MWe/km²", Doc: "implied power density", Scale: 1, DependsOn: reservoirDensity},
	}
	if m.fromGeotherm() {
		specs = append(specs, OutputSpec{Name: "reservoir_temp", Unit: "°C", Doc: "mean reservoir temperature, from the geotherm",
			Scale: 1, Offset: celsiusZero, DependsOn: reservoirTemp})
	}
	return specs
}

// fromGeotherm reports whether m takes its reservoir temperature from a
// geotherm rather than as an input.
func (m *Reservoir) fromGeotherm() bool { return !m.ReservoirTemp.Given() }

// check reports a missing or doubled way to the IF97 fluid pressure, a
// temperature given twice or not at all, and a reservoir that cannot hold
// heat.
func (m *Reservoir) check(p *problems, c *checked) {
	if m.checkTemperature(p, c) {
		checkHeat(p, c, &m.ReservoirTemp, &m.ReferenceTemp)
	}
	if m.Fluid == heatmodel.FluidIF97 {
		pf, zf := fieldOf(c.fields, &m.ReservoirPressure), fieldOf(c.fields, &m.Depth)
		switch hasP, hasZ := m.ReservoirPressure.Given(), m.Depth.Given(); {
		case hasP && hasZ:
			p.input(zf.label(), "give either %s or %s (for a hydrostatic pressure), not both", pf.label(), zf.label())
		case !hasP && !hasZ && m.TopDepth.Given():
			m.checkMidDepth(p, c, zf)
		case !hasP && !hasZ:
			p.add(&InputError{Input: pf.label(), Missing: true,
				Msg: "fluid \"if97\" needs the fluid pressure: give " + pf.label() + ", or " + zf.label() + " for a hydrostatic pressure (or a geotherm, whose reservoir middle gives the depth)"})
		}
	}
}

// checkMidDepth checks the depth of a hydrostatic pressure taken at the
// reservoir's middle, TopDepth + Thickness/2 (a geotherm, no pressure or
// depth given), against the valid range of depth zf.
func (m *Reservoir) checkMidDepth(p *problems, c *checked, zf Field) {
	_, topHi, ok1 := c.span(&m.TopDepth)
	_, hHi, ok2 := c.span(&m.Thickness)
	if !ok1 || !ok2 {
		return
	}
	tf, hf := fieldOf(c.fields, &m.TopDepth), fieldOf(c.fields, &m.Thickness)
	valid := zf.Ranges.Valid
	z := tf.unit().ToSI(topHi) + hf.unit().ToSI(hHi)/2 // m
	if !valid.Contains(zf.unit().FromSI(z)) {
		p.input(tf.label(), "with no %s the fluid pressure is hydrostatic at the reservoir's middle, which reaches %.5g m; %s; keep the reservoir shallower, or give %s", zf.label(), z, valid.Why, fieldOf(c.fields, &m.ReservoirPressure).label())
	}
}

// checkTemperature checks the reservoir temperature, given or from a
// geotherm, and reports whether it is given as an input.
func (m *Reservoir) checkTemperature(p *problems, c *checked) bool {
	tf := fieldOf(c.fields, &m.ReservoirTemp)
	geo := m.SurfaceTemp.Given() || m.TopDepth.Given() || m.Geotherm.given()
	switch {
	case m.ReservoirTemp.Given() && geo:
		p.input(tf.label(), "give either the reservoir temperature or a geotherm (surface_temp_c, top_depth_m and a gradient, heat flow or [[layers]]), not both")
		return false
	case m.ReservoirTemp.Given():
		return true
	case !geo:
		p.add(&InputError{Input: tf.label(), Missing: true, Msg: fmt.Sprintf("missing: the %s (%s) is required, or a geotherm: surface_temp_c, top_depth_m and gradient_c_per_km (or a heat flow, or [[layers]])", tf.Doc, tf.unit().Symbol)})
		return false
	}
	for _, q := range []*Quantity{&m.SurfaceTemp, &m.TopDepth} {
		if !q.Given() {
			f := fieldOf(c.fields, q)
			p.add(&InputError{Input: f.label(), Missing: true, Msg: fmt.Sprintf("missing: the %s (%s) is required with a geotherm", f.Doc, f.unit().Symbol)})
		}
	}
	mode, ok := m.Geotherm.check(p, c, fieldOf(c.fields, &m.Gradient).label())
	if ok && (m.Fluid == heatmodel.FluidIF97 || m.Conversion == heatmodel.ConversionExergy) {
		m.checkGeothermIF97(p, c, mode)
	}
	_, topHi, ok1 := c.span(&m.TopDepth)
	_, hHi, ok2 := c.span(&m.Thickness)
	if ok && ok1 && ok2 {
		tf := fieldOf(c.fields, &m.TopDepth)
		m.Geotherm.checkPeak(p, c, mode, tf.unit().ToSI(topHi)+hHi, tf.label())
	}
	return false
}

// checkGeothermIF97 reports a geotherm that can make the reservoir hotter
// than IF97 region 1 holds, judged on its hottest case at the deepest
// reservoir.
func (m *Reservoir) checkGeothermIF97(p *problems, c *checked, mode heatmodel.GeothermMode) {
	_, tsHi, ok1 := c.span(&m.SurfaceTemp)
	_, topHi, ok2 := c.span(&m.TopDepth)
	_, hHi, ok3 := c.span(&m.Thickness)
	prof, ok4 := m.Geotherm.hottest(c, mode)
	if !ok1 || !ok2 || !ok3 || !ok4 {
		return
	}
	if t := tsHi + prof.MeanRise(topHi, topHi+hHi); t > if97MaxTempC {
		p.input(fieldOf(c.fields, &m.TopDepth).label(), "with the hottest geotherm the reservoir reaches a mean of %.4g °C, above the %s; keep the deepest reservoir cooler", t, fmt.Sprintf("%d °C %s", if97MaxTempC, if97Why))
	}
}

// checkHeat reports a reservoir in which no trial can hold heat: even the
// hottest reservoir temperature is at or below the coldest reference.
func checkHeat(p *problems, c *checked, tr, tref *Quantity) {
	_, hot, ok1 := c.span(tr)
	cold, _, ok2 := c.span(tref)
	if ok1 && ok2 && hot <= cold {
		p.input(fieldOf(c.fields, tr).label(), "reaches at most %g °C, but the reference temperature is at least %g °C: no trial holds heat; check both temperatures", hot, cold)
	}
}

// Limits of IAPWS-IF97 region 1 (compressed liquid).
const (
	if97MaxTempC     = 350 // °C, 623.15 K
	if97MaxPressureM = 100 // MPa
	if97Why          = "the limit of IAPWS-IF97 region 1 (liquid water), which fluid = \"if97\" and conversion = \"exergy\" use"
)

// if97Temp returns r with its valid range cut at the IF97 region 1 limit.
func if97Temp(r Ranges) Ranges {
	r.Valid = r.Valid.below(if97MaxTempC, fmt.Sprintf("%d °C is %s", if97MaxTempC, if97Why))
	return r
}

// if97Pressure returns r with its valid range cut at the IF97 region 1 limit.
func if97Pressure(r Ranges) Ranges {
	r.Valid = r.Valid.below(if97MaxPressureM, fmt.Sprintf("%d MPa is %s", if97MaxPressureM, if97Why))
	return r
}

// tempRange is the range of m's reservoir temperature: IF97's when the
// fluid or the conversion route takes water properties from it.
func (m *Reservoir) tempRange() Ranges {
	if m.Fluid == heatmodel.FluidIF97 || m.Conversion == heatmodel.ConversionExergy {
		return if97Temp(rockTempRange)
	}
	return rockTempRange
}

func (m *Reservoir) pressureRange() Ranges { return if97Pressure(pressureRange) }

// depthRange is the range of the depth of a hydrostatic pressure: down to
// where the pressure reaches the IF97 limit.
func (m *Reservoir) depthRange() Ranges {
	r := depthRange
	zMax := math.Floor(heatmodel.HydrostaticDepth(if97MaxPressureM * 1e6))
	r.Valid = r.Valid.below(zMax, fmt.Sprintf("at %g m a cold water column reaches %d MPa, %s", zMax, if97MaxPressureM, if97Why))
	return r
}

func (m *Reservoir) newEvaluator() evaluator {
	e := &reservoirEval{fluid: m.Fluid, conversion: m.Conversion, hasPressure: m.ReservoirPressure.Given(),
		geotherm: m.fromGeotherm()}
	e.midDepth = e.geotherm && !e.hasPressure && !m.Depth.Given()
	if e.geotherm {
		e.freeze = m.Geotherm.prepare(&e.geo)
	}
	e.dst = dsts(m.fields(e))
	return e
}

// reservoirEval evaluates the reservoir model on one goroutine.
type reservoirEval struct {
	fluid                        heatmodel.FluidSource
	conversion                   heatmodel.Conversion
	hasPressure                  bool
	r                            heatmodel.Reservoir
	geotherm                     bool // the temperature is the mean of geo over the reservoir
	midDepth                     bool // a hydrostatic pressure at top + thickness/2, into mid
	mid                          []float64
	freeze                       bool // build the one geotherm of fixed parameters on the first batch
	geo                          heatmodel.GeothermColumns
	surface, top                 heatmodel.Column
	pressure, depth, utilization heatmodel.Column
	evalBase
}

func (e *reservoirEval) evaluate(n int, out [][]float64) (int, error) {
	r := e.r // the columns set for this batch; fluid steps replace some
	if e.geotherm {
		// Into the reservoir_temp output itself, which the model reads and
		// does not write.
		tr, err := e.meanTemperatures(n, r.Thickness, out[5][:n])
		if err != nil {
			return 0, err
		}
		r.ReservoirTemp = tr
	}
	if e.fluid == heatmodel.FluidIF97 {
		p := e.pressure
		if !e.hasPressure {
			z := e.depth
			if e.midDepth {
				z = e.midDepths(n, r.Thickness)
			}
			p = e.fs.HydrostaticColumn(n, z)
		}
		var err error
		if r.FluidDensity, r.FluidHeatCapacity, err = e.fs.LiquidProperties(n, p, r.ReservoirTemp); err != nil {
			return 0, err
		}
	}
	if e.conversion == heatmodel.ConversionExergy {
		eff, err := e.fs.ExergyEfficiency(n, e.utilization, r.ReservoirTemp, r.ReferenceTemp)
		if err != nil {
			return 0, err
		}
		r.ConversionEfficiency = eff
	}
	return r.Evaluate(n, heatmodel.ReservoirOutputs{
		HeatInPlace: out[0], RecoverableHeat: out[1], ThermalPower: out[2], ElectricPower: out[3], PowerDensity: out[4],
	}), nil
}

// midDepths returns the depth, m, of each trial's reservoir middle,
// top + thickness/2.
func (e *reservoirEval) midDepths(n int, thickness heatmodel.Column) heatmodel.Column {
	if len(e.mid) < n {
		e.mid = make([]float64, n)
	}
	for i := range e.mid[:n] {
		e.mid[i] = e.top.At(i) + thickness.At(i)/2
	}
	return heatmodel.Vary(e.mid[:n])
}

// meanTemperatures returns, written into t, each trial's reservoir
// temperature, K: the
// exact mean of its geotherm over the reservoir, Ts + MeanRise(top,
// top + thickness). With fixed fluid properties the heat in place is
// linear in the temperature, so the mean gives it exactly; with IF97
// fluid or the exergy route (ρf·cf and W/Qr depend on the temperature)
// it is an approximation, close while the temperature varies little over
// the thickness.
func (e *reservoirEval) meanTemperatures(n int, thickness heatmodel.Column, t []float64) (heatmodel.Column, error) {
	if e.freeze {
		if err := e.geo.Freeze(); err != nil {
			return heatmodel.Column{}, err
		}
		e.freeze = false
	}
	for i := range t[:n] {
		p, err := e.geo.At(i)
		if err != nil {
			return heatmodel.Column{}, err
		}
		top := e.top.At(i)
		t[i] = e.surface.At(i) + p.MeanRise(top, top+thickness.At(i))
	}
	return heatmodel.Vary(t), nil
}

// fieldOf returns the field of quantity q.
func fieldOf(fields []Field, q *Quantity) Field {
	for _, f := range fields {
		if f.Q == q {
			return f
		}
	}
	panic("rockheat: no field for a quantity of the model")
}
