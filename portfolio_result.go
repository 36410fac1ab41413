package rockheat

import (
	"rockheat/heatmodel"
	"rockheat/sampler"
	"rockheat/stats"
)

// PortfolioResult is what a portfolio run found. Every Output is one of
// PortfolioOutputs, in that order, in report units, its percentiles from
// quantile sketches (within SketchRelErr of the exact order statistics).
type PortfolioResult struct {
	Title        string
	Trials       int            // trials run, the same for every prospect
	Seed         uint64         // the portfolio's seed, from which each prospect's streams are mixed
	Sampling     sampler.Method // how every prospect's inputs were drawn
	Confidence   float64        // the level of the confidence intervals
	SketchRelErr float64        // the sketches' relative error bound

	Prospects []ProspectResult
	// Unrisked is the total, net of the shares, with every prospect
	// succeeding; Risked the total in which each prospect contributes zero
	// in the trials where it fails.
	Unrisked, Risked []Output
	// SumP90 and SumP10 are, per output, the sums of the prospects' net
	// P90s and P10s, in the output's report unit: what adding percentiles
	// would (wrongly) give.
	SumP90, SumP10 []float64
	// ChanceNone is the share of trials in which no prospect succeeds,
	// with its confidence interval; ExpectedSuccesses the sum of the
	// chances of success.
	ChanceNone        float64
	ChanceNoneCI      stats.Interval
	ExpectedSuccesses float64
	// Target is set when the portfolio asks for a target capacity.
	Target *TargetResult

	Shared              []SharedInput
	Correlations        []ProspectCorrelation
	SuccessCorrelations []ProspectCorrelation
	// Samples is set when Options.KeepSamples is: every trial's inputs
	// and outputs of every prospect (names "prospect/input"), its success
	// (1 or 0), and the totals.
	Samples  *Samples
	Warnings []string
}

// ProspectResult is one prospect's part of a portfolio run.
type ProspectResult struct {
	// Name is the prospect's in the portfolio; Title, Path and
	// SourceSHA256 (hex SHA-256) are those of its scenario.
	Name, Title, Path, SourceSHA256 string
	Kind                            heatmodel.Kind
	Chance                          float64        // chance of success, [0, 1]
	Factors                         []ChanceFactor // the factors Chance is the product of, if given
	Share                           float64        // working interest, (0, 1]
	// Unrisked are the prospect's own outputs, gross (not net of its
	// share), as if it succeeds.
	Unrisked []Output
	// RiskedMean is, per output, the mean over the trials of the net
	// contribution: share × output in the trials where the prospect
	// succeeds, 0 where it fails, in the output's report unit.
	RiskedMean     []float64
	ZeroHeatTrials int      // trials with no heat, counted as in Result
	Warnings       []string // the prospect's own run's warnings
}

// TargetResult is the chance that a portfolio's risked total electric
// capacity reaches a target.
type TargetResult struct {
	MWe         float64
	Probability float64
	CI          stats.Interval // Clopper–Pearson, at the run's confidence level
}
