package rockheat

import (
	"sync/atomic"

	"rockheat/stats"
)

// selection is the state of an exact run that does not keep its trials:
// every output streams into its sketch and, for its exact order
// statistics, into a stats.Selector bracketed from the first batch.
type selection struct {
	sels  []*stats.Selector       // [output], nil for a mirror
	parts [][]*stats.SelectorPart // [worker][output], nil for a mirror
}

// selectExact runs an exact estimate that keeps no trial: batch 0 first,
// then the others on the workers. Batch 0 is the sensitivity sample, held
// in sensOut (the run is longer than keepOutputsLimit, so sensN is a whole
// batch), and its sketches are the pilots of the outputs' selectors.
// While batch 0 runs, a second worker draws and evaluates batch 1; once
// the selectors exist, workers 0 and 1 add batches 0 and 1 to them (and
// batch 1 to the sketches) before they run the rest. Should a selector's
// brackets miss (a chance below 1e-11), the run is made again keeping
// every output.
func (r *run) selectExact() error {
	r.startSketches()
	r.planned = r.s.trials
	ahead, err := r.pilot()
	if err != nil {
		return err
	}
	_, n := r.plan.BatchRange(0)
	sel := &selection{parts: make([][]*stats.SelectorPart, r.s.workers)}
	// Worker 0's sketches hold batch 0 alone: the pilots, unsorted.
	sel.sels = make([]*stats.Selector, len(r.specs)) // nil for a mirror
	for j, m := range r.mirror {
		if m < 0 {
			sel.sels[j] = stats.NewSketchSelector(r.s.trials, r.s.stat, r.sketches[0][j])
		}
	}
	for w := range sel.parts {
		sel.parts[w] = make([]*stats.SelectorPart, len(r.specs))
		for j, s := range sel.sels {
			if s != nil {
				sel.parts[w][j] = s.Part()
			}
		}
	}
	r.selection = sel
	// Before its first batch, worker 0 adds batch 0 to its selector parts
	// and worker 1 adds batch 1, which it evaluated during the pilot.
	first := []func(){func() {
		for j, p := range sel.parts[0] {
			if p != nil {
				p.AddSlice(r.sensOut[j][:n])
			}
		}
	}}
	if ahead == nil {
		return r.batchesAfter(first, 1, r.plan.Batches())
	}
	first = append(first, func() { r.add(ahead.wk, ahead.n, ahead.zero) })
	return r.batchesAfter(first, 2, r.plan.Batches())
}

// aheadBatch is batch 1 of a selecting run, drawn and evaluated while the
// pilot ran, and not yet added.
type aheadBatch struct {
	wk      *worker
	n, zero int
}

// pilot runs batch 0 and adds it to the sketches; with a second worker and
// a second batch, it draws and evaluates batch 1 meanwhile, and returns it
// to be added once the selectors exist. It returns the error of batch 0,
// else that of batch 1.
func (r *run) pilot() (*aheadBatch, error) {
	if r.s.workers < 2 || r.plan.Batches() < 2 {
		return nil, r.batches(0, 1)
	}
	ahead := &aheadBatch{wk: r.worker(1)}
	var aheadErr error
	done := make(chan struct{})
	go func() {
		defer close(done)
		ahead.n, ahead.zero, aheadErr = ahead.wk.batch(1, nil)
	}()
	err := r.batches(0, 1)
	<-done
	if err == nil {
		err = aheadErr
	}
	return ahead, err
}

// add adds a worker's batch of n trials, z without heat, to the run's
// sketches, selectors and counts.
func (r *run) add(wk *worker, n, z int) {
	for j := range r.specs {
		if r.mirror[j] >= 0 {
			continue // its values are those of the output it mirrors
		}
		if r.sketches != nil {
			r.sketches[wk.w][j].AddSlice(wk.out[j])
		}
		if r.selection != nil {
			r.selection.parts[wk.w][j].AddSlice(wk.out[j])
		}
	}
	r.saturated.Add(int64(wk.ev.saturated()))
	r.zero.Add(int64(z))
	if r.s.Progress == nil {
		r.done.Add(int64(n))
		return
	}
	r.progMu.Lock() // counted inside, so that the counts reported rise
	r.s.Progress(int(r.done.Add(int64(n))), r.planned)
	r.progMu.Unlock()
}

// selectedOutputs summarises the outputs of a selectExact run: exact
// order statistics from the selectors, moments from the sketches, and
// the exceedance curve from the sketches (within their relative error).
// It returns false when a selector missed.
func (r *run) selectedOutputs() ([]Output, bool) {
	outs := make([]Output, len(r.specs))
	var missed atomic.Bool
	r.eachSummarised(func(j int) {
		sk := mergeSketch(r.sketches, j)
		parts := make([]*stats.SelectorPart, len(r.selection.parts))
		for w := range parts {
			parts[w] = r.selection.parts[w][j]
		}
		sum, ok := r.selection.sels[j].Summary(sk, parts)
		if !ok {
			missed.Store(true)
			return
		}
		outs[j] = Output{Spec: r.specs[j], Summary: sum, Curve: sk.Quantiles(curveProbabilities)}
	})
	return r.copyMirrors(outs), !missed.Load()
}
