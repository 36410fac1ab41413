package stats

import (
	"math"
	"sync"

	"gonum.org/v1/gonum/stat/distuv"
)

// Interval is a confidence interval [Lo, Hi] in the unit of the sample.
// Level is the coverage probability asked for, in (0, 1), and Coverage the
// coverage the interval achieves: for percentile intervals that of the
// chosen order statistics, at least Level whenever the sample is large
// enough (see QuantileBounds); for the mean's interval its nominal level.
type Interval struct {
	Lo, Hi          float64
	Level, Coverage float64
}

// OK reports whether iv is an interval at its level. A sample too small
// to give one has Coverage below Level, and [Lo, Hi] (its widest pair of
// order statistics) must not be shown as a confidence interval.
func (iv Interval) OK() bool { return iv.Coverage >= iv.Level && iv.Level > 0 }

// RelativeHalfWidth returns max(Hi−value, value−Lo)/|value|, the larger
// distance from value to an end of iv relative to value: the precision of a
// percentile estimate, as a fraction (0.01 = 1 %). It is 0 when iv is the
// single point value, and +Inf when value is 0 and iv is not.
func RelativeHalfWidth(iv Interval, value float64) float64 {
	d := math.Max(iv.Hi-value, value-iv.Lo)
	if d == 0 {
		return 0
	}
	return d / math.Abs(value)
}

// QuantileInterval returns the distribution-free confidence interval for
// the q-quantile of the population from the ascending sample sorted: the
// order statistics sorted[lo] and sorted[hi] chosen by QuantileBounds for
// len(sorted), q and level, with the coverage they achieve. sorted must be
// ascending without NaNs; 0 < q < 1 and 0 < level < 1.
func QuantileInterval(sorted []float64, q, level float64) Interval {
	lo, hi, cov := QuantileBounds(len(sorted), q, level)
	return Interval{Lo: sorted[lo], Hi: sorted[hi], Level: level, Coverage: cov}
}

// normalApproxSD is the standard deviation √(n·q·(1−q)) of the binomial
// count above which QuantileBounds uses the normal approximation. At this
// size the approximation's error in the coverage is far below 1e-6: the
// skewness term of the Edgeworth expansion, (1−2q)/(6σ)·(z²−1)·φ(z), is even
// in z and cancels between the two ends of a symmetric interval, leaving
// terms of order 1/σ². (The tests find agreement to 1e-6 already at σ ≈ 500.)
const normalApproxSD = 2e4

// QuantileBounds returns the indices lo < hi into an ascending sample of n
// values whose order statistics bound a confidence interval for the
// population q-quantile ξ, and the coverage P(x[lo] ≤ ξ ≤ x[hi]).
//
// The construction is the distribution-free one of Hahn & Meeker (1991),
// "Statistical Intervals", §5.2 (section number from memory): the number B of sample values at or below
// ξ is Binomial(n, q), so with 1-based ranks l = lo+1 and u = hi+1
//
//	P(x(l) ≤ ξ < x(u)) = P(l ≤ B < u) = F_B(u−1) − F_B(l−1),
//
// exactly for a continuous distribution and as a lower bound otherwise.
// Among all rank pairs whose coverage reaches level, QuantileBounds picks
// the one of fewest ranks between the ends (the shortest in rank), then
// the one of higher coverage, then the one with the more equal tail
// probabilities, then the lower one.
//
// The binomial probabilities are exact (computed by the ratio recursion in
// a window of ±(10σ + 40) counts around the mode, σ = √(n·q·(1−q)), outside
// which the tail mass is below 1e-20; cost O(σ)). For σ > 2·10⁴ (n > 1.6·10⁹
// at the median) it uses the normal approximation with continuity
// correction instead, with ranks symmetric about n·q.
//
// If n is too small for any pair to reach level, it returns the widest
// pair, lo = 0 and hi = n−1, with its (lower) coverage; the caller should
// compare the coverage with level. For n = 1 it returns 0, 0, 0.
// It is safe for concurrent use and remembers its last few hundred
// answers, which a run asks again for every output.
// It panics if n < 1, q is outside (0, 1) or level outside (0, 1).
func QuantileBounds(n int, q, level float64) (lo, hi int, coverage float64) {
	if n < 1 {
		panic("stats: QuantileBounds with n < 1")
	}
	if !(q > 0 && q < 1) {
		panic("stats: QuantileBounds with q outside (0, 1)")
	}
	if !(level > 0 && level < 1) {
		panic("stats: QuantileBounds with level outside (0, 1)")
	}
	if n == 1 {
		return 0, 0, 0
	}
	k := boundsKey{n, q, level}
	bounds.Lock()
	b, ok := bounds.m[k]
	bounds.Unlock()
	if !ok {
		b.lo, b.hi, b.cov = quantileBounds(n, q, level)
		bounds.Lock()
		if len(bounds.m) >= 256 {
			clear(bounds.m)
		}
		bounds.m[k] = b
		bounds.Unlock()
	}
	return b.lo, b.hi, b.cov
}

// bounds holds QuantileBounds' recent answers: each costs O(√n), and a run
// asks the same ones for every output, once to bracket its selection and
// once to build its summary.
var bounds = struct {
	sync.Mutex
	m map[boundsKey]boundsAnswer
}{m: map[boundsKey]boundsAnswer{}}

type boundsKey struct {
	n        int
	q, level float64
}

type boundsAnswer struct {
	lo, hi int
	cov    float64
}

// quantileBounds is QuantileBounds, computed, for n ≥ 2.
func quantileBounds(n int, q, level float64) (lo, hi int, coverage float64) {
	sd := math.Sqrt(float64(n) * q * (1 - q))
	if sd > normalApproxSD {
		return normalBounds(n, q, level, sd)
	}
	w := newBinomWindow(n, q, sd)
	bestL, bestU := 0, 0
	var bestCov, bestImb float64
	u := 2
	for l := max(1, w.a); l <= n-1; l++ {
		low := w.cdf(l - 1)
		if w.cdf(n-1)-low < level {
			break // coverage only falls as l rises
		}
		u = max(u, l+1)
		for w.cdf(u-1)-low < level {
			u++
		}
		cov := w.cdf(u-1) - low
		imb := math.Abs(low - (1 - w.cdf(u-1)))
		switch {
		case bestU == 0, u-l < bestU-bestL,
			u-l == bestU-bestL && cov > bestCov,
			u-l == bestU-bestL && cov == bestCov && imb < bestImb:
			bestL, bestU, bestCov, bestImb = l, u, cov, imb
		}
	}
	if bestU == 0 {
		return 0, n - 1, w.cdf(n-1) - w.cdf(0)
	}
	return bestL - 1, bestU - 1, bestCov
}

// normalBounds is QuantileBounds by the normal approximation with
// continuity correction, P(B ≤ k) ≈ Φ((k + ½ − n·q)/σ).
func normalBounds(n int, q, level, sd float64) (lo, hi int, coverage float64) {
	z := distuv.UnitNormal.Quantile((1 + level) / 2)
	mu := float64(n) * q
	l := int(math.Floor(mu - z*sd + 0.5))
	u := int(math.Ceil(mu + z*sd + 0.5))
	l = min(max(l, 1), n-1)
	u = min(max(u, l+1), n)
	cov := distuv.UnitNormal.CDF((float64(u)-0.5-mu)/sd) - distuv.UnitNormal.CDF((float64(l)-0.5-mu)/sd)
	return l - 1, u - 1, cov
}

// binomWindow holds the cumulative distribution function of Binomial(n, q)
// for counts a … a+len(c)−1; below a it is taken as 0, above as 1.
type binomWindow struct {
	a int
	c []float64
}

// newBinomWindow computes the binomial CDF around the mode by the ratio
// recursion p(k+1)/p(k) = (n−k)/(k+1) · q/(1−q), normalised by the window
// sum, which holds all but < 1e-20 of the probability.
func newBinomWindow(n int, q, sd float64) binomWindow {
	mode := min(int(math.Floor(float64(n+1)*q)), n)
	half := int(10*sd) + 40
	a, b := max(0, mode-half), min(n, mode+half)
	p := make([]float64, b-a+1)
	p[mode-a] = 1
	r := q / (1 - q)
	for k := mode; k < b; k++ {
		p[k+1-a] = p[k-a] * float64(n-k) / float64(k+1) * r
	}
	for k := mode; k > a; k-- {
		p[k-1-a] = p[k-a] * float64(k) / float64(n-k+1) / r
	}
	var s float64
	for i, v := range p {
		s += v
		p[i] = s
	}
	for i := range p {
		p[i] /= s
	}
	return binomWindow{a: a, c: p}
}

// cdf returns P(B ≤ k).
func (w binomWindow) cdf(k int) float64 {
	switch i := k - w.a; {
	case i < 0:
		return 0
	case i >= len(w.c):
		return 1
	default:
		return w.c[i]
	}
}
