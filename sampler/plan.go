package sampler

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sync"

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
	// PerBatch stratifies a Latin hypercube per batch: each batch is then
	// an exact Latin hypercube of its trials, and batches are independent
	// of each other, so a run can be extended batch by batch. Otherwise a
	// Latin hypercube is stratified over all the trials at once, which
	// holds a permutation of 4 bytes a trial per distribution in memory;
	// callers bound such runs (rockheat.ExactLimit).
	PerBatch bool
}

// Plan describes the draws of a run. It is safe for concurrent use by
// several goroutines once built: Fill only reads it.
type Plan struct {
	dists  []Distribution
	trials int
	seed   uint64
	method Method
	corr   *mat.SymDense
	perm   [][]int32 // global LHS strata, one permutation per input; nil if per batch
}

// NewPlan returns the plan for cfg.Trials draws of each distribution.
// It panics if cfg.Trials < 1.
func NewPlan(dists []Distribution, cfg Config) *Plan {
	trials, seed := cfg.Trials, cfg.Seed
	if trials < 1 {
		panic("sampler: NewPlan with trials < 1")
	}
	p := &Plan{dists: dists, trials: trials, seed: seed, method: cfg.Method, corr: scoresCorrelation(cfg.Correlation)}
	if cfg.Method == LatinHypercube && !cfg.PerBatch && trials > BatchSize {
		// One stream per input: the permutations are independent of each
		// other and are drawn concurrently.
		p.perm = make([][]int32, len(dists))
		var wg sync.WaitGroup
		for j := range dists {
			wg.Add(1)
			go func() {
				defer wg.Done()
				p.perm[j] = permutation(rand.New(rand.NewPCG(seed, permStream|uint64(j))), make([]int32, trials))
			}()
		}
		wg.Wait()
	}
	return p
}

// Stream tags keep the per-batch and per-input streams apart.
const (
	batchStream = 0
	permStream  = 1 << 63
)

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
// must have length at least n. The draws depend only on the plan and b.
func (p *Plan) Fill(b int, cols [][]float64) error {
	if len(cols) != len(p.dists) {
		panic(fmt.Sprintf("sampler: Fill with %d columns for %d distributions", len(cols), len(p.dists)))
	}
	start, n := p.BatchRange(b)
	rng := rand.New(rand.NewPCG(p.seed, batchStream|uint64(b)))
	var local []int32
	for j, d := range p.dists {
		col := cols[j][:n]
		switch {
		case p.method == Random:
			for i := range col {
				col[i] = d.Quantile(open01(rng))
			}
		case p.perm != nil:
			strata := p.perm[j][start : start+n]
			inv := 1 / float64(p.trials)
			for i := range col {
				col[i] = d.Quantile((float64(strata[i]) + open01(rng)) * inv)
			}
		default: // Latin hypercube within this batch
			if local == nil {
				local = make([]int32, n)
			}
			permutation(rng, local)
			inv := 1 / float64(n)
			for i := range col {
				col[i] = d.Quantile((float64(local[i]) + open01(rng)) * inv)
			}
		}
	}
	if p.corr != nil && n > 1 {
		sub := make([][]float64, len(cols))
		for j := range cols {
			sub[j] = cols[j][:n]
		}
		return ImanConover(sub, p.corr, rng)
	}
	return nil
}

// permutation fills perm with a uniformly random permutation of
// 0, 1, ..., len(perm)−1 drawn from rng, and returns it.
func permutation(rng *rand.Rand, perm []int32) []int32 {
	for i := range perm {
		perm[i] = int32(i)
	}
	rng.Shuffle(len(perm), func(a, b int) { perm[a], perm[b] = perm[b], perm[a] })
	return perm
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
func open01(rng *rand.Rand) float64 {
	return (float64(rng.Uint64()>>11) + 0.5) * 0x1p-53
}
