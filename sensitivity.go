package rockheat

import (
	"math"

	"rockheat/heatmodel"
	"rockheat/stats"
)

// sensitivity ranks every sampled input against every output on the
// sensitivity sample, the run's first sensN trials, and evaluates the
// one-at-a-time swings.
func (r *run) sensitivity() []Sensitivity {
	if len(r.sampled) == 0 || r.sensN < 3 {
		return nil
	}
	sensIn, sensOut := r.keepIn, r.exactOut
	if sensIn == nil {
		sensIn = r.sensIn
	}
	if sensOut == nil {
		sensOut = r.sensOut
	}
	sensIn, sensOut = prefix(sensIn, r.sensN), prefix(sensOut, r.sensN)
	defer func() { r.sensIn, r.sensOut, r.sensRanks = nil, nil, nil }() // not needed once ranked
	// One rank scratch per goroutine, handed round through a channel.
	scratch := make(chan *stats.RankScratch, max(1, r.s.workers))
	for range cap(scratch) {
		scratch <- new(stats.RankScratch)
	}
	ranked := func(x []float64) []int32 {
		s := <-scratch
		defer func() { scratch <- s }()
		d := make([]int32, len(x))
		stats.DoubledRanks(x, d, s)
		return d
	}
	inRanks := make([][]int32, len(sensIn))
	parallel(len(sensIn), r.s.workers, func(j int) {
		if r.sensRanks != nil && r.sensRanks[j] != nil {
			inRanks[j] = r.sensRanks[j] // from the plan
			return
		}
		inRanks[j] = ranked(sensIn[j])
	})
	low, high, base := r.swings()
	index := make(map[string]int, len(r.names))
	for k, name := range r.names {
		index[name] = k
	}
	out := make([]Sensitivity, len(r.specs))
	infls := make([][]stats.Influence, len(r.specs))
	r.eachSummarised(func(j int) {
		outRanks := ranked(sensOut[j])
		// Only the inputs the output's formula uses are ranked.
		var names []string
		var ranks [][]int32
		for k, in := range r.sampled {
			if r.specs[j].dependsOn(in.Base) {
				names, ranks = append(names, r.names[k]), append(ranks, inRanks[k])
			}
		}
		infls[j] = stats.DoubledRankSensitivity(names, ranks, outRanks)
	})
	for j, m := range r.mirror {
		infl := infls[j]
		if m >= 0 {
			infl = infls[m] // the same values, so the same ranks
		}
		sens := Sensitivity{Output: r.specs[j].Name, Base: base[j]}
		for _, f := range infl {
			k := index[f.Input]
			sens.Influences = append(sens.Influences, Influence{Influence: f, SwingLow: low[j][k], SwingHigh: high[j][k]})
		}
		out[j] = sens
	}
	return out
}

// swings evaluates the model with each sampled input in turn at its own
// 10th and 90th percentile (its P90 and P10) and the others at their
// medians: low[j][k] and high[j][k] are output j with input k low and
// high, base[j] output j with every input at its median.
func (r *run) swings() (low, high [][]float64, base []float64) {
	k := len(r.sampled)
	n := 2*k + 1 // the last trial has every input at its median
	ev, cols := r.newEvaluator()
	for j, in := range r.sampled {
		col := make([]float64, n)
		med := in.dist.Quantile(0.5)
		for i := range col {
			col[i] = med
		}
		col[2*j] = in.dist.Quantile(0.1)
		col[2*j+1] = in.dist.Quantile(0.9)
		*cols[in.fi] = in.unit.column(heatmodel.Vary(col), make([]float64, n))
	}
	out := columns(len(r.specs), n)
	if _, err := ev.evaluate(n, out); err != nil {
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
		base[j] = out[j][n-1]/sp.Scale - sp.Offset
		low[j], high[j] = make([]float64, k), make([]float64, k)
		for i := 0; i < k; i++ {
			low[j][i] = out[j][2*i]/sp.Scale - sp.Offset
			high[j][i] = out[j][2*i+1]/sp.Scale - sp.Offset
		}
	}
	return low, high, base
}

func prefix(cols [][]float64, n int) [][]float64 {
	p := make([][]float64, len(cols))
	for j := range cols {
		p[j] = cols[j][:n]
	}
	return p
}
