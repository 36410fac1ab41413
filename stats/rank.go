package stats

import (
	"cmp"
	"math"
	"math/bits"
	"slices"

	"rockheat/stats/radix"
)

// Ranks returns the ranks 1 … n of the values x, with tied values given
// the average of the ranks they span (so ranks are multiples of ½ and sum
// to n(n+1)/2). x is not changed. Ranks takes O(n) time (radix sort). It
// panics if x holds a NaN or more than 2^31−1 values.
func Ranks(x []float64) []float64 {
	n := len(x)
	if n > math.MaxInt32 {
		panic("stats: Ranks of more than 2^31−1 values")
	}
	keys := make([]uint64, n)
	idx := make([]int32, n)
	for i, v := range x {
		if v != v {
			panic("stats: Ranks of a column with NaN; drop the NaN trials first")
		}
		keys[i] = radix.Key(v)
		idx[i] = int32(i)
	}
	if n < radix.MinLen {
		slices.SortStableFunc(idx, func(a, b int32) int { return cmp.Compare(keys[a], keys[b]) })
		for i, j := range idx {
			keys[i] = radix.Key(x[j])
		}
	} else {
		keys, idx = radix.Sort(keys, make([]uint64, n), 0, idx, make([]int32, n))
	}
	r := make([]float64, n)
	for a := 0; a < n; {
		b := a + 1
		for b < n && radix.Float(keys[b]) == radix.Float(keys[a]) { // −0 ties +0
			b++
		}
		avg := float64(a+b+1) / 2 // mean of the ranks a+1 … b
		for _, j := range idx[a:b] {
			r[j] = avg
		}
		a = b
	}
	return r
}

// Spearman returns Spearman's rank correlation coefficient of x and y: the
// Pearson correlation of their ranks (average ranks for ties), in [−1, 1].
// It is 0 when either column is constant (including n < 2). It panics if
// the lengths differ or a value is NaN.
func Spearman(x, y []float64) float64 {
	return CorrelateRanks(Ranks(x), Ranks(y))
}

// CorrelateRanks returns the Pearson correlation of two rank columns as
// returned by Ranks, which is Spearman's coefficient of the ranked
// values; it is 0 when either column is constant. Because ranks are
// multiples of ½ with known mean (n+1)/2, the sums are formed exactly in
// integer arithmetic, so the result is accurate to a few rounding errors
// and independent of the order of the trials; it is exactly ±1 for equal
// or reversed ranks. It panics if the lengths differ or a value is not a
// rank of a column of that length.
func CorrelateRanks(rx, ry []float64) float64 {
	n := len(rx)
	if len(ry) != n {
		panic("stats: CorrelateRanks of columns of different lengths")
	}
	doubled := func(r []float64) []int32 {
		d := make([]int32, n)
		for i, v := range r {
			d[i] = int32(2 * v)
			if float64(d[i]) != 2*v || v < 1 || v > float64(n) {
				panic("stats: CorrelateRanks of values that are not ranks")
			}
		}
		return d
	}
	return CorrelateDoubledRanks(doubled(rx), doubled(ry))
}

// int128 is a two's-complement 128-bit accumulator.
type int128 struct{ hi, lo uint64 }

func (s *int128) add(p int64) {
	var c uint64
	s.lo, c = bits.Add64(s.lo, uint64(p), 0)
	s.hi += uint64(p>>63) + c
}

func (s int128) float() float64 {
	hi, lo := s.hi, s.lo
	neg := int64(hi) < 0
	if neg {
		var b uint64
		lo, b = bits.Sub64(0, lo, 0)
		hi = -hi - b
	}
	f := float64(hi)*0x1p64 + float64(lo)
	if neg {
		return -f
	}
	return f
}

// Influence is one input's effect on an output, from rank correlation.
type Influence struct {
	// Input is the input's name.
	Input string
	// RankCorrelation is Spearman's coefficient of the input and the
	// output, in [−1, 1]; 0 for a constant input.
	RankCorrelation float64
	// VarianceShare is RankCorrelation² / Σ RankCorrelation² over all
	// inputs, in [0, 1]: the approximate fraction of the output's variance
	// due to the input. It is meaningful for near-additive, monotone
	// models with independent inputs; for others it only ranks the inputs.
	VarianceShare float64
}

// RankSensitivity returns the Influence of each input column on output,
// sorted by |RankCorrelation| descending, ties by name and then by input
// order. names[i] names inputs[i]; every column must have the length of
// output. It panics on mismatched lengths or NaN values.
func RankSensitivity(names []string, inputs [][]float64, output []float64) []Influence {
	if len(names) != len(inputs) {
		panic("stats: RankSensitivity with different numbers of names and inputs")
	}
	var s RankScratch
	ranked := func(x []float64) []int32 {
		d := make([]int32, len(x))
		DoubledRanks(x, d, &s)
		return d
	}
	in := make([][]int32, len(inputs))
	for i, x := range inputs {
		if len(x) != len(output) {
			panic("stats: RankSensitivity with columns of different lengths")
		}
		in[i] = ranked(x)
	}
	return DoubledRankSensitivity(names, in, ranked(output))
}

// influences returns the Influences of inputs names with rank correlations
// rhos, sorted by |RankCorrelation| descending, ties by name.
func influences(names []string, rhos []float64) []Influence {
	inf := make([]Influence, len(names))
	var ss float64
	for i, rho := range rhos {
		inf[i] = Influence{Input: names[i], RankCorrelation: rho}
		ss += rho * rho
	}
	if ss > 0 {
		for i := range inf {
			inf[i].VarianceShare = inf[i].RankCorrelation * inf[i].RankCorrelation / ss
		}
	}
	slices.SortStableFunc(inf, func(a, b Influence) int {
		if c := cmp.Compare(math.Abs(b.RankCorrelation), math.Abs(a.RankCorrelation)); c != 0 {
			return c
		}
		return cmp.Compare(a.Input, b.Input)
	})
	return inf
}

// RankScratch holds the buffers of DoubledRanks, reused call after call.
// The zero value is ready; a RankScratch is not safe for concurrent use.
type RankScratch struct {
	keys, kbuf []uint64
	run        []rankedKey
}

// rankedKey is a value's order key and its packed sort key.
type rankedKey struct{ key, packed uint64 }

// DoubledRanks writes twice the ranks of x (the average ranks of Ranks,
// so whole numbers 2 … 2n) into dst, which must have len(x) elements, using
// s's buffers: a sixth of the memory of Ranks, and none allocated once s
// has held as many values. It panics if x holds a NaN or dst is short.
//
// It sorts one word a value: the value's order key (radix.Key, −0 taken
// as +0) with its low bits replaced by the value's index. The keys start
// in index order and the sort is stable, so the index bytes need no pass;
// values whose keys agree above the index bits (a relative difference
// below about 2⁻³⁵ for 2¹⁶ values) are then put in the order of their
// whole keys, so the order is exactly that of a sort of the values.
func DoubledRanks(x []float64, dst []int32, s *RankScratch) {
	n := len(x)
	if len(dst) < n {
		panic("stats: DoubledRanks with a short destination")
	}
	if n > math.MaxInt32 {
		panic("stats: DoubledRanks of more than 2^31−1 values")
	}
	if cap(s.keys) < n {
		s.keys, s.kbuf = make([]uint64, n), make([]uint64, n)
	}
	idxBits := bits.Len(uint(max(n-1, 1)))
	mask := uint64(1)<<idxBits - 1
	keys := s.keys[:n]
	for i, v := range x {
		if v != v {
			panic("stats: DoubledRanks of a column with NaN; drop the NaN trials first")
		}
		keys[i] = rankKey(v)&^mask | uint64(i)
	}
	keys, _ = radix.Sort(keys, s.kbuf[:n], idxBits/8, nil, nil)
	for a := 0; a < n; {
		b := a + 1
		for b < n && keys[b]&^mask == keys[a]&^mask {
			b++
		}
		if b == a+1 {
			dst[keys[a]&mask] = int32(2*a + 2)
		} else {
			s.rankRun(keys[a:b], a, x, mask, dst)
		}
		a = b
	}
}

// rankKey is radix.Key of v with −0 taken as +0, so that they tie.
func rankKey(v float64) uint64 {
	if v == 0 {
		v = 0
	}
	return radix.Key(v)
}

// rankRun ranks keys, the packed keys of DoubledRanks at sorted positions
// a, a+1, … that agree above the index bits (in index order): it orders
// them by their whole keys, stably, and gives tied values the mean of
// their ranks.
func (s *RankScratch) rankRun(keys []uint64, a int, x []float64, mask uint64, dst []int32) {
	run := s.run[:0]
	for _, p := range keys {
		run = append(run, rankedKey{key: rankKey(x[p&mask]), packed: p})
	}
	s.run = run
	if !slices.IsSortedFunc(run, compareKeys) {
		slices.SortStableFunc(run, compareKeys)
	}
	for i := 0; i < len(run); {
		j := i + 1
		for j < len(run) && run[j].key == run[i].key {
			j++
		}
		for _, r := range run[i:j] {
			dst[r.packed&mask] = int32(2*a + i + j + 1) // twice the mean of the ranks a+i+1 … a+j
		}
		i = j
	}
}

func compareKeys(p, q rankedKey) int { return cmp.Compare(p.key, q.key) }

// CorrelateDoubledRanks returns the Pearson correlation of two columns of
// DoubledRanks, which is Spearman's coefficient of the ranked values
// (CorrelateRanks, with the same exact integer sums). It panics if the
// lengths differ.
func CorrelateDoubledRanks(dx, dy []int32) float64 {
	n := len(dx)
	if len(dy) != n {
		panic("stats: CorrelateDoubledRanks of columns of different lengths")
	}
	var sxy, sxx, syy int128
	c := int64(n + 1)
	if n < 1<<20 {
		// Each product is below n² in size and the sums below n³ < 2^60:
		// int64 holds them exactly.
		var xy, xx, yy int64
		for i := range n {
			ix, iy := int64(dx[i])-c, int64(dy[i])-c // integers in (−n, n)
			xy += ix * iy
			xx += ix * ix
			yy += iy * iy
		}
		sxy.add(xy)
		sxx.add(xx)
		syy.add(yy)
	} else {
		for i := range n {
			ix, iy := int64(dx[i])-c, int64(dy[i])-c
			sxy.add(ix * iy)
			sxx.add(ix * ix)
			syy.add(iy * iy)
		}
	}
	vx, vy := sxx.float(), syy.float()
	if vx == 0 || vy == 0 {
		return 0
	}
	r := sxy.float() / math.Sqrt(vx*vy) // exactly ±1 for equal or reversed ranks
	return math.Max(-1, math.Min(1, r))
}

// DoubledRankSensitivity is RankSensitivity for columns already ranked
// by DoubledRanks, so that the inputs are ranked once for several outputs.
func DoubledRankSensitivity(names []string, inputRanks [][]int32, outputRanks []int32) []Influence {
	if len(names) != len(inputRanks) {
		panic("stats: DoubledRankSensitivity with different numbers of names and inputs")
	}
	rhos := make([]float64, len(names))
	for i, r := range inputRanks {
		rhos[i] = CorrelateDoubledRanks(r, outputRanks)
	}
	return influences(names, rhos)
}
