package rockheat

import (
	"rockheat/sampler"
	"rockheat/stats"
)

// stream runs a streaming-mode estimate: the whole run, or, to a
// precision, rounds that double the trials until every percentile's
// interval is narrow enough. Rounds end on batch boundaries fixed by the
// trial counts alone, so where a run stops does not depend on workers.
func (r *run) stream() error {
	if r.s.Precision == 0 {
		r.planned = r.s.trials
		return r.batches(0, r.plan.Batches())
	}
	planTrials := r.s.planTrials
	target := r.s.firstRound()
	from := 0
	for {
		target = min(target, planTrials)
		to := (target + sampler.BatchSize - 1) / sampler.BatchSize
		r.planned = min(to*sampler.BatchSize, planTrials)
		if err := r.batches(from, to); err != nil {
			return err
		}
		ran := min(to*sampler.BatchSize, planTrials)
		from = to
		if r.settled() {
			r.converged = true
			return nil
		}
		if ran >= planTrials {
			return nil
		}
		target = 2 * ran
	}
}

// settled reports whether every P90, P50 and P10 has a confidence
// interval narrower than the precision asked.
func (r *run) settled() bool {
	for _, sk := range mergeSketches(r.sketches) {
		if sk == nil {
			continue // a mirror
		}
		s := sk.Summary(r.s.stat)
		for _, c := range []struct {
			v  float64
			iv stats.Interval
		}{{s.P90, s.P90CI}, {s.P50, s.P50CI}, {s.P10, s.P10CI}} {
			if stats.RelativeHalfWidth(c.iv, c.v) >= r.s.Precision {
				return false
			}
		}
	}
	return true
}

// mergeSketches returns, per output, the merge of every worker's sketch
// (nil for a mirror, which has none).
func mergeSketches(per [][]*stats.Sketch) []*stats.Sketch {
	total := make([]*stats.Sketch, len(per[0]))
	for j := range total {
		if per[0][j] != nil {
			total[j] = mergeSketch(per, j)
		}
	}
	return total
}

// foldSketch merges the sketches of output j of every other worker into
// worker 0's, per[0][j], drops them (so that folding again changes
// nothing), and returns it: for the run's final figures, after which no
// batch adds to the workers' sketches. It saves the allocation of
// mergeSketch's new sketch.
func foldSketch(per [][]*stats.Sketch, j int) *stats.Sketch {
	for w := 1; w < len(per); w++ {
		if per[w][j] != nil {
			per[0][j].Merge(per[w][j])
			per[w][j] = nil
		}
	}
	return per[0][j]
}

// mergeSketch returns the sketches of output j of every worker, per[w][j],
// merged into a new one.
func mergeSketch(per [][]*stats.Sketch, j int) *stats.Sketch {
	total := stats.NewSketch(stats.DefaultRelErr)
	for w := range per {
		total.Merge(per[w][j])
	}
	return total
}
