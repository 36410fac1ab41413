package expect

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// Mode is the way a check compares figures.
type Mode int

const (
	// Exact compares the text of every figure: bit-identical results.
	Exact Mode = iota
	// Statistical allows each compared figure the difference two
	// independent Monte Carlo estimates may show (see the package
	// documentation).
	Statistical
)

// String returns "exact" or "stat", the names ParseMode reads.
func (m Mode) String() string {
	switch m {
	case Exact:
		return "exact"
	case Statistical:
		return "stat"
	}
	return fmt.Sprintf("Mode(%d)", int(m))
}

// ParseMode reads a Mode by the name String gives it.
func ParseMode(s string) (Mode, error) {
	for _, m := range []Mode{Exact, Statistical} {
		if s == m.String() {
			return m, nil
		}
	}
	return 0, fmt.Errorf("tolerance %q is not \"exact\" (bit for bit, the default) or \"stat\" (within Monte Carlo error)", s)
}

// Tolerance says how a check compares figures.
type Tolerance struct {
	Mode Mode
	// Z is the two-sided standard normal quantile each statistically
	// compared figure is tested at (BonferroniZ); used by Statistical.
	Z float64
}

// statsPerOutput are the statistics of an output compared in Statistical
// mode.
var statsPerOutput = []string{"p90", "p50", "p10", "mean", "sd"}

// StatFigures returns the number of figures of e that Statistical
// compares: p90, p50, p10, mean and sd of every output, and the count of
// zero-heat trials.
func StatFigures(e *Expectation) int { return len(statsPerOutput)*len(e.Outputs) + 1 }

// BonferroniZ returns the two-sided standard normal quantile z for m
// comparisons at family-wise level alpha: P(|N(0,1)| > z) = alpha/m, so
// that by Bonferroni's inequality m tests of true hypotheses all pass with
// probability at least 1 − alpha. It panics unless 0 < alpha < 1 and m ≥ 1.
func BonferroniZ(alpha float64, m int) float64 {
	if !(alpha > 0 && alpha < 1) || m < 1 {
		panic(fmt.Sprintf("expect: BonferroniZ(%g, %d): need 0 < alpha < 1 and m ≥ 1", alpha, m))
	}
	return distuv.UnitNormal.Quantile(1 - alpha/float64(m)/2)
}

// percentileSE returns the standard error of a percentile whose
// order-statistic confidence interval at level is ci: the interval spans
// about ±Φ⁻¹((1+level)/2) standard errors.
func percentileSE(ci Interval, level float64) float64 {
	zc := distuv.UnitNormal.Quantile((1 + level) / 2)
	return (ci[1].value() - ci[0].value()) / (2 * zc)
}

// meanSE returns the standard error sd/√n of a mean of n trials.
func meanSE(o *Output, n int) float64 { return o.SD.value() / math.Sqrt(float64(n)) }

// sdSE returns a bound on the asymptotic standard error of the sample
// standard deviation s of n trials: √((μ₄ − σ⁴)/(4σ²n)) with μ₄ ≤ R²σ², R the
// largest distance of a trial from the mean, gives √((R² − s²)/(4n)).
func sdSE(o *Output, n int) float64 {
	s, mean := o.SD.value(), o.Mean.value()
	r := math.Max(o.Max.value()-mean, mean-o.Min.value())
	return math.Sqrt(math.Max(0, r*r-s*s) / (4 * float64(n)))
}

// proportionAllowed returns the largest difference of the fractions
// k1/n1 and k2/n2 the pooled two-proportion test passes at z.
func proportionAllowed(k1, n1, k2, n2 int, z float64) float64 {
	p := float64(k1+k2) / float64(n1+n2)
	return z * math.Sqrt(p*(1-p)*(1/float64(n1)+1/float64(n2)))
}
