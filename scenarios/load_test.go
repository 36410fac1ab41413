package scenarios

import (
	"bytes"
	"errors"
	"strings"
	"testing"

	"rockheat/sampler"
)

const good = `
title = "Test prospect"
[run]
trials = 5000
seed = 7
sampling = "random"
[model]
kind = "reservoir"
[inputs]
area_km2 = { dist = "triangular", min = 3, mode = 6, max = 14 }
thickness_m = { dist = "uniform", min = 800, max = 1600 }
reservoir_temp_c = { dist = "normal", mean = 235, sd = 12, min = 200 }
porosity = { dist = "pert", min = 0.02, mode = 0.06, max = 0.12 }
rock_density_kg_m3 = 2650
rock_heat_capacity_j_kgk = { dist = "lognormal", p90 = 850, p10 = 1000 }
fluid_density_kg_m3 = 850
fluid_heat_capacity_j_kgk = 4600
recovery_factor = { dist = "uniform", min = 0.08, max = 0.20 }
conversion_efficiency = { dist = "lognormal", mean = 0.11, sd = 0.01, max = 0.2 }
capacity_factor = 0.9
life_years = 30
`

func TestParseGood(t *testing.T) {
	t.Parallel()
	s, err := Parse("good.toml", []byte(good))
	if err != nil {
		t.Fatal(err)
	}
	r := s.Run
	if r.Title != "Test prospect" || r.Trials != 5000 || r.Seed != 7 || r.Sampling != sampler.Random {
		t.Errorf("run settings = %q %d %d %v", r.Title, r.Trials, r.Seed, r.Sampling)
	}
	if ref, ok := s.Input("reference_temp_c"); ok {
		t.Errorf("reference_temp_c = %+v, want not given (the run defaults it)", ref)
	}
	if n := s.InputCount(); n != 13 {
		t.Errorf("%d inputs, want 13 (12 given, reference_temp_c defaulted)", n)
	}
	a, _ := s.Input("area_km2")
	if a.IsFixed() || a.Dist.Quantile(0) != 3 || a.Dist.Quantile(1) != 14 {
		t.Errorf("area_km2 = %v", a.Dist)
	}
}

// TestParseProblems feeds one mistake at a time and checks that the
// message names the key and says what to do.
func TestParseProblems(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name, from, to string
		want           []string // substrings of the message
	}{
		{"typo in key", "porosity =", "porosty =", []string{"inputs.porosty", "unknown input", `did you mean "porosity"`, "inputs.porosity: missing"}},
		{"unknown top key", "[run]", "colour = 3\n[run]", []string{"colour", "unknown key"}},
		{"min > max", "min = 800, max = 1600", "min = 1600, max = 800", []string{"inputs.thickness_m", "less than max"}},
		{"mode outside", "mode = 6,", "mode = 20,", []string{"inputs.area_km2", "mode = 20 lies outside"}},
		{"sd zero", "sd = 12", "sd = 0", []string{"inputs.reservoir_temp_c", "sd = 0 must be > 0"}},
		{"porosity 1", "porosity = { dist = \"pert\", min = 0.02, mode = 0.06, max = 0.12 }", "porosity = 1", []string{"inputs.porosity", "[0, 1)"}},
		{"porosity range", "mode = 0.06, max = 0.12", "mode = 0.06, max = 1.2", []string{"inputs.porosity", "outside the valid range [0, 1)"}},
		{"recovery 0", "recovery_factor = { dist = \"uniform\", min = 0.08, max = 0.20 }", "recovery_factor = 0", []string{"inputs.recovery_factor", "(0, 1]"}},
		{"capacity > 1", "capacity_factor = 0.9", "capacity_factor = 1.5", []string{"inputs.capacity_factor", "[0.01, 1]"}},
		{"life 0", "life_years = 30", "life_years = 0", []string{"inputs.life_years", "= 0 is outside the valid range"}},
		{"negative density", "rock_density_kg_m3 = 2650", "rock_density_kg_m3 = -2650", []string{"inputs.rock_density_kg_m3", "= -2650 is outside the valid range (0, 20000]"}},
		{"negative area", "min = 3, mode = 6", "min = -3, mode = 6", []string{"inputs.area_km2", "outside the valid range"}},
		{"nan", "capacity_factor = 0.9", "capacity_factor = nan", []string{"inputs.capacity_factor", "not a finite number"}},
		{"inf", "life_years = 30", "life_years = inf", []string{"inputs.life_years", "not a finite number"}},
		{"trials 0", "trials = 5000", "trials = 0", []string{"run.trials", "positive"}},
		{"trials huge", "trials = 5000", "trials = 100000000000000", []string{"run.trials", "more than"}},
		{"sampling", `sampling = "random"`, `sampling = "sobol"`, []string{"run.sampling", `"lhs"`}},
		{"kind", `kind = "reservoir"`, `kind = "lake"`, []string{"model.kind", `"lake"`}},
		{"missing input", "life_years = 30\n", "\n", []string{"inputs.life_years: missing"}},
		{"unknown dist", `dist = "uniform", min = 800`, `dist = "gamma", min = 800`, []string{"inputs.thickness_m", `"gamma"`}},
		{"unknown param", "min = 800, max = 1600", "min = 800, max = 1600, mean = 3", []string{"inputs.thickness_m.mean", "not a parameter of a uniform"}},
		{"missing param", "min = 800, max = 1600", "min = 800", []string{"inputs.thickness_m", "needs min, max"}},
		{"string value", "capacity_factor = 0.9", `capacity_factor = "high"`, []string{"inputs.capacity_factor", "neither a number"}},
		{"lognormal mix", "p90 = 850, p10 = 1000", "p90 = 850, sd = 10", []string{"inputs.rock_heat_capacity_j_kgk", "either mean and sd"}},
		{"lognormal p90 > p10", "p90 = 850, p10 = 1000", "p90 = 1000, p10 = 850", []string{"0 < p90 < p10"}},
		{"untruncated normal tail", "mean = 235, sd = 12, min = 200", "mean = 235, sd = 200", []string{"inputs.reservoir_temp_c", "add min = -273.15"}},
		{"missing title", `title = "Test prospect"`, "", []string{"title: missing"}},
		{"syntax", "trials = 5000", "trials = = 5000", []string{"good.toml:4:", "TOML syntax"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			src := strings.Replace(good, c.from, c.to, 1)
			if src == good {
				t.Fatalf("replacement %q not found", c.from)
			}
			_, err := Parse("good.toml", []byte(src))
			var ps Problems
			if !errors.As(err, &ps) {
				t.Fatalf("err = %v, want Problems", err)
			}
			msg := err.Error()
			for _, w := range c.want {
				if !strings.Contains(msg, w) {
					t.Errorf("message %q lacks %q", msg, w)
				}
			}
			for _, line := range strings.Split(msg, "\n") {
				if !strings.HasPrefix(line, "good.toml") {
					t.Errorf("line %q does not name the file", line)
				}
			}
		})
	}
}

// TestAllProblemsAtOnce checks that several mistakes are all reported.
func TestAllProblemsAtOnce(t *testing.T) {
	t.Parallel()
	src := strings.NewReplacer("trials = 5000", "trials = -1", "sd = 12", "sd = -1", "capacity_factor = 0.9", "capacity_factor = 2").Replace(good)
	_, err := Parse("x.toml", []byte(src))
	var ps Problems
	if !errors.As(err, &ps) || len(ps) != 3 {
		t.Fatalf("got %d problems (%v), want 3", len(ps), err)
	}
}

func TestExamplesParse(t *testing.T) {
	t.Parallel()
	exs := Examples()
	if len(exs) == 0 {
		t.Fatal("no bundled examples")
	}
	for _, ex := range exs {
		if _, err := Parse(ex.Name, ex.Text); err != nil {
			t.Errorf("example %s: %v", ex.Name, err)
		}
		if ex.Title == "" || !strings.Contains(strings.ToLower(ex.Title), "invented") {
			t.Errorf("example %s: title %q should say the prospect is invented", ex.Name, ex.Title)
		}
		// The listing shows the opening comment's first line.
		if !bytes.HasPrefix(ex.Text, []byte("# ")) || ex.Description == "" || ex.Description == ex.Title ||
			!bytes.Contains(ex.Text, []byte(ex.Description)) || strings.Contains(ex.Description, "\n") {
			t.Errorf("example %s: description %q should be the first line of an opening comment", ex.Name, ex.Description)
		}
	}
	if _, err := LookupExample("nonesuch"); err == nil || !strings.Contains(err.Error(), "demo") {
		t.Errorf("LookupExample(nonesuch) = %v, want an error listing the examples", err)
	}
}

// FuzzParse feeds the loader arbitrary bytes: it must never panic, and
// must return either a scenario or Problems.
func FuzzParse(f *testing.F) {
	f.Add([]byte(good))
	for _, ex := range Examples() {
		f.Add(ex.Text)
	}
	f.Add([]byte("[inputs]\nporosity = { dist = \"pert\" }"))
	f.Add([]byte("title = 1\n[run]\ntrials = 1e400"))
	f.Fuzz(func(t *testing.T, src []byte) {
		s, err := Parse("fuzz.toml", src)
		if err == nil && s == nil {
			t.Fatal("nil scenario without error")
		}
		var ps Problems
		if err != nil && !errors.As(err, &ps) {
			t.Fatalf("error %v is not Problems", err)
		}
	})
}

func TestDescribe(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ text, want string }{
		{"# An invented prospect.\n# More.\ntitle = \"T\"\n", "An invented prospect."},
		{"#   spaced out  \n", "spaced out"},
		{"##\ntitle = \"T\"\n", "T"},
		{"title = \"T\"\n# late comment\n", "T"},
		{"", "T"},
	} {
		if got := describe([]byte(c.text), "T"); got != c.want {
			t.Errorf("describe(%q) = %q, want %q", c.text, got, c.want)
		}
	}
}
