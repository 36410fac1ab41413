package rockheat

import (
	"fmt"
	"strings"
	"sync"
	"sync/atomic"

	"rockheat/heatmodel"
	"rockheat/sampler"
)

// batches draws and evaluates batches [from, to) of the plan on the
// workers.
func (r *run) batches(from, to int) error { return forBatches(r.s.workers, from, to, nil, r.batchWork) }

// batchWork returns worker w's batch function for forBatches: it draws
// and evaluates a batch and adds it to the run.
func (r *run) batchWork(w int) func(b int) error {
	wk := r.worker(w)
	return func(b int) error {
		n, z, err := wk.batch(b, nil)
		if err == nil {
			r.add(wk, n, z)
		}
		return err
	}
}

// forBatches runs batches [from, to) on at most workers goroutines, and
// on at least len(first) of them, goroutine w calling first[w] (if it
// has one) and then taking batches, in order, from a shared counter, with
// the batch function newWork(w) gave it. newWork is called on the
// caller's goroutine, for w = 0, 1, … in turn, each before goroutine w
// starts. It returns the error of the lowest batch that failed, whatever
// the workers: every batch below it has run.
func forBatches(workers, from, to int, first []func(), newWork func(w int) func(b int) error) error {
	var (
		next     atomic.Int64
		wg       sync.WaitGroup
		mu       sync.Mutex
		errBatch = to
		firstErr error
	)
	next.Store(int64(from))
	for w := range max(min(workers, to-from), len(first)) {
		work := newWork(w)
		wg.Add(1)
		go func() {
			defer wg.Done()
			if w < len(first) {
				first[w]()
			}
			for {
				b := int(next.Add(1) - 1)
				if b >= to {
					return
				}
				if err := work(b); err != nil {
					mu.Lock()
					if b < errBatch {
						errBatch, firstErr = b, err
					}
					mu.Unlock()
					return
				}
			}
		}()
	}
	wg.Wait()
	return firstErr
}

// worker is one goroutine's share of a run: its evaluator, with the fixed
// inputs set once, and its buffers.
type worker struct {
	r    *run
	w    int // index, for the worker's sketches
	size int // trials of its largest batch
	ev   evaluator
	cols []*heatmodel.Column // the evaluator's input columns, by field
	// si[j] holds the SI values of sampled input j.
	si                [][]float64
	in, out           [][]float64 // the current batch's draws and outputs
	localIn, localOut [][]float64 // where they go when nothing keeps them
	fill              [][]float64 // the columns of in the plan draws
	// lend, if not nil, lends localIn, localOut and si for one batch at a
	// time (borrow, giveBack) instead of the worker owning them.
	lend *colPool
}

// worker returns the run's worker of slot w, made on first use and kept
// for the run's later batches (a later round, or the batches after a
// pilot), so that its buffers are made once: where its draws and outputs
// go is chosen then (newWorker), and stays right while the run keeps no
// fewer trials than it did. It is not safe for concurrent use (forBatches
// calls it from one goroutine), and a slot's worker serves one goroutine
// at a time.
func (r *run) worker(w int) *worker {
	if w >= len(r.pool) {
		r.pool = append(r.pool, make([]*worker, w+1-len(r.pool))...)
	}
	if r.pool[w] == nil {
		r.pool[w] = r.newWorker(w)
	}
	return r.pool[w]
}

func (r *run) newWorker(w int) *worker { return r.newLendingWorker(w, nil) }

// newLendingWorker is newWorker with its buffers lent by lend, if not nil,
// batch by batch; the run may then keep no draws or outputs.
func (r *run) newLendingWorker(w int, lend *colPool) *worker {
	size := min(sampler.BatchSize, r.plan.Trials())
	wk := &worker{r: r, w: w, size: size, lend: lend,
		si:  make([][]float64, len(r.sampled)),
		in:  make([][]float64, len(r.sampled)),
		out: make([][]float64, len(r.specs))}
	// Buffers only where a batch needs them: somewhere for the draws and
	// outputs that the run does not keep; the SI columns of inputs not in
	// SI units (si) are made when first needed (see batch).
	var nIn, nOut int
	if r.keepIn == nil && lend == nil {
		nIn = len(r.sampled)
	}
	if r.exactOut == nil && lend == nil {
		nOut = len(r.specs)
	}
	if nIn+nOut > 0 {
		sets := columnSets(size, nIn, nOut)
		wk.localIn, wk.localOut = nilIfNone(sets[0], nIn), nilIfNone(sets[1], nOut)
	}
	wk.ev, wk.cols = r.newEvaluator()
	return wk
}

// nilIfNone returns cols, or nil if there were to be no columns (k = 0).
func nilIfNone(cols [][]float64, k int) [][]float64 {
	if k == 0 {
		return nil
	}
	return cols
}

// borrow takes the worker's buffers for a batch from its lender, if it
// has one.
func (wk *worker) borrow() {
	if wk.lend != nil && wk.localIn == nil {
		wk.localIn, wk.localOut = wk.lend.take(len(wk.in)), wk.lend.take(len(wk.out))
	}
}

// giveBack returns the buffers of borrow, and the SI columns, to the
// lender once the batch's draws and outputs are no longer needed.
func (wk *worker) giveBack() {
	if wk.lend == nil {
		return
	}
	for _, cols := range [][][]float64{wk.localIn, wk.localOut, wk.si} {
		wk.lend.give(cols)
	}
	wk.localIn, wk.localOut = nil, nil
	clear(wk.si)
	clear(wk.in)
	clear(wk.out)
}

// newEvaluator returns an evaluator of the run's model with its fixed
// inputs set, and its input columns by field.
func (r *run) newEvaluator() (evaluator, []*heatmodel.Column) {
	ev := r.c.run.Model.newEvaluator()
	cols := ev.columns()
	for _, in := range r.c.inputs {
		if in.fixed {
			*cols[in.fi] = in.unit.column(heatmodel.Const(in.dist.Quantile(0.5)), nil)
		}
	}
	return ev, cols
}

// batch draws and evaluates batch b into wk.out, in report units, and
// returns its number of trials and of trials without heat. given, if not
// nil, holds for each sampled input either nil (drawn by the plan) or the
// batch's values of an input drawn elsewhere (a portfolio's shared input).
func (wk *worker) batch(b int, given [][]float64) (n, zeroHeat int, err error) {
	r := wk.r
	start, n := r.plan.BatchRange(b)
	// Draws that nothing keeps are converted to SI in place.
	inPlace := wk.place(start, n) && given == nil
	if inPlace {
		clear(wk.si) // SI buffers of an earlier batch whose draws were kept (batch 0): not needed again
	}
	for j, g := range given {
		if g != nil {
			copy(wk.in[j], g[:n])
		}
	}
	var ranks [][]int32 // batch 0's ranks, where the sensitivity takes them
	if b == 0 {
		ranks = r.sensRanks
	}
	if err := r.plan.FillRanked(b, wk.drawn(), ranks); err != nil {
		return n, 0, err
	}
	for j, in := range r.sampled {
		buf := wk.in[j]
		if !inPlace && (in.unit.Scale != 1 || in.unit.Offset != 0) {
			if wk.si[j] == nil {
				wk.si[j] = wk.newColumn()
			}
			buf = wk.si[j]
		}
		*wk.cols[in.fi] = in.unit.column(heatmodel.Vary(wk.in[j]), buf)
	}
	z, err := wk.ev.evaluate(n, wk.out)
	if err != nil {
		return n, 0, err
	}
	for j, sp := range r.specs {
		if i := toReportUnit(wk.out[j], sp); i >= 0 {
			return n, 0, wk.trialError(b, start, i, j, inPlace)
		}
	}
	return n, z, nil
}

// newColumn returns a column of the worker's batch size, lent if it has a
// lender.
func (wk *worker) newColumn() []float64 {
	if wk.lend != nil {
		return wk.lend.one()
	}
	return make([]float64, wk.size)
}

// toReportUnit converts the SI values x of output sp to its report unit,
// x/Scale − Offset, in one pass (two values at a time where
// reportUnitPairs has a kernel), and returns the index of the first value
// that is infinite or NaN, or −1.
func toReportUnit(x []float64, sp OutputSpec) int {
	inv, off := 1/sp.Scale, sp.Offset
	if inv == 1 && off == 0 { // the identity: only the check
		if even := len(x) &^ 1; !nonFinitePairs(x[:even]) && firstNonFinite(x[even:]) < 0 {
			return -1
		}
		return firstNonFinite(x)
	}
	even := len(x) &^ 1
	bad := reportUnitPairs(x[:even], inv, off)
	if !reportUnitLoop(x[even:], inv, off) && !bad {
		return -1
	}
	return firstNonFinite(x)
}

// reportUnitLoop sets each value v of x to v·inv − off and reports
// whether any result is infinite or NaN.
func reportUnitLoop(x []float64, inv, off float64) bool {
	nan := 0.0 // becomes NaN, and stays so, at the first value not finite
	for i, v := range x {
		// The conversion rounds the product, so that it is not fused with
		// the subtraction; each step is exact for Scale 1 or Offset 0.
		v = float64(v*inv) - off
		x[i] = v
		nan += v - v // ±Inf − ±Inf and NaN − NaN are NaN
	}
	return nan != nan
}

// drawn returns the columns of the batch's inputs that the plan draws.
func (wk *worker) drawn() [][]float64 {
	if wk.r.drawn == nil {
		return wk.in
	}
	cols := wk.fill[:0]
	for _, j := range wk.r.drawn {
		cols = append(cols, wk.in[j])
	}
	wk.fill = cols
	return cols
}

// firstNonFinite returns the index of the first infinite or NaN value of
// x, or −1.
func firstNonFinite(x []float64) int {
	for i, v := range x {
		if v-v != 0 { // ±Inf − ±Inf and NaN − NaN are NaN
			return i
		}
	}
	return -1
}

// trialError describes trial i of batch b, which starts at start, whose
// output j is not finite. If the batch's draws were converted to SI in
// place, it draws them again to report them in their units.
func (wk *worker) trialError(b, start, i, j int, inPlace bool) error {
	r := wk.r
	e := &TrialError{Trial: start + i + 1, Output: r.specs[j].Name, Value: wk.out[j][i]}
	drawn := wk.in
	if inPlace {
		drawn = columns(len(r.sampled), wk.size)
		if err := r.plan.Fill(b, drawn); err != nil {
			return err
		}
	}
	k := 0
	for _, in := range r.c.inputs {
		v := in.dist.Quantile(0.5)
		if !in.fixed {
			v = drawn[k][i]
			k++
		}
		e.Inputs = append(e.Inputs, fmt.Sprintf("%s = %g", in.name, v))
	}
	return e
}

// TrialError reports a trial whose output is not a finite number: the
// run fails rather than report Inf or NaN figures.
type TrialError struct {
	Trial  int      // 1-based
	Output string   // the output's name
	Value  float64  // ±Inf or NaN
	Inputs []string // the trial's inputs, "name = value" in their units
}

func (e *TrialError) Error() string {
	return fmt.Sprintf("trial %d gave %s = %v, not a finite number, with %s; narrow the ranges of the inputs that reach such values",
		e.Trial, e.Output, e.Value, strings.Join(e.Inputs, ", "))
}

// place points the batch's input and output columns where they are kept:
// every trial, the sensitivity sample, or the worker's own buffers. It
// reports whether the inputs went to the worker's own buffers.
func (wk *worker) place(start, n int) (localIn bool) {
	r := wk.r
	localIn = slot(wk.in, r.keepIn, r.sensIn, wk.localIn, start, n, r.sensN)
	slot(wk.out, r.exactOut, r.sensOut, wk.localOut, start, n, r.sensN)
	return localIn
}

// slot sets dst[j] to trials [start, start+n) of all[j] when every trial
// is kept (all not nil), else of sens[j] when they fall in the first sensN
// trials, else to the first n values of local[j]; it reports the last.
func slot(dst, all, sens, local [][]float64, start, n, sensN int) (isLocal bool) {
	switch {
	case all != nil:
		for j := range dst {
			dst[j] = all[j][start : start+n]
		}
	case sens != nil && start+n <= sensN:
		for j := range dst {
			dst[j] = sens[j][start : start+n]
		}
	default:
		for j := range dst {
			dst[j] = local[j][:n]
		}
		return true
	}
	return false
}
