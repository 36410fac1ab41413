package stats

import (
	"math"
	"math/big"
	"slices"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestBinomWindow checks the windowed binomial CDF against gonum's
// distuv.Binomial.CDF (regularized incomplete beta function, which is
// itself accurate to ~1e-11 at these n), and at n = 1000 against the
// binomial sum in 256-bit arithmetic to 1e-14.
func TestBinomWindow(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		n int
		q float64
	}{{10, 0.5}, {200, 0.1}, {1000, 0.9}, {5000, 0.5}, {20000, 0.01}, {30, 0.999}} {
		sd := math.Sqrt(float64(tc.n) * tc.q * (1 - tc.q))
		w := newBinomWindow(tc.n, tc.q, sd)
		ref := distuv.Binomial{N: float64(tc.n), P: tc.q}
		for k := 0; k <= tc.n; k++ {
			if got, want := w.cdf(k), ref.CDF(float64(k)); !within(got, want, 1e-10) {
				t.Errorf("n=%d q=%g: P(B ≤ %d) = %.15g, gonum %.15g", tc.n, tc.q, k, got, want)
			}
		}
	}
	const n, q = 1000, 0.3
	exact := exactBinomCDF(n, q)
	w := newBinomWindow(n, q, math.Sqrt(n*q*(1-q)))
	for k := 0; k <= n; k++ {
		if got := w.cdf(k); !within(got, exact[k], 1e-14) {
			t.Errorf("n=%d q=%g: P(B ≤ %d) = %.17g, exact %.17g", n, q, k, got, exact[k])
		}
	}
}

// exactBinomCDF returns P(B ≤ k), k = 0 … n, for B ~ Binomial(n, q),
// summing C(n, k)·q^k·(1−q)^(n−k) in 256-bit floating point.
func exactBinomCDF(n int, q float64) []float64 {
	const prec = 256
	nf := func(x float64) *big.Float { return new(big.Float).SetPrec(prec).SetFloat64(x) }
	p := nf(q)
	c := new(big.Float).SetPrec(prec).Sub(nf(1), p) // 1 − q without rounding
	term := nf(1)
	for range n {
		term.Mul(term, c) // (1−q)^n
	}
	ratio := new(big.Float).SetPrec(prec).Quo(p, c)
	sum := nf(0)
	out := make([]float64, n+1)
	for k := 0; k <= n; k++ {
		sum.Add(sum, term)
		out[k], _ = sum.Float64()
		term.Mul(term, nf(float64(n-k)))
		term.Quo(term, nf(float64(k+1)))
		term.Mul(term, ratio)
	}
	return out
}

// TestQuantileBounds checks the chosen ranks against gonum's binomial CDF:
// the coverage reported is F(hi) − F(lo) (1-based P(l ≤ B < u) of Hahn &
// Meeker 1991 §5.2 with l = lo+1, u = hi+1), it reaches the level, and no
// pair of fewer ranks does (brute force over all pairs).
func TestQuantileBounds(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		n        int
		q, level float64
	}{
		{20, 0.5, 0.9}, {50, 0.5, 0.95}, {59, 0.1, 0.95}, {60, 0.9, 0.95},
		{100, 0.1, 0.99}, {200, 0.5, 0.95}, {200, 0.9, 0.8}, {300, 0.25, 0.95},
	} {
		lo, hi, cov := QuantileBounds(tc.n, tc.q, tc.level)
		ref := distuv.Binomial{N: float64(tc.n), P: tc.q}
		F := func(k int) float64 { return ref.CDF(float64(k)) }
		if want := F(hi) - F(lo); !within(cov, want, 1e-12) {
			t.Errorf("n=%d q=%g: coverage %.15g, gonum F(%d)−F(%d) = %.15g", tc.n, tc.q, cov, hi, lo, want)
		}
		if cov < tc.level || lo < 0 || hi >= tc.n || lo >= hi {
			t.Errorf("n=%d q=%g level=%g: bounds %d, %d with coverage %g", tc.n, tc.q, tc.level, lo, hi, cov)
		}
		best := tc.n
		for l := 0; l < tc.n; l++ {
			for u := l + 1; u < tc.n; u++ {
				if F(u)-F(l) >= tc.level+1e-12 && u-l < best {
					best = u - l
				}
			}
		}
		if hi-lo > best {
			t.Errorf("n=%d q=%g level=%g: %d ranks apart, brute force finds %d", tc.n, tc.q, tc.level, hi-lo, best)
		}
	}
}

// TestQuantileBoundsSmallN: with n = 5 no pair covers the median at 95 %;
// the widest, [x(1), x(5)], covers it with probability 1 − 2·0.5⁵ = 0.9375
// (analytic).
func TestQuantileBoundsSmallN(t *testing.T) {
	t.Parallel()
	lo, hi, cov := QuantileBounds(5, 0.5, 0.95)
	if lo != 0 || hi != 4 || !within(cov, 0.9375, 1e-15) {
		t.Errorf("QuantileBounds(5, 0.5, 0.95) = %d, %d, %g; want 0, 4, 0.9375", lo, hi, cov)
	}
	if lo, hi, cov := QuantileBounds(1, 0.5, 0.95); lo != 0 || hi != 0 || cov != 0 {
		t.Errorf("QuantileBounds(1, …) = %d, %d, %g; want 0, 0, 0", lo, hi, cov)
	}
}

// TestQuantileBoundsLarge checks large n, exact window and normal
// approximation, against the normal approximation with continuity
// correction (de Moivre–Laplace): coverage at least the level, close to
// it, and ranks near n·q ± z·σ.
func TestQuantileBoundsLarge(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		n        int64
		q, level float64
	}{
		{1e6, 0.5, 0.95}, {1e7, 0.1, 0.95}, {1e7, 0.9, 0.99},
		{1.5e9, 0.5, 0.95}, // σ = 19365: exact, just below the switch
		{1.7e9, 0.5, 0.95}, // σ = 20616: normal approximation
		{1e11, 0.1, 0.95},  // beyond a 32-bit int: left out there
	} {
		if tc.n > math.MaxInt {
			continue
		}
		lo, hi, cov := QuantileBounds(int(tc.n), tc.q, tc.level)
		sd := math.Sqrt(float64(tc.n) * tc.q * (1 - tc.q))
		mu := float64(tc.n) * tc.q
		z := distuv.UnitNormal.Quantile((1 + tc.level) / 2)
		approx := distuv.UnitNormal.CDF((float64(hi)+0.5-mu)/sd) - distuv.UnitNormal.CDF((float64(lo)+0.5-mu)/sd)
		if cov < tc.level || cov > tc.level+2/sd {
			t.Errorf("n=%d q=%g: coverage %.9g, want in [%g, %g]", tc.n, tc.q, cov, tc.level, tc.level+2/sd)
		}
		if !within(cov, approx, 1e-6) {
			t.Errorf("n=%d q=%g: coverage %.9g, normal approximation of same ranks %.9g", tc.n, tc.q, cov, approx)
		}
		// 1-based rank l = lo+1 near mu − z·sd + 1/2, u = hi+1 near mu + z·sd + 1/2.
		if d := float64(lo+1) - (mu - z*sd + 0.5); math.Abs(d) > 2+0.01*sd {
			t.Errorf("n=%d q=%g: lower rank %d is %g from the normal value", tc.n, tc.q, lo+1, d)
		}
		if d := float64(hi+1) - (mu + z*sd + 0.5); math.Abs(d) > 2+0.01*sd {
			t.Errorf("n=%d q=%g: upper rank %d is %g from the normal value", tc.n, tc.q, hi+1, d)
		}
	}
}

// TestIntervalCoverage: over 2000 samples of n = 200, the 95 % interval
// holds the population quantile (distuv.LogNormal.Quantile) in 93–97 % of
// them, and within 4 standard errors (√(L(1−L)/2000)) of the achieved
// level L.
func TestIntervalCoverage(t *testing.T) {
	t.Parallel()
	const reps, n, level = 2000, 200, 0.95
	dist := distuv.LogNormal{Mu: 1, Sigma: 0.8}
	for _, q := range []float64{0.1, 0.5, 0.9} {
		truth := dist.Quantile(q)
		hits := 0
		var achieved float64
		for r := range reps {
			x := lognormal(n, dist.Mu, dist.Sigma, uint64(1000+r))
			slices.Sort(x)
			iv := QuantileInterval(x, q, level)
			achieved = iv.Coverage
			if iv.Lo <= truth && truth <= iv.Hi {
				hits++
			}
		}
		emp := float64(hits) / reps
		t.Logf("q=%g: empirical coverage %.4f, achieved level %.4f", q, emp, achieved)
		se := math.Sqrt(achieved * (1 - achieved) / reps)
		if emp < 0.93 || emp > 0.97 || math.Abs(emp-achieved) > 4*se {
			t.Errorf("q=%g: empirical coverage %.4f, achieved level %.4f (se %.4f)", q, emp, achieved, se)
		}
		if achieved < level {
			t.Errorf("q=%g: achieved level %g below %g", q, achieved, level)
		}
	}
}

func TestRelativeHalfWidth(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		iv   Interval
		v    float64
		want float64
	}{
		{Interval{Lo: 90, Hi: 120}, 100, 0.2}, // max(20, 10)/100
		{Interval{Lo: 80, Hi: 105}, 100, 0.2}, // max(5, 20)/100
		{Interval{Lo: -12, Hi: -9}, -10, 0.2}, // max(1, 2)/10
		{Interval{Lo: 5, Hi: 5}, 5, 0},        // a point
		{Interval{Lo: 0, Hi: 0}, 0, 0},        // a point at zero
		{Interval{Lo: -1, Hi: 1}, 0, math.Inf(1)},
	} {
		if got := RelativeHalfWidth(tc.iv, tc.v); !within(got, tc.want, 1e-15) && got != tc.want {
			t.Errorf("RelativeHalfWidth(%+v, %g) = %g, want %g", tc.iv, tc.v, got, tc.want)
		}
	}
}
