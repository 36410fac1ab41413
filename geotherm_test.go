package rockheat_test

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"rockheat"
	"rockheat/scenarios"
)

// reservoirWith is a reservoir scenario with every input fixed but the
// temperature lines given.
func reservoirWith(temperature string) string {
	return `title = "Geotherm reservoir (invented)"
[inputs]
area_km2 = 4
thickness_m = 1000
` + temperature + `
porosity = 0.05
rock_density_kg_m3 = 2650
rock_heat_capacity_j_kgk = 900
fluid_density_kg_m3 = 900
fluid_heat_capacity_j_kgk = 4300
recovery_factor = 0.15
conversion_efficiency = 0.1
capacity_factor = 0.9
life_years = 30
`
}

func figure(t *testing.T, r *rockheat.Result, name string) float64 {
	t.Helper()
	for _, o := range r.Outputs {
		if o.Spec.Name == name {
			return o.Summary.P50
		}
	}
	t.Fatalf("no output %s", name)
	return 0
}

// TestReservoirFromGeotherm: a reservoir's temperature from a geotherm is
// the exact mean of T(z) over its thickness, so the run equals one given
// that mean temperature. By hand (docs/references.md §6):
//
//	gradient: Ts = 12 °C, G = 35 °C/km, top 2 km, h = 1 km:
//	  T̄ = 12 + 35·2.5 = 99.5 °C
//	heat flow: Ts = 10 °C, q0 = 65 mW/m², k = 2.5 W/(m·K), A = 1 µW/m³:
//	  T(z) = 10 + 0.026·z − 2e-7·z², mean of z over 2–3 km 2500 m,
//	  mean of z² (3000³ − 2000³)/(3·1000) = 6.33333e6 m²:
//	  T̄ = 10 + 65 − 1.266667 = 73.733333 °C
//	layers: 0–1.5 km at 50 °C/km, then 20 °C/km; Ts = 10 °C, reservoir 1–3 km:
//	  T(1 km) = 60, T(1.5 km) = 85, T(3 km) = 115 °C;
//	  T̄ = [(60 + 85)/2·0.5 + (85 + 115)/2·1.5]/2 = (36.25 + 150)/2 = 93.125 °C
func TestReservoirFromGeotherm(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name, geo string
		top       float64 // m
		tbar      float64 // °C, by hand
	}{
		{"gradient", "surface_temp_c = 12\ntop_depth_m = 2000\ngradient_c_per_km = 35", 2000, 99.5},
		{"heat flow", "surface_temp_c = 10\ntop_depth_m = 2000\nheat_flow_mw_m2 = 65\nconductivity_w_mk = 2.5\nheat_production_uw_m3 = 1", 2000, 73.7333333333},
		{"layers", "surface_temp_c = 10\ntop_depth_m = 1000", 1000, 93.125},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			src := reservoirWith(c.geo)
			if c.name == "layers" {
				src += "[[layers]]\nbottom_km = 1.5\ngradient_c_per_km = 50\n[[layers]]\nbottom_km = 10\ngradient_c_per_km = 20\n"
				src = strings.Replace(src, "thickness_m = 1000", "thickness_m = 2000", 1)
			}
			geo, err := rockheat.Estimate(&mustParse(t, src).Run, rockheat.Options{Trials: 3})
			if err != nil {
				t.Fatal(err)
			}
			if got := figure(t, geo, "reservoir_temp"); math.Abs(got-c.tbar) > 1e-9 {
				t.Errorf("mean reservoir temperature %.10g °C, want %.10g by hand", got, c.tbar)
			}
			direct := reservoirWith("reservoir_temp_c = " + strconv.FormatFloat(c.tbar, 'g', -1, 64))
			if c.name == "layers" {
				direct = strings.Replace(direct, "thickness_m = 1000", "thickness_m = 2000", 1)
			}
			want, err := rockheat.Estimate(&mustParse(t, direct).Run, rockheat.Options{Trials: 3})
			if err != nil {
				t.Fatal(err)
			}
			if a, b := figure(t, geo, "heat_in_place"), figure(t, want, "heat_in_place"); math.Abs(a/b-1) > 1e-9 {
				t.Errorf("heat in place %g J from the geotherm, %g J from its mean temperature", a, b)
			}
		})
	}
}

// hotRockText returns the bundled hot-rock demo's text.
func hotRockText(t *testing.T) string {
	t.Helper()
	ex, err := scenarios.LookupExample("hot-rock-demo")
	if err != nil {
		t.Fatal(err)
	}
	return string(ex.Text)
}

// TestHotRockDeclinesAgree: the exponential and the fracture declines of
// one hot-rock column share its useful heat E0 and initial power
// E0/τ = ρw·cw·Q·(T̄ − Tmin) (docs/references.md §5, §11), trial by trial
// (the same draws: the fracture inputs are fixed); the fracture model with
// a wide spacing keeps less of its power than the well-mixed one does
// late in the life, as water short-circuits through few fractures.
func TestHotRockDeclinesAgree(t *testing.T) {
	t.Parallel()
	ex := hotRockText(t)
	frac := strings.Replace(ex, "report_years = [0, 10, 20, 30]", "report_years = [0, 10, 20, 30]\ndecline = \"fractures\"", 1)
	frac = strings.Replace(frac, "life_years = 30", "life_years = 30\nfracture_spacing_m = 200\nflow_path_m = 800\nrock_conductivity_w_mk = 2.8", 1)
	opt := rockheat.Options{Trials: 4000, KeepSamples: true}
	e, err := rockheat.Estimate(&mustParse(t, ex).Run, opt)
	if err != nil {
		t.Fatal(err)
	}
	f, err := rockheat.Estimate(&mustParse(t, frac).Run, opt)
	if err != nil {
		t.Fatal(err)
	}
	col := func(r *rockheat.Result, name string) []float64 {
		for j, n := range r.Samples.Names {
			if n == name {
				return r.Samples.Columns[j]
			}
		}
		t.Fatalf("no column %s", name)
		return nil
	}
	for _, name := range []string{"heat_in_place", "initial_thermal_power"} {
		a, b := col(e, name), col(f, name)
		for i := range a {
			if a[i] != 0 && math.Abs(b[i]/a[i]-1) > 1e-9 {
				t.Fatalf("trial %d: %s %g (exponential) vs %g (fractures)", i, name, a[i], b[i])
			}
		}
	}
	if a, b := figure(t, e, "thermal_power_at_30_years"), figure(t, f, "thermal_power_at_30_years"); !(b < a) {
		t.Errorf("power at 30 years: fractures %g MWth, exponential %g; 200 m spacing should cool faster", b, a)
	}
}

// TestLayerBottomRangeNotRejected: a hot layer whose bottom is uncertain
// can reach the minimum useful temperature above the maximum depth in
// some trials only; the scenario must run, not be refused as "no trial
// has useful heat". With Ts = 10 °C, 60 °C/km above a bottom b uniform on
// [1, 5] km and 10 °C/km below, T(5 km) = 10 + 60·b + 10·(5 − b) =
// 60 + 50·b °C, so 250 °C is reached above 5 km when b ≥ 3.8 km: in 30 %
// of trials (analytic); checked to 5 binomial standard errors.
func TestLayerBottomRangeNotRejected(t *testing.T) {
	t.Parallel()
	src := strings.Replace(hotRockText(t), "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 40 }\n", "", 1)
	src = strings.Replace(src, "surface_temp_c = { dist = \"normal\", mean = 10, sd = 1.5 }", "surface_temp_c = 10", 1)
	src = strings.Replace(src, "min_useful_temp_c = 150", "min_useful_temp_c = 250", 1)
	src = strings.Replace(src, "max_depth_km = { dist = \"uniform\", min = 5, max = 6.5 }", "max_depth_km = 5", 1)
	src += `
[[layers]]
bottom_km = { dist = "uniform", min = 1, max = 5 }
gradient_c_per_km = 60

[[layers]]
bottom_km = 20
gradient_c_per_km = 10
`
	const n = 20000
	res, err := rockheat.Estimate(&mustParse(t, src).Run, rockheat.Options{Trials: n})
	if err != nil {
		t.Fatal(err)
	}
	got := 1 - float64(res.ZeroHeatTrials)/n
	if se := math.Sqrt(0.3 * 0.7 / n); math.Abs(got-0.3) > 5*se {
		t.Errorf("%.4f of trials hold useful heat, want 0.3 ± %.4f", got, 5*se)
	}
}

// TestGeothermPeakAboveRock: one rock under a surface heat flow q0 with
// heat production A peaks at q0/A (the heat flow q0 − A·z falls to zero;
// docs/references.md §6): 0.080 W/m² / 8e-6 W/m³ = 10 km, 160 K above the
// surface (q0²/(2kA), k = 2.5 W/(m·K)). A hot-rock column mined to 12 km
// would use rock below the peak and is refused, naming max_depth_km and
// the 10 km; to 9 km (158 K, above the 140 K the demo's 150 °C needs) it
// runs.
func TestGeothermPeakAboveRock(t *testing.T) {
	t.Parallel()
	src := strings.Replace(hotRockText(t), "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 40 }",
		"heat_flow_mw_m2 = 80\nconductivity_w_mk = 2.5\nheat_production_uw_m3 = 8", 1)
	for _, c := range []struct {
		maxDepth string
		refused  bool
	}{{"12", true}, {"9", false}} {
		s := strings.Replace(src, "max_depth_km = { dist = \"uniform\", min = 5, max = 6.5 }", "max_depth_km = "+c.maxDepth, 1)
		_, err := scenarios.Parse("test.toml", []byte(s))
		switch {
		case c.refused && (err == nil || !strings.Contains(err.Error(), "max_depth_km") || !strings.Contains(err.Error(), "peak at 10 km")):
			t.Errorf("max depth %s km: err = %v, want a refusal naming max_depth_km and the 10 km peak", c.maxDepth, err)
		case !c.refused && err != nil:
			t.Errorf("max depth %s km: %v", c.maxDepth, err)
		}
	}
}

// TestIF97PressureAtReservoirMiddle: with IF97 fluid and a geotherm, and
// neither a pressure nor a depth, the fluid pressure is hydrostatic at the
// reservoir's middle, top + thickness/2, trial by trial: each trial of a
// run with a sampled thickness equals a run of that trial's thickness
// with depth_m given as its middle (the hydrostatic column of
// docs/references.md §2).
func TestIF97PressureAtReservoirMiddle(t *testing.T) {
	t.Parallel()
	if97 := func(thickness, depth string) string {
		src := reservoirWith("surface_temp_c = 12\ntop_depth_m = 2000\ngradient_c_per_km = 35" + depth)
		src = strings.Replace(src, "thickness_m = 1000", "thickness_m = "+thickness, 1)
		src = strings.Replace(src, "fluid_density_kg_m3 = 900\nfluid_heat_capacity_j_kgk = 4300\n", "", 1)
		return strings.Replace(src, "[inputs]", "[model]\nfluid = \"if97\"\n[inputs]", 1)
	}
	run, err := rockheat.Estimate(&mustParse(t, if97(`{ dist = "uniform", min = 200, max = 1800 }`, "")).Run,
		rockheat.Options{Trials: 50, KeepSamples: true})
	if err != nil {
		t.Fatal(err)
	}
	col := func(name string) []float64 {
		for j, n := range run.Samples.Names {
			if n == name {
				return run.Samples.Columns[j]
			}
		}
		t.Fatalf("no sample column %s", name)
		return nil
	}
	h, q := col("thickness_m"), col("heat_in_place")
	for _, i := range []int{0, 17, 49} {
		th := strconv.FormatFloat(h[i], 'g', -1, 64)
		mid := strconv.FormatFloat(2000+h[i]/2, 'g', -1, 64)
		one, err := rockheat.Estimate(&mustParse(t, if97(th, "\ndepth_m = "+mid)).Run, rockheat.Options{Trials: 1})
		if err != nil {
			t.Fatal(err)
		}
		if want := one.Outputs[0].Summary.Mean; math.Abs(q[i]/want-1) > 1e-12 {
			t.Errorf("trial %d (thickness %s m): heat in place %.15g J, %.15g J with depth_m = %s", i, th, q[i], want, mid)
		}
	}
}
