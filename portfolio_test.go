package rockheat

import (
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"rockheat/sampler"
)

// normalProspect is goReservoir with every input fixed but a normal
// recovery factor N(0.15, 0.02²), so that its electric capacity is normal:
// Pe = η·R·Q/(F·L) is linear in R (docs/references.md §1). The normal's
// tails beyond (0, 1] hold 3e-14 of its probability, below the 1e-6 tail
// rule, so the cut at the valid range leaves it normal.
func normalProspect(t *testing.T, name string, chance float64) Prospect {
	t.Helper()
	m := goReservoir(t)
	m.Area = Fixed(6, SquareKilometre)
	d, err := sampler.NewNormal(0.15, 0.02, -inf, inf)
	if err != nil {
		t.Fatal(err)
	}
	m.RecoveryFactor = Quantity{Dist: d}
	return Prospect{Name: name, Run: &Run{Title: name, Model: m}, Chance: chance}
}

// within reports whether |got − want| ≤ k standard errors se.
func within(got, want, se, k float64) bool { return math.Abs(got-want) <= k*se }

// TestPortfolioIndependentNormals: for independent prospects the
// portfolio's mean is the sum of their means and its standard deviation the
// root sum of their squares (variances of independent variables add), the
// expected successes are the sum of the chances, and, for independent
// success draws, P(no success) = Π(1 − chance) (binomial check at the run's
// trials). The risked mean is Σ chance × mean (success independent of the
// outcome). Tolerances are 5 standard errors at n trials.
func TestPortfolioIndependentNormals(t *testing.T) {
	t.Parallel()
	const n = 200_000
	p := &Portfolio{Title: "independent", Trials: n, Seed: 11,
		Prospects: []Prospect{normalProspect(t, "a", 0.6), normalProspect(t, "b", 0.7)}}
	res, err := EstimatePortfolio(p, Options{})
	if err != nil {
		t.Fatal(err)
	}
	const power = PortfolioPower
	a, b := res.Prospects[0].Unrisked[power].Summary, res.Prospects[1].Unrisked[power].Summary
	tot, risked := res.Unrisked[power].Summary, res.Risked[power].Summary
	if math.Abs(tot.Mean/(a.Mean+b.Mean)-1) > 1e-12 {
		t.Errorf("mean of the total %g, sum of the means %g", tot.Mean, a.Mean+b.Mean)
	}
	rss := math.Hypot(a.SD, b.SD)
	if !within(tot.SD, rss, rss/math.Sqrt(2*n), 5) { // se of a normal sd: σ/√(2n)
		t.Errorf("sd of the total %g, root sum of squares %g", tot.SD, rss)
	}
	wantRisked := 0.6*a.Mean + 0.7*b.Mean
	if !within(risked.Mean, wantRisked, risked.SD/math.Sqrt(n), 5) {
		t.Errorf("risked mean %g, Σ chance × mean %g", risked.Mean, wantRisked)
	}
	if got := res.Prospects[0].RiskedMean[power]; !within(got, 0.6*a.Mean, a.SD/math.Sqrt(n)+a.Mean*math.Sqrt(0.24/n), 5) {
		t.Errorf("prospect a risked mean %g, want 0.6 × %g", got, a.Mean)
	}
	none := 0.4 * 0.3
	if !within(res.ChanceNone, none, math.Sqrt(none*(1-none)/n), 5) {
		t.Errorf("P(no success) = %g, want (1 − 0.6)(1 − 0.7) = %g", res.ChanceNone, none)
	}
	if math.Abs(res.ExpectedSuccesses-1.3) > 1e-12 || !(res.ChanceNoneCI.Lo < res.ChanceNone && res.ChanceNone < res.ChanceNoneCI.Hi) {
		t.Errorf("expected successes %g, want 1.3; P(none) interval %+v", res.ExpectedSuccesses, res.ChanceNoneCI)
	}
	// Percentiles do not add: the sum of two P90s is lower than the P90 of
	// the sum (for independent normals μ1+μ2 − 1.2816·(σ1+σ2) <
	// μ1+μ2 − 1.2816·√(σ1²+σ2²); docs/references.md §8).
	if !(res.SumP90[power] < tot.P90) || !(res.SumP10[power] > tot.P10) {
		t.Errorf("sum of P90s %g vs P90 of the total %g; sum of P10s %g vs %g", res.SumP90[power], tot.P90, res.SumP10[power], tot.P10)
	}
}

// TestPortfolioComonotone: prospects whose outcomes are (almost) fully rank
// correlated add like comonotone variables, whose quantiles add: the
// portfolio's P90 is the sum of the P90s (rank 0.999 moves it by
// 1.2816·σ·(2 − √3.998) ≈ 6e-4·σ, far inside the intervals).
func TestPortfolioComonotone(t *testing.T) {
	t.Parallel()
	p := &Portfolio{Title: "comonotone", Trials: 100_000, Seed: 5,
		Prospects:    []Prospect{normalProspect(t, "a", 1), normalProspect(t, "b", 1)},
		Correlations: []ProspectCorrelation{{Prospects: [2]string{"a", "b"}, Rank: 0.999}}}
	res, err := EstimatePortfolio(p, Options{})
	if err != nil {
		t.Fatal(err)
	}
	const power = PortfolioPower
	s := res.Unrisked[power].Summary
	half := (s.P90CI.Hi - s.P90CI.Lo) / 2
	if !within(s.P90, res.SumP90[power], half, 3) {
		t.Errorf("P90 of the total %g, sum of P90s %g (interval half-width %g)", s.P90, res.SumP90[power], half)
	}
}

// TestPortfolioSharedInput: a shared input takes the same draw in every
// trial for the prospects that share it (seen in the kept trials), and
// not for a prospect that does not.
func TestPortfolioSharedInput(t *testing.T) {
	t.Parallel()
	p := &Portfolio{Title: "shared", Trials: 5000, Seed: 2,
		Prospects: []Prospect{normalProspect(t, "a", 1), normalProspect(t, "b", 1), normalProspect(t, "c", 1)},
		Shared:    []SharedInput{{Input: "recovery_factor", Prospects: []string{"a", "b"}}}}
	res, err := EstimatePortfolio(p, Options{KeepSamples: true})
	if err != nil {
		t.Fatal(err)
	}
	col := func(name string) []float64 {
		for j, n := range res.Samples.Names {
			if n == name {
				return res.Samples.Columns[j]
			}
		}
		t.Fatalf("no sample column %s in %v", name, res.Samples.Names)
		return nil
	}
	a, b, c := col("a/recovery_factor"), col("b/recovery_factor"), col("c/recovery_factor")
	if !reflect.DeepEqual(a, b) {
		t.Error("prospects a and b do not share the recovery factor draw")
	}
	if reflect.DeepEqual(a, c) {
		t.Error("prospect c, which shares nothing, has a's draws")
	}
}

// TestPortfolioWorkers: the same portfolio and seed give the same figures
// whatever the number of workers.
func TestPortfolioWorkers(t *testing.T) {
	t.Parallel()
	mk := func() *Portfolio {
		return &Portfolio{Title: "workers", Trials: 300_000, Seed: 8, TargetMWe: 100,
			Prospects:           []Prospect{normalProspect(t, "a", 0.5), normalProspect(t, "b", 0.8), normalProspect(t, "c", 0.9)},
			Shared:              []SharedInput{{Input: "recovery_factor", Prospects: []string{"b", "c"}}},
			SuccessCorrelations: []ProspectCorrelation{{Prospects: [2]string{"a", "b"}, Rank: 0.5}}}
	}
	one, err := EstimatePortfolio(mk(), Options{Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	three, err := EstimatePortfolio(mk(), Options{Workers: 3})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(one, three) {
		t.Error("results differ between 1 and 3 workers")
	}
}

// TestPortfolioLentBuffers: prospects that borrow their batch buffers
// (neither kept nor in an outcome correlation) and prospects that hold
// theirs give the same figures, bit for bit, whatever the number of
// workers and whether the trials are kept (when every prospect holds its
// buffers). a and e share their area, drawn in km², so their SI columns
// are lent too; b and d are correlated, so they hold theirs between lent
// prospects. Three batches, the last one short.
func TestPortfolioLentBuffers(t *testing.T) {
	t.Parallel()
	mk := func() *Portfolio {
		res := func(name string, chance float64) Prospect {
			return Prospect{Name: name, Run: &Run{Title: name, Model: goReservoir(t)}, Chance: chance}
		}
		return &Portfolio{Title: "lent", Trials: 2*sampler.BatchSize + 5000, Seed: 21, TargetMWe: 60,
			Prospects: []Prospect{res("a", 0.6), normalProspect(t, "b", 0.7), res("c", 0.5),
				normalProspect(t, "d", 0.8), res("e", 0.9)},
			Shared:       []SharedInput{{Input: "area_km2", Prospects: []string{"a", "e"}}},
			Correlations: []ProspectCorrelation{{Prospects: [2]string{"b", "d"}, Rank: 0.6}}}
	}
	want, err := EstimatePortfolio(mk(), Options{Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	for _, opt := range []Options{{Workers: 2}, {Workers: 3}, {Workers: 2, KeepSamples: true}} {
		got, err := EstimatePortfolio(mk(), opt)
		if err != nil {
			t.Fatal(err)
		}
		if opt.KeepSamples {
			if got.Samples == nil {
				t.Fatal("KeepSamples gave no samples")
			}
			got.Samples = nil
		}
		if !reflect.DeepEqual(got, want) {
			t.Errorf("%+v: results differ from 1 worker without kept trials", opt)
		}
	}
}

// overflowProspect is overflowModel with the four outputs a portfolio adds
// up, each the draw x, +Inf above limit.
type overflowProspect struct{ overflowModel }

func (*overflowProspect) outputs() []OutputSpec {
	var specs []OutputSpec
	for _, name := range PortfolioOutputs {
		specs = append(specs, OutputSpec{Name: name, Unit: "J", Doc: "x", Scale: 1})
	}
	return specs
}
func (m *overflowProspect) newEvaluator() evaluator {
	e := &overflowEval{limit: m.Limit}
	e.dst = dsts(m.fields(e))
	return &overflowProspectEval{e}
}

type overflowProspectEval struct{ *overflowEval }

func (e *overflowProspectEval) evaluate(n int, out [][]float64) (int, error) {
	z, err := e.overflowEval.evaluate(n, out)
	for _, col := range out[1:] {
		copy(col[:n], out[0][:n])
	}
	return z, err
}

// TestPortfolioFirstFailingProspect: when prospects' trials fail, the
// portfolio reports the first failing prospect's trial, whatever the order
// in which they run (those in outcome correlations run first) and the
// workers, and names the prospect: here f fails, and g, later in the list
// and in an outcome correlation, fails too.
func TestPortfolioFirstFailingProspect(t *testing.T) {
	t.Parallel()
	u, err := sampler.NewUniform(0.5, 1)
	if err != nil {
		t.Fatal(err)
	}
	failing := func(name string, limit float64) Prospect {
		return Prospect{Name: name, Chance: 0.5, Run: &Run{Title: name,
			Model: &overflowProspect{overflowModel{X: Quantity{Dist: u}, Limit: limit}}}}
	}
	var msgs []string
	for _, w := range []int{1, 2, 3} {
		p := &Portfolio{Title: "failing", Trials: 2 * sampler.BatchSize, Seed: 9,
			Prospects: []Prospect{normalProspect(t, "a", 0.5), failing("f", 0.9999), normalProspect(t, "b", 0.5),
				failing("g", 0.99)},
			Correlations: []ProspectCorrelation{{Prospects: [2]string{"a", "g"}, Rank: 0.5}}}
		_, err := EstimatePortfolio(p, Options{Workers: w})
		var te *TrialError
		if !errors.As(err, &te) {
			t.Fatalf("%d workers: err = %v, want a TrialError", w, err)
		}
		if !strings.HasPrefix(te.Inputs[0], "x = 0.9999") || !strings.HasPrefix(err.Error(), `prospect "f": trial `) {
			t.Errorf("%d workers: %v; want prospect f's trial (x above 0.9999), not g's", w, te)
		}
		msgs = append(msgs, te.Error())
	}
	if msgs[0] != msgs[1] || msgs[0] != msgs[2] {
		t.Errorf("the error depends on the workers:\n%s", strings.Join(msgs, "\n"))
	}
}

// TestPortfolioProblems checks the errors a portfolio can have.
func TestPortfolioProblems(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		edit func(p *Portfolio)
		want string
	}{
		{"chance above 1", func(p *Portfolio) { p.Prospects[0].Chance = 1.5 }, "must be a probability in [0, 1]"},
		{"duplicate name", func(p *Portfolio) { p.Prospects[1].Name = "a" }, `the name "a" is used twice`},
		{"unknown prospect", func(p *Portfolio) {
			p.Correlations = []ProspectCorrelation{{Prospects: [2]string{"a", "z"}, Rank: 0.3}}
		}, `"z" is not a prospect of the portfolio`},
		{"shared and correlated", func(p *Portfolio) {
			p.Shared = []SharedInput{{Input: "recovery_factor"}}
			p.Correlations = []ProspectCorrelation{{Prospects: [2]string{"a", "b"}, Rank: 0.3}}
		}, "would break the shared draw"},
		{"shared fixed input", func(p *Portfolio) { p.Shared = []SharedInput{{Input: "porosity"}} }, "only sampled inputs are shared"},
		{"factors disagree", func(p *Portfolio) {
			p.Prospects[0].Factors = []ChanceFactor{{"temperature", 0.5}, {"permeability", 0.5}}
		}, "is not the product 0.25"},
		{"bad run", func(p *Portfolio) { p.Prospects[1].Run.Model.(*Reservoir).Thickness = Quantity{} }, `prospect "b": thickness_m: missing`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p := &Portfolio{Title: c.name, Trials: 100,
				Prospects: []Prospect{normalProspect(t, "a", 0.5), normalProspect(t, "b", 0.5)}}
			c.edit(p)
			err := p.Validate()
			var es InputErrors
			if !errors.As(err, &es) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("err = %v, want one saying %q", err, c.want)
			}
		})
	}
}

// TestPortfolioSharesTargetAndSuccessCorrelation: with chances 1, the total
// of two independent normal prospects net of working interests 0.5 and 1
// is normal with mean 0.5·μa + μb and sd √(0.25·σa² + σb²) (a linear
// combination of independent normals), so P(total ≥ T) = 1 − Φ((T − μ)/σ)
// (gonum distuv.Normal), checked to 5 binomial standard errors. And two
// prospects of chance 0.5 whose successes are rank-correlated at 0.8 fail
// together more often than independent ones (0.25): for normal scores
// correlated at r = 2·sin(π·0.8/6), P(both fail) = 1/4 + asin(r)/(2π) =
// 0.401 (Sheppard's formula for the bivariate normal orthant), which
// Iman–Conover meets approximately (within 0.02 here).
func TestPortfolioSharesTargetAndSuccessCorrelation(t *testing.T) {
	t.Parallel()
	const n = 200_000
	a, b := normalProspect(t, "a", 1), normalProspect(t, "b", 1)
	a.Share = 0.5
	alone, err := EstimatePortfolio(&Portfolio{Title: "alone", Trials: n, Seed: 3, Prospects: []Prospect{normalProspect(t, "a", 1), normalProspect(t, "b", 1)}}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	const power = PortfolioPower
	sa, sb := alone.Prospects[0].Unrisked[power].Summary, alone.Prospects[1].Unrisked[power].Summary
	mu, sd := 0.5*sa.Mean+sb.Mean, math.Sqrt(0.25*sa.SD*sa.SD+sb.SD*sb.SD)
	target := mu + 0.5*sd
	res, err := EstimatePortfolio(&Portfolio{Title: "shares", Trials: n, Seed: 3, TargetMWe: target, Prospects: []Prospect{a, b}}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	tot := res.Unrisked[power].Summary
	if !within(tot.Mean, mu, sd/math.Sqrt(n), 5) {
		t.Errorf("net mean %g, want 0.5·%g + %g = %g", tot.Mean, sa.Mean, sb.Mean, mu)
	}
	if !within(tot.SD, sd, sd/math.Sqrt(2*n), 5) {
		t.Errorf("net sd %g, want %g", tot.SD, sd)
	}
	want := 1 - distuv.UnitNormal.CDF(0.5)
	if res.Target == nil || !within(res.Target.Probability, want, math.Sqrt(want*(1-want)/n), 5) {
		t.Errorf("P(total ≥ %g) = %+v, want 1 − Φ(0.5) = %.4f", target, res.Target, want)
	}

	corr, err := EstimatePortfolio(&Portfolio{Title: "fail together", Trials: n, Seed: 4,
		Prospects:           []Prospect{normalProspect(t, "a", 0.5), normalProspect(t, "b", 0.5)},
		SuccessCorrelations: []ProspectCorrelation{{Prospects: [2]string{"a", "b"}, Rank: 0.8}}}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	r := 2 * math.Sin(math.Pi*0.8/6)
	both := 0.25 + math.Asin(r)/(2*math.Pi)
	if se := math.Sqrt(0.25 * 0.75 / n); corr.ChanceNone < 0.25+5*se || math.Abs(corr.ChanceNone-both) > 0.02 {
		t.Errorf("P(no success) = %.4f with success correlation 0.8; want above 0.25 + 5 se and near %.3f", corr.ChanceNone, both)
	}
}

// TestPortfolioOutputPlaces: the named places are those of their outputs.
func TestPortfolioOutputPlaces(t *testing.T) {
	if PortfolioOutputs[PortfolioHeat] != "heat_in_place" || PortfolioOutputs[PortfolioPower] != "electric_power" {
		t.Errorf("PortfolioHeat, PortfolioPower = %d, %d name %q, %q", PortfolioHeat, PortfolioPower,
			PortfolioOutputs[PortfolioHeat], PortfolioOutputs[PortfolioPower])
	}
}
