package sampler

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"

	"rockheat/stats"
)

// TestLatinHypercubeStrata checks the defining property of Latin hypercube
// sampling (McKay, Beckman & Conover 1979): with N trials, each of the N
// equal-probability strata of every input holds exactly one draw. Runs of
// one batch and of a last, partial batch are covered; runs of several
// batches are stratified per batch (TestLatinHypercubePerBatch).
func TestLatinHypercubeStrata(t *testing.T) {
	t.Parallel()
	for _, trials := range []int{1, 7, 1000, BatchSize} {
		u, _ := NewUniform(0, 1)
		tri, _ := NewTriangular(3, 6, 14)
		dists := []Distribution{u, tri}
		cdfs := []func(float64) float64{func(x float64) float64 { return x }, tri.d.CDF}
		p := NewPlan(dists, Config{Trials: trials, Seed: 42, Method: LatinHypercube})
		cols := fillAll(t, p)
		for j, col := range cols {
			seen := make([]int, trials)
			for _, x := range col {
				k := int(math.Floor(cdfs[j](x) * float64(trials)))
				if k == trials { // x at the upper limit
					k--
				}
				seen[k]++
			}
			for k, c := range seen {
				if c != 1 {
					t.Fatalf("trials %d, input %d: stratum %d holds %d draws, want 1", trials, j, k, c)
				}
			}
		}
	}
}

// TestLatinHypercubePerBatch checks that a plan puts exactly one draw of
// every batch in each of that batch's n strata.
func TestLatinHypercubePerBatch(t *testing.T) {
	t.Parallel()
	u, _ := NewUniform(0, 1)
	trials := 2*BatchSize + 999
	p := NewPlan([]Distribution{u}, Config{Trials: trials, Seed: 9, Method: LatinHypercube})
	col := fillAll(t, p)[0]
	for b := 0; b < p.Batches(); b++ {
		start, n := p.BatchRange(b)
		seen := make([]int, n)
		for _, x := range col[start : start+n] {
			seen[min(int(x*float64(n)), n-1)]++
		}
		for k, c := range seen {
			if c != 1 {
				t.Fatalf("batch %d: stratum %d holds %d draws, want 1", b, k, c)
			}
		}
	}
}

// fillAll fills every batch of p, in reverse order, into full columns.
func fillAll(t *testing.T, p *Plan) [][]float64 {
	t.Helper()
	cols := make([][]float64, len(p.dists))
	for j := range cols {
		cols[j] = make([]float64, p.Trials())
	}
	for b := p.Batches() - 1; b >= 0; b-- {
		start, n := p.BatchRange(b)
		sub := make([][]float64, len(cols))
		for j := range cols {
			sub[j] = cols[j][start : start+n]
		}
		if err := p.Fill(b, sub); err != nil {
			t.Fatal(err)
		}
	}
	return cols
}

// TestFillDeterministic checks that a batch's draws depend only on the
// seed and the batch index, not on the order batches are filled in, and
// that another seed gives other draws.
func TestFillDeterministic(t *testing.T) {
	t.Parallel()
	u, _ := NewUniform(0, 1)
	for _, m := range []Method{LatinHypercube, Random} {
		p := NewPlan([]Distribution{u, u}, Config{Trials: 2*BatchSize + 5, Seed: 7, Method: m})
		a := fillAll(t, p)
		b := make([][]float64, 2)
		for j := range b {
			b[j] = make([]float64, p.Trials())
		}
		for bi := 0; bi < p.Batches(); bi++ {
			start, n := p.BatchRange(bi)
			if err := p.Fill(bi, [][]float64{b[0][start : start+n], b[1][start : start+n]}); err != nil {
				t.Fatal(err)
			}
		}
		for j := range a {
			if !slices.Equal(a[j], b[j]) {
				t.Fatalf("%v: input %d differs with fill order", m, j)
			}
		}
		c := fillAll(t, NewPlan([]Distribution{u, u}, Config{Trials: 2*BatchSize + 5, Seed: 8, Method: m}))
		if slices.Equal(a[0], c[0]) {
			t.Fatalf("%v: seeds 7 and 8 give the same draws", m)
		}
	}
}

func BenchmarkFill(b *testing.B) {
	u, _ := NewUniform(800, 1600)
	tri, _ := NewTriangular(3, 6, 14)
	pert, _ := NewPERT(0.02, 0.06, 0.12)
	nrm, _ := NewNormal(235, 12, 200, math.Inf(1))
	dists := []Distribution{u, tri, pert, nrm}
	corr, err := BuildCorrelation([]string{"area", "temp"}, []Pair{{"area", "temp", 0.5}})
	if err != nil {
		b.Fatal(err)
	}
	corr4 := mat.NewSymDense(4, nil) // area (1) and temperature (3) correlated
	for i := range 4 {
		corr4.SetSym(i, i, 1)
	}
	corr4.SetSym(1, 3, corr.At(0, 1))
	for _, c := range []struct {
		m    Method
		corr *mat.SymDense
		name string
	}{{LatinHypercube, nil, "lhs"}, {Random, nil, "random"}, {LatinHypercube, corr4, "lhs-correlated"}, {Random, corr4, "random-correlated"}} {
		m := c.m
		b.Run(c.name, func(b *testing.B) {
			p := NewPlan(dists, Config{Trials: 1_000_000, Seed: 1, Method: m, Correlation: c.corr})
			cols := make([][]float64, len(dists))
			for j := range cols {
				cols[j] = make([]float64, BatchSize)
			}
			for b.Loop() {
				if err := p.Fill(0, cols); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*BatchSize*len(dists)), "ns/draw")
		})
	}
}

// TestCorrelatedLHSOrder: a correlated Latin hypercube hands its columns
// to Iman–Conover in stratum order, taking the shuffle's draws without
// moving anything, since Iman–Conover reorders a column by ranks alone.
// The draws must be bit for bit those of shuffling first: the columns
// drawn, shuffled and rearranged by ImanConover on the same stream.
func TestCorrelatedLHSOrder(t *testing.T) {
	t.Parallel()
	tri, _ := NewTriangular(3, 6, 14)
	pert, _ := NewPERT(0.02, 0.06, 0.12)
	nrm, _ := NewNormal(235, 12, 200, math.Inf(1))
	dists := []Distribution{tri, pert, nrm}
	target, err := BuildCorrelation([]string{"a", "b", "c"}, []Pair{{"a", "c", 0.5}, {"b", "c", -0.3}})
	if err != nil {
		t.Fatal(err)
	}
	const trials = BatchSize + 999
	p := NewPlan(dists, Config{Trials: trials, Seed: 4, Method: LatinHypercube, Correlation: target})
	for b := range p.Batches() {
		_, n := p.BatchRange(b)
		got, want := make([][]float64, len(dists)), make([][]float64, len(dists))
		for j := range dists {
			got[j], want[j] = make([]float64, n), make([]float64, n)
		}
		if err := p.Fill(b, got); err != nil {
			t.Fatal(err)
		}
		rng := newPCG(4, batchStream|uint64(b))
		for j, d := range dists {
			stratified(rng, d, want[j], nil, true)
		}
		if err := ImanConover(want, p.corr, rand.New(rng)); err != nil { // the scores' correlation for target
			t.Fatal(err)
		}
		for j := range dists {
			if !slices.Equal(got[j], want[j]) {
				t.Fatalf("batch %d, column %d: the draws differ from shuffling before Iman–Conover", b, j)
			}
		}
	}
}

// TestOneInputCorrelationShuffles: a plan of one input with a 1×1
// correlation (BuildCorrelation of one name and no pairs) has nothing for
// Iman–Conover to rearrange, so its draws are those of no correlation:
// shuffled, not left in stratum order.
func TestOneInputCorrelationShuffles(t *testing.T) {
	t.Parallel()
	u, _ := NewUniform(0, 1)
	one, err := BuildCorrelation([]string{"x"}, nil)
	if err != nil {
		t.Fatal(err)
	}
	const n = 1000
	got, want := [][]float64{make([]float64, n)}, [][]float64{make([]float64, n)}
	if err := NewPlan([]Distribution{u}, Config{Trials: n, Seed: 3, Method: LatinHypercube, Correlation: one}).Fill(0, got); err != nil {
		t.Fatal(err)
	}
	if err := NewPlan([]Distribution{u}, Config{Trials: n, Seed: 3, Method: LatinHypercube}).Fill(0, want); err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(got[0], want[0]) || slices.IsSorted(got[0]) {
		t.Error("a one-input correlated plan does not draw as an uncorrelated one")
	}
}

// TestPlanRankCorrelation checks that a plan with a target rank
// correlation achieves it as Spearman's coefficient (Pearson correlation
// of ranks, gonum stat.Correlation) for LHS and random sampling, within
// 4 standard errors (1 − ρ²)/√(n − 1) (from memory; the usual large-n
// approximation), while every marginal keeps its Latin hypercube strata.
func TestPlanRankCorrelation(t *testing.T) {
	t.Parallel()
	u, _ := NewUniform(0, 1)
	tri, _ := NewTriangular(3, 6, 14)
	ln, _ := NewLogNormal(0, 0.5, 0, math.Inf(1))
	target, err := BuildCorrelation([]string{"a", "b", "c"}, []Pair{{"a", "b", -0.6}, {"b", "c", 0.5}})
	if err != nil {
		t.Fatal(err)
	}
	const n = 20000
	for _, m := range []Method{LatinHypercube, Random} {
		p := NewPlan([]Distribution{u, tri, ln}, Config{Trials: n, Seed: 11, Method: m, Correlation: target})
		cols := fillAll(t, p)
		for _, c := range []struct {
			i, j int
			rho  float64
		}{{0, 1, -0.6}, {1, 2, 0.5}, {0, 2, 0}} {
			got := stat.Correlation(ranks(cols[c.i]), ranks(cols[c.j]), nil)
			se := (1 - c.rho*c.rho) / math.Sqrt(n-1)
			if math.Abs(got-c.rho) > 4*se+0.01 {
				t.Errorf("%v: Spearman(%d, %d) = %.4f, want %.2f ± %.4f", m, c.i, c.j, got, c.rho, 4*se+0.01)
			}
		}
		if m == LatinHypercube {
			seen := make([]int, n)
			for _, x := range cols[0] {
				seen[min(int(x*n), n-1)]++
			}
			for k, c := range seen {
				if c != 1 {
					t.Fatalf("stratum %d of input 0 holds %d draws after correlation", k, c)
				}
			}
		}
	}
}

// TestShuffleUniform checks that shuffle puts four items in each of the
// 24 orders equally often: a chi-square test with 23 degrees
// of freedom over 240 000 draws, at a level of 1e-6 (critical value
// 65.5, from the chi-square quantile of gonum's distuv.ChiSquared).
func TestShuffleUniform(t *testing.T) {
	t.Parallel()
	rng := newPCG(5, 6)
	counts := map[[4]float64]int{}
	const draws = 240_000
	perm := make([]float64, 4)
	for range draws {
		copy(perm, []float64{0, 1, 2, 3})
		shuffle(rng, perm, nil)
		counts[[4]float64(perm)]++
	}
	if len(counts) != 24 {
		t.Fatalf("%d distinct orders, want 24", len(counts))
	}
	var chi2 float64
	const want = draws / 24.0
	for _, c := range counts {
		chi2 += (float64(c) - want) * (float64(c) - want) / want
	}
	crit := distuv.ChiSquared{K: 23}.Quantile(1 - 1e-6)
	if chi2 > crit {
		t.Errorf("chi-square %g over 23 dof, above the 1e-6 critical value %g", chi2, crit)
	}
}

// TestShufflePairsSameMoves holds fisherYates, whose values go two
// indices a draw, two draws at a time, while no index might be rejected
// (shufflePairs), to the plain loop of one index a half-draw of
// math/rand/v2's PCG (refFisherYates, the loop it replaced): the same
// order of values and the same draws taken, for sizes from 1 to a whole
// batch and many seeds. At a whole batch about half the shuffles meet an
// index that might be rejected (each of the n indices with a chance near
// i/2^32), so the hand-over to the plain loop, at the first or the second
// of two draws, and back to the pairs after the doubtful draw, is
// exercised; the test counts both kinds and fails if either is missing.
func TestShufflePairsSameMoves(t *testing.T) {
	t.Parallel()
	var handovers [2]int // at the first, second draw of two taken at once
	for seed := range uint64(40) {
		for _, n := range []int{1, 2, 3, 4, 5, 100, 101, BatchSize} {
			x, want := make([]float64, n), make([]float64, n)
			for i := range x {
				x[i], want[i] = float64(i), float64(i)
			}
			a, b := newPCG(seed, 3), rand.NewPCG(seed, 3)
			if i, _, have := shufflePairs(newPCG(seed, 3), slices.Clone(x), n-1); have > 0 && i >= 4 {
				handovers[(n-1-i)%4/2]++
			}
			fisherYates(a, n, x, nil)
			refFisherYates(b, n, want)
			if !slices.Equal(x, want) || a.Uint64() != b.Uint64() {
				t.Fatalf("seed %d, n %d: moves or draws differ from the plain loop", seed, n)
			}
		}
	}
	if handovers[0] == 0 || handovers[1] == 0 {
		t.Errorf("handovers to the plain loop at the first and second of two draws: %v; the test does not exercise both", handovers)
	}
}

// refFisherYates is the plain loop of fisherYates for x alone, before
// shufflePairs: each index from the next unused 32-bit half of a draw.
func refFisherYates(rng *rand.PCG, n int, x []float64) {
	var pool uint64
	have := 0
	for i := n - 1; i > 0; i-- {
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
		j := int(m >> 32)
		x[i], x[j] = x[j], x[i]
	}
}

// TestSliceQuantiles checks that every distribution's Quantiles gives
// exactly its Quantile, value by value.
func TestSliceQuantiles(t *testing.T) {
	t.Parallel()
	u, _ := NewUniform(2, 5)
	tri, _ := NewTriangular(3, 6, 14)
	pert, _ := NewPERT(0.02, 0.06, 0.12)
	nrm, _ := NewNormal(235, 12, 200, math.Inf(1))
	ln, _ := NewLogNormal(0, 0.5, 0, math.Inf(1))
	lnCut, _ := NewLogNormal(0, 0.5, 0.8, 2) // both limits, so that clamp bites
	nrmCut, _ := NewNormal(235, 12, 220, 240)
	rng := rand.New(rand.NewPCG(1, 1))
	ps := make([]float64, 20000)
	for i := range ps {
		ps[i] = rng.Float64()
	}
	ps[0], ps[1] = 0, 1
	// The tails: far (below 2^−20), at its edge, and within the tail tables.
	copy(ps[2:], []float64{1e-7, 1 - 1e-7, 0x1p-20, math.Nextafter(0x1p-20, 0), 1 - 0x1p-20, 1e-3, 1 - 1e-3})
	for _, d := range []Distribution{Fixed{Value: 3}, u, tri, pert, nrm, ln, lnCut, nrmCut} {
		got := slices.Clone(ps)
		d.(SliceQuantiler).Quantiles(got)
		for i, p := range ps {
			if want := d.Quantile(p); math.Float64bits(got[i]) != math.Float64bits(want) {
				t.Fatalf("%v: Quantiles gives %v at p = %v, Quantile %v", d, got[i], p, want)
			}
		}
	}
}

// TestFillRankedMatchesSort: the ranks FillRanked gives a Latin hypercube
// without correlations are the doubled ranks of a sort of the draws
// (stats.DoubledRanks, the reference), for continuous distributions, for
// one with ties (a range a few ulps wide) and for a constant, in a whole
// and a partial batch; the draws are Fill's; and random or correlated
// plans give no ranks.
func TestFillRankedMatchesSort(t *testing.T) {
	t.Parallel()
	u, _ := NewUniform(2, 5)
	tri, _ := NewTriangular(3, 6, 14)
	pert, _ := NewPERT(0.02, 0.06, 0.12)
	nrm, _ := NewNormal(235, 12, 200, math.Inf(1))
	ln, _ := NewLogNormal(0, 0.5, 0, math.Inf(1))
	tiny, _ := NewUniform(1, 1+8*0x1p-52) // nine values: ties
	dists := []Distribution{u, tri, pert, nrm, ln, tiny, Fixed{Value: 3}}
	var s stats.RankScratch
	for _, trials := range []int{BatchSize, 1000} {
		p := NewPlan(dists, Config{Trials: trials, Seed: 5, Method: LatinHypercube})
		cols, ranks := make([][]float64, len(dists)), make([][]int32, len(dists))
		for j := range cols {
			cols[j], ranks[j] = make([]float64, trials), make([]int32, trials)
		}
		if err := p.FillRanked(0, cols, ranks); err != nil {
			t.Fatal(err)
		}
		want := fillAll(t, p)
		for j, d := range dists {
			if !slices.Equal(cols[j], want[j]) {
				t.Fatalf("%v, %d trials: FillRanked's draws differ from Fill's", d, trials)
			}
			if ranks[j] == nil {
				t.Errorf("%v, %d trials: no ranks from a Latin hypercube", d, trials)
				continue
			}
			dr := make([]int32, trials)
			stats.DoubledRanks(cols[j], dr, &s)
			if !slices.Equal(ranks[j], dr) {
				t.Errorf("%v, %d trials: ranks differ from a sort's", d, trials)
			}
		}
	}
	corr := mat.NewSymDense(2, []float64{1, 0.5, 0.5, 1})
	for name, cfg := range map[string]Config{
		"random":     {Trials: 1000, Seed: 5, Method: Random},
		"correlated": {Trials: 1000, Seed: 5, Method: LatinHypercube, Correlation: corr},
	} {
		p := NewPlan([]Distribution{u, tri}, cfg)
		cols := [][]float64{make([]float64, 1000), make([]float64, 1000)}
		ranks := [][]int32{make([]int32, 1000), make([]int32, 1000)}
		if err := p.FillRanked(0, cols, ranks); err != nil {
			t.Fatal(err)
		}
		if ranks[0] != nil || ranks[1] != nil {
			t.Errorf("%s: ranks given, where the plan cannot know them", name)
		}
	}
}

// TestStrataRanks: doubled ranks of quantiles in stratum order, with a
// run of ties sharing the mean of their ranks (2, 6, 6, 6, 10: twice the
// ranks 1, 3 — the mean of 2, 3, 4 — and 5), and a quantile that falls from one stratum to the next
// refused.
func TestStrataRanks(t *testing.T) {
	t.Parallel()
	r := make([]int32, 5)
	if !strataRanks([]float64{1, 2, 2, 2, 3}, r) || !slices.Equal(r, []int32{2, 6, 6, 6, 10}) {
		t.Errorf("ties: %v, want [2 6 6 6 10]", r)
	}
	neg := math.Copysign(0, -1)
	if !strataRanks([]float64{-1, neg, 0, neg, 1}, r) || !slices.Equal(r, []int32{2, 6, 6, 6, 10}) {
		t.Errorf("both zeros: %v, want [2 6 6 6 10] (they tie, as in stats.DoubledRanks)", r)
	}
	if strataRanks([]float64{1, 2, 1.5, 3, 4}, r) {
		t.Error("a falling quantile was ranked")
	}
	if strataRanks([]float64{1, 2, math.NaN(), 3, 4}, r) {
		t.Error("a NaN was ranked")
	}
}
