package rockheat

import (
	"fmt"

	"rockheat/heatmodel"
	"rockheat/scenarios"
)

// Unit conversions from scenario units to SI.
const (
	km2         = 1e6            // m² per km²
	celsiusZero = 273.15         // K at 0 °C
	year        = 365.25 * 86400 // s per Julian year
	mega        = 1e6            // W per MW
)

// OutputSpec names one model output and its unit in reports.
type OutputSpec struct {
	Name  string  // JSON key, e.g. "heat_in_place"
	Unit  string  // unit of reported values: "J", "MWth", "MWe", "years"
	Doc   string  // a few words for the text report
	Scale float64 // reported value = SI value / Scale
	// Group, if not empty, gathers outputs reported as one list, each at
	// its Year (the hot-rock power at each report year).
	Group string
	Year  float64
}

// model evaluates one batch of a model kind. cols maps each input key to
// its column in scenario units; out has one slice per output, in the
// order of outputs(), to fill in SI units.
type model interface {
	outputs() []OutputSpec
	evaluate(n int, cols map[string]heatmodel.Column, out [][]float64, scratch *scratch) (zeroHeat int, err error)
}

// scratch holds a worker's conversion buffers, reused batch after batch,
// and its count of trials whose fluid state was taken at saturation.
type scratch struct {
	bufs      [][]float64
	saturated int
}

// buf returns the i-th buffer of at least n values.
func (s *scratch) buf(i, n int) []float64 {
	for len(s.bufs) <= i {
		s.bufs = append(s.bufs, nil)
	}
	if cap(s.bufs[i]) < n {
		s.bufs[i] = make([]float64, n)
	}
	return s.bufs[i][:n]
}

func modelFor(m scenarios.Model) model {
	switch m.Kind {
	case scenarios.KindReservoir:
		return reservoirModel{if97: m.Fluid == scenarios.FluidIF97, exergy: m.Conversion == scenarios.ConversionExergy}
	case scenarios.KindHotRock:
		return newHotRockModel(m)
	}
	panic("rockheat: no model for kind " + m.Kind)
}

// reservoirModel evaluates the volumetric reservoir kind, with fluid
// properties from the inputs or IF97, and the conversion-efficiency or
// exergy route to electric capacity.
type reservoirModel struct{ if97, exergy bool }

func (reservoirModel) outputs() []OutputSpec {
	return []OutputSpec{
		{Name: "heat_in_place", Unit: "J", Doc: "heat in place", Scale: 1},
		{Name: "recoverable_heat", Unit: "J", Doc: "recoverable heat", Scale: 1},
		{Name: "thermal_power", Unit: "MWth", Doc: "mean thermal power over the life", Scale: mega},
		{Name: "electric_power", Unit: "MWe", Doc: "electric capacity", Scale: mega},
	}
}

func (m reservoirModel) evaluate(n int, c map[string]heatmodel.Column, out [][]float64, s *scratch) (int, error) {
	tr := c["reservoir_temp_c"].Shift(celsiusZero, s.buf(1, n))
	tref := c["reference_temp_c"].Shift(celsiusZero, s.buf(2, n))
	r := heatmodel.Reservoir{
		Area:                 c["area_km2"].Scale(km2, s.buf(0, n)),
		Thickness:            c["thickness_m"],
		ReservoirTemp:        tr,
		ReferenceTemp:        tref,
		Porosity:             c["porosity"],
		RockDensity:          c["rock_density_kg_m3"],
		RockHeatCapacity:     c["rock_heat_capacity_j_kgk"],
		FluidDensity:         c["fluid_density_kg_m3"],
		FluidHeatCapacity:    c["fluid_heat_capacity_j_kgk"],
		RecoveryFactor:       c["recovery_factor"],
		ConversionEfficiency: c["conversion_efficiency"],
		CapacityFactor:       c["capacity_factor"],
		Life:                 c["life_years"].Scale(year, s.buf(3, n)),
	}
	if m.if97 {
		p, ok := c["reservoir_pressure_mpa"]
		if ok {
			p = p.Scale(1e6, s.buf(4, n))
		} else {
			p = c["depth_m"].Map(hydrostatic, s.buf(4, n))
		}
		var err error
		if r.FluidDensity, r.FluidHeatCapacity, err = liquidProps(n, p, tr, s); err != nil {
			return 0, err
		}
	}
	if m.exergy {
		eff, err := exergyEfficiency(n, c["utilization_efficiency"], tr, tref, s)
		if err != nil {
			return 0, err
		}
		r.ConversionEfficiency = eff
	}
	z := r.Evaluate(n, heatmodel.ReservoirOutputs{
		HeatInPlace: out[0], RecoverableHeat: out[1], ThermalPower: out[2], ElectricPower: out[3],
	})
	return z, nil
}

// hotRockModel evaluates the hot-rock (heat-mining) kind.
type hotRockModel struct {
	geotherm heatmodel.Profile // zero unless [[layers]] are given
	years    []float64
	times    []float64 // s
}

func newHotRockModel(m scenarios.Model) *hotRockModel {
	h := &hotRockModel{years: m.ReportYears}
	for _, y := range m.ReportYears {
		h.times = append(h.times, y*year)
	}
	if m.Layered {
		p, err := m.Geotherm()
		if err != nil {
			panic("rockheat: layers passed the scenario checks but not NewProfile: " + err.Error())
		}
		h.geotherm = p
	}
	return h
}

func (h *hotRockModel) outputs() []OutputSpec {
	specs := []OutputSpec{
		{Name: "heat_in_place", Unit: "J", Doc: "useful heat in place", Scale: 1},
		{Name: "recoverable_heat", Unit: "J", Doc: "heat mined over the life", Scale: 1},
		{Name: "time_constant", Unit: "years", Doc: "time constant of the decline", Scale: year},
		{Name: "initial_thermal_power", Unit: "MWth", Doc: "initial thermal power", Scale: mega},
	}
	for _, y := range h.years {
		specs = append(specs, OutputSpec{Name: fmt.Sprintf("thermal_power_at_%g_years", y), Unit: "MWth",
			Doc: fmt.Sprintf("thermal power at year %g", y), Scale: mega, Group: "thermal_power_at", Year: y})
	}
	return append(specs,
		OutputSpec{Name: "thermal_power", Unit: "MWth", Doc: "mean thermal power over the life", Scale: mega},
		OutputSpec{Name: "electric_power", Unit: "MWe", Doc: "electric capacity", Scale: mega},
	)
}

func (h *hotRockModel) evaluate(n int, c map[string]heatmodel.Column, out [][]float64, s *scratch) (int, error) {
	rho, cp := c["fluid_density_kg_m3"], c["fluid_heat_capacity_j_kgk"]
	if _, ok := c["fluid_temp_c"]; ok {
		var err error
		rho, cp, err = liquidProps(n, c["fluid_pressure_mpa"].Scale(1e6, s.buf(10, n)), c["fluid_temp_c"].Shift(celsiusZero, s.buf(11, n)), s)
		if err != nil {
			return 0, err
		}
	}
	hr := heatmodel.HotRock{
		Area:                 c["area_km2"].Scale(km2, s.buf(0, n)),
		SurfaceTemp:          c["surface_temp_c"].Shift(celsiusZero, s.buf(1, n)),
		Geotherm:             h.geotherm,
		MinTemp:              c["min_useful_temp_c"].Shift(celsiusZero, s.buf(2, n)),
		TopDepth:             c["top_depth_km"].Scale(1000, s.buf(3, n)),
		MaxDepth:             c["max_depth_km"].Scale(1000, s.buf(4, n)),
		RockDensity:          c["rock_density_kg_m3"],
		RockHeatCapacity:     c["rock_heat_capacity_j_kgk"],
		Flux:                 c["flow_per_area_m3_s_km2"].Scale(1/km2, s.buf(5, n)),
		WaterDensity:         rho,
		WaterHeatCapacity:    cp,
		ConversionEfficiency: c["conversion_efficiency"],
		CapacityFactor:       c["capacity_factor"],
		Life:                 c["life_years"].Scale(year, s.buf(6, n)),
		ReportTimes:          h.times,
	}
	if h.geotherm.IsZero() {
		hr.Gradient = c["gradient_c_per_km"].Scale(1.0/1000, s.buf(7, n))
	}
	k := len(h.years)
	z := hr.Evaluate(n, heatmodel.HotRockOutputs{
		HeatInPlace: out[0], Recovered: out[1], TimeConstant: out[2], InitialPower: out[3],
		PowerAt: out[4 : 4+k], MeanPower: out[4+k], ElectricPower: out[5+k],
	})
	return z, nil
}
