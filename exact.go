package rockheat

import (
	"errors"
	"sync/atomic"

	"rockheat/stats"
)

// selection is the state of an exact run that does not keep its trials:
// every output streams into its sketch and, for its exact order
// statistics, into a stats.Selector bracketed from a pilot batch (see
// selectExact).
type selection struct {
	sels  []*stats.Selector       // [output], nil for a mirror
	parts [][]*stats.SelectorPart // [worker][output], nil for a mirror
}

// selectExact runs an exact estimate that keeps no trial. Batch 0 is the
// sensitivity sample, held in sensOut (the run is longer than
// keepOutputsLimit, so sensN is a whole batch). Every output streams into
// its sketch and into a stats.Selector bracketed from the sketches of a
// pilot batch: batch 1 when there are two workers or more, which worker 1
// draws while worker 0 draws batch 0 (the longer of the two: its draws and
// their ranks are kept), else batch 0. The other batches start once the
// selectors exist. Any pilot gives the same figures, the selectors' order
// statistics being exact; it only sets the brackets. Should a selector's
// brackets miss (a chance below 1e-11), the run is made again keeping
// every output.
func (r *run) selectExact() error {
	r.startSketches()
	r.planned = r.s.trials
	if r.s.workers < 2 || r.plan.Batches() < 2 { // (Estimate selects above 4 batches; the guard is for direct calls)
		if err := r.batches(0, 1); err != nil {
			return err
		}
		r.selection = r.newSelection(0)
		r.selection.addSensitivitySample(r)
		return r.batches(1, r.plan.Batches())
	}
	p := &pilots{ready: make(chan struct{})}
	err := forBatches(r.s.workers, 2, r.plan.Batches(), r.pilotHooks(p), func(w int) func(b int) error {
		work := r.batchWork(w)
		return func(b int) error {
			<-p.ready // the selectors exist (or batch 1 failed) before any other batch is added
			if p.fails.Load() {
				return errPilotFailed
			}
			return work(b)
		}
	})
	for _, e := range p.err {
		if e != nil {
			return e
		}
	}
	return err
}

// pilots is the state of a selecting run's batches 0 and 1.
type pilots struct {
	ready chan struct{} // closed once r.selection is set, or batch 1 failed
	err   [2]error      // of batches 0 and 1
	fails atomic.Bool   // whether either failed
}

// pilotHooks returns forBatches's first hooks for workers 0 and 1, which
// run batches 0 and 1: worker 1 builds the selectors from its batch and
// closes p.ready; worker 0 adds batch 0 to them once they exist.
func (r *run) pilotHooks(p *pilots) []func() {
	wk0, wk1 := r.worker(0), r.worker(1) // made here: forBatches's goroutines may not make workers
	// pilot runs batch b on wk and adds it to wk's sketches; a failure is
	// kept in p and stops the other batches.
	pilot := func(wk *worker, b int) (n, z int, ok bool) {
		n, z, err := wk.batch(b, nil)
		if err != nil {
			p.err[b] = err
			p.fails.Store(true)
			return 0, 0, false
		}
		r.addSketches(wk)
		return n, z, true
	}
	return []func(){
		func() {
			n, z, ok := pilot(wk0, 0)
			if !ok {
				return
			}
			<-p.ready
			if r.selection != nil {
				r.selection.addSensitivitySample(r)
			}
			r.count(wk0, n, z)
		},
		func() {
			defer close(p.ready)
			n, z, ok := pilot(wk1, 1)
			if !ok {
				return
			}
			r.selection = r.newSelection(1) // worker 1's sketches hold batch 1 alone
			r.selection.add(wk1)
			r.count(wk1, n, z)
		},
	}
}

// errPilotFailed stops the batches after a pilot batch failed; the pilot's
// error is reported instead.
var errPilotFailed = errors.New("rockheat: a pilot batch failed")

// newSelection returns the selection of the run's outputs, bracketed from
// worker w's sketches, which must hold one batch alone.
func (r *run) newSelection(w int) *selection {
	sel := &selection{sels: make([]*stats.Selector, len(r.specs)), parts: make([][]*stats.SelectorPart, r.s.workers)}
	for j, m := range r.mirror {
		if m < 0 {
			sel.sels[j] = stats.NewSketchSelector(r.s.trials, r.s.stat, r.sketches[w][j])
		}
	}
	for w := range sel.parts {
		sel.parts[w] = make([]*stats.SelectorPart, len(r.specs))
	}
	for j, s := range sel.sels {
		if s != nil {
			for w, p := range s.Parts(r.s.workers) {
				sel.parts[w][j] = p
			}
		}
	}
	return sel
}

// addSensitivitySample adds batch 0, held in the sensitivity sample, to
// worker 0's selector parts.
func (sel *selection) addSensitivitySample(r *run) {
	_, n := r.plan.BatchRange(0)
	for j, p := range sel.parts[0] {
		if p != nil {
			p.AddSlice(r.sensOut[j][:n])
		}
	}
}

// add adds a worker's batch to its selector parts.
func (sel *selection) add(wk *worker) {
	for j, p := range sel.parts[wk.w] {
		if p != nil {
			p.AddSlice(wk.out[j])
		}
	}
}

// add adds a worker's batch of n trials, z without heat, to the run's
// sketches, selectors and counts.
func (r *run) add(wk *worker, n, z int) {
	if r.sketches != nil {
		r.addSketches(wk)
	}
	if r.selection != nil {
		r.selection.add(wk)
	}
	r.count(wk, n, z)
}

// addSketches adds a worker's batch to its sketches, but for mirrors,
// whose values are those of the output they mirror.
func (r *run) addSketches(wk *worker) {
	for j, sk := range r.sketches[wk.w] {
		if sk != nil {
			sk.AddSlice(wk.out[j])
		}
	}
}

// count adds a worker's batch of n trials, z without heat, to the run's
// counts, and reports progress.
func (r *run) count(wk *worker, n, z int) {
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
		sk := foldSketch(r.sketches, j)
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
