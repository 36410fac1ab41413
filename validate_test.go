package rockheat

import (
	"errors"
	"strings"
	"testing"

	"rockheat/heatmodel"
	"rockheat/sampler"
)

// goReservoir is a complete reservoir model built in Go, with the area in
// its own unit (a zero Unit: km²) and the rest in named units.
func goReservoir(t *testing.T) *Reservoir {
	t.Helper()
	area, err := sampler.NewTriangular(3, 6, 14)
	if err != nil {
		t.Fatal(err)
	}
	return &Reservoir{
		Area: Quantity{Dist: area}, Thickness: Fixed(1000, Metre), ReservoirTemp: Fixed(230, Celsius),
		Porosity: Fixed(0.05, Fraction), RockDensity: Fixed(2650, KgPerCubicMetre), RockHeatCapacity: Fixed(900, JPerKgK),
		FluidDensity: Fixed(850, KgPerCubicMetre), FluidHeatCapacity: Fixed(4600, JPerKgK),
		RecoveryFactor: Fixed(0.15, Fraction), ConversionEfficiency: Fixed(0.11, Fraction),
		CapacityFactor: Fixed(0.9, Fraction), Life: Fixed(30, Year),
	}
}

// inputErrors returns the InputErrors of err, failing if it has none.
func inputErrors(t *testing.T, err error) InputErrors {
	t.Helper()
	var es InputErrors
	if !errors.As(err, &es) {
		t.Fatalf("err = %v, want InputErrors", err)
	}
	return es
}

// TestMissingInputIsAnError is the defect of a map of inputs read by key:
// a Go caller who leaves out the thickness got heat in place 0 and no
// error. Estimate must refuse the run and name the input.
func TestMissingInputIsAnError(t *testing.T) {
	t.Parallel()
	m := goReservoir(t)
	m.Thickness = Quantity{}
	res, err := Estimate(&Run{Title: "missing thickness", Trials: 100, Model: m}, Options{})
	if res != nil {
		t.Fatalf("Estimate ran a model without a thickness: P50 heat %g", res.Outputs[0].Summary.P50)
	}
	es := inputErrors(t, err)
	if len(es) != 1 || es[0].Input != "thickness_m" || !es[0].Missing || !strings.Contains(es[0].Msg, "reservoir thickness (m) is required") {
		t.Errorf("errors = %v, want one: thickness_m missing", es)
	}
}

// TestValidateProblems checks each kind of problem a Go caller can make,
// one at a time, by the input or setting it names and a phrase of its fix.
func TestValidateProblems(t *testing.T) {
	t.Parallel()
	normal := func(mean, sd float64) sampler.Distribution {
		d, err := sampler.NewNormal(mean, sd, -inf, inf)
		if err != nil {
			t.Fatal(err)
		}
		return d
	}
	cases := []struct {
		name  string
		edit  func(r *Run, m *Reservoir)
		where string // Input or Setting at fault
		want  string
	}{
		{"value outside its domain", func(_ *Run, m *Reservoir) { m.Porosity = Fixed(1.2, Fraction) },
			"porosity", "outside the valid range [0, 1)"},
		{"wrong dimension", func(_ *Run, m *Reservoir) { m.Area = Fixed(5, Celsius) },
			"area_c", "a unit of temperature; give it in a unit of area such as km²"},
		{"tail beyond the domain", func(_ *Run, m *Reservoir) { m.RecoveryFactor = Quantity{Dist: normal(0.1, 0.1)} },
			"recovery_factor", "add min = 0 and max = 1 to truncate it"},
		{"no model", func(r *Run, _ *Reservoir) { r.Model = nil }, "model", "set Model"},
		{"negative trials", func(r *Run, _ *Reservoir) { r.Trials = -5 }, "trials", "positive number of trials"},
		{"correlated fixed input", func(r *Run, _ *Reservoir) {
			r.Correlations = []Correlation{{Inputs: [2]string{"area_km2", "porosity"}, Rank: 0.5}}
		}, "correlations", "only inputs with a distribution can be correlated"},
		{"correlated unknown input", func(r *Run, _ *Reservoir) {
			r.Correlations = []Correlation{{Inputs: [2]string{"area_km2", "volume"}, Rank: 0.5}}
		}, "correlations", `"volume" is not an input of this run`},
		{"IF97 without a pressure", func(_ *Run, m *Reservoir) { m.Fluid = heatmodel.FluidIF97 },
			"reservoir_pressure_mpa", "needs the fluid pressure"},
		{"IF97 above 350 °C", func(_ *Run, m *Reservoir) {
			m.Fluid, m.Depth, m.ReservoirTemp = heatmodel.FluidIF97, Fixed(2000, Metre), Fixed(380, Celsius)
		}, "reservoir_temp_c", "above the 350 °C limit of IAPWS-IF97"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := goReservoir(t)
			r := &Run{Title: c.name, Trials: 100, Model: m}
			c.edit(r, m)
			es := inputErrors(t, r.Validate())
			for _, e := range es {
				if (e.Input == c.where || e.Setting == c.where) && strings.Contains(e.Msg, c.want) {
					return
				}
			}
			t.Errorf("errors = %v, want one at %s saying %q", es, c.where, c.want)
		})
	}
}

// TestTailTruncatedToDomain: a normal whose tail crosses a physical limit
// with negligible probability (< 1e-6, the stated tail rule) is cut at the
// limit, so no draw leaves the domain; the caller's quantity is unchanged.
func TestTailTruncatedToDomain(t *testing.T) {
	t.Parallel()
	m := goReservoir(t)
	d, err := sampler.NewNormal(0.5, 0.08, -inf, inf) // P(X < 0) = Φ(−6.25) ≈ 2e-10
	if err != nil {
		t.Fatal(err)
	}
	m.CapacityFactor = Quantity{Dist: d}
	c, err := (&Run{Title: "tail", Model: m}).resolve()
	if err != nil {
		t.Fatal(err)
	}
	in := c.inputs[c.byQ[&m.CapacityFactor]]
	if lo, hi := in.dist.Support(); lo != 0 || hi != 1 {
		t.Errorf("support = [%g, %g], want [0, 1]", lo, hi)
	}
	if lo, _ := m.CapacityFactor.Dist.Support(); lo != -inf {
		t.Errorf("the caller's distribution was changed: lower limit %g", lo)
	}
}

// TestUnitsConvert: the same reservoir with its area in m² and its
// temperatures in K gives the same heat in place as in km² and °C, since
// 1 km² = 10⁶ m² and T(K) = T(°C) + 273.15 (SI definitions); and the
// inputs are named in the units given.
func TestUnitsConvert(t *testing.T) {
	t.Parallel()
	km := goReservoir(t)
	si := goReservoir(t)
	si.Area = Fixed(6e6, SquareMetre)
	km.Area = Fixed(6, SquareKilometre)
	si.ReservoirTemp = Fixed(230+273.15, Kelvin)
	si.ReferenceTemp = Fixed(15+273.15, Kelvin)
	var heat [2]float64
	for i, m := range []*Reservoir{km, si} {
		res, err := Estimate(&Run{Title: "units", Trials: 10, Model: m}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		heat[i] = res.Outputs[0].Summary.P50
		if i == 1 && (res.Inputs[0].Key != "area_m2" || res.Inputs[2].Key != "reservoir_temp_k") {
			t.Errorf("inputs named %s, %s; want area_m2, reservoir_temp_k", res.Inputs[0].Key, res.Inputs[2].Key)
		}
	}
	// Q = A·h·ρC·ΔT = 6e6 m² · 1000 m · (0.95·2650·900 + 0.05·850·4600) J/(m³·K) · 215 K, by hand:
	// ρC = 2265750 + 195500 = 2461250 J/(m³·K); Q = 6e9 · 2461250 · 215 = 1.47675e16 · 215 = 3.1750125e18 J.
	for i, h := range heat {
		if d := h/3.1750125e18 - 1; d > 1e-12 || d < -1e-12 {
			t.Errorf("case %d: heat in place %.10g J, want 3.1750125e18", i, h)
		}
	}
}
