package stats

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// ProportionInterval returns the exact (Clopper–Pearson) confidence
// interval, at coverage level, for a probability estimated by k successes
// in n trials: the Beta(k, n−k+1) quantile (1−level)/2 and the
// Beta(k+1, n−k) quantile (1+level)/2, with 0 and 1 at the ends k = 0 and
// k = n (Clopper & Pearson 1934; docs/references.md §9). Its coverage is at
// least level for every true probability, so Coverage is set to Level. It
// panics if n < 1, k is outside [0, n] or level is outside (0, 1).
func ProportionInterval(k, n int, level float64) Interval {
	if n < 1 || k < 0 || k > n {
		panic("stats: ProportionInterval with k outside [0, n] or n < 1")
	}
	if !(level > 0 && level < 1) {
		panic("stats: ProportionInterval with level outside (0, 1)")
	}
	a := (1 - level) / 2
	iv := Interval{Lo: 0, Hi: 1, Level: level, Coverage: level}
	if k > 0 {
		iv.Lo = distuv.Beta{Alpha: float64(k), Beta: float64(n - k + 1)}.Quantile(a)
	}
	if k < n {
		iv.Hi = distuv.Beta{Alpha: float64(k + 1), Beta: float64(n - k)}.Quantile(1 - a)
	}
	iv.Lo, iv.Hi = math.Max(0, iv.Lo), math.Min(1, iv.Hi)
	return iv
}
