// Package sampler draws the uncertain inputs of a scenario.
//
// Every distribution is sampled by its inverse cumulative distribution
// function (Quantile), so that one sampling scheme serves all of them:
// plain Monte Carlo draws p ~ U(0, 1), Latin hypercube sampling (McKay,
// Beckman & Conover 1979) draws p from a random permutation of N
// equal-probability strata, and Iman–Conover rank correlation
// (Iman & Conover 1982) rearranges the draws without changing any
// input's marginal distribution.
//
// Trials are drawn in fixed-size batches. Each batch has its own random
// stream derived from the run's seed and the batch index alone, so a run
// gives bit-identical draws whatever the number of goroutines that fill
// the batches, and in whatever order they do it.
//
// Values are in the units the caller gives the distribution parameters
// in; the package attaches no meaning to them.
package sampler
