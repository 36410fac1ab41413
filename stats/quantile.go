package stats

import (
	"math"
	"slices"
)

// Quantile returns the q-quantile (the value not exceeded with probability
// q) of the ascending sample sorted, by linear interpolation between order
// statistics, type 7 of Hyndman & Fan (1996), the default of R and numpy:
// with n = len(sorted) and h = (n−1)·q,
//
//	Quantile = sorted[⌊h⌋] + (h − ⌊h⌋)·(sorted[⌊h⌋+1] − sorted[⌊h⌋]).
//
// Quantile(sorted, 0) is the minimum, Quantile(sorted, 1) the maximum. When
// h is within rounding error of an integer k (as for q = 0.1 given as 1 − 0.9),
// h is taken as k, so the result is the order statistic sorted[k] exactly.
// The result is in the unit of the sample.
//
// Constraints are 0 ≤ q ≤ 1 and len(sorted) ≥ 1, and sorted must be in
// ascending order without NaNs; Quantile panics on an empty sample or q
// outside [0, 1] and does not check the order.
func Quantile(sorted []float64, q float64) float64 {
	if len(sorted) == 0 {
		panic("stats: Quantile of empty sample")
	}
	return quantileAt(len(sorted), q, func(k int) float64 { return sorted[k] })
}

// quantileAt returns the type-7 q-quantile of n values whose order
// statistic of 0-based rank k is at(k).
func quantileAt(n int, q float64, at func(k int) float64) float64 {
	lo, f := position(n, q)
	if f == 0 {
		return at(lo)
	}
	return interpolate(at(lo), at(lo+1), f)
}

// quantileRanks returns ranks with the order statistics that quantileAt
// reads for each q of qs, of n values, appended, then sorted and without
// repeats.
func quantileRanks(ranks []int, n int, qs ...float64) []int {
	for _, q := range qs {
		lo, f := position(n, q)
		ranks = append(ranks, lo)
		if f > 0 {
			ranks = append(ranks, lo+1)
		}
	}
	slices.Sort(ranks)
	return slices.Compact(ranks)
}

// Exceedance returns the value exceeded with probability p (the "P" value
// of resource reporting: Exceedance(sorted, 0.9) is P90, the low case), that
// is Quantile(sorted, 1−p). sorted must be ascending; see Quantile for the
// estimator and the constraints (0 ≤ p ≤ 1).
func Exceedance(sorted []float64, p float64) float64 {
	if !(p >= 0 && p <= 1) {
		panic("stats: Exceedance probability outside [0, 1]")
	}
	return Quantile(sorted, 1-p)
}

// position returns the type-7 interpolation position of the q-quantile in
// a sample of n values: the lower index lo and the fraction f in [0, 1), with
// lo+1 < n whenever f > 0.
func position(n int, q float64) (lo int, f float64) {
	if !(q >= 0 && q <= 1) {
		panic("stats: quantile probability outside [0, 1]")
	}
	h := float64(n-1) * q
	fl := math.Floor(h)
	// Snap h to the nearest integer when it is off by rounding only, so
	// that q = 1 − 0.9 and q = 0.1 give the same order statistic.
	if r := math.Round(h); math.Abs(h-r) <= 4*epsilon*math.Max(h, 1) {
		fl, h = r, r
	}
	lo = int(fl)
	if lo >= n-1 {
		return n - 1, 0
	}
	return lo, h - fl
}

// epsilon is the relative spacing of float64 values near 1 (2^−52).
const epsilon = 0x1p-52

// interpolate returns a + f·(b − a) for 0 < f < 1: a itself when a == b
// (which keeps all-equal samples exact) and the infinite end when a or b
// is infinite (where the formula would give NaN).
func interpolate(a, b, f float64) float64 {
	switch {
	case a == b, math.IsInf(a, 0):
		return a
	case math.IsInf(b, 0):
		return b
	}
	return a + f*(b-a)
}
