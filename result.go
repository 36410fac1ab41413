package rockheat

import (
	"rockheat/heatmodel"
	"rockheat/sampler"
	"rockheat/stats"
)

// Result is what a run found.
type Result struct {
	Title string // the Run's
	Path  string // the Run's scenario file, "" for a run built in Go
	// SourceSHA256 is the Run's: the hex SHA-256 of its scenario file.
	SourceSHA256 string
	Kind         heatmodel.Kind // the model's
	// Fluid and Conversion are the model's fluid property source and
	// conversion route.
	Fluid      heatmodel.FluidSource
	Conversion heatmodel.Conversion
	// Decline is a hot-rock result's drawdown model.
	Decline  heatmodel.Decline
	Trials   int            // trials run
	Seed     uint64         // the seed of every random stream of the run
	Sampling sampler.Method // how the inputs were drawn
	// PerBatch is true when a Latin hypercube run had more than one batch:
	// each batch of sampler.BatchSize trials is stratified on its own.
	PerBatch bool
	// Confidence is the requested level of the confidence intervals.
	Confidence float64
	// Streaming is true when percentiles come from quantile sketches;
	// SketchRelErr is then their relative error bound.
	Streaming    bool
	SketchRelErr float64
	// Precision is the requested relative half-width (0 if none);
	// Converged says whether every percentile reached it.
	Precision float64
	Converged bool

	// Inputs are the run's inputs, sampled or fixed, in the model's order.
	Inputs []Input
	// Correlations are the target rank correlations among the inputs.
	Correlations []Correlation
	Outputs      []Output
	// Sensitivity has one entry per output, from the first
	// SensitivityTrials trials (SensitivityN of them).
	Sensitivity  []Sensitivity
	SensitivityN int
	// ZeroHeatTrials counts trials with no heat above the reference (or
	// minimum useful) temperature; their outputs are 0 and are included
	// in the percentiles.
	ZeroHeatTrials int
	// Samples is set when Options.KeepSamples is.
	Samples *Samples
	// Warnings are problems that did not stop the run, each with a fix.
	Warnings []string
	// Comparison, when set (by CompareDeclines), is the same hot-rock run
	// with the other decline model.
	Comparison *Result
}

// Input describes one input of a run in a Result.
type Input struct {
	Key   string // name, e.g. "area_km2"
	Unit  string // unit symbol, e.g. "km²"
	Doc   string
	Dist  string // the distribution, e.g. "uniform(min 800, max 1600)"
	Fixed bool
}

// CurvePoints is the number of points of Output.Curve.
const CurvePoints = 101

// Output is the summary of one model output. Figures are in Spec.Unit.
type Output struct {
	Spec    OutputSpec
	Summary stats.Summary
	// Curve holds the output's quantiles at non-exceedance probabilities
	// 0, 0.01, ..., 1 (Curve[k] is exceeded with probability 1 − k/100,
	// Curve[10] is the P90): the points of an exceedance curve. They are
	// exact order statistics when the run kept its outputs (a run of up to
	// 262 144 trials, or KeepSamples); otherwise they come from the sketch,
	// within stats.DefaultRelErr, while Summary stays exact.
	Curve []float64
}

// Influence is one input's effect on one output.
type Influence struct {
	stats.Influence
	// SwingLow and SwingHigh are the output, in its report unit, with the
	// input at its own P90 (low, 10th percentile) and P10 (high, 90th
	// percentile) value and every other sampled input at its median.
	SwingLow, SwingHigh float64
}

// Sensitivity lists the influence of every sampled input on one output,
// most influential first.
type Sensitivity struct {
	Output string
	// Base is the output, in its report unit, with every sampled input
	// at its median: the point the swings move away from.
	Base       float64
	Influences []Influence
}

// Samples holds every trial of a run, one column per input (in the unit
// given) and per output (in report units). A fixed input has a nil column
// and its value in Consts.
type Samples struct {
	Names   []string
	Columns [][]float64
	Consts  []float64
}

// Value returns column j of trial i.
func (s *Samples) Value(j, i int) float64 {
	if s.Columns[j] == nil {
		return s.Consts[j]
	}
	return s.Columns[j][i]
}
