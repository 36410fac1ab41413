package rockheat_test

import (
	"math"
	"strings"
	"testing"

	"rockheat"
	"rockheat/heatmodel/water"
	"rockheat/scenarios"
)

func estimateFixed(t *testing.T, src string) *rockheat.Result {
	t.Helper()
	res, err := rockheat.Estimate(&mustParse(t, src).Run, rockheat.Options{Trials: 8})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

func p50(t *testing.T, r *rockheat.Result, name string) float64 {
	t.Helper()
	for _, o := range r.Outputs {
		if o.Spec.Name == name {
			if o.Summary.P90 != o.Summary.P10 {
				t.Fatalf("%s varies (%g to %g) in an all-fixed scenario", name, o.Summary.P90, o.Summary.P10)
			}
			return o.Summary.P50
		}
	}
	t.Fatalf("no output %s", name)
	return 0
}

// TestExergyRouteUSGSChain runs the USGS Circular 790 chain with fixed
// inputs and checks it against the derived check values of docs/references.md §8
// (derived from the Circular 790 formulas with IAPWS-IF97 properties):
// A = 10 km², Δz = 1 km, ρC = 2.7 MJ/(m³·K), TR = 250 °C, T0 = 15 °C,
// Rg = 0.25, ηu = 0.4, L = 30 years of 365.25 d, F = 1 →
// Q = 6.345e18 J, Qwh = 1.58625e18 J, WA = 4.380072e17 J, Pe = 185.06 MWe.
// By hand: Pe = ηu·WA/(L·F) = 0.4 · 4.380072e17 / 9.46728e8 s = 185.06 MW.
func TestExergyRouteUSGSChain(t *testing.T) {
	t.Parallel()
	res := estimateFixed(t, `
title = "USGS chain"
[model]
kind = "reservoir"
conversion = "exergy"
[inputs]
area_km2 = 10
thickness_m = 1000
reservoir_temp_c = 250
reference_temp_c = 15
porosity = 0
rock_density_kg_m3 = 2700
rock_heat_capacity_j_kgk = 1000
fluid_density_kg_m3 = 1000
fluid_heat_capacity_j_kgk = 4180
recovery_factor = 0.25
utilization_efficiency = 0.4
capacity_factor = 1
life_years = 30
`)
	if q := p50(t, res, "heat_in_place"); math.Abs(q/6.345e18-1) > 1e-12 {
		t.Errorf("Q = %.7g J, want 6.345e18", q)
	}
	if pe := p50(t, res, "electric_power"); math.Abs(pe/185.06-1) > 5e-5 {
		t.Errorf("Pe = %.6g MWe, want 185.06 (USGS chain, docs/references.md §8)", pe)
	}
}

// TestIF97FluidSaturatedRule: at 250 °C and 3.9 MPa, below the saturation
// pressure (3.9762 MPa, IAPWS-IF97), the stated rule takes saturated
// liquid: ρ = 798.89 kg/m³, cp = 4.865 kJ/(kg·K) (docs/references.md §2, derived
// from IF97). Heat in place by hand with φ = 0.1, rock 2650·900,
// A = 1 km², h = 100 m, ΔT = 235 K:
// Q = 1e6·100·(0.9·2650·900 + 0.1·798.89·4865)·235. A warning counts
// the trials.
func TestIF97FluidSaturatedRule(t *testing.T) {
	t.Parallel()
	src := `
title = "IF97 fluid"
[model]
fluid = "if97"
[inputs]
area_km2 = 1
thickness_m = 100
reservoir_temp_c = 250
porosity = 0.1
rock_density_kg_m3 = 2650
rock_heat_capacity_j_kgk = 900
reservoir_pressure_mpa = 3.9
recovery_factor = 0.1
conversion_efficiency = 0.1
capacity_factor = 1
life_years = 30
`
	res := estimateFixed(t, src)
	want := 1e6 * 100 * (0.9*2650*900 + 0.1*798.89*4865) * 235
	if q := p50(t, res, "heat_in_place"); math.Abs(q/want-1) > 2e-5 {
		t.Errorf("Q = %.7g J, want %.7g", q, want)
	}
	if len(res.Warnings) == 0 || !strings.Contains(res.Warnings[0], "saturation pressure") {
		t.Errorf("warnings %q lack the saturation rule", res.Warnings)
	}
	// At depth_m = 2000 the hydrostatic pressure is 101325 Pa +
	// 1000·9.80665·2000 Pa = 19.714625 MPa (cold column, common practice):
	// compressed liquid, no warning, properties from IF97 region 1
	// (package water, checked against the IAPWS verification tables).
	res = estimateFixed(t, strings.Replace(src, "reservoir_pressure_mpa = 3.9", "depth_m = 2000", 1))
	if len(res.Warnings) != 0 {
		t.Errorf("warnings at 2000 m: %q", res.Warnings)
	}
	st, err := water.Liquid(19.714625e6, 523.15)
	if err != nil {
		t.Fatal(err)
	}
	want = 1e6 * 100 * (0.9*2650*900 + 0.1*st.Density*st.Cp) * 235
	if q := p50(t, res, "heat_in_place"); math.Abs(q/want-1) > 1e-12 {
		t.Errorf("compressed liquid: Q = %.9g J, want %.9g", q, want)
	}
}

// TestHotRockDerivedCheck runs the hot-rock kind with fixed inputs on the
// derived check of docs/references.md §5/§8 (derived from the heat-mining
// formulas): Ts = 15 °C, G = 30 K/km, Tmin = 120 °C, z2 = 6 km,
// ρr·cr = 2600·900, ρw·cw = 1000·4180, V̇/A = 0.5 m³/s per km², A = 1 km² →
// z1 = 3.5 km, E0 = 2.19375e11 J/m² · 1e6 m² = 2.19375e17 J,
// τ = 2.799043e9 s = 88.696 years, P0 = 78.375 MW, P(30 yr) = 55.884 MW.
func TestHotRockDerivedCheck(t *testing.T) {
	t.Parallel()
	res := estimateFixed(t, `
title = "hot-rock check"
[model]
kind = "hot-rock"
report_years = [0, 30]
[inputs]
area_km2 = 1
surface_temp_c = 15
gradient_c_per_km = 30
min_useful_temp_c = 120
max_depth_km = 6
rock_density_kg_m3 = 2600
rock_heat_capacity_j_kgk = 900
flow_per_area_m3_s_km2 = 0.5
fluid_density_kg_m3 = 1000
fluid_heat_capacity_j_kgk = 4180
conversion_efficiency = 0.1
capacity_factor = 1
life_years = 30
`)
	for _, c := range []struct {
		name string
		want float64
		tol  float64
	}{
		{"heat_in_place", 2.19375e17, 1e-12},
		{"time_constant", 88.696, 1e-5},
		{"initial_thermal_power", 78.375, 1e-12},
		{"thermal_power_at_30_years", 55.884, 1e-5},
	} {
		if got := p50(t, res, c.name); math.Abs(got/c.want-1) > c.tol {
			t.Errorf("%s = %.8g, want %.8g", c.name, got, c.want)
		}
	}
	// Energy balance: mean power over the life times the life is the heat
	// mined, E0·(1 − e^(−L/τ)) (the model's closed form).
	mined := p50(t, res, "recoverable_heat")
	if want := 2.19375e17 * (1 - math.Exp(-30/88.696)); math.Abs(mined/want-1) > 1e-5 {
		t.Errorf("heat mined %g J, want %g", mined, want)
	}
	if got := p50(t, res, "thermal_power") * 1e6 * 30 * 365.25 * 86400; math.Abs(got/mined-1) > 1e-12 {
		t.Errorf("mean power × life = %g J, heat mined %g J", got, mined)
	}
}

// TestHotRockLayersEqualGradient: a layered geotherm whose layers share one
// gradient gives the single-gradient result (an identity of the
// piecewise integral).
func TestHotRockLayersEqualGradient(t *testing.T) {
	t.Parallel()
	base := `
title = "layers"
[model]
kind = "hot-rock"
[inputs]
area_km2 = 2
surface_temp_c = 12
%s
min_useful_temp_c = 130
max_depth_km = { dist = "uniform", min = 5, max = 7 }
rock_density_kg_m3 = 2650
rock_heat_capacity_j_kgk = 900
flow_per_area_m3_s_km2 = 0.5
fluid_density_kg_m3 = 1000
fluid_heat_capacity_j_kgk = 4180
conversion_efficiency = 0.1
capacity_factor = 0.9
life_years = 25
%s
`
	one, err := rockheat.Estimate(&mustParse(t, strings.Replace(strings.Replace(base, "%s", "gradient_c_per_km = 32", 1), "%s", "", 1)).Run, rockheat.Options{Trials: 5000})
	if err != nil {
		t.Fatal(err)
	}
	layers := "[[layers]]\nbottom_km = 1.5\ngradient_c_per_km = 32\n[[layers]]\nbottom_km = 4\ngradient_c_per_km = 32\n"
	lay, err := rockheat.Estimate(&mustParse(t, strings.Replace(strings.Replace(base, "%s", "", 1), "%s", layers, 1)).Run, rockheat.Options{Trials: 5000})
	if err != nil {
		t.Fatal(err)
	}
	for j := range one.Outputs {
		a, b := one.Outputs[j].Summary, lay.Outputs[j].Summary
		if math.Abs(a.Mean/b.Mean-1) > 1e-9 || math.Abs(a.P50/b.P50-1) > 1e-9 {
			t.Errorf("%s: one gradient %g / %g, layers %g / %g", one.Outputs[j].Spec.Name, a.Mean, a.P50, b.Mean, b.P50)
		}
	}
}

// TestPowerDensity checks the analog kind, MWe = A × power density
// (docs/references.md §3), and the reservoir's implied power density
// Pe/A, against hand values: 7.7 km² at 12 MWe/km² is 92.4 MWe; the demo
// scenario's figures divide exactly (the area cancels).
func TestPowerDensity(t *testing.T) {
	t.Parallel()
	res, err := rockheat.Estimate(&mustParse(t, `
title = "Analog (invented)"
[model]
kind = "power-density"
[inputs]
area_km2 = 7.7
power_density_mwe_km2 = 12
`).Run, rockheat.Options{Trials: 5})
	if err != nil {
		t.Fatal(err)
	}
	if got := res.Outputs[0].Summary.P50; math.Abs(got-92.4) > 1e-12 {
		t.Errorf("power-density kind: %g MWe, want 92.4", got)
	}
	src := strings.Replace(demoText(t), `area_km2 = { dist = "triangular", min = 3, mode = 6, max = 14 }`, "area_km2 = 5", 1)
	res, err = rockheat.Estimate(&mustParse(t, src).Run, rockheat.Options{Trials: 2000, KeepSamples: true})
	if err != nil {
		t.Fatal(err)
	}
	s := res.Samples
	var pe, pd []float64
	for j, name := range s.Names {
		switch name {
		case "electric_power":
			pe = s.Columns[j]
		case "power_density":
			pd = s.Columns[j]
		}
	}
	for i := range pe {
		if math.Abs(pd[i]*5/pe[i]-1) > 1e-12 {
			t.Fatalf("trial %d: power density %g MWe/km² × 5 km² ≠ %g MWe", i, pd[i], pe[i])
		}
	}
}

// demoText returns the bundled demo scenario's text.
func demoText(t *testing.T) string {
	t.Helper()
	ex, err := scenarios.LookupExample("demo")
	if err != nil {
		t.Fatal(err)
	}
	return string(ex.Text)
}
