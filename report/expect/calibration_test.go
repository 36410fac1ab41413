package expect

import (
	"strings"
	"sync"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"rockheat"
	"rockheat/scenarios"
)

// calibrationScenario is a small invented reservoir whose reservoir
// temperature lies at or below the reference temperature in 5 % of trials,
// so that the zero-heat count is compared too.
const calibrationScenario = `title = "Calibration block (invented)"
[run]
trials = 1000
sampling = "random"
[inputs]
area_km2 = { dist = "triangular", min = 2, mode = 4, max = 9 }
thickness_m = { dist = "uniform", min = 500, max = 1500 }
reservoir_temp_c = { dist = "uniform", min = 12.5, max = 62.5 }
reference_temp_c = 15
porosity = { dist = "pert", min = 0.05, mode = 0.1, max = 0.2 }
rock_density_kg_m3 = 2650
rock_heat_capacity_j_kgk = { dist = "normal", mean = 900, sd = 50 }
fluid_density_kg_m3 = 1000
fluid_heat_capacity_j_kgk = 4180
recovery_factor = { dist = "uniform", min = 0.1, max = 0.25 }
conversion_efficiency = 0.05
capacity_factor = 0.9
life_years = 30
`

// parse reads the scenario text src.
func parse(t testing.TB, src string) *scenarios.Scenario {
	t.Helper()
	s, err := scenarios.Parse("calibration.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// runScenario runs s with seed, as rockheat run does.
func runScenario(s *scenarios.Scenario, seed uint64) (*rockheat.Result, error) {
	return rockheat.Estimate(&s.Run, rockheat.Options{Seed: &seed, Workers: 1})
}

// record runs s with seed and returns its expectation.
func record(s *scenarios.Scenario, seed uint64) (*Expectation, error) {
	res, err := runScenario(s, seed)
	if err != nil {
		return nil, err
	}
	return New(res, "calibration.toml", s.Source, BuildInfo{Module: "rockheat", Version: "(devel)"}), nil
}

// pairChecks runs n pairs of independent runs of s (seeds 2k+1 and 2k+2),
// on two goroutines, and returns compare of each pair.
func pairChecks(t *testing.T, s *scenarios.Scenario, n int, compare func(a, b *Expectation) []Check) [][]Check {
	t.Helper()
	out := make([][]Check, n)
	errs := make([]error, n)
	var wg sync.WaitGroup
	for part := range 2 {
		wg.Go(func() {
			for k := part; k < n; k += 2 {
				a, err := record(s, uint64(2*k+1))
				if err == nil {
					var b *Expectation
					if b, err = record(s, uint64(2*k+2)); err == nil {
						out[k] = compare(a, b)
					}
				}
				errs[k] = err
			}
		})
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			t.Fatal(err)
		}
	}
	return out
}

// binomialRange returns the central range of b holding all but p of its
// probability.
func binomialRange(b distuv.Binomial, p float64) (lo, hi int) {
	for lo = 0; b.CDF(float64(lo)) < p/2; lo++ {
	}
	for hi = int(b.N); 1-b.CDF(float64(hi-1)) < p/2; hi-- {
	}
	return lo, hi
}

// TestCalibration compares pairs of independent runs (different seeds) of
// one small scenario in Statistical mode at a per-figure level of 5 %
// (z = 1.96) and counts, per figure, the pairs that fail. With random
// sampling each figure's failures are Binomial(pairs, 0.05) when the
// tolerances are right; the count must lie in the central 99.9 % of that
// binomial (gonum's distuv.Binomial). The sd tolerance is a bound, so its
// count must only stay below the upper limit. The same pairs, at the
// Bonferroni level over all the scenario's figures (family-wise 5 %), must
// fail no more often than that binomial's upper limit either.
func TestCalibration(t *testing.T) {
	if testing.Short() {
		t.Skip("runs 800 small estimates")
	}
	const pairs, alpha = 400, 0.05
	s := parse(t, calibrationScenario)
	z := BonferroniZ(alpha, 1)
	shape, err := record(s, 1)
	if err != nil {
		t.Fatal(err)
	}
	m := StatFigures(shape)
	zFamily := BonferroniZ(alpha, m)
	family := 0
	var mu sync.Mutex
	checks := pairChecks(t, s, pairs, func(a, b *Expectation) []Check {
		if len(Drifts(Compare(a, b, Tolerance{Mode: Statistical, Z: zFamily}))) > 0 {
			mu.Lock()
			family++
			mu.Unlock()
		}
		return Drifts(Compare(a, b, Tolerance{Mode: Statistical, Z: z}))
	})
	fails := map[string]int{}
	for _, cs := range checks {
		for _, c := range cs {
			fails[c.Figure]++
		}
	}
	lo, hi := binomialRange(distuv.Binomial{N: pairs, P: alpha}, 1e-3)
	t.Logf("acceptance %d … %d of %d pairs", lo, hi, pairs)
	total := 0
	figs := []string{"heat_in_place.p90", "heat_in_place.p50", "heat_in_place.p10", "heat_in_place.mean",
		"electric_power.p50", "electric_power.mean", "zero_heat_trials"}
	for _, fig := range figs {
		n := fails[fig]
		total += n
		t.Logf("%-22s %3d failures (%.1f %%)", fig, n, 100*float64(n)/pairs)
		if n < lo || n > hi {
			t.Errorf("%s failed in %d of %d pairs; a calibrated test at %g fails in %d … %d", fig, n, pairs, alpha, lo, hi)
		}
	}
	t.Logf("all %d figures above: %.2f %% of comparisons", len(figs), 100*float64(total)/float64(pairs*len(figs)))
	for fig, n := range fails {
		if strings.HasSuffix(fig, ".sd") && n > hi {
			t.Errorf("%s failed in %d of %d pairs, above %d", fig, n, pairs, hi)
		}
	}
	t.Logf("family-wise (z = %.3f over %d figures): %d of %d pairs failed (%.1f %%)", zFamily, m, family, pairs, 100*float64(family)/pairs)
	if family > hi {
		t.Errorf("family-wise: %d of %d pairs failed, above %d for a level of %g", family, pairs, hi, alpha)
	}
}

// TestCalibrationLatinHypercube: Latin hypercube estimates vary less than
// independent trials, so the tolerances (from independent-trial standard
// errors) are conservative: every figure fails at most as often as the
// upper limit of Binomial(pairs, 0.05).
func TestCalibrationLatinHypercube(t *testing.T) {
	if testing.Short() {
		t.Skip("runs 400 small estimates")
	}
	const pairs, alpha = 200, 0.05
	s := parse(t, strings.Replace(calibrationScenario, `"random"`, `"lhs"`, 1))
	z := BonferroniZ(alpha, 1)
	fails := map[string]int{}
	for _, cs := range pairChecks(t, s, pairs, func(a, b *Expectation) []Check {
		return Drifts(Compare(a, b, Tolerance{Mode: Statistical, Z: z}))
	}) {
		for _, c := range cs {
			fails[c.Figure]++
		}
	}
	_, hi := binomialRange(distuv.Binomial{N: pairs, P: alpha}, 1e-3)
	total := 0
	for fig, n := range fails {
		total += n
		if n > hi {
			t.Errorf("%s failed in %d of %d LHS pairs, above %d", fig, n, pairs, hi)
		}
	}
	t.Logf("LHS: %d failures over all figures of %d pairs (limit %d per figure): %v", total, pairs, hi, fails)
}
