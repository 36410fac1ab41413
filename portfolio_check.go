package rockheat

import (
	"errors"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/gonum/mat"

	"rockheat/sampler"
)

// checkedPortfolio is a portfolio whose prospects and links have been
// checked.
type checkedPortfolio struct {
	p         *Portfolio
	trials    int
	prospects []*checked // each prospect's run, checked with the portfolio's settings
	chance    []float64
	share     []float64
	outcome   *mat.SymDense // target rank correlations of the outcomes, or nil
	success   *mat.SymDense // of the success draws, or nil
	shared    []sharedDraw
}

// sharedDraw is a shared input: drawn from one prospect's distribution and
// given to the prospects that share it.
type sharedDraw struct {
	name string
	dist sampler.Distribution
	to   []int // prospects given the draw
}

// Validate checks p as EstimatePortfolio does and returns every problem
// found, as InputErrors, or nil.
func (p *Portfolio) Validate() error {
	_, err := p.check()
	return err
}

// check checks p and returns it checked, or every problem found.
func (p *Portfolio) check() (*checkedPortfolio, error) {
	var ps problems
	c := &checkedPortfolio{p: p, trials: p.Trials}
	if c.trials == 0 {
		c.trials = DefaultTrials
	}
	if c.trials < 0 || c.trials > MaxTrials {
		ps.setting("trials", 0, "= %d must be a positive number of trials, at most %d", p.Trials, int64(MaxTrials))
	}
	if len(p.Prospects) == 0 {
		ps.setting("prospects", 0, "a portfolio needs at least one prospect")
	}
	index := map[string]int{}
	for i, pr := range p.Prospects {
		c.checkProspect(&ps, i, pr, index)
	}
	if !(p.TargetMWe >= 0) || math.IsInf(p.TargetMWe, 0) {
		ps.setting("target_mwe", 0, "= %g must be a capacity ≥ 0 in MWe", p.TargetMWe)
	}
	if len(ps.list) > 0 { // links name prospects and inputs that must be sound
		return nil, ps.err()
	}
	c.checkShared(&ps, index)
	c.outcome = prospectMatrix(&ps, "correlations", p.Correlations, p.Prospects)
	c.success = prospectMatrix(&ps, "success_correlations", p.SuccessCorrelations, p.Prospects)
	for _, pc := range p.Correlations {
		for _, name := range pc.Prospects {
			if c.sharesInput(index[name]) {
				ps.setting("correlations", 0, "prospect %q shares an input with others and takes part in an outcome correlation: reordering its trials would break the shared draw; correlate other prospects, or share no input with it", name)
			}
		}
	}
	if err := ps.err(); err != nil {
		return nil, err
	}
	return c, nil
}

// checkProspect checks prospect i: its name, chance, share and run.
func (c *checkedPortfolio) checkProspect(ps *problems, i int, pr Prospect, index map[string]int) {
	at := func(format string, args ...any) { ps.setting("prospects", i+1, format, args...) }
	switch _, dup := index[pr.Name]; {
	case pr.Name == "":
		at("has no name; name each prospect")
	case dup:
		at("the name %q is used twice; name each prospect once", pr.Name)
	}
	index[pr.Name] = i
	chance := pr.Chance
	if len(pr.Factors) > 0 {
		prod := 1.0
		for _, f := range pr.Factors {
			if !(f.Chance >= 0 && f.Chance <= 1) {
				at("chance factor %q = %g must be a probability in [0, 1]", f.Name, f.Chance)
			}
			prod *= f.Chance
		}
		if chance != 0 && math.Abs(chance-prod) > 1e-12 {
			at("chance of success %g is not the product %g of its factors; give one or the other", chance, prod)
		}
		chance = prod
	}
	if !(chance >= 0 && chance <= 1) {
		at("chance of success = %g must be a probability in [0, 1]", chance)
	}
	share := pr.Share
	if share == 0 {
		share = 1
	}
	if !(share > 0 && share <= 1) {
		at("share = %g must be a working-interest fraction in (0, 1]", pr.Share)
	}
	c.chance, c.share = append(c.chance, chance), append(c.share, share)
	if pr.Run == nil {
		at("has no run; give the prospect's scenario")
		c.prospects = append(c.prospects, nil)
		return
	}
	run := *pr.Run
	run.Trials, run.Seed, run.Sampling = c.trials, c.p.Seed, c.p.Sampling
	chk, err := run.resolve()
	var es InputErrors
	if errors.As(err, &es) {
		for _, e := range es {
			at("prospect %q: %v", pr.Name, e)
		}
	} else if err != nil {
		at("prospect %q: %v", pr.Name, err)
	}
	if chk != nil && err == nil {
		for _, o := range PortfolioOutputs {
			if !slices.ContainsFunc(run.Model.outputs(), func(s OutputSpec) bool { return s.Name == o }) {
				at("prospect %q has no output %s to add up", pr.Name, o)
			}
		}
	}
	c.prospects = append(c.prospects, chk)
}

// checkShared checks the shared inputs and picks each one's distribution.
func (c *checkedPortfolio) checkShared(ps *problems, index map[string]int) {
	for k, sh := range c.p.Shared {
		at := func(format string, args ...any) { ps.setting("shared", k+1, format, args...) }
		d := sharedDraw{name: sh.Input}
		names := sh.Prospects
		if len(names) == 0 {
			for _, pr := range c.p.Prospects {
				names = append(names, pr.Name)
			}
		}
		for _, name := range names {
			i, ok := index[name]
			if !ok {
				at("%q is not a prospect of the portfolio", name)
				continue
			}
			in, found := c.prospects[i].input(sh.Input)
			switch {
			case !found && len(sh.Prospects) > 0:
				at("prospect %q has no input %q to share", name, sh.Input)
			case !found:
				// All prospects by default: those that have the input.
			case in.fixed:
				at("input %q of prospect %q is a fixed value; only sampled inputs are shared", sh.Input, name)
			case c.prospects[i].correlated(sh.Input):
				at("input %q of prospect %q is rank-correlated within the prospect; a shared input cannot be", sh.Input, name)
			default:
				if d.dist == nil { // the first sharer's distribution
					d.dist = in.dist
				}
				d.to = append(d.to, i)
			}
		}
		if len(d.to) < 2 {
			at("input %q is shared by %d prospects; sharing needs at least two", sh.Input, len(d.to))
		}
		for _, prev := range c.shared {
			if prev.name == d.name && slices.ContainsFunc(prev.to, func(i int) bool { return slices.Contains(d.to, i) }) {
				at("input %q is shared twice by one prospect; list it once", sh.Input)
			}
		}
		c.shared = append(c.shared, d)
	}
}

// sharesInput reports whether prospect i takes a shared draw.
func (c *checkedPortfolio) sharesInput(i int) bool {
	for _, d := range c.shared {
		if slices.Contains(d.to, i) {
			return true
		}
	}
	return false
}

// input returns the checked input named name.
func (c *checked) input(name string) (input, bool) {
	for _, in := range c.inputs {
		if in.name == name {
			return in, true
		}
	}
	return input{}, false
}

// correlated reports whether the input named name is in a correlation.
func (c *checked) correlated(name string) bool {
	for _, cr := range c.run.Correlations {
		if cr.Inputs[0] == name || cr.Inputs[1] == name {
			return true
		}
	}
	return false
}

// prospectMatrix builds the target rank correlation matrix over the
// prospects, in their order, from pairs, reporting problems under setting.
func prospectMatrix(ps *problems, setting string, pairs []ProspectCorrelation, prospects []Prospect) *mat.SymDense {
	if len(pairs) == 0 {
		return nil
	}
	names := make([]string, len(prospects))
	for i, pr := range prospects {
		names[i] = pr.Name
	}
	sp := make([]sampler.Pair, len(pairs))
	bad := false
	for i, pc := range pairs {
		sp[i] = sampler.Pair{A: pc.Prospects[0], B: pc.Prospects[1], Rank: pc.Rank}
		for _, name := range pc.Prospects {
			if !slices.Contains(names, name) {
				ps.setting(setting, i+1, "%q is not a prospect of the portfolio; the prospects are %s", name, strings.Join(names, ", "))
				bad = true
			}
		}
	}
	if bad {
		return nil
	}
	m, err := sampler.BuildCorrelation(names, sp)
	if err != nil {
		for _, e := range unjoin(err) {
			ps.setting(setting, 0, "%v", e)
		}
		return nil
	}
	return m
}
