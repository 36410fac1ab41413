package rockheat_test

import (
	"fmt"
	"math"
	"os"
	"reflect"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"rockheat"
	"rockheat/heatmodel"
	"rockheat/sampler"
	"rockheat/scenarios"
	"rockheat/stats"
)

func mustParse(t testing.TB, src string) *scenarios.Scenario {
	t.Helper()
	s, err := scenarios.Parse("test.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// lognormalScenario has four independent lognormal factors of heat in
// place (area, thickness, rock heat capacity, temperature above a 0 °C
// reference) and no porosity, so Q = 1e6·A·h·ρr·cr·Tr is lognormal with
// ln Q ~ N(ln(1e6·ρr) + Σμi, Σσi²).
const lognormalScenario = `
title = "lognormal product"
[run]
trials = 100000
seed = 3
sampling = "%s"
[inputs]
area_km2 = { dist = "lognormal", p90 = 3, p10 = 12 }
thickness_m = { dist = "lognormal", p90 = 600, p10 = 1500 }
reservoir_temp_c = { dist = "lognormal", p90 = 150, p10 = 260 }
reference_temp_c = 0
porosity = 0
rock_density_kg_m3 = 2650
rock_heat_capacity_j_kgk = { dist = "lognormal", p90 = 800, p10 = 1000 }
fluid_density_kg_m3 = 1000
fluid_heat_capacity_j_kgk = 4180
recovery_factor = 0.1
conversion_efficiency = 0.1
capacity_factor = 1
life_years = 30
`

// TestLognormalProduct checks the Monte Carlo P90/P50/P10 of a product of
// independent lognormal inputs against the analytic lognormal quantiles
// (gonum distuv.LogNormal). Tolerance: 5 standard errors of a sample
// quantile of plain Monte Carlo, σ·sqrt(q(1−q)/n)/φ(z_q) in relative terms
// (asymptotic variance of a sample quantile, e.g. Serfling 1980 §2.3);
// Latin hypercube sampling is at least as accurate.
func TestLognormalProduct(t *testing.T) {
	t.Parallel()
	for _, method := range []string{"random", "lhs"} {
		s := mustParse(t, strings.Replace(lognormalScenario, "%s", method, 1))
		mu := math.Log(1e6 * 2650)
		var s2 float64
		for _, pq := range [][2]float64{{3, 12}, {600, 1500}, {150, 260}, {800, 1000}} {
			lo, hi := math.Log(pq[0]), math.Log(pq[1])
			z := distuv.UnitNormal.Quantile(0.9)
			mu += (lo + hi) / 2
			s2 += math.Pow((hi-lo)/(2*z), 2)
		}
		ref := distuv.LogNormal{Mu: mu, Sigma: math.Sqrt(s2)}
		res, err := rockheat.Estimate(&s.Run, rockheat.Options{})
		if err != nil {
			t.Fatal(err)
		}
		q := res.Outputs[0].Summary
		n := float64(res.Trials)
		for _, c := range []struct {
			name string
			got  float64
			prob float64 // non-exceedance probability
		}{{"P90", q.P90, 0.1}, {"P50", q.P50, 0.5}, {"P10", q.P10, 0.9}} {
			want := ref.Quantile(c.prob)
			z := distuv.UnitNormal.Quantile(c.prob)
			tol := 5 * ref.Sigma * math.Sqrt(c.prob*(1-c.prob)/n) / distuv.UnitNormal.Prob(z)
			if rel := math.Abs(c.got/want - 1); rel > tol {
				t.Errorf("%s %s = %.6g J, analytic %.6g J: relative error %.2g > %.2g", method, c.name, c.got, want, rel, tol)
			}
		}
		if !(q.P90 <= q.P50 && q.P50 <= q.P10) {
			t.Errorf("%s: percentiles out of order: %g %g %g", method, q.P90, q.P50, q.P10)
		}
		// The mean of a lognormal is exp(μ + σ²/2); sample mean standard
		// error sd/√n.
		if d := math.Abs(q.Mean - ref.Mean()); d > 5*ref.StdDev()/math.Sqrt(n) {
			t.Errorf("%s mean = %.6g, analytic %.6g", method, q.Mean, ref.Mean())
		}
	}
}

// TestChainIdentities checks that the outputs keep the model's chain for
// every trial of a mixed scenario: recoverable = R·Q, thermal power =
// Qr/L and electric power = η·Qr/(F·L), in report units.
func TestChainIdentities(t *testing.T) {
	t.Parallel()
	ex, err := scenarios.LookupExample("demo")
	if err != nil {
		t.Fatal(err)
	}
	s, err := scenarios.Parse("demo", ex.Text)
	if err != nil {
		t.Fatal(err)
	}
	res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 3000, KeepSamples: true})
	if err != nil {
		t.Fatal(err)
	}
	col := map[string]int{}
	for j, n := range res.Samples.Names {
		col[n] = j
	}
	v := func(name string, i int) float64 { return res.Samples.Value(col[name], i) }
	for i := 0; i < 3000; i++ {
		q := v("heat_in_place", i)
		qr := v("recoverable_heat", i)
		life := v("life_years", i) * 365.25 * 86400
		if got, want := qr, v("recovery_factor", i)*q; math.Abs(got-want) > 1e-12*want {
			t.Fatalf("trial %d: Qr = %g, want R·Q = %g", i, got, want)
		}
		if got, want := v("thermal_power", i), qr/life/1e6; math.Abs(got-want) > 1e-12*want {
			t.Fatalf("trial %d: thermal power %g MW, want %g", i, got, want)
		}
		if got, want := v("electric_power", i), v("conversion_efficiency", i)*qr/(v("capacity_factor", i)*life)/1e6; math.Abs(got-want) > 1e-12*want {
			t.Fatalf("trial %d: electric power %g MW, want %g", i, got, want)
		}
	}
}

// TestWorkersDoNotChangeResults: same seed, bit-identical summaries and
// samples for 1, 2 and 8 workers, over several batches.
func TestWorkersDoNotChangeResults(t *testing.T) {
	t.Parallel()
	ex, _ := scenarios.LookupExample("demo")
	s, err := scenarios.Parse("demo", ex.Text)
	if err != nil {
		t.Fatal(err)
	}
	// The streaming route merges per-worker sketches: also bit-identical.
	var stream *rockheat.Result
	for _, w := range []int{1, 3} {
		res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 300_001, Workers: w, Stream: true})
		if err != nil {
			t.Fatal(err)
		}
		if stream == nil {
			stream = res
			continue
		}
		for j := range res.Outputs {
			a, b := res.Outputs[j].Summary, stream.Outputs[j].Summary
			if !reflect.DeepEqual(a, b) || !reflect.DeepEqual(res.Outputs[j].Curve, stream.Outputs[j].Curve) {
				t.Errorf("streaming, workers %d: %s differs", w, res.Outputs[j].Spec.Name)
			}
		}
	}
	var first *rockheat.Result
	for _, w := range []int{1, 2, 8} {
		res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 300_001, Workers: w, KeepSamples: true})
		if err != nil {
			t.Fatal(err)
		}
		if first == nil {
			first = res
			continue
		}
		for j := range res.Outputs {
			a, b := res.Outputs[j].Summary, first.Outputs[j].Summary
			a.Warnings, b.Warnings = nil, nil
			if !reflect.DeepEqual(a, b) {
				t.Errorf("workers %d: %s summary differs: %+v vs %+v", w, res.Outputs[j].Spec.Name, res.Outputs[j].Summary, first.Outputs[j].Summary)
			}
		}
		for j := range res.Samples.Columns {
			a, b := res.Samples.Columns[j], first.Samples.Columns[j]
			for i := range a {
				if a[i] != b[i] {
					t.Fatalf("workers %d: %s differs at trial %d", w, res.Samples.Names[j], i)
				}
			}
		}
	}
	// Without KeepSamples an exact run selects its order statistics in one
	// pass and draws the sensitivity sample again: the same summaries and
	// sensitivities, bit for bit, as the run that keeps every trial.
	for _, w := range []int{1, 3} {
		res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 300_001, Workers: w})
		if err != nil {
			t.Fatal(err)
		}
		for j := range res.Outputs {
			a, b := res.Outputs[j].Summary, first.Outputs[j].Summary
			a.Warnings, b.Warnings = nil, nil
			if !reflect.DeepEqual(a, b) {
				t.Errorf("selecting, workers %d: %s summary differs: %+v vs %+v", w, res.Outputs[j].Spec.Name, a, b)
			}
		}
		if !reflect.DeepEqual(res.Sensitivity, first.Sensitivity) {
			t.Errorf("selecting, workers %d: sensitivities differ from the kept run's", w)
		}
		if res.ZeroHeatTrials != first.ZeroHeatTrials {
			t.Errorf("selecting, workers %d: %d zero-heat trials, kept run %d", w, res.ZeroHeatTrials, first.ZeroHeatTrials)
		}
	}
}

func BenchmarkEstimate(b *testing.B) {
	ex, _ := scenarios.LookupExample("demo")
	s, err := scenarios.Parse("demo", ex.Text)
	if err != nil {
		b.Fatal(err)
	}
	for _, n := range []int{1_000, 100_000, 1_000_000, 10_000_000} {
		b.Run(fmt.Sprintf("trials=%d", n), func(b *testing.B) {
			for b.Loop() {
				if _, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: n}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// TestStreamingMatchesExact runs the same plain Monte Carlo draws through
// the exact route and the sketch route: percentiles agree within the
// sketch's stated relative error bound (stats.Sketch), and the mean, from
// exact sums in both, is identical.
func TestStreamingMatchesExact(t *testing.T) {
	t.Parallel()
	ex, _ := scenarios.LookupExample("demo")
	s, err := scenarios.Parse("demo", ex.Text)
	if err != nil {
		t.Fatal(err)
	}
	s.Run.Sampling = sampler.Random
	exact, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 300_000})
	if err != nil {
		t.Fatal(err)
	}
	str, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 300_000, Stream: true})
	if err != nil {
		t.Fatal(err)
	}
	if exact.Streaming || !str.Streaming {
		t.Fatalf("streaming flags %v %v", exact.Streaming, str.Streaming)
	}
	for j := range exact.Outputs {
		a, b := exact.Outputs[j].Summary, str.Outputs[j].Summary
		for _, c := range [][2]float64{{a.P90, b.P90}, {a.P50, b.P50}, {a.P10, b.P10}} {
			if math.Abs(c[1]/c[0]-1) > str.SketchRelErr {
				t.Errorf("%s: sketch %g vs exact %g beyond the bound %g", exact.Outputs[j].Spec.Name, c[1], c[0], str.SketchRelErr)
			}
		}
		if a.Mean != b.Mean || a.Min != b.Min || a.Max != b.Max {
			t.Errorf("%s: mean/min/max differ: %g %g %g vs %g %g %g", exact.Outputs[j].Spec.Name, a.Mean, a.Min, a.Max, b.Mean, b.Min, b.Max)
		}
	}
	if exact.ZeroHeatTrials != str.ZeroHeatTrials {
		t.Errorf("zero-heat trials %d vs %d", exact.ZeroHeatTrials, str.ZeroHeatTrials)
	}
}

// TestPrecisionStops checks the stopping rule: the run ends with every
// percentile's interval narrower than asked, and the same for 1 and 2
// workers.
func TestPrecisionStops(t *testing.T) {
	t.Parallel()
	ex, _ := scenarios.LookupExample("demo")
	s, err := scenarios.Parse("demo", ex.Text)
	if err != nil {
		t.Fatal(err)
	}
	var trials []int
	for _, w := range []int{1, 2} {
		res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 10_000, Precision: 0.01, Workers: w})
		if err != nil {
			t.Fatal(err)
		}
		if !res.Converged {
			t.Fatalf("did not converge in %d trials", res.Trials)
		}
		for _, o := range res.Outputs {
			q := o.Summary
			for _, c := range []struct {
				v  float64
				iv stats.Interval
			}{{q.P90, q.P90CI}, {q.P50, q.P50CI}, {q.P10, q.P10CI}} {
				if h := stats.RelativeHalfWidth(c.iv, c.v); h >= 0.01 {
					t.Errorf("%s: half-width %.4f ≥ 0.01", o.Spec.Name, h)
				}
			}
		}
		trials = append(trials, res.Trials)
	}
	if trials[0] != trials[1] {
		t.Errorf("stopped at %d trials with 1 worker, %d with 2", trials[0], trials[1])
	}
}

// TestSwings checks the one-at-a-time swings of heat in place against the
// Muffler & Cataldi formula (heatmodel.Block.HeatInPlace) evaluated at the
// inputs' own quantiles: base with every input at its median, and the
// area's swing at its 10th (P90) and 90th (P10) percentiles.
func TestSwings(t *testing.T) {
	t.Parallel()
	ex, _ := scenarios.LookupExample("demo")
	s, err := scenarios.Parse("demo", ex.Text)
	if err != nil {
		t.Fatal(err)
	}
	res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 2000})
	if err != nil {
		t.Fatal(err)
	}
	q := func(key string, p float64) float64 {
		in, _ := s.Input(key)
		return in.Dist.Quantile(p)
	}
	heat := func(areaP float64) float64 {
		return heatmodel.Block{Area: q("area_km2", areaP) * 1e6, Thickness: q("thickness_m", 0.5), Porosity: q("porosity", 0.5),
			RockDensity: q("rock_density_kg_m3", 0.5), RockHeatCapacity: q("rock_heat_capacity_j_kgk", 0.5),
			FluidDensity: q("fluid_density_kg_m3", 0.5), FluidHeatCapacity: q("fluid_heat_capacity_j_kgk", 0.5),
			ReservoirTemp: q("reservoir_temp_c", 0.5), ReferenceTemp: q("reference_temp_c", 0.5)}.HeatInPlace()
	}
	sens := res.Sensitivity[0]
	if sens.Output != "heat_in_place" {
		t.Fatalf("first sensitivity is %s", sens.Output)
	}
	if math.Abs(sens.Base/heat(0.5)-1) > 1e-12 {
		t.Errorf("base %g J, want %g", sens.Base, heat(0.5))
	}
	for _, f := range sens.Influences {
		if f.Input != "area_km2" {
			continue
		}
		if math.Abs(f.SwingLow/heat(0.1)-1) > 1e-12 || math.Abs(f.SwingHigh/heat(0.9)-1) > 1e-12 {
			t.Errorf("area swing %g → %g J, want %g → %g", f.SwingLow, f.SwingHigh, heat(0.1), heat(0.9))
		}
		return
	}
	t.Error("no area_km2 influence")
}

// BenchmarkEstimateKinds runs the other model routes at 10⁵ trials: IF97
// fluid with the exergy route and correlated inputs, and hot rock.
func BenchmarkEstimateKinds(b *testing.B) {
	src, err := os.ReadFile("testdata/correlated.toml")
	if err != nil {
		b.Fatal(err)
	}
	corr, err := scenarios.Parse("correlated", src)
	if err != nil {
		b.Fatal(err)
	}
	ex, _ := scenarios.LookupExample("hot-rock-demo")
	hot, err := scenarios.Parse("hot-rock-demo", ex.Text)
	if err != nil {
		b.Fatal(err)
	}
	for name, s := range map[string]*scenarios.Scenario{"if97-exergy-correlated": corr, "hot-rock": hot} {
		b.Run(name, func(b *testing.B) {
			for b.Loop() {
				if _, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 100_000}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// TestPrecisionSensitivitySample: a run to a precision computes its
// sensitivities on its first rockheat.SensitivityTrials trials, which are the same
// draws as a streaming run of exactly that many (per-batch streams depend
// only on the seed and the batch index), so both give identical rank
// correlations.
func TestPrecisionSensitivitySample(t *testing.T) {
	t.Parallel()
	ex, _ := scenarios.LookupExample("demo")
	s, err := scenarios.Parse("demo", ex.Text)
	if err != nil {
		t.Fatal(err)
	}
	prec, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 10_000, Precision: 0.01})
	if err != nil {
		t.Fatal(err)
	}
	str, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: rockheat.SensitivityTrials, Stream: true})
	if err != nil {
		t.Fatal(err)
	}
	if prec.SensitivityN != rockheat.SensitivityTrials {
		t.Fatalf("sensitivity sample of %d trials, want %d", prec.SensitivityN, rockheat.SensitivityTrials)
	}
	if !reflect.DeepEqual(prec.Sensitivity, str.Sensitivity) {
		t.Errorf("sensitivities differ:\n%+v\n%+v", prec.Sensitivity[0], str.Sensitivity[0])
	}
}

// TestSensitivityOnlyFormulaInputs: an output's sensitivity lists only the
// inputs its formula uses (docs/references.md §1: heat in place
// A·h·ρC·(Tr − Tref) has no recovery factor, conversion efficiency,
// capacity factor or life), in every format, since they come from Result;
// electric capacity uses them all.
func TestSensitivityOnlyFormulaInputs(t *testing.T) {
	t.Parallel()
	ex, _ := scenarios.LookupExample("demo")
	s, err := scenarios.Parse("demo", ex.Text)
	if err != nil {
		t.Fatal(err)
	}
	res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 3000})
	if err != nil {
		t.Fatal(err)
	}
	listed := func(output string) map[string]bool {
		m := map[string]bool{}
		for _, sens := range res.Sensitivity {
			if sens.Output == output {
				for _, f := range sens.Influences {
					m[f.Input] = true
				}
			}
		}
		return m
	}
	heat, power := listed("heat_in_place"), listed("electric_power")
	for _, in := range []string{"recovery_factor", "conversion_efficiency"} {
		if heat[in] {
			t.Errorf("heat in place lists %s, which its formula does not use", in)
		}
		if !power[in] {
			t.Errorf("electric capacity does not list %s", in)
		}
	}
	if !heat["area_km2"] || len(power) != 7 {
		t.Errorf("heat in place lists %v; electric capacity lists %d inputs, want the 7 sampled", heat, len(power))
	}
}

// TestEverySampledInputIsRanked: every input a bundled example samples
// drives at least one output's sensitivity ranking. An input a formula
// uses but no output's OutputSpec.DependsOn names would be left out of
// every "what drives" table, misstating what the result depends on (the
// geotherm's heat flow and the fractures' inputs once were).
func TestEverySampledInputIsRanked(t *testing.T) {
	t.Parallel()
	for _, ex := range scenarios.Examples() {
		s, err := scenarios.Parse(ex.Name, ex.Text)
		if err != nil {
			t.Fatal(err)
		}
		res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 1000})
		if err != nil {
			t.Fatalf("%s: %v", ex.Name, err)
		}
		ranked := map[string]bool{}
		for _, sens := range res.Sensitivity {
			for _, f := range sens.Influences {
				ranked[f.Input] = true
			}
		}
		for _, in := range res.Inputs {
			if !in.Fixed && !ranked[in.Key] {
				t.Errorf("%s: %s is sampled but ranked for no output", ex.Name, in.Key)
			}
		}
	}
}
