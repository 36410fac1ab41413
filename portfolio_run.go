package rockheat

import (
	"fmt"
	"math/rand/v2"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/mat"

	"rockheat/sampler"
	"rockheat/stats"
	"rockheat/stats/radix"
)

// Stream tags of a portfolio's random streams, mixed with its seed.
const (
	prospectStream = 1 + iota
	sharedStream
	successStream
	outcomeStream
)

// mixSeed derives the seed of stream (tag, i) of a run seeded with seed
// (the SplitMix64 finaliser, Steele, Lea & Flood 2014), so that every
// prospect and every shared input has a stream of its own.
func mixSeed(seed, tag, i uint64) uint64 {
	z := seed + 0x9e3779b97f4a7c15*(tag<<32|(i+1))
	z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9
	z = (z ^ (z >> 27)) * 0x94d049bb133111eb
	return z ^ (z >> 31)
}

// EstimatePortfolio runs the prospects of p together, trial by trial, and
// summarises each prospect and the unrisked and risked totals. It checks p
// first and returns every problem found as InputErrors. Options.Trials,
// Seed, Workers, Confidence and KeepSamples apply; a precision target does
// not (an *OptionError). The same portfolio and seed give bit-identical
// results for any number of workers; memory does not grow with the trials
// (quantile sketches), except when every trial is kept.
func EstimatePortfolio(p *Portfolio, opt Options) (*PortfolioResult, error) {
	c, err := p.check()
	if err != nil {
		return nil, err
	}
	if opt.Precision != 0 {
		return nil, optionErrorf([]string{"Precision"}, "a portfolio runs a fixed number of trials; drop the precision target")
	}
	pr := &portfolioRun{c: c, trials: c.trials, seed: p.Seed, workers: opt.Workers, keep: opt.KeepSamples,
		stat: stats.Options{Confidence: opt.Confidence}}
	if opt.Trials > 0 {
		pr.trials = opt.Trials
	}
	if opt.Seed != nil {
		pr.seed = *opt.Seed
	}
	if pr.workers <= 0 {
		pr.workers = runtime.GOMAXPROCS(0)
	}
	if err := pr.stat.Validate(); err != nil {
		return nil, &OptionError{Options: []string{"Confidence"}, Msg: err.Error()}
	}
	if pr.trials > MaxTrials {
		return nil, optionErrorf([]string{"Trials"}, "%d trials is more than the %d a run may take", pr.trials, int64(MaxTrials))
	}
	if pr.keep && pr.trials > ExactLimit {
		return nil, optionErrorf([]string{"KeepSamples"}, "keeping every trial works for runs of up to %d trials; this portfolio has %d: use fewer trials, or do not keep the trials", ExactLimit, pr.trials)
	}
	pr.setUp()
	if err := pr.runBatches(); err != nil {
		return nil, err
	}
	return pr.result(), nil
}

// portfolioRun is the state of one EstimatePortfolio.
type portfolioRun struct {
	c       *checkedPortfolio
	trials  int
	seed    uint64
	workers int
	keep    bool
	stat    stats.Options
	runs    []*run          // one per prospect
	outIdx  [][]int         // [prospect][PortfolioOutputs index] → index of the run's output
	given   [][]int         // [prospect][sampled input] → shared draw, or −1
	shared  []*sampler.Plan // one per shared draw
	outcome []int           // prospects in outcome correlations
	outTgt  *mat.SymDense   // their target matrix
	success []int           // prospects in success correlations
	sucTgt  *mat.SymDense
	batches int

	none, target atomic.Int64 // trials with no success; reaching the target
	zero         []atomic.Int64
	parts        []*portfolioSketches // one per worker
	prospects    []*prospectSketches  // one per prospect, shared by the workers
	samples      *Samples
}

// portfolioSketches are one worker's sketches of a portfolio's totals.
type portfolioSketches struct {
	total, riskTotal []*stats.Sketch // [output]
}

// prospectSketches are the sketches of one prospect's gross figures, and
// the exact sums of its net risked figures, of which only the mean is
// reported. Every worker adds its batches to them, one at a time (their
// state is exact counts and sums, so the order does not matter).
type prospectSketches struct {
	mu       sync.Mutex
	unrisked []*stats.Sketch // [output], gross
	risked   []*stats.Mean   // [output], net risked
}

func newSketches(n int) []*stats.Sketch {
	s := make([]*stats.Sketch, n)
	for i := range s {
		s[i] = stats.NewSketch(stats.DefaultRelErr)
	}
	return s
}

// setUp builds each prospect's run, with its own seed and the shared
// draws left to the portfolio, and the shared inputs' plans.
func (pr *portfolioRun) setUp() {
	c := pr.c
	n := len(c.prospects)
	pr.zero = make([]atomic.Int64, n)
	for range n {
		ps := &prospectSketches{unrisked: newSketches(len(PortfolioOutputs))}
		for range PortfolioOutputs {
			ps.risked = append(ps.risked, stats.NewMean())
		}
		pr.prospects = append(pr.prospects, ps)
	}
	for i, chk := range c.prospects {
		s := &settings{trials: pr.trials, seed: mixSeed(pr.seed, prospectStream, uint64(i)), workers: 1,
			stat: pr.stat, streaming: true, planTrials: pr.trials, maxTrials: pr.trials, noSensitivity: true}
		given := map[string]bool{}
		for _, d := range c.shared {
			if slices.Contains(d.to, i) {
				given[d.name] = true
			}
		}
		r := newRunGiven(chk, s, given)
		pr.runs = append(pr.runs, r)
		idx := make([]int, len(PortfolioOutputs))
		for o, name := range PortfolioOutputs {
			idx[o] = slices.IndexFunc(r.specs, func(sp OutputSpec) bool { return sp.Name == name })
		}
		pr.outIdx = append(pr.outIdx, idx)
		g := make([]int, len(r.sampled))
		for j, in := range r.sampled {
			g[j] = slices.IndexFunc(c.shared, func(d sharedDraw) bool { return d.name == in.name && slices.Contains(d.to, i) })
		}
		pr.given = append(pr.given, g)
	}
	for k, d := range c.shared {
		pr.shared = append(pr.shared, sampler.NewPlan([]sampler.Distribution{d.dist}, sampler.Config{Trials: pr.trials,
			Seed: mixSeed(pr.seed, sharedStream, uint64(k)), Method: c.p.Sampling}))
	}
	pr.outcome, pr.outTgt = involved(c.p.Correlations, c.p.Prospects, c.outcome)
	pr.success, pr.sucTgt = involved(c.p.SuccessCorrelations, c.p.Prospects, c.success)
	pr.batches = pr.runs[0].plan.Batches()
	if pr.keep {
		pr.samples = pr.newSamples()
	}
}

// involved returns the prospects named in pairs, in portfolio order, and
// their rows and columns of the target matrix m.
func involved(pairs []ProspectCorrelation, prospects []Prospect, m *mat.SymDense) ([]int, *mat.SymDense) {
	if m == nil {
		return nil, nil
	}
	var idx []int
	for i, p := range prospects {
		if slices.ContainsFunc(pairs, func(pc ProspectCorrelation) bool { return pc.Prospects[0] == p.Name || pc.Prospects[1] == p.Name }) {
			idx = append(idx, i)
		}
	}
	return idx, subMatrix(m, idx)
}

// runBatches runs every batch on the workers; the error of the lowest
// failing batch is returned, whatever the workers.
func (pr *portfolioRun) runBatches() error {
	nw := max(1, min(pr.workers, pr.batches))
	pr.parts = make([]*portfolioSketches, nw)
	return forBatches(nw, 0, pr.batches, nil, func(w int) func(b int) error {
		pw := pr.newWorker()
		pr.parts[w] = pw.sk
		return pw.batch
	})
}

// portfolioWorker is one goroutine's share of a portfolio run.
type portfolioWorker struct {
	pr     *portfolioRun
	wks    []*worker     // one per prospect
	shared [][]float64   // the batch's shared draws
	given  [][][]float64 // [prospect][sampled input] → shared draw, or nil
	won    [][]bool      // [prospect] whether it succeeds in each trial of the batch
	draws  [][]float64   // [a] the success draws of prospect pr.success[a], uniform on [0, 1)
	total  [][]float64   // [output] unrisked total of the batch
	risked [][]float64   // [output] risked total of the batch
	tmp    []float64
	sk     *portfolioSketches
	// held marks the prospects whose draws and outputs stay in their own
	// buffers for the whole batch: those in outcome correlations, or all
	// when the trials are kept. The others borrow theirs from lend while
	// they are evaluated and added.
	held []bool
	lend *colPool
}

func (pr *portfolioRun) newWorker() *portfolioWorker {
	n := len(pr.runs)
	size := min(sampler.BatchSize, pr.trials)
	pw := &portfolioWorker{pr: pr, shared: columns(len(pr.shared), size), won: make([][]bool, n), draws: columns(len(pr.success), size),
		total: columns(len(PortfolioOutputs), size), risked: columns(len(PortfolioOutputs), size), tmp: make([]float64, size),
		sk:   &portfolioSketches{total: newSketches(len(PortfolioOutputs)), riskTotal: newSketches(len(PortfolioOutputs))},
		held: make([]bool, n), lend: &colPool{size: size}}
	for i, r := range pr.runs {
		pw.won[i] = make([]bool, size)
		pw.held[i] = pr.keep || slices.Contains(pr.outcome, i)
		lend := pw.lend
		if pw.held[i] {
			lend = nil
		}
		pw.wks = append(pw.wks, r.newLendingWorker(0, lend))
		// A prospect that shares no draw takes none from the portfolio, so
		// its batches convert their own draws to SI in place, unless the
		// trials are kept in their units.
		var g [][]float64
		for j, k := range pr.given[i] {
			if k >= 0 {
				if g == nil {
					g = make([][]float64, len(r.sampled))
				}
				g[j] = pw.shared[k]
			}
		}
		if g == nil && pr.keep {
			g = make([][]float64, len(r.sampled))
		}
		pw.given = append(pw.given, g)
	}
	return pw
}

// batch runs batch b of every prospect and adds it to the sketches. The
// held prospects run first, and have their outcomes correlated; then the
// others run a few at a time, side by side, and the prospects are added
// in order, so that the totals are summed in the same order whatever the
// timing.
func (pw *portfolioWorker) batch(b int) error {
	pr := pw.pr
	for k, plan := range pr.shared {
		if err := plan.Fill(b, [][]float64{pw.shared[k]}); err != nil {
			return err
		}
	}
	_, n := pr.runs[0].plan.BatchRange(b)
	var held []int
	for i, h := range pw.held {
		if h {
			held = append(held, i)
		}
	}
	if err := pw.evaluate(b, held); err != nil {
		return pw.failed(b, err)
	}
	if pr.outTgt != nil {
		if err := pw.correlateOutcomes(b, n); err != nil {
			return pw.failed(b, err)
		}
	}
	if err := pw.drawSuccess(b, n); err != nil {
		return pw.failed(b, err)
	}
	pw.startTotals(n)
	step := max(1, pr.workers)
	var chunk []int // the prospects of lo … hi−1 that borrow their buffers
	for lo := 0; lo < len(pw.wks); {
		hi := lo
		for chunk = chunk[:0]; hi < len(pw.wks) && len(chunk) < step; hi++ {
			if !pw.held[hi] {
				chunk = append(chunk, hi)
			}
		}
		if err := pw.evaluate(b, chunk); err != nil {
			return pw.failed(b, err)
		}
		for i := lo; i < hi; i++ {
			pw.addProspect(i, n)
			pw.wks[i].giveBack()
		}
		lo = hi
	}
	pw.finish(b, n)
	return nil
}

// evaluate runs batch b of the prospects idx side by side (their batches
// are independent: the shared draws are read only), and returns the error
// of the first of them that failed, whatever the timing.
func (pw *portfolioWorker) evaluate(b int, idx []int) error {
	pr := pw.pr
	errs := make([]error, len(idx))
	parallel(len(idx), pr.workers, func(a int) {
		i := idx[a]
		z, err := pw.prospectBatch(i, b)
		errs[a] = err
		pr.zero[i].Add(int64(z))
	})
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}

// failed returns the error that batch b reports once err stopped it: that
// of the first prospect whose batch fails, else err, as when every
// prospect ran before the outcomes were correlated and the successes
// drawn.
func (pw *portfolioWorker) failed(b int, err error) error {
	for i, wk := range pw.wks {
		_, e := pw.prospectBatch(i, b)
		wk.giveBack()
		if e != nil {
			return e
		}
	}
	return err
}

// prospectBatch runs batch b of prospect i, in buffers it borrows if it
// does not hold its own, and returns its trials without heat; an error
// names the prospect.
func (pw *portfolioWorker) prospectBatch(i, b int) (zeroHeat int, err error) {
	wk := pw.wks[i]
	wk.borrow()
	_, z, err := wk.batch(b, pw.given[i])
	if err != nil {
		return 0, fmt.Errorf("prospect %q: %w", pw.pr.c.p.Prospects[i].Name, err)
	}
	return z, nil
}

// correlateOutcomes reorders the trials of the prospects in outcome
// correlations so that their electric capacities have the target rank
// correlations (Iman–Conover on their ranks, so that each prospect's
// trials move whole: its outputs stay together, and its inputs with them
// when the trials are kept).
func (pw *portfolioWorker) correlateOutcomes(b, n int) error {
	pr := pw.pr
	const power = PortfolioPower
	ranks := make([][]float64, len(pr.outcome))
	orders := make([][]int32, len(pr.outcome)) // [a] the trials in order of outcome
	for a, i := range pr.outcome {
		col := pw.wks[i].out[pr.outIdx[i][power]][:n]
		keys := make([]uint64, n)
		idx := make([]int32, n)
		for t, v := range col {
			keys[t], idx[t] = radix.Key(v), int32(t)
		}
		_, order := radix.Sort(keys, make([]uint64, n), 0, idx, make([]int32, n))
		orders[a] = order
		ranks[a] = make([]float64, n)
		for r, t := range order {
			ranks[a][t] = float64(r)
		}
	}
	rng := rand.New(rand.NewPCG(mixSeed(pr.seed, outcomeStream, 0), uint64(b)))
	if err := sampler.ImanConover(ranks, pr.outTgt, rng); err != nil {
		return err
	}
	for a, i := range pr.outcome {
		perm := make([]int32, n) // trial t takes the trial perm[t] drew
		for t, r := range ranks[a] {
			perm[t] = orders[a][int(r)]
		}
		wk := pw.wks[i]
		cols := wk.out
		if pr.samples != nil { // the inputs move with their outputs only where they are written out
			cols = append(append([][]float64(nil), wk.out...), wk.in...)
		}
		for _, col := range cols {
			for t, src := range perm {
				pw.tmp[t] = col[src]
			}
			copy(col[:n], pw.tmp[:n])
		}
	}
	return nil
}

// drawSuccess draws each prospect's success in each trial: a uniform draw
// below its chance, with the target rank correlations among the draws of
// the prospects in success correlations, which are kept until they are
// correlated; the others' are compared as they are drawn.
func (pw *portfolioWorker) drawSuccess(b, n int) error {
	pr := pw.pr
	chance := pr.c.chance
	rng := rand.New(rand.NewPCG(mixSeed(pr.seed, successStream, 0), uint64(b)))
	a := 0 // next of pr.success
	for i, won := range pw.won {
		won = won[:n]
		if a < len(pr.success) && pr.success[a] == i {
			u := pw.draws[a][:n]
			for t := range u {
				u[t] = rng.Float64()
			}
			a++
			continue
		}
		for t := range won {
			won[t] = rng.Float64() < chance[i]
		}
	}
	if pr.sucTgt == nil {
		return nil
	}
	cols := make([][]float64, len(pr.success))
	for a := range pr.success {
		cols[a] = pw.draws[a][:n]
	}
	if err := sampler.ImanConover(cols, pr.sucTgt, rng); err != nil {
		return err
	}
	for a, i := range pr.success {
		for t, u := range cols[a] {
			pw.won[i][t] = u < chance[i]
		}
	}
	return nil
}

// startTotals clears the batch's unrisked and risked totals.
func (pw *portfolioWorker) startTotals(n int) {
	for o := range PortfolioOutputs {
		clear(pw.total[o][:n])
		clear(pw.risked[o][:n])
	}
}

// addProspect adds prospect i's figures of the batch, n trials, to its
// sketches and to the totals.
func (pw *portfolioWorker) addProspect(i, n int) {
	pr, c, wk := pw.pr, pw.pr.c, pw.wks[i]
	won, share := pw.won[i][:n], c.share[i]
	ps := pr.prospects[i]
	ps.mu.Lock()
	defer ps.mu.Unlock()
	for o := range PortfolioOutputs {
		col := wk.out[pr.outIdx[i][o]][:n]
		ps.unrisked[o].AddSlice(col)
		for t, v := range col {
			net := share * v
			pw.total[o][t] += net
			if won[t] {
				pw.risked[o][t] += net
				pw.tmp[t] = net
			} else {
				pw.tmp[t] = 0
			}
		}
		ps.risked[o].AddSlice(pw.tmp[:n])
	}
}

// finish adds batch b's totals, n trials, to the worker's sketches and the
// run's counts, and keeps its trials if asked.
func (pw *portfolioWorker) finish(b, n int) {
	pr, c := pw.pr, pw.pr.c
	none, reach := 0, 0
	for t := range n {
		succeeded := false
		for i := range pw.wks {
			succeeded = succeeded || pw.won[i][t]
		}
		if !succeeded {
			none++
		}
		if c.p.TargetMWe > 0 && pw.risked[PortfolioPower][t] >= c.p.TargetMWe {
			reach++
		}
	}
	for o := range PortfolioOutputs {
		pw.sk.total[o].AddSlice(pw.total[o][:n])
		pw.sk.riskTotal[o].AddSlice(pw.risked[o][:n])
	}
	pr.none.Add(int64(none))
	pr.target.Add(int64(reach))
	if pr.samples != nil {
		pw.keep(b, n)
	}
}
