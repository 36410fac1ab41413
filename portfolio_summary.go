package rockheat

import (
	"fmt"

	"rockheat/stats"
)

// result summarises a finished portfolio run.
func (pr *portfolioRun) result() *PortfolioResult {
	c := pr.c
	p := c.p
	res := &PortfolioResult{Title: p.Title, Trials: pr.trials, Seed: pr.seed, Sampling: p.Sampling,
		Confidence: pr.stat.Level(), SketchRelErr: stats.DefaultRelErr, Shared: p.Shared,
		Correlations: p.Correlations, SuccessCorrelations: p.SuccessCorrelations, Samples: pr.samples}
	merge := func(pick func(*portfolioSketches) *stats.Sketch) *stats.Sketch {
		total := stats.NewSketch(stats.DefaultRelErr)
		for _, part := range pr.parts {
			total.Merge(pick(part))
		}
		return total
	}
	specs := pr.runs[0].specs
	output := func(o int, sk *stats.Sketch) Output {
		return Output{Spec: specs[pr.outIdx[0][o]], Summary: sk.Summary(pr.stat), Curve: sk.Quantiles(curveProbabilities)}
	}
	res.SumP90 = make([]float64, len(PortfolioOutputs))
	res.SumP10 = make([]float64, len(PortfolioOutputs))
	for i, pp := range p.Prospects {
		r := ProspectResult{Name: pp.Name, Title: pp.Run.Title, Path: pp.Run.Path, SourceSHA256: pp.Run.SourceSHA256,
			Kind: pp.Run.Model.Kind(), Chance: c.chance[i], Factors: pp.Factors, Share: c.share[i],
			ZeroHeatTrials: int(pr.zero[i].Load())}
		for _, w := range c.prospects[i].warnings {
			r.Warnings = append(r.Warnings, w.Error())
		}
		for o := range PortfolioOutputs {
			out := output(o, pr.prospects[i].unrisked[o])
			out.Spec = pr.runs[i].specs[pr.outIdx[i][o]]
			r.Unrisked = append(r.Unrisked, out)
			r.RiskedMean = append(r.RiskedMean, pr.prospects[i].risked[o].Value())
			res.SumP90[o] += r.Share * out.Summary.P90
			res.SumP10[o] += r.Share * out.Summary.P10
		}
		res.ExpectedSuccesses += r.Chance
		res.Prospects = append(res.Prospects, r)
	}
	for o := range PortfolioOutputs {
		res.Unrisked = append(res.Unrisked, output(o, merge(func(s *portfolioSketches) *stats.Sketch { return s.total[o] })))
		res.Risked = append(res.Risked, output(o, merge(func(s *portfolioSketches) *stats.Sketch { return s.riskTotal[o] })))
	}
	level := pr.stat.Level()
	none := int(pr.none.Load())
	res.ChanceNone = float64(none) / float64(pr.trials)
	res.ChanceNoneCI = stats.ProportionInterval(none, pr.trials, level)
	if p.TargetMWe > 0 {
		k := int(pr.target.Load())
		res.Target = &TargetResult{MWe: p.TargetMWe, Probability: float64(k) / float64(pr.trials),
			CI: stats.ProportionInterval(k, pr.trials, level)}
	}
	for _, r := range res.Prospects {
		if r.ZeroHeatTrials == res.Trials {
			res.Warnings = append(res.Warnings, fmt.Sprintf("prospect %q has no heat in any trial; check its temperature inputs", r.Name))
		}
		for _, w := range r.Warnings {
			res.Warnings = append(res.Warnings, fmt.Sprintf("prospect %q: %s", r.Name, w))
		}
	}
	return res
}

// newSamples lays out the kept trials of a portfolio run: each prospect's
// inputs, outputs and success, then the unrisked and risked totals.
func (pr *portfolioRun) newSamples() *Samples {
	smp := &Samples{}
	add := func(name string, col []float64, v float64) {
		smp.Names = append(smp.Names, name)
		smp.Columns = append(smp.Columns, col)
		smp.Consts = append(smp.Consts, v)
	}
	for i, p := range pr.c.p.Prospects {
		for _, in := range pr.c.prospects[i].inputs {
			if in.fixed {
				add(p.Name+"/"+in.name, nil, in.dist.Quantile(0.5))
			} else {
				add(p.Name+"/"+in.name, make([]float64, pr.trials), 0)
			}
		}
		for _, o := range PortfolioOutputs {
			add(p.Name+"/"+o, make([]float64, pr.trials), 0)
		}
		add(p.Name+"/success", make([]float64, pr.trials), 0)
	}
	for _, total := range []string{"unrisked_total", "risked_total"} {
		for _, o := range PortfolioOutputs {
			add(total+"/"+o, make([]float64, pr.trials), 0)
		}
	}
	return smp
}

// keep copies the trials of batch b into the run's samples, in the order
// of newSamples.
func (pw *portfolioWorker) keep(b, n int) {
	pr := pw.pr
	start, _ := pr.runs[0].plan.BatchRange(b)
	cols := pr.samples.Columns
	k := 0
	for i, wk := range pw.wks {
		j := 0
		for _, in := range pr.c.prospects[i].inputs {
			if !in.fixed {
				copy(cols[k][start:], wk.in[j][:n])
				j++
			}
			k++
		}
		for o := range PortfolioOutputs {
			copy(cols[k][start:], wk.out[pr.outIdx[i][o]][:n])
			k++
		}
		for t := range n {
			cols[k][start+t] = 0
			if pw.won[i][t] {
				cols[k][start+t] = 1
			}
		}
		k++
	}
	for _, totals := range [][][]float64{pw.total, pw.risked} {
		for o := range PortfolioOutputs {
			copy(cols[k][start:], totals[o][:n])
			k++
		}
	}
}
