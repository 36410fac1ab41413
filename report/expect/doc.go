// Package expect keeps the expected results of a scenario beside it and
// checks new runs against them: the regression runs of a CI pipeline.
//
// # Layout
//
// The expectation of scenario NAME.toml is NAME.expect.json in the same
// folder (Path). It is a JSON object of
//
//	format            "rockheat-expectation/1" (Format)
//	title, kind       of the scenario, for the reader
//	scenario          the scenario's file name, and scenario_sha256 the
//	                  SHA-256 of its bytes (hex): an edited scenario is told
//	                  from drifted results
//	written_by        module, version, revision, modified, go and platform
//	                  of the rockheat that wrote it (runtime/debug.ReadBuildInfo)
//	trials, seed,     the run's settings: a check re-runs the scenario with
//	sampling          this seed and trial count
//	confidence        level of the confidence intervals
//	percentiles       "exact", or "sketch" with sketch_relative_error
//	zero_heat_trials  trials without heat
//	outputs           a list, in model order, of {name, unit, p90, p50,
//	                  p10, mean, sd, min, max, p90_ci, p50_ci, p10_ci,
//	                  mean_ci}; the hot-rock power at each report year is
//	                  the output thermal_power_at_Y_years
//
// Every figure is a JSON string holding the shortest decimal that reads
// back as the same float64 (strconv.FormatFloat(x, 'g', -1, 64)); an
// interval is a pair of them, [lo, hi].
//
// # Exact comparison
//
// The same seed and trial count on the same version of rockheat (and the
// same platform) reproduce every figure bit for bit, so Exact compares the
// text of every figure, interval end and count.
//
// # Statistical comparison
//
// Statistical asks whether the two records could be two independent Monte
// Carlo estimates of the same quantities. For a figure with standard errors
// se₁ and se₂ at the two records' trial counts, the difference is allowed
// up to
//
//	z · √(se₁² + se₂²)
//
// where z is the two-sided standard normal quantile of the per-figure level
// (BonferroniZ). The standard errors:
//
//   - P90, P50, P10: from the percentile's own distribution-free interval,
//     se = (hi − lo) / (2·z_c), z_c = Φ⁻¹((1 + c)/2) for the interval's
//     level c: the order-statistic interval spans about ±z_c standard errors
//     of the percentile (asymptotic normality of sample quantiles; Serfling
//     1980, "Approximation Theorems of Mathematical Statistics", §2.3, from
//     memory). When the
//     percentiles come from sketches, each side's relative error bound times
//     its value is added to the allowance.
//   - mean: sd/√n.
//   - sd: the asymptotic standard error of a sample standard deviation,
//     √((μ₄ − σ⁴)/(4σ²n)) by the delta method on Var(s²) ≈ (μ₄ − σ⁴)/n (a
//     standard result of sampling theory, from memory),
//     with the fourth central moment, which a run does not report, bounded
//     by μ₄ ≤ R²σ² (R = max(max − mean, mean − min), the largest distance of
//     a trial from the mean): se ≤ √((R² − s²)/(4n)). This is conservative
//     (about three times too wide for a normal output), so sd catches only
//     gross changes of spread; P90 and P10 catch the rest.
//   - zero-heat trials: the pooled two-proportion test (common practice), the difference of
//     the fractions k/n allowed up to z·√(p(1−p)(1/n₁ + 1/n₂)) with p the
//     pooled fraction.
//   - min, max and the interval ends are not compared statistically: the
//     extremes of a sample have no standard error of this kind, and the
//     interval ends move with their percentile.
//
// All standard errors assume independent trials. Latin hypercube sampling
// makes estimates less variable than that, so for LHS runs the tolerance
// is conservative: fewer false alarms than the level says, and a larger
// shift needed to be detected.
//
// Across the figures of a check, Bonferroni's inequality bounds the
// family-wise false-alarm probability: with m figures compared
// (StatFigures summed over every scenario of the check) each at level α/m,
// a clean check fails with probability at most α.
package expect
