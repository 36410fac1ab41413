package stats

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/stat/distuv"

	"rockheat/stats/radix"
)

// DefaultConfidence is the coverage probability of confidence intervals
// when Options.Confidence is 0.
const DefaultConfidence = 0.95

// Options controls Summarize and Sketch.Summary. The zero value is
// DefaultOptions.
type Options struct {
	// Confidence is the coverage probability of every confidence interval,
	// in (0, 1); 0 selects DefaultConfidence.
	Confidence float64
}

// DefaultOptions are the options of rockheat's reports: 95 % intervals.
var DefaultOptions = Options{Confidence: DefaultConfidence}

// Validate reports whether o is usable, with an error naming the problem
// and its fix. Options built from user input should be validated before
// they reach Summarize, which panics on invalid options.
func (o Options) Validate() error {
	c := o.Confidence
	if c == 0 || (c > 0 && c < 1) {
		return nil
	}
	return fmt.Errorf("confidence level %g is outside (0, 1); give a probability such as 0.95", c)
}

// Level returns the confidence level of o: Confidence, or
// DefaultConfidence for 0. It panics if o is invalid.
func (o Options) Level() float64 {
	if err := o.Validate(); err != nil {
		panic("stats: " + err.Error())
	}
	if o.Confidence == 0 {
		return DefaultConfidence
	}
	return o.Confidence
}

// Summary describes a column of trial results. All values are in the unit
// of the column. Percentiles follow the exceedance convention (P90 is
// exceeded with 90 % probability, P90 ≤ P50 ≤ P10) and the type-7
// estimator; see the package documentation.
type Summary struct {
	// N is the number of values summarised; NaN values are not counted.
	N int
	// NaN is the number of NaN values left out.
	NaN int

	// Mean is the sample mean, correctly rounded from an exact sum.
	Mean float64
	// SD is the sample standard deviation, with divisor N−1; NaN if N < 2.
	SD float64
	// Min and Max are the smallest and largest values.
	Min, Max float64

	// P90, P50 and P10 are the values exceeded with probability 0.9, 0.5
	// and 0.1: the 10th, 50th and 90th percentiles.
	P90, P50, P10 float64
	// P90CI, P50CI and P10CI are distribution-free confidence intervals
	// for the population P90, P50 and P10, with their achieved coverage.
	P90CI, P50CI, P10CI Interval
	// MeanCI is the interval Mean ± t·SD/√N, t the Student t quantile with
	// N−1 degrees of freedom; its Level is nominal (it relies on the central
	// limit theorem).
	MeanCI Interval

	// Warnings lists problems that do not stop the summary (NaN values,
	// too few values for an interval), each saying what to do about it.
	Warnings []error
}

// Summarize returns the Summary of the values x with the options opt.
//
// Summarize sorts x in place: on return x holds its NaN values first and
// then the other values in ascending order. Pass a copy to keep the
// original order. NaN values are left out of every statistic and counted
// in Summary.NaN, with a warning. An empty x (or one of NaNs only) gives a
// Summary with N = 0, NaN statistics and a warning. Summarize takes O(n)
// time (radix sort) and 16 bytes of scratch memory per value. It panics if
// opt is invalid.
func Summarize(x []float64, opt Options) Summary {
	level := opt.Level()
	nan := 0
	for i, v := range x {
		if v != v {
			x[i], x[nan] = x[nan], x[i]
			nan++
		}
	}
	s := x[nan:]
	radix.Float64s(s)
	m := newMoments()
	for _, v := range s {
		m.add(v)
	}
	return build(len(s), nan, func(i int) float64 { return s[i] }, m, level)
}

// build assembles a Summary of n values from the order statistic at(i),
// i in [0, n), and the exact moments m.
func build(n, nan int, at func(i int) float64, m *moments, level float64) Summary {
	s := Summary{N: n, NaN: nan}
	if nan > 0 {
		s.Warnings = append(s.Warnings, fmt.Errorf(
			"%d of %d values are NaN and were left out of the statistics; find the trials that give NaN and correct the input ranges that produce them",
			nan, n+nan))
	}
	if n == 0 {
		nan := math.NaN()
		none := Interval{Lo: nan, Hi: nan, Level: level}
		s.Mean, s.SD, s.Min, s.Max = nan, nan, nan, nan
		s.P90, s.P50, s.P10 = nan, nan, nan
		s.P90CI, s.P50CI, s.P10CI, s.MeanCI = none, none, none, none
		s.Warnings = append(s.Warnings, fmt.Errorf("no values to summarise; run at least one trial"))
		return s
	}
	s.Min, s.Max = at(0), at(n-1)
	s.Mean, s.SD = m.meanSD()

	quant := func(q float64) float64 { return quantileAt(n, q, at) }
	var short []string // percentiles without an interval at the level
	need := 0
	interval := func(name string, q float64) Interval {
		lo, hi, cov := QuantileBounds(n, q, level)
		if cov < level {
			short = append(short, name)
			need = max(need, trialsFor(q, level))
		}
		return Interval{Lo: at(lo), Hi: at(hi), Level: level, Coverage: cov}
	}
	s.P90, s.P90CI = quant(0.1), interval("P90", 0.1)
	s.P50, s.P50CI = quant(0.5), interval("P50", 0.5)
	s.P10, s.P10CI = quant(0.9), interval("P10", 0.9)
	if len(short) > 0 {
		s.Warnings = append(s.Warnings, fmt.Errorf(
			"%s cannot give a %g %% confidence interval for %s, so none is shown; run at least %d trials",
			count(n, "value"), 100*level, strings.Join(short, ", "), need))
	}

	s.MeanCI = Interval{Lo: math.NaN(), Hi: math.NaN(), Level: level}
	if n < 2 {
		s.Warnings = append(s.Warnings, fmt.Errorf(
			"the standard deviation and the interval for the mean need at least 2 values; run more trials"))
	} else if !math.IsNaN(s.SD) {
		t := distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(n - 1)}.Quantile((1 + level) / 2)
		h := t * s.SD / math.Sqrt(float64(n))
		s.MeanCI.Lo, s.MeanCI.Hi, s.MeanCI.Coverage = s.Mean-h, s.Mean+h, level
	}
	return s
}

// trialsFor returns the least n for which the widest order-statistic
// interval [x(1), x(n)] covers the q-quantile with probability ≥ level:
// 1 − q^n − (1−q)^n ≥ level.
func trialsFor(q, level float64) int {
	n := 2
	for 1-math.Pow(q, float64(n))-math.Pow(1-q, float64(n)) < level {
		n++
	}
	return n
}

// count returns "1 value" or "n values".
func count(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}
