// Package stats turns columns of Monte Carlo trial results into summaries:
// percentiles with distribution-free confidence intervals, moments, a
// bounded-memory mergeable quantile sketch for very long runs, and rank
// correlation sensitivities.
//
// # Percentile convention
//
// rockheat reports exceedance percentiles, as resource-reporting practice
// does: P90 is the value exceeded with 90 % probability (the low case),
// P50 the median and P10 the value exceeded with only 10 % probability
// (the high case). In terms of the ordinary, non-exceedance quantile
// function Q,
//
//	P90 = Q(0.10),  P50 = Q(0.50),  P10 = Q(0.90),
//
// so P90 ≤ P50 ≤ P10. Exceedance(sorted, p) returns the value exceeded
// with probability p; Quantile(sorted, q) the value not exceeded with
// probability q.
//
// # Estimator
//
// Sample quantiles use linear interpolation between order statistics,
// type 7 of Hyndman & Fan (1996), "Sample quantiles in statistical
// packages", The American Statistician 50(4):361–365 — the default of R
// and numpy. For an ascending sample x[0] ≤ … ≤ x[n−1] and h = (n−1)·q,
//
//	Q(q) = x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]).
//
// # Confidence intervals
//
// Percentile intervals are distribution-free: they are pairs of order
// statistics whose ranks come from the binomial distribution of the number
// of trials falling below the true quantile (Hahn & Meeker 1991,
// "Statistical Intervals", §5.2). They hold for any continuous output
// distribution and are conservative for discrete ones.
//
// # Long runs
//
// A Sketch summarises any number of trials in bounded memory: a histogram
// of bins named by the top bits of each value (so of relative width at
// most 2^−13 at the default resolution) gives every order statistic
// within a stated relative error (DefaultRelErr = 10⁻⁴), and
// exact integer sums give the mean and standard deviation exactly. Its
// state is made of exact counts, so sketches merge in any order with
// bit-identical results.
//
// # Sensitivity
//
// RankSensitivity ranks the inputs of a model by Spearman's rank
// correlation with an output, with the normalised squared coefficients as
// approximate variance shares (meaningful for near-additive monotone
// models).
//
// # Values and units
//
// The functions attach no unit to the values: results are in the unit of
// the input column (J, W, …). NaN values are dropped and counted; they are
// never silently treated as numbers.
package stats
