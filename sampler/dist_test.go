package sampler

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat/distuv"
)

// truncCDF is the CDF of base truncated to [lo, hi], written out from the
// definition F_T(x) = (F(x) − F(lo)) / (F(hi) − F(lo)).
func truncCDF(base func(float64) float64, lo, hi float64) func(float64) float64 {
	flo, fhi := 0.0, 1.0
	if !math.IsInf(lo, -1) {
		flo = base(lo)
	}
	if !math.IsInf(hi, 1) {
		fhi = base(hi)
	}
	return func(x float64) float64 {
		switch {
		case x <= lo:
			return 0
		case x >= hi:
			return 1
		}
		return (base(x) - flo) / (fhi - flo)
	}
}

// TestSampledQuantiles draws n values of each distribution by plain Monte
// Carlo and checks that gonum's reference CDF at each sample quantile is
// the nominal probability within 5 standard errors, sqrt(q(1−q)/n) (the
// binomial standard error of an empirical CDF).
func TestSampledQuantiles(t *testing.T) {
	t.Parallel()
	mustU := func(d Uniform, err error) Distribution { check(t, err); return d }
	mustT := func(d Triangular, err error) Distribution { check(t, err); return d }
	mustP := func(d PERT, err error) Distribution { check(t, err); return d }
	mustN := func(d Truncated, err error) Distribution { check(t, err); return d }
	mu, sigma, err := LogNormalParams(10, 4)
	check(t, err)
	beta := distuv.Beta{Alpha: 1 + 4*(0.06-0.02)/0.10, Beta: 1 + 4*(0.12-0.06)/0.10}
	inf := math.Inf(1)
	cases := []struct {
		name string
		d    Distribution
		cdf  func(float64) float64 // gonum reference
	}{
		{"uniform", mustU(NewUniform(800, 1600)), distuv.Uniform{Min: 800, Max: 1600}.CDF},
		{"triangular", mustT(NewTriangular(3, 6, 14)), distuv.NewTriangle(3, 14, 6, nil).CDF},
		{"triangular mode at min", mustT(NewTriangular(0, 0, 1)), distuv.NewTriangle(0, 1, 0, nil).CDF},
		{"pert", mustP(NewPERT(0.02, 0.06, 0.12)), func(x float64) float64 { return beta.CDF((x - 0.02) / 0.10) }},
		{"normal", mustN(NewNormal(235, 12, -inf, inf)), distuv.Normal{Mu: 235, Sigma: 12}.CDF},
		{"normal truncated", mustN(NewNormal(235, 12, 225, 260)), truncCDF(distuv.Normal{Mu: 235, Sigma: 12}.CDF, 225, 260)},
		{"lognormal", mustN(NewLogNormal(mu, sigma, 0, inf)), distuv.LogNormal{Mu: mu, Sigma: sigma}.CDF},
		{"lognormal truncated", mustN(NewLogNormal(mu, sigma, 5, 20)), truncCDF(distuv.LogNormal{Mu: mu, Sigma: sigma}.CDF, 5, 20)},
	}
	const n = 100000
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			rng := rand.New(rand.NewPCG(1, 2))
			x := make([]float64, n)
			for i := range x {
				x[i] = c.d.Quantile(rng.Float64())
			}
			sort.Float64s(x)
			for _, q := range []float64{0.01, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99} {
				got := c.cdf(x[int(q*n)])
				se := math.Sqrt(q * (1 - q) / n)
				if math.Abs(got-q) > 5*se {
					t.Errorf("F(sample %g-quantile) = %.5f, want %.5f ± %.5f", q, got, q, 5*se)
				}
			}
		})
	}
}

func check(t *testing.T, err error) {
	t.Helper()
	if err != nil {
		t.Fatal(err)
	}
}

// TestPERTQuantileTable checks the tabulated PERT inverse against gonum's
// exact beta quantile (distuv.Beta.Quantile) across the whole range,
// including the tails and every part of the direct tables, for skewed and
// symmetric shapes: the stated bound is 1e-12 of the range.
func TestPERTQuantileTable(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ min, mode, max float64 }{
		{0.02, 0.06, 0.12}, {0, 0, 1}, {0, 1, 1}, {0, 0.5, 1}, {100, 101, 300}, {-5, 3, 4},
	} {
		d, err := NewPERT(c.min, c.mode, c.max)
		check(t, err)
		a, b := d.Shape()
		ref := distuv.Beta{Alpha: a, Beta: b}
		worst := 0.0
		if d.tab.lo.direct.node == nil || d.tab.hi.direct.node == nil || d.tab.lo.tail.bin == nil || d.tab.hi.tail.bin == nil {
			t.Errorf("pert(%g, %g, %g): no direct table; its bound is not tested", c.min, c.mode, c.max)
		}
		probes := append(grid(2001), 1e-12, 1e-9, 1e-7, 1e-5, 1-1e-5, 1-1e-7, 1-1e-9)
		rng := rand.New(rand.NewPCG(3, 4))
		for range 20000 { // the direct tables' middle, and their cell ends
			probes = append(probes, directLo+rng.Float64()*(0.5-directLo), 1-directLo-rng.Float64()*(0.5-directLo))
		}
		for _, b := range append(d.tab.lo.tail.bin, d.tab.hi.tail.bin...) { // the tail tables
			for k := 0; k < len(b.node); k += 7 {
				pk := b.lo + (float64(k)+rng.Float64())*b.step
				probes = append(probes, pk, 1-pk, math.Nextafter(b.lo+float64(k)*b.step, 0))
			}
		}
		for k := 0; k <= directCells; k += 97 {
			pk := directLo + float64(k)*d.tab.lo.direct.step
			probes = append(probes, pk, math.Nextafter(pk, 0), 1-pk)
		}
		for _, p := range probes {
			want := c.min + (c.max-c.min)*ref.Quantile(p)
			got := d.Quantile(p)
			worst = math.Max(worst, math.Abs(got-want)/(c.max-c.min))
		}
		if worst > 1e-12 {
			t.Errorf("pert(%g, %g, %g): max |Q − Q_beta| = %.3g of the range, want ≤ 1e-12", c.min, c.mode, c.max, worst)
		}
		// PERT mean (min + 4·mode + max)/6 (Malcolm et al. 1959) equals
		// the beta mean α/(α+β) scaled to [min, max].
		if !scalar.EqualWithinAbsOrRel(d.Mean(), c.min+(c.max-c.min)*ref.Mean(), 1e-12, 1e-12) {
			t.Errorf("pert mean %g, beta mean %g", d.Mean(), c.min+(c.max-c.min)*ref.Mean())
		}
	}
}

func grid(n int) []float64 {
	g := make([]float64, n)
	for i := range g {
		g[i] = (float64(i) + 0.5) / float64(n)
	}
	return g
}

// TestQuantileInvertsCDF is the property CDF(Quantile(p)) = p for the
// closed-form distributions (exact up to rounding).
func TestQuantileInvertsCDF(t *testing.T) {
	t.Parallel()
	nrm, err := NewNormal(10, 2, 7, 20)
	check(t, err)
	ln, err := NewLogNormal(1, 0.5, 0, math.Inf(1))
	check(t, err)
	for _, p := range grid(999) {
		if got := nrm.CDF(nrm.Quantile(p)); math.Abs(got-p) > 1e-9 {
			t.Fatalf("truncated normal CDF(Q(%g)) = %g", p, got)
		}
		if got := ln.CDF(ln.Quantile(p)); math.Abs(got-p) > 1e-9 {
			t.Fatalf("lognormal CDF(Q(%g)) = %g", p, got)
		}
	}
}

// TestLogNormalParameterisations checks the two ways to give a lognormal.
// Moments: E[X] = exp(μ + σ²/2), Var[X] = (exp(σ²) − 1)·exp(2μ + σ²)
// (standard lognormal identities, checked here through gonum's
// distuv.LogNormal Mean and Variance). Exceedance: the 10th and 90th
// percentiles from distuv.LogNormal.Quantile are the given P90 and P10.
func TestLogNormalParameterisations(t *testing.T) {
	t.Parallel()
	mu, sigma, err := LogNormalParams(10, 4)
	check(t, err)
	ref := distuv.LogNormal{Mu: mu, Sigma: sigma}
	if !scalar.EqualWithinRel(ref.Mean(), 10, 1e-12) || !scalar.EqualWithinRel(ref.StdDev(), 4, 1e-12) {
		t.Errorf("mean, sd = %g, %g; want 10, 4", ref.Mean(), ref.StdDev())
	}
	mu, sigma, err = LogNormalFromExceedance(2, 50)
	check(t, err)
	ref = distuv.LogNormal{Mu: mu, Sigma: sigma}
	if !scalar.EqualWithinRel(ref.Quantile(0.1), 2, 1e-9) || !scalar.EqualWithinRel(ref.Quantile(0.9), 50, 1e-9) {
		t.Errorf("10th, 90th percentiles = %g, %g; want 2, 50", ref.Quantile(0.1), ref.Quantile(0.9))
	}
}

func TestDistributionErrors(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	inf := math.Inf(1)
	cases := []struct {
		name string
		err  error
	}{
		{"uniform min > max", second(NewUniform(2, 1))},
		{"uniform min = max", second(NewUniform(1, 1))},
		{"uniform NaN", second(NewUniform(nan, 1))},
		{"triangular mode outside", second(NewTriangular(0, 2, 1))},
		{"triangular Inf", second(NewTriangular(0, 0.5, inf))},
		{"pert mode outside", second(NewPERT(0, -1, 1))},
		{"normal sd 0", second(NewNormal(1, 0, -inf, inf))},
		{"normal sd < 0", second(NewNormal(1, -1, -inf, inf))},
		{"normal truncation inverted", second(NewNormal(1, 1, 3, 2))},
		{"normal truncation beyond the mass", second(NewNormal(0, 1, 50, 60))},
		{"lognormal mean 0", thirdOf(LogNormalParams(0, 1))},
		{"lognormal p90 > p10", thirdOf(LogNormalFromExceedance(10, 5))},
		{"lognormal sigma 0", second(NewLogNormal(0, 0, 0, inf))},
	}
	for _, c := range cases {
		if c.err == nil {
			t.Errorf("%s: no error", c.name)
		}
	}
}

func second[T any](_ T, err error) error    { return err }
func thirdOf(_, _ float64, err error) error { return err }
