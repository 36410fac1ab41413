package rockheat

import (
	"rockheat/heatmodel"
)

// PowerDensity is the analog model: the electric capacity of a prospect as
// its area times the power density of producing fields of its kind
// (Wilmarth & Stimac 2014, docs/references.md §3), a cross-check on the
// volumetric estimate.
type PowerDensity struct {
	Area    Quantity // m² (km²), > 0
	Density Quantity // W/m² (MWe/km²), > 0: electric capacity per unit area
}

// Kind returns heatmodel.KindPowerDensity.
func (*PowerDensity) Kind() heatmodel.Kind { return heatmodel.KindPowerDensity }

// Settings returns the defaults: the kind takes no fluid or conversion.
func (*PowerDensity) Settings() (heatmodel.FluidSource, heatmodel.Conversion) {
	return heatmodel.FluidFixed, heatmodel.ConversionEfficiency
}

// Fields returns the inputs of m.
func (m *PowerDensity) Fields() []Field { return m.fields(&powerDensityEval{}) }

// powerDensityRange is the range of power densities: producing fields
// above 200 °C span about 2–50 MWe/km² (Wilmarth & Stimac 2014).
var powerDensityRange = Ranges{Domain{Lo: 0, Hi: 1000, LoOpen: true}, Domain{Lo: 0.5, Hi: 60}}

func (m *PowerDensity) fields(e *powerDensityEval) []Field {
	return []Field{
		required(&m.Area, &e.area, "area", SquareKilometre, "area of the prospect", areaRange),
		required(&m.Density, &e.density, "power_density", MWePerKm2, "power density of analogous producing fields", powerDensityRange),
	}
}

func (*PowerDensity) outputs() []OutputSpec {
	return []OutputSpec{{Name: "electric_power", Unit: "MWe", Doc: "electric capacity", Scale: mega,
		DependsOn: []string{"area", "power_density"}}}
}

func (*PowerDensity) check(*problems, *checked) {}

func (m *PowerDensity) newEvaluator() evaluator {
	e := &powerDensityEval{}
	e.dst = dsts(m.fields(e))
	return e
}

type powerDensityEval struct {
	evalBase
	area, density heatmodel.Column
}

func (e *powerDensityEval) evaluate(n int, out [][]float64) (int, error) {
	for i := range n {
		out[0][i] = heatmodel.PowerDensityCapacity(e.area.At(i), e.density.At(i))
	}
	return 0, nil
}
