package scenarios

import (
	"errors"
	"reflect"
	"strings"
	"testing"

	"rockheat"
)

const hotRock = `
title = "Hot rock test"
[model]
kind = "hot-rock"
report_years = [0, 15, 30]
[inputs]
area_km2 = { dist = "uniform", min = 2, max = 4 }
surface_temp_c = 12
gradient_c_per_km = { dist = "uniform", min = 28, max = 36 }
min_useful_temp_c = 140
max_depth_km = { dist = "uniform", min = 5, max = 6 }
rock_density_kg_m3 = 2650
rock_heat_capacity_j_kgk = { dist = "uniform", min = 850, max = 950 }
flow_per_area_m3_s_km2 = { dist = "uniform", min = 0.3, max = 0.7 }
fluid_density_kg_m3 = 1000
fluid_heat_capacity_j_kgk = 4180
conversion_efficiency = 0.11
capacity_factor = 0.9
life_years = 30
`

func TestParseHotRock(t *testing.T) {
	t.Parallel()
	s, err := Parse("hr.toml", []byte(hotRock))
	if err != nil {
		t.Fatal(err)
	}
	m, ok := s.Run.Model.(*rockheat.HotRock)
	if !ok || len(m.ReportYears) != 3 || m.ReportYears[1] != 15 {
		t.Errorf("model = %+v", s.Run.Model)
	}
	if top, ok := s.Input("top_depth_km"); ok {
		t.Errorf("top_depth_km = %+v, want not given (the run defaults it)", top)
	}
	layered := strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n", "", 1) +
		"[[layers]]\nbottom_km = 2\ngradient_c_per_km = 40\n[[layers]]\nbottom_km = 8\ngradient_c_per_km = 25\n"
	s, err = Parse("hr.toml", []byte(layered))
	if err != nil {
		t.Fatal(err)
	}
	m = s.Run.Model.(*rockheat.HotRock)
	if len(m.Layers) != 2 || m.Layers[1].Gradient.Dist.Quantile(0.5) != 25 || m.Layers[1].Bottom.Dist.Quantile(0.5) != 8 {
		t.Errorf("layers = %+v", m.Layers)
	}
	if _, ok := s.Input("gradient_c_per_km"); ok {
		t.Error("a layered scenario keeps gradient_c_per_km")
	}
}

func TestModelProblems(t *testing.T) {
	t.Parallel()
	withCorr := func(c string) string { return good + "\n" + c }
	cases := []struct {
		name string
		src  string
		want []string
	}{
		{"exergy for hot rock", strings.Replace(hotRock, `kind = "hot-rock"`, "kind = \"hot-rock\"\nconversion = \"exergy\"", 1),
			[]string{"model.conversion", "efficiency"}},
		{"report years out of order", strings.Replace(hotRock, "[0, 15, 30]", "[0, 30, 15]", 1), []string{"model.report_years", "increasing"}},
		{"report years for reservoir", strings.Replace(good, `kind = "reservoir"`, "kind = \"reservoir\"\nreport_years = [1]", 1), []string{"model.report_years", "hot-rock"}},
		{"zero gradient", strings.Replace(hotRock, "min = 28, max = 36", "min = 0, max = 36", 1), []string{"inputs.gradient_c_per_km", "limit"}},
		{"negative gradient", strings.Replace(hotRock, "min = 28, max = 36", "min = -5, max = 36", 1), []string{"inputs.gradient_c_per_km", "outside the valid range"}},
		{"zero flow", strings.Replace(hotRock, "min = 0.3, max = 0.7", "min = 0, max = 0.7", 1), []string{"inputs.flow_per_area_m3_s_km2", "outside the valid range [1e-06, 1000]"}},
		{"too shallow for any heat", strings.Replace(hotRock, "min = 5, max = 6 }", "min = 1, max = 3 }", 1), []string{"inputs.max_depth_km", "no trial has useful heat"}},
		{"layers out of order", strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n", "", 1) +
			"[[layers]]\nbottom_km = 3\ngradient_c_per_km = 40\n[[layers]]\nbottom_km = 2\ngradient_c_per_km = 25\n",
			[]string{"layers[2]", "bottom reaches 2 km, not below layer 1's"}},
		{"layers and gradient", hotRock + "[[layers]]\nbottom_km = 3\ngradient_c_per_km = 40\n", []string{"inputs.gradient_c_per_km", "remove it or the layers"}},
		{"layer gradient zero", strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n", "", 1) +
			"[[layers]]\nbottom_km = 3\ngradient_c_per_km = 0\n", []string{"layers[1].gradient_c_per_km", "outside the valid range (0, 1000]"}},
		{"heat flow with no useful depth", strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n",
			"heat_flow_mw_m2 = 30\nconductivity_w_mk = 3.5\nheat_production_uw_m3 = 3\n", 1), []string{"inputs.max_depth_km", "no trial has useful heat"}},
		{"heat flow without conductivity", strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n",
			"heat_flow_mw_m2 = 80\n", 1), []string{"needs both heat_flow_mw_m2 and conductivity_w_mk"}},
		{"gradient and heat flow", strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n",
			"gradient_c_per_km = 30\nheat_flow_mw_m2 = 80\nconductivity_w_mk = 3\n", 1), []string{"not both"}},
		{"layers of rock without heat flow", strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n", "", 1) +
			"[[layers]]\nbottom_km = 3\nconductivity_w_mk = 2.5\n", []string{"layers", "need the surface heat flow"}},
		{"layers mixed", strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n", "", 1) +
			"[[layers]]\nbottom_km = 3\nconductivity_w_mk = 2.5\n[[layers]]\nbottom_km = 9\ngradient_c_per_km = 30\n", []string{"not a mix"}},
		{"layer typo", strings.Replace(hotRock, "gradient_c_per_km = { dist = \"uniform\", min = 28, max = 36 }\n", "", 1) +
			"[[layers]]\nbottom_km = 3\ngradeint_c_per_km = 30\n", []string{"layers[1].gradeint_c_per_km", `did you mean "gradient_c_per_km"`}},
		{"unknown decline", strings.Replace(hotRock, `kind = "hot-rock"`, "kind = \"hot-rock\"\ndecline = \"linear\"", 1), []string{"model.decline", `"fractures"`}},
		{"decline for reservoir", strings.Replace(good, `kind = "reservoir"`, "kind = \"reservoir\"\ndecline = \"fractures\"", 1), []string{"model.decline", "hot-rock"}},
		{"fracture spacing missing", strings.Replace(hotRock, `kind = "hot-rock"`, "kind = \"hot-rock\"\ndecline = \"fractures\"", 1),
			[]string{"fracture_spacing_m", "missing"}},
		{"flow path longer than the block", strings.Replace(strings.Replace(hotRock, `kind = "hot-rock"`, "kind = \"hot-rock\"\ndecline = \"fractures\"", 1),
			"life_years = 30", "life_years = 30\nfracture_spacing_m = 100\nflow_path_m = 3000\nrock_conductivity_w_mk = 3", 1),
			[]string{"inputs.flow_path_m", "longer than the side of the smallest block"}},
		{"fracture spacing not positive", strings.Replace(strings.Replace(hotRock, `kind = "hot-rock"`, "kind = \"hot-rock\"\ndecline = \"fractures\"", 1),
			"life_years = 30", "life_years = 30\nfracture_spacing_m = 0\nflow_path_m = 500\nrock_conductivity_w_mk = 3", 1),
			[]string{"inputs.fracture_spacing_m", "outside the valid range"}},
		{"reservoir temperature twice", strings.Replace(good, "porosity =", "surface_temp_c = 10\ntop_depth_m = 1500\ngradient_c_per_km = 40\nporosity =", 1),
			[]string{"inputs.reservoir_temp_c", "not both"}},
		{"if97 without pressure", strings.Replace(strings.Replace(good, "fluid_density_kg_m3 = 850\nfluid_heat_capacity_j_kgk = 4600\n", "", 1),
			`kind = "reservoir"`, "kind = \"reservoir\"\nfluid = \"if97\"", 1), []string{"reservoir_pressure_mpa", "depth_m"}},
		{"if97 with both", strings.Replace(strings.Replace(good, "fluid_density_kg_m3 = 850\nfluid_heat_capacity_j_kgk = 4600\n", "reservoir_pressure_mpa = 10\ndepth_m = 1000\n", 1),
			`kind = "reservoir"`, "kind = \"reservoir\"\nfluid = \"if97\"", 1), []string{"inputs.depth_m", "not both"}},
		{"if97 too hot", strings.Replace(strings.Replace(strings.Replace(good, "fluid_density_kg_m3 = 850\nfluid_heat_capacity_j_kgk = 4600\n", "reservoir_pressure_mpa = 20\n", 1),
			`kind = "reservoir"`, "kind = \"reservoir\"\nfluid = \"if97\"", 1), "mean = 235, sd = 12, min = 200", "mean = 340, sd = 12, min = 200", 1),
			[]string{"inputs.reservoir_temp_c", "350 °C"}},
		{"correlation with fixed input", withCorr("[[correlations]]\ninputs = [\"porosity\", \"rock_density_kg_m3\"]\nrank = -0.6\n"),
			[]string{"correlations[1]", "rock_density_kg_m3", "fixed"}},
		{"correlation with unknown input", withCorr("[[correlations]]\ninputs = [\"porosity\", \"porosty\"]\nrank = -0.6\n"),
			[]string{"correlations[1]", "porosty", `did you mean "porosity"`}},
		{"correlation out of range", withCorr("[[correlations]]\ninputs = [\"porosity\", \"area_km2\"]\nrank = 1.5\n"),
			[]string{"correlations", "= 1.5 is outside [-1, 1]"}},
		{"correlations not positive definite", withCorr("[[correlations]]\ninputs = [\"porosity\", \"area_km2\"]\nrank = 0.9\n" +
			"[[correlations]]\ninputs = [\"area_km2\", \"thickness_m\"]\nrank = 0.9\n" +
			"[[correlations]]\ninputs = [\"porosity\", \"thickness_m\"]\nrank = -0.9\n"),
			[]string{"correlations", "porosity", "thickness_m"}},
		{"correlation missing rank", withCorr("[[correlations]]\ninputs = [\"porosity\", \"area_km2\"]\n"), []string{"correlations[1]", "rank"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			_, err := Parse("x.toml", []byte(c.src))
			var ps Problems
			if !errors.As(err, &ps) {
				t.Fatalf("err = %v, want Problems", err)
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("message %q lacks %q", err, w)
				}
			}
		})
	}
}

func TestCorrelationMatrix(t *testing.T) {
	t.Parallel()
	s, err := Parse("x.toml", []byte(good+"\n[[correlations]]\ninputs = [\"porosity\", \"area_km2\"]\nrank = -0.4\n"))
	if err != nil {
		t.Fatal(err)
	}
	want := []rockheat.Correlation{{Inputs: [2]string{"porosity", "area_km2"}, Rank: -0.4}}
	if !reflect.DeepEqual(s.Run.Correlations, want) {
		t.Errorf("correlations = %+v, want %+v", s.Run.Correlations, want)
	}
}
