package rockheat

import (
	"fmt"
	"slices"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/mat"

	"rockheat/heatmodel"
	"rockheat/sampler"
	"rockheat/stats"
)

// run is the state of one Estimate.
type run struct {
	c       *checked
	s       *settings
	specs   []OutputSpec
	sampled []input // the sampled inputs
	// drawn, if not nil, lists the sampled inputs (indices into sampled)
	// that the plan draws, in the order of its distributions; the others
	// are given batch by batch (a portfolio's shared inputs).
	drawn   []int
	dists   []sampler.Distribution
	names   []string // names of the sampled inputs
	plan    *sampler.Plan
	planned int // trials planned, for progress
	done    atomic.Int64
	zero    atomic.Int64
	// saturated counts trials whose IF97 fluid state was on the steam
	// side of saturation and was taken as saturated liquid.
	saturated atomic.Int64
	progMu    sync.Mutex
	keepIn    [][]float64 // every trial's inputs (KeepSamples), or nil
	exactOut  [][]float64 // every trial's outputs (exact mode), or nil
	sensIn    [][]float64 // inputs of the sensitivity sample, unless keepIn holds them
	sensOut   [][]float64 // its outputs, unless exactOut holds them
	sensN     int
	// sensRanks, if not nil, receives from the plan the doubled ranks of
	// the sensitivity sample's draws, where it knows them (nil where not).
	sensRanks [][]int32
	// mirror[j] is the output that output j mirrors (OutputSpec.Mirror),
	// or −1: a mirror has no sketch, selector or ranks of its own.
	mirror    []int
	sketches  [][]*stats.Sketch // [worker][output], streaming and selecting; nil for a mirror
	selection *selection        // exact order statistics without the trials, or nil
	converged bool              // a run to a precision reached it
	pool      []*worker         // the workers, by slot (see worker)
}

// Estimate runs rn and summarises its outputs. It checks rn first and
// returns every problem found as InputErrors, and options that cannot run
// with it as an *OptionError.
func Estimate(rn *Run, opt Options) (*Result, error) {
	c, err := rn.resolve()
	if err != nil {
		return nil, err
	}
	s, err := resolveOptions(c, opt)
	if err != nil {
		return nil, err
	}
	r := newRun(c, s)
	switch {
	case s.streaming:
		r.startSketches()
		err = r.stream()
	case s.keepsOutputs():
		err = r.keepExact()
	default:
		err = r.selectExact()
	}
	if err != nil {
		return nil, err
	}
	return r.result()
}

// keepExact runs an exact estimate that keeps every trial's outputs.
func (r *run) keepExact() error {
	r.sketches, r.selection = nil, nil
	r.zero.Store(0)
	r.done.Store(0)
	r.saturated.Store(0)
	r.exactOut = columns(len(r.specs), r.s.trials)
	r.planned = r.s.trials
	return r.batches(0, r.plan.Batches())
}

// newRun sets up the draws and the buffers of a run.
func newRun(c *checked, s *settings) *run { return newRunGiven(c, s, nil) }

// newRunGiven is newRun with the sampled inputs named in given left to the
// caller, batch by batch (see worker.batch); they may not be correlated.
func newRunGiven(c *checked, s *settings, given map[string]bool) *run {
	r := &run{c: c, s: s, specs: c.run.Model.outputs()}
	r.mirror = mirrors(r.specs)
	var keep []int // indices, among the sampled inputs, of those drawn
	for _, in := range c.inputs {
		if in.fixed {
			continue
		}
		if !given[in.name] {
			keep = append(keep, len(r.sampled))
			r.dists = append(r.dists, in.dist)
		}
		r.sampled = append(r.sampled, in)
		r.names = append(r.names, in.name)
	}
	corr := c.corr
	if len(keep) < len(r.sampled) {
		r.drawn = append([]int{}, keep...) // not nil, even when empty
		corr = subMatrix(c.corr, keep)
	}
	r.plan = sampler.NewPlan(r.dists, sampler.Config{Trials: s.planTrials, Seed: s.seed, Method: c.run.Sampling,
		Correlation: corr})
	// The sensitivity sample is the first batch of the run (all of a
	// shorter one), held where the run does not keep every trial.
	if !s.noSensitivity {
		r.sensN = min(s.firstRound(), SensitivityTrials)
	}
	var nIn, nOut int // sensitivity columns
	if s.KeepSamples {
		r.keepIn = columns(len(r.sampled), s.trials)
	} else if r.sensN > 0 {
		nIn = len(r.sampled)
	}
	if !s.keepsOutputs() && r.sensN > 0 {
		nOut = len(r.specs)
	}
	sens := columnSets(r.sensN, nIn, nOut)
	r.sensIn, r.sensOut = nilIfNone(sens[0], nIn), nilIfNone(sens[1], nOut)
	// A Latin hypercube without correlations knows the order of its draws:
	// the sensitivity sample's inputs need no ranking when it is a whole
	// batch.
	if _, n0 := r.plan.BatchRange(0); r.sensN == n0 && r.drawn == nil && corr == nil && c.run.Sampling == sampler.LatinHypercube {
		r.sensRanks = make([][]int32, len(r.sampled))
		for j := range r.sensRanks {
			r.sensRanks[j] = make([]int32, n0)
		}
	}
	return r
}

// subMatrix returns the rows and columns keep of m, or nil for a nil m.
func subMatrix(m *mat.SymDense, keep []int) *mat.SymDense {
	if m == nil {
		return nil
	}
	sub := mat.NewSymDense(len(keep), nil)
	for a, i := range keep {
		for b, j := range keep[a:] {
			sub.SetSym(a, a+b, m.At(i, j))
		}
	}
	return sub
}

// startSketches gives every worker a sketch per output.
func (r *run) startSketches() {
	r.sketches = make([][]*stats.Sketch, r.s.workers)
	for w := range r.sketches {
		r.sketches[w] = make([]*stats.Sketch, len(r.specs))
		for j := range r.specs {
			if r.mirror[j] < 0 {
				r.sketches[w][j] = stats.NewSketch(stats.DefaultRelErr)
			}
		}
	}
}

// result summarises the trials run.
func (r *run) result() (*Result, error) {
	c, s := r.c, r.s
	fluid, conv := c.run.Model.Settings()
	res := &Result{Title: c.run.Title, Path: c.run.Path, SourceSHA256: c.run.SourceSHA256, Kind: c.run.Model.Kind(), Fluid: fluid, Conversion: conv,
		Trials: r.ranTrials(), Seed: s.seed, Sampling: c.run.Sampling, Confidence: s.stat.Level(),
		Streaming: s.streaming, Precision: s.Precision, Correlations: c.run.Correlations}
	res.PerBatch = c.run.Sampling == sampler.LatinHypercube && res.Trials > sampler.BatchSize
	if h, ok := c.run.Model.(*HotRock); ok {
		res.Decline = h.Decline
	}
	for _, in := range c.inputs {
		res.Inputs = append(res.Inputs, Input{Key: in.name, Unit: in.unit.Symbol, Doc: in.Doc, Dist: in.dist.String(), Fixed: in.fixed})
	}
	res.ZeroHeatTrials = int(r.zero.Load())
	res.SensitivityN = r.sensN
	res.Sensitivity = r.sensitivity()
	var err error
	if res.Outputs, err = r.outputs(); err != nil {
		return nil, err
	}
	if s.streaming {
		res.SketchRelErr = stats.DefaultRelErr
		res.Converged = r.converged
	}
	for _, w := range c.warnings {
		res.Warnings = append(res.Warnings, w.Error())
	}
	res.Warnings = append(res.Warnings, r.warnings(res)...)
	if s.KeepSamples {
		res.Samples = r.samples()
	}
	return res, nil
}

// ranTrials returns the number of trials run.
func (r *run) ranTrials() int {
	if r.s.Precision > 0 {
		return int(r.done.Load())
	}
	return r.s.trials
}

// outputs summarises every output.
func (r *run) outputs() ([]Output, error) {
	if r.selection != nil {
		if outs, ok := r.selectedOutputs(); ok {
			return outs, nil
		}
		// A selector missed its rank: run again, keeping every output.
		if err := r.keepExact(); err != nil {
			return nil, err
		}
	}
	outs := make([]Output, len(r.specs))
	if r.sketches != nil {
		r.eachSummarised(func(j int) {
			sk := foldSketch(r.sketches, j)
			outs[j] = Output{Spec: r.specs[j], Summary: sk.Summary(r.s.stat), Curve: sk.Quantiles(curveProbabilities)}
		})
		return r.copyMirrors(outs), nil
	}
	r.eachSummarised(func(j int) {
		sum, c := stats.SummarizeAt(r.exactOut[j], r.s.stat, curveProbabilities)
		outs[j] = Output{Spec: r.specs[j], Summary: sum, Curve: c}
	})
	return r.copyMirrors(outs), nil
}

// mirrors returns, for each output of specs, the index of the output it
// mirrors (OutputSpec.Mirror), or −1. It panics on a mirror of no earlier
// output, or of one in another unit or of other inputs: a mistake in a
// model's outputs.
func mirrors(specs []OutputSpec) []int {
	m := make([]int, len(specs))
	for j, sp := range specs {
		m[j] = -1
		if sp.Mirror == "" {
			continue
		}
		i := slices.IndexFunc(specs[:j], func(o OutputSpec) bool { return o.Name == sp.Mirror && o.Mirror == "" })
		if i < 0 {
			panic(fmt.Sprintf("rockheat: output %s mirrors %q, which is not an earlier output", sp.Name, sp.Mirror))
		}
		if o := specs[i]; o.Unit != sp.Unit || o.Scale != sp.Scale || o.Offset != sp.Offset || !slices.Equal(o.DependsOn, sp.DependsOn) {
			panic(fmt.Sprintf("rockheat: output %s mirrors %s, which differs in unit or inputs", sp.Name, sp.Mirror))
		}
		m[j] = i
	}
	return m
}

// eachSummarised calls f(j), on the workers, for every output that is not
// a mirror.
func (r *run) eachSummarised(f func(j int)) {
	var own []int
	for j, m := range r.mirror {
		if m < 0 {
			own = append(own, j)
		}
	}
	parallel(len(own), r.s.workers, func(a int) { f(own[a]) })
}

// copyMirrors gives each mirror the figures of the output it mirrors,
// under its own spec, and returns outs.
func (r *run) copyMirrors(outs []Output) []Output {
	for j, m := range r.mirror {
		if m >= 0 {
			outs[j] = outs[m]
			outs[j].Spec = r.specs[j]
			outs[j].Curve = slices.Clone(outs[m].Curve)
		}
	}
	return outs
}

// warnings returns the problems that did not stop the run, each once.
func (r *run) warnings(res *Result) []string {
	var ws []string
	if r.s.Precision > 0 && !res.Converged {
		ws = append(ws, fmt.Sprintf("the percentiles did not reach the %.3g%% precision asked within %d trials; raise the trial cap or ask for a looser precision", 100*r.s.Precision, res.Trials))
	}
	if n := r.saturated.Load(); n > 0 {
		ws = append(ws, fmt.Sprintf("in %d of %d trials the fluid pressure was below the saturation pressure at the sampled temperature, so the water would boil; those trials use saturated-liquid properties at their temperature (a boiling-point reservoir). Check the pressure (or depth) and temperature ranges together", n, res.Trials))
	}
	// The summaries' own warnings (too few trials for an interval, NaN
	// values), each said once; a run with no sampled input has exact
	// percentiles whatever the trial count.
	seen := map[string]bool{}
	for _, o := range res.Outputs {
		if len(r.sampled) == 0 {
			break
		}
		for _, w := range o.Summary.Warnings {
			if msg := w.Error(); !seen[msg] {
				seen[msg] = true
				ws = append(ws, msg)
			}
		}
	}
	if res.ZeroHeatTrials == res.Trials {
		if res.Kind == heatmodel.KindHotRock {
			ws = append(ws, "no trial has rock at or above the minimum useful temperature above the maximum depth; check the temperature, gradient and depth inputs")
		} else {
			ws = append(ws, "no trial has any heat above the reference temperature; check the temperature inputs")
		}
	}
	return ws
}

// samples returns every trial's inputs and outputs.
func (r *run) samples() *Samples {
	smp := &Samples{}
	j := 0
	for _, in := range r.c.inputs {
		smp.Names = append(smp.Names, in.name)
		if in.fixed {
			smp.Columns = append(smp.Columns, nil)
			smp.Consts = append(smp.Consts, in.dist.Quantile(0.5))
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

// curveProbabilities are the non-exceedance probabilities of an
// Output.Curve: 0, 0.01, ..., 1.
var curveProbabilities = func() []float64 {
	q := make([]float64, CurvePoints)
	for k := range q {
		q[k] = float64(k) / (CurvePoints - 1)
	}
	return q
}()

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
