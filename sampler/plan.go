package sampler

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/mat"
)

// Method is a sampling scheme.
type Method int

const (
	// LatinHypercube draws each input from N equal-probability strata,
	// one draw per stratum, in random order (McKay, Beckman & Conover 1979).
	LatinHypercube Method = iota
	// Random draws every input independently from U(0, 1) probabilities.
	Random
)

func (m Method) String() string {
	switch m {
	case LatinHypercube:
		return "lhs"
	case Random:
		return "random"
	}
	return fmt.Sprintf("Method(%d)", int(m))
}

// BatchSize is the number of trials in every batch but the last. It is a
// constant of the random streams: changing it changes every result.
const BatchSize = 1 << 16

// Config sets up a Plan.
type Config struct {
	Trials int    // number of trials, ≥ 1
	Seed   uint64 // seed of every stream of the run
	Method Method
	// Correlation, if not nil, is the target rank correlation matrix of
	// the distributions (in their order), applied batch by batch with the
	// Iman–Conover method; build it with BuildCorrelation.
	Correlation *mat.SymDense
}

// Plan describes the draws of a run. A Latin hypercube is stratified batch
// by batch: each batch is an exact Latin hypercube of its trials, and
// batches are independent of each other, so a run can be extended batch
// by batch and its memory does not grow with its trials. It is safe for
// concurrent use by several goroutines once built: Fill only reads it.
type Plan struct {
	dists  []Distribution
	trials int
	seed   uint64
	method Method
	corr   *mat.SymDense
}

// NewPlan returns the plan for cfg.Trials draws of each distribution.
// It panics if cfg.Trials < 1.
func NewPlan(dists []Distribution, cfg Config) *Plan {
	if cfg.Trials < 1 {
		panic("sampler: NewPlan with trials < 1")
	}
	return &Plan{dists: dists, trials: cfg.Trials, seed: cfg.Seed, method: cfg.Method, corr: scoresCorrelation(cfg.Correlation)}
}

// batchStream tags the per-batch streams.
const batchStream = 0

// Trials returns the number of trials of the plan.
func (p *Plan) Trials() int { return p.trials }

// Batches returns the number of batches, ⌈Trials/BatchSize⌉.
func (p *Plan) Batches() int { return (p.trials + BatchSize - 1) / BatchSize }

// BatchRange returns the first trial and the number of trials of batch b.
func (p *Plan) BatchRange(b int) (start, n int) {
	start = b * BatchSize
	n = min(BatchSize, p.trials-start)
	return start, n
}

// Fill draws batch b into cols: cols[j][i] is the draw of distribution j
// in trial start+i, where start and n come from BatchRange. Each column
// must have length at least n. The draws depend only on the plan and b:
// batch b draws from the stream rand.NewPCG(seed, b), input after input:
// for a Latin hypercube, a uniform offset in each of the batch's n strata
// in stratum order, their quantiles, then a random shuffle (stratified);
// for random sampling, one probability per trial, then their quantiles.
func (p *Plan) Fill(b int, cols [][]float64) error { return p.FillRanked(b, cols, nil) }

// FillRanked is Fill that also gives the order of the draws where the
// plan knows it without a sort: if ranks is not nil (one slice per
// distribution, each of length at least n), ranks[j][i] becomes twice
// the rank of trial start+i's draw of distribution j among the batch's
// draws of j (1-based, ties sharing the mean of their ranks: the doubled
// ranks of stats.DoubledRanks), or ranks[j] becomes nil where the plan
// does not know it (a nil ranks[j] is left alone). It knows it for a
// Latin hypercube without correlations whose quantiles do not decrease
// from stratum to stratum. The draws are those of Fill.
func (p *Plan) FillRanked(b int, cols [][]float64, ranks [][]int32) error {
	if len(cols) != len(p.dists) || (ranks != nil && len(ranks) != len(p.dists)) {
		panic(fmt.Sprintf("sampler: Fill with %d columns and %d rank columns for %d distributions", len(cols), len(ranks), len(p.dists)))
	}
	_, n := p.BatchRange(b)
	// rand.PCG's stream, drawn by the sampler's copy of it (pcg), which
	// inlines and takes draws two at a time.
	rng := newPCG(p.seed, batchStream|uint64(b))
	for j, d := range p.dists {
		col := cols[j][:n]
		if p.method == Random {
			uniforms(rng, col)
			quantiles(d, col)
			if ranks != nil {
				ranks[j] = nil
			}
			continue
		}
		var rk []int32
		if ranks != nil && ranks[j] != nil && p.corr == nil {
			rk = ranks[j][:n]
		}
		// Iman–Conover reorders the columns by ranks alone: they go to it
		// in stratum order, the shuffle's draws being taken all the same.
		if !stratified(rng, d, col, rk, !p.reorders(n)) && ranks != nil {
			ranks[j] = nil
		}
	}
	if p.reorders(n) {
		sub := make([][]float64, len(cols))
		for j := range cols {
			sub[j] = cols[j][:n]
		}
		return ImanConover(sub, p.corr, rand.New(rng)) // the same stream, continued
	}
	return nil
}

// reorders reports whether a batch of n trials goes through Iman–Conover,
// which rearranges at least two columns of at least two draws (it leaves
// fewer as they are).
func (p *Plan) reorders(n int) bool { return p.corr != nil && len(p.dists) > 1 && n > 1 }

// stratified fills col with a Latin hypercube sample of d: the quantiles
// of (k + v_k)/n for each of the n = len(col) strata k, v_k uniform on
// (0, 1) and drawn in stratum order, then shuffled into a uniformly random
// order. The quantiles are taken in stratum order, increasing, so that a
// table-driven quantile walks its table in order rather than at random.
// Unless permute, the shuffle's draws are taken from rng but col is left
// in stratum order (for a caller that reorders it by ranks alone).
//
// If ranks is not nil (as long as col), stratified also writes the
// doubled rank of each draw there (see FillRanked) and reports whether
// it could: whether the quantiles do not decrease with the stratum.
func stratified(rng *pcg, d Distribution, col []float64, ranks []int32, permute bool) bool {
	inv := 1 / float64(len(col))
	// Each 64-bit draw gives the offsets of two strata, 32 bits each: p
	// is then resolved to 2^−32 of a stratum, below 10⁻¹⁴ for a batch.
	// fk is float64(k), counted in floats (exact below 2^53) rather than
	// converted; each half of u converts as a uint32, which costs one
	// instruction where a uint64 costs several.
	// Two draws at a time (pcg.next2), four strata, then one draw for two.
	k, fk, s := 0, 0.0, *rng
	for ; k+3 < len(col); k, fk = k+4, fk+4 {
		s1, s2 := s.next(), s.next2()
		u, v := s1.out(), s2.out()
		s = s2
		c := col[k : k+4 : k+4]
		c[0] = (fk + (float64(uint32(u))+0.5)*0x1p-32) * inv
		c[1] = (fk + 1 + (float64(uint32(u>>32))+0.5)*0x1p-32) * inv
		c[2] = (fk + 2 + (float64(uint32(v))+0.5)*0x1p-32) * inv
		c[3] = (fk + 3 + (float64(uint32(v>>32))+0.5)*0x1p-32) * inv
	}
	*rng = s
	for ; k+1 < len(col); k, fk = k+2, fk+2 {
		u := rng.Uint64()
		col[k] = (fk + (float64(uint32(u))+0.5)*0x1p-32) * inv
		col[k+1] = (fk + 1 + (float64(uint32(u>>32))+0.5)*0x1p-32) * inv
	}
	if k < len(col) {
		col[k] = (float64(k) + open01(rng)) * inv
	}
	quantiles(d, col)
	ranked := ranks != nil && strataRanks(col, ranks)
	if !ranked {
		ranks = nil
	}
	if !permute {
		fisherYates(rng, len(col), nil, nil)
		return ranked
	}
	shuffle(rng, col, ranks)
	return ranked
}

// strataRanks writes into ranks the doubled ranks of col, the quantiles
// of the strata in stratum order, and reports whether they do not
// decrease (else ranks is not written in full). A run of equal values
// a … b−1 shares the doubled rank a + b + 1, twice the mean of the ranks
// a+1 … b.
func strataRanks(col []float64, ranks []int32) bool {
	for a := 0; a < len(col); {
		b := a + 1
		for b < len(col) && col[b] == col[a] {
			b++
		}
		if b < len(col) && !(col[b] > col[a]) {
			return false
		}
		for k := a; k < b; k++ {
			ranks[k] = int32(a + b + 1)
		}
		a = b
	}
	return true
}

// SliceQuantiler is a distribution that maps a slice of probabilities to
// their quantiles in place, in one loop: faster than a call per draw.
type SliceQuantiler interface {
	// Quantiles replaces every p in ps by Quantile(p).
	Quantiles(ps []float64)
}

// quantiles replaces every probability in ps by d's quantile of it.
func quantiles(d Distribution, ps []float64) {
	if sq, ok := d.(SliceQuantiler); ok {
		sq.Quantiles(ps)
		return
	}
	for i, p := range ps {
		ps[i] = d.Quantile(p)
	}
}

// shuffle puts x in a uniformly random order drawn from rng: the
// Fisher–Yates shuffle (Knuth, TAOCP vol. 2, algorithm P), each index
// drawn by Lemire's multiply-and-reject method (Lemire 2019, "Fast random
// integer generation in an interval"), exact, from one 32-bit half of a
// 64-bit draw. y, if not nil, is put in the same order.
func shuffle(rng *pcg, x []float64, y []int32) { fisherYates(rng, len(x), x, y) }

// fisherYates is shuffle of n values, x and y; with x nil it only takes
// the shuffle's draws from rng, and moves nothing. Where x goes alone,
// each index that starts a fresh draw goes to shufflePairs, which takes
// the indices two a draw for as long as none might be rejected; the plain
// loop below takes the indices of a doubtful draw, then hands back.
func fisherYates(rng *pcg, n int, x []float64, y []int32) {
	pairs := x != nil && y == nil
	i, pool, have := n-1, uint64(0), 0 // pool: unused 32-bit halves of a draw
	for i > 0 {
		if have == 0 && pairs {
			if i, pool, have = shufflePairs(rng, x, i); i <= 0 {
				return
			}
		}
		bound := uint32(i + 1)
		var m uint64
		for {
			if have == 0 {
				pool, have = rng.Uint64(), 2
			}
			m = uint64(uint32(pool)) * uint64(bound)
			pool >>= 32
			have--
			if lo := uint32(m); lo >= bound || lo >= -bound%bound {
				break
			}
		}
		if x != nil {
			j := int(m >> 32)
			x[i], x[j] = x[j], x[i]
			if y != nil {
				y[i], y[j] = y[j], y[i]
			}
		}
		i--
	}
}

// shufflePairs is fisherYates of x[:i+1] from the top, two indices a
// draw, in a loop without the pool's bookkeeping, for as long as both
// halves of a draw are accepted at sight (Lemire's low part at least the
// bound, which leaves no doubt). At a draw that might be rejected (a
// chance of about (i+1)/2^32 an index) it stops, and returns the index it
// reached with that draw as the pool of two halves, for fisherYates to
// take on exactly as it would have; else it returns an index below 2 and
// an empty pool. The moves and draws are fisherYates's. While four
// indices remain it takes two draws at a time (pcg.next2), its state in
// a local value.
func shufflePairs(rng *pcg, x []float64, i int) (int, uint64, int) {
	s := *rng
	for ; i >= 4 && i < len(x); i -= 4 {
		s1, s2 := s.next(), s.next2()
		u, v := s1.out(), s2.out()
		j1, j2, ok := pairIndices(u, i)
		if !ok {
			*rng = s1
			return i, u, 2
		}
		j3, j4, ok := pairIndices(v, i-2)
		x[i], x[j1] = x[j1], x[i]
		x[i-1], x[j2] = x[j2], x[i-1]
		if !ok {
			*rng = s2
			return i - 2, v, 2
		}
		x[i-2], x[j3] = x[j3], x[i-2]
		x[i-3], x[j4] = x[j4], x[i-3]
		s = s2
	}
	*rng = s
	for ; i >= 2 && i < len(x); i -= 2 {
		u := rng.Uint64()
		j1, j2, ok := pairIndices(u, i)
		if !ok {
			return i, u, 2
		}
		x[i], x[j1] = x[j1], x[i]
		x[i-1], x[j2] = x[j2], x[i-1]
	}
	return i, 0, 0
}

// pairIndices returns the indices j1 ≤ i and j2 ≤ i − 1 that the low and
// high halves of draw u give indices i and i − 1 by Lemire's method, and
// whether both are accepted at sight (the low part of each product at
// least its bound), which leaves no doubt.
func pairIndices(u uint64, i int) (j1, j2 int, ok bool) {
	b1, b2 := uint64(i+1), uint64(i)
	m1, m2 := uint64(uint32(u))*b1, (u>>32)*b2
	return int(m1 >> 32), int(m2 >> 32), uint32(m1) >= uint32(b1) && uint32(m2) >= uint32(b2)
}

// scoresCorrelation returns the correlation to induce among normal scores
// so that the Spearman rank correlation comes out at target: for a
// bivariate normal with Pearson correlation r, Spearman's coefficient is
// (6/π)·asin(r/2) (Pearson 1907; Kruskal 1958), so each off-diagonal ρs
// becomes r = 2·sin(π·ρs/6). The change is at most 0.018 in size. Should
// the adjusted matrix not be positive definite (only near the edge of the
// feasible set) the target itself is used.
func scoresCorrelation(target *mat.SymDense) *mat.SymDense {
	if target == nil {
		return nil
	}
	k := target.SymmetricDim()
	adj := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		adj.SetSym(i, i, 1)
		for j := i + 1; j < k; j++ {
			adj.SetSym(i, j, 2*math.Sin(math.Pi*target.At(i, j)/6))
		}
	}
	var ch mat.Cholesky
	if !ch.Factorize(adj) {
		return target
	}
	return adj
}

// open01 returns a uniform draw from the open interval (0, 1): the
// midpoints of the 2^53 equal cells of [0, 1). It never returns 0 or 1,
// so no draw lands on an infinite tail or on a distribution's open limit.
func open01(rng *pcg) float64 { return unitOpen(rng.Uint64()) }

// unitOpen returns open01's value of the draw x.
func unitOpen(x uint64) float64 { return (float64(x>>11) + 0.5) * 0x1p-53 }

// uniforms fills u with draws of open01, in order, two at a time
// (pcg.next2) with the state in a local value.
func uniforms(rng *pcg, u []float64) {
	s, i := *rng, 0
	for ; i+1 < len(u); i += 2 {
		s1, s2 := s.next(), s.next2()
		u[i], u[i+1] = unitOpen(s1.out()), unitOpen(s2.out())
		s = s2
	}
	*rng = s
	if i < len(u) {
		u[i] = open01(rng)
	}
}
