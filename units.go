package rockheat

import "rockheat/heatmodel"

// Dimension is the physical dimension of a quantity, so that a value given
// in one unit is never read as another kind of quantity.
type Dimension string

// The dimensions of rockheat's inputs.
const (
	DimArea           Dimension = "area"
	DimLength         Dimension = "length"
	DimTemperature    Dimension = "temperature"
	DimFraction       Dimension = "fraction"
	DimDensity        Dimension = "density"
	DimHeatCapacity   Dimension = "specific heat capacity"
	DimTime           Dimension = "time"
	DimPressure       Dimension = "pressure"
	DimGradient       Dimension = "temperature gradient"
	DimFlowPerArea    Dimension = "flow per unit area"
	DimPowerPerArea   Dimension = "power per unit area"
	DimHeatFlow       Dimension = "heat flow"
	DimConductivity   Dimension = "thermal conductivity"
	DimHeatProduction Dimension = "heat production"
)

// Unit is a unit in which an input's values are given, with its affine map
// to SI: si = v·Scale + Offset. Symbol is shown to users ("km²"); Suffix
// ends the input's name in scenario files and reports ("km2", as in
// area_km2), and is empty for a dimensionless fraction.
type Unit struct {
	Symbol, Suffix string
	Dim            Dimension
	Scale, Offset  float64
}

// Conversion factors to SI.
const (
	km2         = 1e6            // m² per km²
	celsiusZero = 273.15         // K at 0 °C
	year        = 365.25 * 86400 // s per Julian year
	mega        = 1e6            // W per MW
)

// The units of scenario files, and the SI units a Go caller may prefer.
var (
	SquareKilometre = Unit{"km²", "km2", DimArea, km2, 0}
	SquareMetre     = Unit{"m²", "m2", DimArea, 1, 0}
	Metre           = Unit{"m", "m", DimLength, 1, 0}
	Kilometre       = Unit{"km", "km", DimLength, 1000, 0}
	Celsius         = Unit{"°C", "c", DimTemperature, 1, celsiusZero}
	Kelvin          = Unit{"K", "k", DimTemperature, 1, 0}
	Fraction        = Unit{"fraction", "", DimFraction, 1, 0}
	KgPerCubicMetre = Unit{"kg/m³", "kg_m3", DimDensity, 1, 0}
	JPerKgK         = Unit{"J/(kg·K)", "j_kgk", DimHeatCapacity, 1, 0}
	Year            = Unit{"years", "years", DimTime, year, 0}
	Second          = Unit{"s", "s", DimTime, 1, 0}
	Megapascal      = Unit{"MPa", "mpa", DimPressure, 1e6, 0}
	Pascal          = Unit{"Pa", "pa", DimPressure, 1, 0}
	CelsiusPerKm    = Unit{"°C/km", "c_per_km", DimGradient, 1.0 / 1000, 0}
	KelvinPerMetre  = Unit{"K/m", "k_per_m", DimGradient, 1, 0}
	FlowPerKm2      = Unit{"m³/s per km²", "m3_s_km2", DimFlowPerArea, 1 / km2, 0}
	MetrePerSecond  = Unit{"m³/s per m²", "m_s", DimFlowPerArea, 1, 0}
	MWePerKm2       = Unit{"MWe/km²", "mwe_km2", DimPowerPerArea, 1, 0} // 1 MW per km² is 1 W/m²
)

// ToSI returns v in SI units.
func (u Unit) ToSI(v float64) float64 { return heatmodel.Const(v).Affine(u.Scale, u.Offset, nil).Const }

// FromSI returns the SI value si in unit u.
func (u Unit) FromSI(si float64) float64 {
	switch {
	case u.Scale == 1 && u.Offset == 0:
		return si
	case u.Offset == 0:
		return si / u.Scale
	case u.Scale == 1:
		return si - u.Offset
	}
	return (si - u.Offset) / u.Scale
}

// column converts a column of values in u into SI, writing into buf.
func (u Unit) column(c heatmodel.Column, buf []float64) heatmodel.Column {
	return c.Affine(u.Scale, u.Offset, buf)
}
