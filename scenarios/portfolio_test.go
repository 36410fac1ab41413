package scenarios

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"rockheat/sampler"
)

func TestBundledPortfolio(t *testing.T) {
	t.Parallel()
	names := BundledPortfolios()
	if len(names) == 0 {
		t.Fatal("no bundled portfolio")
	}
	for _, name := range names {
		pf, err := LoadPortfolio(name)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		p := pf.Portfolio
		if len(p.Prospects) < 4 || len(p.Shared) == 0 || len(p.Correlations) == 0 {
			t.Errorf("%s: %d prospects, %d shared inputs, %d correlations; the demo needs at least 4, 1, 1", name, len(p.Prospects), len(p.Shared), len(p.Correlations))
		}
		if got := p.Prospects[0].Factors; len(got) != 2 || got[0].Name != "permeability" {
			t.Errorf("%s: first prospect's factors %+v", name, got)
		}
		for _, pr := range p.Prospects {
			if len(pr.Run.SourceSHA256) != 64 {
				t.Errorf("%s: prospect %s has no scenario hash", name, pr.Name)
			}
		}
	}
}

// TestPortfolioFileProblems feeds one mistake at a time.
func TestPortfolioFileProblems(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	ex, err := LookupExample("demo")
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "a.toml"), ex.Text, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "bad.toml"), []byte("title = \"bad\"\n[inputs]\narea_km2 = -1\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	good := `title = "P"
[[prospects]]
name = "a"
scenario = "a.toml"
chance_of_success = 0.5
[[prospects]]
name = "b"
scenario = "demo"
chance_of_success = 0.4
`
	cases := []struct{ name, src, want string }{
		{"unknown factor", strings.Replace(good, "chance_of_success = 0.5", "chance_of_success = { temprature = 0.5 }", 1),
			`prospects[1].chance_of_success.temprature: is not a chance factor rockheat knows (did you mean "temperature"?)`},
		{"missing chance", strings.Replace(good, "chance_of_success = 0.4\n", "", 1), "prospects[2]: needs chance_of_success"},
		{"empty chance table", strings.Replace(good, "chance_of_success = 0.5", "chance_of_success = {}", 1),
			"prospects[1].chance_of_success: is an empty table"},
		{"bad scenario", strings.Replace(good, `"a.toml"`, `"bad.toml"`, 1), "bad.toml:3: inputs.area_km2: = -1 is outside"},
		{"no such scenario", strings.Replace(good, `"a.toml"`, `"none.toml"`, 1), `prospects[1]: scenario "none.toml"`},
		{"chance above 1", strings.Replace(good, "0.4", "1.4", 1), "prospects[2]: chance of success = 1.4 must be a probability"},
		{"unknown prospect", good + "[[correlations]]\nprospects = [\"a\", \"z\"]\nrank = 0.5\n", `correlations[1]: "z" is not a prospect`},
		{"typo key", good + "[run]\ntrails = 5\n", `run.trails: unknown key (did you mean "run.trials"?)`},
		{"bad sampling", good + "[run]\nsampling = \"sobol\"\n", `run.sampling: = "sobol" is not a sampling method; use "lhs"`},
		{"negative seed", good + "[run]\nseed = -3\n", "run.seed: = -3 must be a whole number ≥ 0"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParsePortfolio(filepath.Join(dir, "p.toml"), dir, []byte(c.src))
			var ps Problems
			if !errors.As(err, &ps) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("err = %v, want %q", err, c.want)
			}
		})
	}
	if _, err := ParsePortfolio(filepath.Join(dir, "p.toml"), dir, []byte(good)); err != nil {
		t.Errorf("good portfolio: %v", err)
	}
	// The [run] table: what scenario files take, and a capacity target.
	run := good + "[run]\ntrials = 1234\nseed = 9\nsampling = \"random\"\ntarget_mwe = 20\n"
	pf, err := ParsePortfolio(filepath.Join(dir, "p.toml"), dir, []byte(run))
	if err != nil {
		t.Fatalf("portfolio with a [run] table: %v", err)
	}
	if p := pf.Portfolio; p.Trials != 1234 || p.Seed != 9 || p.Sampling != sampler.Random || p.TargetMWe != 20 {
		t.Errorf("[run] read as trials %d, seed %d, sampling %v, target %g MWe; want 1234, 9, random, 20", p.Trials, p.Seed, p.Sampling, p.TargetMWe)
	}
}
