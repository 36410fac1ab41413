package rockheat

import (
	"fmt"
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"rockheat/heatmodel"
	"rockheat/sampler"
	"rockheat/scenarios"
	"rockheat/stats"
)

// ExactLimit is the largest run whose percentiles are computed exactly from
// every trial held in memory. Longer runs, and runs to a precision, stream
// their outputs into bounded-memory quantile sketches (stats.Sketch, with
// relative error stats.DefaultRelErr) and stratify their Latin hypercube
// per batch.
const ExactLimit = sampler.GlobalLHSLimit

// SensitivityTrials is the number of trials, from the start of a run, that
// rank-correlation sensitivity is computed on: all of them in a shorter run.
const SensitivityTrials = 2 * sampler.BatchSize

// MaxKeptTrials bounds the runs that can keep every trial (--samples).
const MaxKeptTrials = ExactLimit

// DefaultMaxTrials caps a run to a precision when Options.MaxTrials is 0.
const DefaultMaxTrials = 100_000_000

// Options adjusts a run. The zero value runs the scenario as written.
type Options struct {
	// Trials overrides the scenario's trial count when > 0. With
	// Precision, it is the size of the first round.
	Trials int
	// Seed overrides the scenario's seed when not nil.
	Seed *uint64
	// Workers is the number of goroutines filling batches; 0 means
	// runtime.GOMAXPROCS(0). It never changes the results.
	Workers int
	// Confidence is the level of the confidence intervals, in (0, 1);
	// 0 means 0.95.
	Confidence float64
	// Precision, when > 0, runs round after round of trials until the
	// confidence interval of every reported percentile (P90, P50, P10 of
	// every output) has a relative half-width below Precision (0.005 for
	// 0.5 %), or MaxTrials is reached.
	Precision float64
	// MaxTrials caps a run to a precision; 0 means DefaultMaxTrials.
	MaxTrials int
	// Stream forces the bounded-memory route (quantile sketches, Latin
	// hypercube per batch) for a run short enough to be exact.
	Stream bool
	// KeepSamples keeps every trial's inputs and outputs in
	// Result.Samples. Runs longer than MaxKeptTrials cannot keep them.
	KeepSamples bool
	// Progress, if not nil, is called after each batch with the number of
	// trials done and the number planned. Calls come from one goroutine
	// at a time.
	Progress func(done, total int)
}

// Input describes one scenario input in a Result.
type Input struct {
	Key   string // scenario key, e.g. "area_km2"
	Unit  string
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
	// Curve[10] is the P90): the points of an exceedance curve.
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

// Samples holds every trial of a run, one column per input (in scenario
// units) and per output (in report units). A fixed input has a nil column
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

// Result is what a run found.
type Result struct {
	Title string
	Path  string
	Kind  string
	// Fluid and Conversion are the [model] fluid property source and
	// conversion route (scenarios.Fluid*, scenarios.Conversion*).
	Fluid, Conversion string
	Trials            int // trials run
	Seed              uint64
	Sampling          string // "lhs" or "random"
	// PerBatch is true when the Latin hypercube was stratified batch by
	// batch rather than over the whole run.
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

	Inputs []Input
	// Correlations are the target rank correlations among the inputs.
	Correlations []scenarios.Correlation
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
}

// OptionError reports options that cannot run with the scenario (too
// many trials, --samples with a streaming run, ...): a usage problem, not
// a failure of the run.
type OptionError struct{ Msg string }

func (e *OptionError) Error() string { return e.Msg }

func optionErrorf(format string, args ...any) error {
	return &OptionError{fmt.Sprintf(format, args...)}
}

// run is the state of one Estimate.
type run struct {
	s       *scenarios.Scenario
	opt     Options
	m       model
	specs   []OutputSpec
	dists   []sampler.Distribution
	keys    []string // keys of the sampled inputs, in the order of dists
	consts  map[string]float64
	plan    *sampler.Plan
	workers int
	planned int // trials planned, for progress
	done    atomic.Int64
	zero    atomic.Int64
	// saturated counts trials whose IF97 fluid state was on the steam
	// side of saturation and was taken as saturated liquid.
	saturated atomic.Int64
	progMu    sync.Mutex
	keepIn    [][]float64 // every trial's inputs (KeepSamples), or nil
	exactOut  [][]float64 // every trial's outputs (exact mode), or nil
	sensIn    [][]float64 // inputs of the sensitivity sample
	sensOut   [][]float64 // outputs of the sensitivity sample
	sensN     int
	sketches  [][]*stats.Sketch // [worker][output], streaming mode
}

// Estimate runs scenario s and summarises its outputs.
func Estimate(s *scenarios.Scenario, opt Options) (*Result, error) {
	trials := s.Trials
	if opt.Trials > 0 {
		trials = opt.Trials
	}
	seed := s.Seed
	if opt.Seed != nil {
		seed = *opt.Seed
	}
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	conf := opt.Confidence
	if conf == 0 {
		conf = stats.DefaultConfidence
	}
	if !(conf > 0 && conf < 1) {
		return nil, optionErrorf("confidence level %g must lie strictly between 0 and 1, e.g. 0.95", conf)
	}
	if opt.Precision < 0 || opt.Precision >= 1 || math.IsNaN(opt.Precision) {
		return nil, optionErrorf("precision %g must be a fraction between 0 and 1, e.g. 0.005 for 0.5%%", opt.Precision)
	}
	if trials > scenarios.MaxTrials || opt.MaxTrials > scenarios.MaxTrials {
		return nil, optionErrorf("%d trials is more than the %d a run may take (hours of work); use fewer trials, or --precision to stop when the percentiles are settled", max(trials, opt.MaxTrials), int64(scenarios.MaxTrials))
	}
	maxTrials := opt.MaxTrials
	if maxTrials <= 0 {
		maxTrials = DefaultMaxTrials
	}
	streaming := trials > ExactLimit || opt.Precision > 0 || opt.Stream
	if opt.KeepSamples && streaming { // every run longer than MaxKeptTrials streams
		if opt.Precision > 0 {
			return nil, optionErrorf("keeping every trial (--samples) does not go with --precision; drop one of them")
		}
		return nil, optionErrorf("keeping every trial (--samples) works for runs of up to %d trials; this run has %d: use fewer trials or drop --samples", MaxKeptTrials, trials)
	}

	r := &run{s: s, opt: opt, m: modelFor(s.Model), workers: workers, consts: map[string]float64{}}
	r.specs = r.m.outputs()
	res := &Result{Title: s.Title, Path: s.Path, Kind: s.Model.Kind, Fluid: s.Model.Fluid, Conversion: s.Model.Conversion, Seed: seed, Sampling: s.Sampling.String(),
		Confidence: conf, Streaming: streaming, Precision: opt.Precision, Correlations: s.Correlations}
	for _, in := range s.Inputs {
		res.Inputs = append(res.Inputs, Input{Key: in.Key.Name, Unit: in.Key.Unit, Doc: in.Key.Doc, Dist: in.Dist.String(), Fixed: in.Fixed})
		if in.Fixed {
			r.consts[in.Key.Name] = in.Dist.Quantile(0.5)
			continue
		}
		r.dists = append(r.dists, in.Dist)
		r.keys = append(r.keys, in.Key.Name)
	}
	planTrials := trials
	if opt.Precision > 0 {
		planTrials = max(maxTrials, trials)
	}
	r.plan = sampler.NewPlan(r.dists, sampler.Config{Trials: planTrials, Seed: seed, Method: s.Sampling,
		Correlation: s.Correlation, PerBatch: streaming})
	res.PerBatch = s.Sampling == sampler.LatinHypercube && streaming && trials > sampler.BatchSize

	// The sensitivity sample is the first trials of the run. A run to a
	// precision runs at least SensitivityTrials in its first round.
	firstRound := trials
	if opt.Precision > 0 {
		firstRound = min(max(trials, SensitivityTrials), planTrials)
	}
	r.sensN = min(firstRound, SensitivityTrials)
	if opt.KeepSamples {
		r.keepIn = columns(len(r.dists), trials)
	} else {
		r.sensIn = columns(len(r.dists), r.sensN)
	}
	if streaming {
		r.sensOut = columns(len(r.specs), r.sensN)
	}
	stat := stats.Options{Confidence: conf}
	var err error
	if !streaming {
		r.exactOut = columns(len(r.specs), trials)
		r.planned = trials
		if err = r.batches(0, r.plan.Batches()); err != nil {
			return nil, err
		}
		res.Trials = trials
	} else {
		res.SketchRelErr = stats.DefaultRelErr
		r.sketches = make([][]*stats.Sketch, workers)
		for w := range r.sketches {
			r.sketches[w] = make([]*stats.Sketch, len(r.specs))
			for j := range r.specs {
				r.sketches[w][j] = stats.NewSketch(stats.DefaultRelErr)
			}
		}
		if res.Trials, res.Converged, err = r.stream(trials, planTrials, stat); err != nil {
			return nil, err
		}
	}
	res.ZeroHeatTrials = int(r.zero.Load())
	res.SensitivityN = r.sensN

	// Sensitivity first: it needs the trials in their original order.
	res.Sensitivity = r.sensitivity()

	res.Outputs = make([]Output, len(r.specs))
	if streaming {
		total := mergeSketches(r.sketches)
		for j, sp := range r.specs {
			res.Outputs[j] = Output{Spec: sp, Summary: total[j].Summary(stat), Curve: curve(total[j].Quantile)}
		}
	} else {
		parallel(len(r.specs), workers, func(j int) {
			col := r.exactOut[j]
			if opt.KeepSamples {
				col = append([]float64(nil), col...)
			}
			sum := stats.Summarize(col, stat) // sorts col
			res.Outputs[j] = Output{Spec: r.specs[j], Summary: sum,
				Curve: curve(func(q float64) float64 { return stats.Quantile(col[sum.NaN:], q) })}
		})
	}
	if opt.Precision > 0 && !res.Converged {
		res.Warnings = append(res.Warnings, fmt.Sprintf("the percentiles did not reach the %.3g%% precision asked within %d trials; raise the trial cap or ask for a looser precision", 100*opt.Precision, maxTrials))
	}
	if n := r.saturated.Load(); n > 0 {
		res.Warnings = append(res.Warnings, fmt.Sprintf("in %d of %d trials the fluid pressure was below the saturation pressure at the sampled temperature, so the water would boil; those trials use saturated-liquid properties at their temperature (a boiling-point reservoir). Check the pressure (or depth) and temperature ranges together", n, res.Trials))
	}
	// The summaries' own warnings (too few trials for an interval, NaN
	// values), each said once; an output that does not vary has exact
	// percentiles whatever the trial count.
	seen := map[string]bool{}
	for _, o := range res.Outputs {
		if o.Summary.Min == o.Summary.Max {
			continue
		}
		for _, w := range o.Summary.Warnings {
			if msg := w.Error(); !seen[msg] {
				seen[msg] = true
				res.Warnings = append(res.Warnings, msg)
			}
		}
	}
	if res.ZeroHeatTrials == res.Trials {
		if s.Model.Kind == scenarios.KindHotRock {
			res.Warnings = append(res.Warnings, "no trial has rock at or above the minimum useful temperature above the maximum depth; check the temperature, gradient and depth inputs")
		} else {
			res.Warnings = append(res.Warnings, "no trial has any heat above the reference temperature; check the temperature inputs")
		}
	}
	if opt.KeepSamples {
		res.Samples = r.samples()
	}
	return res, nil
}

// stream runs a streaming-mode estimate: the whole run, or, to a
// precision, rounds that double the trials until every percentile's
// interval is narrow enough. Rounds end on batch boundaries fixed by the
// trial counts alone, so where a run stops does not depend on workers.
func (r *run) stream(trials, planTrials int, stat stats.Options) (ran int, converged bool, err error) {
	if r.opt.Precision == 0 {
		r.planned = trials
		return trials, false, r.batches(0, r.plan.Batches())
	}
	target := max(trials, SensitivityTrials) // as firstRound in Estimate
	from := 0
	for {
		target = min(target, planTrials)
		to := (target + sampler.BatchSize - 1) / sampler.BatchSize
		r.planned = min(to*sampler.BatchSize, planTrials)
		if err := r.batches(from, to); err != nil {
			return 0, false, err
		}
		ran = min(to*sampler.BatchSize, planTrials)
		from = to
		if r.settled(stat) {
			return ran, true, nil
		}
		if ran >= planTrials {
			return ran, false, nil
		}
		target = 2 * ran
	}
}

// settled reports whether every P90, P50 and P10 has a confidence
// interval narrower than the precision asked.
func (r *run) settled(stat stats.Options) bool {
	for _, sk := range mergeSketches(r.sketches) {
		s := sk.Summary(stat)
		for _, c := range []struct {
			v  float64
			iv stats.Interval
		}{{s.P90, s.P90CI}, {s.P50, s.P50CI}, {s.P10, s.P10CI}} {
			if stats.RelativeHalfWidth(c.iv, c.v) >= r.opt.Precision {
				return false
			}
		}
	}
	return true
}

func mergeSketches(per [][]*stats.Sketch) []*stats.Sketch {
	total := make([]*stats.Sketch, len(per[0]))
	for j := range total {
		total[j] = stats.NewSketch(stats.DefaultRelErr)
		for w := range per {
			total[j].Merge(per[w][j])
		}
	}
	return total
}

// batches draws and evaluates batches [from, to) of the plan on the
// workers.
func (r *run) batches(from, to int) error {
	var (
		next     atomic.Int64
		wg       sync.WaitGroup
		errOnce  sync.Once
		firstErr error
	)
	next.Store(int64(from))
	for w := 0; w < min(r.workers, to-from); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			if err := r.worker(w, &next, to); err != nil {
				errOnce.Do(func() { firstErr = err })
			}
		}()
	}
	wg.Wait()
	return firstErr
}

// worker processes batches until none is left below to.
func (r *run) worker(w int, next *atomic.Int64, to int) error {
	var sc scratch
	cols := make(map[string]heatmodel.Column, len(r.consts)+len(r.keys))
	for k, v := range r.consts {
		cols[k] = heatmodel.Const(v)
	}
	in := make([][]float64, len(r.dists))
	out := make([][]float64, len(r.specs))
	size := min(sampler.BatchSize, r.plan.Trials())
	localIn := columns(len(r.dists), size)
	localOut := columns(len(r.specs), size)
	for {
		b := int(next.Add(1) - 1)
		if b >= to {
			return nil
		}
		start, n := r.plan.BatchRange(b)
		// Inputs go where they are kept: every trial, the sensitivity
		// sample, or a scratch buffer.
		for j := range in {
			switch {
			case r.keepIn != nil:
				in[j] = r.keepIn[j][start : start+n]
			case start+n <= r.sensN:
				in[j] = r.sensIn[j][start : start+n]
			default:
				in[j] = localIn[j][:n]
			}
		}
		for j := range out {
			switch {
			case r.exactOut != nil:
				out[j] = r.exactOut[j][start : start+n]
			case start+n <= r.sensN:
				out[j] = r.sensOut[j][start : start+n]
			default:
				out[j] = localOut[j][:n]
			}
		}
		if err := r.plan.Fill(b, in); err != nil {
			return err
		}
		for j, k := range r.keys {
			cols[k] = heatmodel.Vary(in[j])
		}
		z, err := r.m.evaluate(n, cols, out, &sc)
		if err != nil {
			return err
		}
		r.saturated.Add(int64(sc.saturated))
		sc.saturated = 0
		for j, sp := range r.specs {
			if sp.Scale != 1 {
				inv := 1 / sp.Scale
				for i := range out[j] {
					out[j][i] *= inv
				}
			}
			if r.sketches != nil {
				r.sketches[w][j].AddSlice(out[j])
			}
		}
		r.zero.Add(int64(z))
		d := r.done.Add(int64(n))
		if r.opt.Progress != nil {
			r.progMu.Lock()
			r.opt.Progress(int(d), r.planned)
			r.progMu.Unlock()
		}
	}
}

// sensitivity ranks every sampled input against every output on the
// sensitivity sample, and evaluates the one-at-a-time swings.
func (r *run) sensitivity() []Sensitivity {
	if len(r.keys) == 0 || r.sensN < 3 {
		return nil
	}
	sensIn, sensOut := r.sensIn, r.sensOut
	if r.keepIn != nil {
		sensIn = prefix(r.keepIn, r.sensN)
	}
	if r.exactOut != nil {
		sensOut = prefix(r.exactOut, r.sensN)
	}
	inRanks := make([][]float64, len(sensIn))
	parallel(len(sensIn), r.workers, func(j int) { inRanks[j] = stats.Ranks(sensIn[j]) })
	low, high, base := r.swings()
	out := make([]Sensitivity, len(r.specs))
	parallel(len(r.specs), r.workers, func(j int) {
		infl := stats.RankedSensitivity(r.keys, inRanks, stats.Ranks(sensOut[j]))
		sens := Sensitivity{Output: r.specs[j].Name, Base: base[j]}
		for _, f := range infl {
			k := indexOf(r.keys, f.Input)
			sens.Influences = append(sens.Influences, Influence{Influence: f, SwingLow: low[j][k], SwingHigh: high[j][k]})
		}
		out[j] = sens
	})
	return out
}

// swings evaluates the model with each sampled input in turn at its own
// 10th and 90th percentile (its P90 and P10) and the others at their
// medians: low[j][k] and high[j][k] are output j with input k low and
// high, base[j] output j with every input at its median.
func (r *run) swings() (low, high [][]float64, base []float64) {
	k := len(r.keys)
	n := 2*k + 1 // the last trial has every input at its median
	in := columns(k, n)
	for j, d := range r.dists {
		med := d.Quantile(0.5)
		for i := 0; i < n; i++ {
			in[j][i] = med
		}
		in[j][2*j] = d.Quantile(0.1)
		in[j][2*j+1] = d.Quantile(0.9)
	}
	cols := map[string]heatmodel.Column{}
	for key, v := range r.consts {
		cols[key] = heatmodel.Const(v)
	}
	for j, key := range r.keys {
		cols[key] = heatmodel.Vary(in[j])
	}
	out := columns(len(r.specs), n)
	var sc scratch
	if _, err := r.m.evaluate(n, cols, out, &sc); err != nil {
		// Percentile points lie inside each input's checked domain; a
		// model that rejects them rejects the run as well, reported there.
		for j := range out {
			for i := range out[j] {
				out[j][i] = math.NaN()
			}
		}
	}
	low, high = make([][]float64, len(r.specs)), make([][]float64, len(r.specs))
	base = make([]float64, len(r.specs))
	for j, sp := range r.specs {
		base[j] = out[j][n-1] / sp.Scale
		low[j], high[j] = make([]float64, k), make([]float64, k)
		for i := 0; i < k; i++ {
			low[j][i] = out[j][2*i] / sp.Scale
			high[j][i] = out[j][2*i+1] / sp.Scale
		}
	}
	return low, high, base
}

func (r *run) samples() *Samples {
	smp := &Samples{}
	j := 0
	for _, in := range r.s.Inputs {
		smp.Names = append(smp.Names, in.Key.Name)
		if in.Fixed {
			smp.Columns = append(smp.Columns, nil)
			smp.Consts = append(smp.Consts, r.consts[in.Key.Name])
			continue
		}
		smp.Columns = append(smp.Columns, r.keepIn[j])
		smp.Consts = append(smp.Consts, 0)
		j++
	}
	for j, sp := range r.specs {
		smp.Names = append(smp.Names, sp.Name)
		smp.Columns = append(smp.Columns, r.exactOut[j])
		smp.Consts = append(smp.Consts, 0)
	}
	return smp
}

// curve returns quantile(k/100) for k = 0, ..., 100.
func curve(quantile func(q float64) float64) []float64 {
	c := make([]float64, CurvePoints)
	for k := range c {
		c[k] = quantile(float64(k) / (CurvePoints - 1))
	}
	return c
}

func columns(k, n int) [][]float64 {
	c := make([][]float64, k)
	for j := range c {
		c[j] = make([]float64, n)
	}
	return c
}

func prefix(cols [][]float64, n int) [][]float64 {
	p := make([][]float64, len(cols))
	for j := range cols {
		p[j] = cols[j][:n]
	}
	return p
}

func indexOf(list []string, s string) int {
	for i, x := range list {
		if x == s {
			return i
		}
	}
	panic("rockheat: no " + s)
}

// parallel calls f(0), ..., f(n−1) on at most workers goroutines.
func parallel(n, workers int, f func(i int)) {
	var wg sync.WaitGroup
	sem := make(chan struct{}, max(1, workers))
	for i := 0; i < n; i++ {
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer wg.Done()
			defer func() { <-sem }()
			f(i)
		}()
	}
	wg.Wait()
}
