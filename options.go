package rockheat

import (
	"fmt"
	"math"
	"runtime"
	"strings"

	"rockheat/sampler"
	"rockheat/stats"
)

// ExactLimit is the largest run whose percentiles are exact order
// statistics of all its trials (found in one pass, stats.Selector, without
// holding the trials); it is also the longest run that can keep every
// trial (Options.KeepSamples). Longer runs, and runs to a precision,
// stream their outputs into bounded-memory quantile sketches (stats.Sketch,
// with relative error stats.DefaultRelErr).
const ExactLimit = 1 << 21

// SensitivityTrials is the number of trials, from the start of a run, that
// rank-correlation sensitivity is computed on: the first batch, or all of
// a shorter run. The standard error of a rank correlation near 0 over
// them is about 1/sqrt(SensitivityTrials) = 0.004.
const SensitivityTrials = sampler.BatchSize

// DefaultMaxTrials caps a run to a precision when Options.MaxTrials is 0.
const DefaultMaxTrials = 100_000_000

// Options adjusts a run. The zero value runs the Run as described.
type Options struct {
	// Trials overrides the run's trial count when > 0. With Precision,
	// the run's (or this) trial count is the size of the first round.
	Trials int
	// Seed overrides the run's seed when not nil.
	Seed *uint64
	// Workers is the number of goroutines filling batches; 0 means
	// runtime.GOMAXPROCS(0). It never changes the results.
	Workers int
	// Confidence is the level of the confidence intervals, in (0, 1);
	// 0 means stats.DefaultConfidence.
	Confidence float64
	// Precision, when > 0, runs round after round of trials until the
	// confidence interval of every reported percentile (P90, P50, P10 of
	// every output) has a relative half-width below Precision (0.005 for
	// 0.5 %), or MaxTrials is reached.
	Precision float64
	// MaxTrials caps a run to a precision; 0 means DefaultMaxTrials. It
	// may not be below the first round.
	MaxTrials int
	// Stream forces the sketch route (percentiles within
	// stats.DefaultRelErr) for a run short enough to be exact.
	Stream bool
	// KeepSamples keeps every trial's inputs and outputs in
	// Result.Samples. Runs longer than ExactLimit cannot keep them.
	KeepSamples bool
	// Progress, if not nil, is called after each batch with the number of
	// trials done and the number planned. Calls come from one goroutine
	// at a time.
	Progress func(done, total int)
}

// OptionError reports options that cannot run with the Run (too many
// trials, keeping the samples of a streaming run, ...): a usage problem,
// not a failure of the run. Options names the Options fields at fault, so
// that a command can name its own flags.
type OptionError struct {
	Options []string // e.g. ["KeepSamples", "Precision"]
	Msg     string
}

func (e *OptionError) Error() string {
	if len(e.Options) == 0 {
		return e.Msg
	}
	return strings.Join(e.Options, " and ") + ": " + e.Msg
}

func optionErrorf(options []string, format string, args ...any) error {
	return &OptionError{Options: options, Msg: fmt.Sprintf(format, args...)}
}

// settings are the options of one run, resolved against its Run.
type settings struct {
	Options
	trials     int // trials of the run, or of its first round
	seed       uint64
	workers    int
	stat       stats.Options
	maxTrials  int  // cap of a run to a precision
	streaming  bool // outputs go to sketches
	planTrials int  // trials the plan must cover
	// noSensitivity leaves out the sensitivity sample (a portfolio's
	// prospects have none).
	noSensitivity bool
}

// resolveOptions checks opt against the checked run c.
func resolveOptions(c *checked, opt Options) (*settings, error) {
	s := &settings{Options: opt, trials: c.trials, seed: c.run.Seed, workers: opt.Workers}
	if opt.Trials > 0 {
		s.trials = opt.Trials
	}
	if opt.Seed != nil {
		s.seed = *opt.Seed
	}
	if s.workers <= 0 {
		s.workers = runtime.GOMAXPROCS(0)
	}
	s.stat = stats.Options{Confidence: opt.Confidence}
	if err := s.stat.Validate(); err != nil {
		return nil, &OptionError{Options: []string{"Confidence"}, Msg: err.Error()}
	}
	if opt.Precision < 0 || opt.Precision >= 1 || math.IsNaN(opt.Precision) {
		return nil, optionErrorf([]string{"Precision"}, "%g must be a fraction between 0 and 1, e.g. 0.005 for 0.5%%", opt.Precision)
	}
	if s.trials > MaxTrials || opt.MaxTrials > MaxTrials {
		return nil, optionErrorf([]string{"Trials"}, "%d trials is more than the %d a run may take (hours of work); use fewer trials, or a precision target to stop when the percentiles are settled", max(s.trials, opt.MaxTrials), int64(MaxTrials))
	}
	s.maxTrials = opt.MaxTrials
	if s.maxTrials <= 0 {
		s.maxTrials = DefaultMaxTrials
	}
	s.streaming = s.trials > ExactLimit || opt.Precision > 0 || opt.Stream
	s.planTrials = s.trials
	if opt.Precision > 0 {
		if opt.MaxTrials > 0 && opt.MaxTrials < s.trials {
			return nil, optionErrorf([]string{"MaxTrials"}, "the trial cap %d is below the first round of %d trials; raise the cap, or ask for fewer trials in the first round", opt.MaxTrials, s.trials)
		}
		s.planTrials = max(s.maxTrials, s.trials)
	}
	if opt.KeepSamples && s.streaming {
		if opt.Precision > 0 {
			return nil, optionErrorf([]string{"KeepSamples", "Precision"}, "keeping every trial does not go with a precision target; drop one of them")
		}
		return nil, optionErrorf([]string{"KeepSamples"}, "keeping every trial works for runs of up to %d trials; this run has %d: use fewer trials, or do not keep the trials", ExactLimit, s.trials)
	}
	return s, nil
}

// keepsOutputs reports whether the run holds every trial's outputs: an
// exact run that keeps its trials or is at most keepOutputsLimit long.
func (s *settings) keepsOutputs() bool {
	return !s.streaming && (s.KeepSamples || s.trials <= keepOutputsLimit)
}

// keepOutputsLimit is the longest exact run that holds its outputs rather
// than select their order statistics in one pass (run.selectExact): up to
// it, the outputs take little memory (2 MB an output), and the selection's
// pilot batch, run before the others, would cost a large share of the
// time.
const keepOutputsLimit = 4 * sampler.BatchSize

// firstRound returns the trials of the first round: the whole run, or, to
// a precision, at least SensitivityTrials (the sensitivity sample) and at
// most the cap.
func (s *settings) firstRound() int {
	if s.Precision == 0 {
		return s.trials
	}
	return min(max(s.trials, SensitivityTrials), s.planTrials)
}
