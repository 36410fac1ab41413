package stats

import (
	"fmt"
	"math"
	"math/bits"
	"slices"
	"sync"

	"rockheat/stats/radix"
)

// DefaultRelErr is the relative error bound of rockheat's sketches: bins
// 2·10⁻⁴ wide in relative terms, 11 513 bins (46 kB) per decade of values.
const DefaultRelErr = 1e-4

// Sketch is a bounded-memory, mergeable summary of a stream of values, for
// runs too long to keep every trial. It keeps exact counts in a histogram of
// logarithmic bins of constant relative width (one for positive values, a
// mirrored one for negative values, and counters for zeros, infinities and
// NaNs), the exact minimum and maximum (−0 before +0), and exact sums of the values and of
// their squares.
//
// Error bound: with α = RelErr() (at most the relErr asked of NewSketch),
// every order statistic is reported within α·|x| of its exact value x, so
// Quantile(q) differs from the exact type-7 quantile of the same values by
// at most α·((1−f)·|x(lo)| + f·|x(lo+1)|), where x(lo), x(lo+1) and f are
// the order statistics and fraction of the type-7 formula: at most
// α·|Quantile| when both order statistics have the same sign. The minimum
// and maximum are exact, and so are the mean and standard deviation
// (correctly rounded; the same as Summarize gives for the same values).
// The bound holds for normal float64 magnitudes (≥ 2.2·10⁻³⁰⁸); subnormal
// values lose relative precision.
//
// Merging: all the state is exact integers and extremes, so Merge is
// commutative and associative, and a sketch's results are bit-identical
// whatever the order in which values were added and sketches merged.
//
// Memory: 4 bytes per bin (32-bit counts, folded into 64-bit ones before
// one could wrap round), in pages of 256 bins allocated where values
// fall: at most about ln(max/min)/(2α) bins per sign for the range of
// magnitudes seen (46 kB per decade at α = 10⁻⁴), far fewer when values
// are spread thinly over many decades; a page table of 8 bytes a page of
// the range; and 66 kB of sums (1.7 kB of
// limbs and 64 kB of accumulators, one per binary exponent); Bins reports
// the count. The look-up tables of a resolution (about 115 kB at
// α = 10⁻⁴) are built once and shared by all sketches.
//
// Add costs a table look-up on the bits of the value (no logarithm) and a
// few integer additions; AddSlice does the same work in one loop, without
// a call per value. A Sketch is not safe for concurrent use; give
// each goroutine its own and merge them. The zero Sketch is not usable;
// use NewSketch.
type Sketch struct {
	tab      *binTable
	pos, neg bins // counts of positive values and of negative values by |x|
	zero     uint64
	posInf   uint64
	negInf   uint64
	nan      uint64
	n        uint64 // values other than NaN
	low      uint64 // bound on the bins' 32-bit counts (see reserve)
	min, max float64
	mom      *moments
}

// NewSketch returns an empty sketch whose quantiles are within relative
// error relErr of exact order statistics (see Sketch). Constraint:
// 1e-6 ≤ relErr ≤ 0.1; NewSketch panics otherwise. Use DefaultRelErr
// unless there is a reason not to.
func NewSketch(relErr float64) *Sketch {
	if !(relErr >= 1e-6 && relErr <= 0.1) {
		panic(fmt.Sprintf("stats: NewSketch relative error %g outside [1e-6, 0.1]", relErr))
	}
	g := (1 + relErr) / (1 - relErr)
	k := int(math.Ceil(math.Ln2 / math.Log(g)))
	return &Sketch{
		tab: tableFor(k),
		min: math.Inf(1),
		max: math.Inf(-1),
		mom: newMoments(),
	}
}

// RelErr returns the relative error bound α of the sketch's order
// statistics, including rounding; it is at most the relErr given to
// NewSketch (up to ~1e-15).
func (s *Sketch) RelErr() float64 { return s.tab.relErr }

// N returns the number of values added, NaNs excluded.
func (s *Sketch) N() int { return int(s.n) }

// Bins returns the number of histogram bins allocated, each of 4 bytes
// (and 8 more once its page has been folded, after 2³² − 1 values, or
// carried into by Merge).
func (s *Sketch) Bins() int { return (s.pos.used + s.neg.used) * pageSize }

// Add adds the value x. NaN is counted apart and excluded from every
// statistic, as in Summarize.
func (s *Sketch) Add(x float64) {
	s.reserve(1)
	s.add(x)
}

// add is Add without the reservation of room in the bins' 32-bit counts,
// for addRun, whose values AddSlice has reserved.
func (s *Sketch) add(x float64) {
	switch {
	case x > 0:
		if x > math.MaxFloat64 {
			s.posInf++
		} else {
			s.pos.inc(s.tab.index(x))
		}
	case x < 0:
		if x < -math.MaxFloat64 {
			s.negInf++
		} else {
			s.neg.inc(s.tab.index(-x))
		}
	case x == 0:
		s.zero++
	default:
		s.nan++
		return
	}
	s.n++
	if keyLess(x, s.min) {
		s.min = x
	}
	if keyLess(s.max, x) {
		s.max = x
	}
	s.mom.add(x)
}

// lowMax is the largest 32-bit count of a bin.
const lowMax = 1<<32 - 1

// reserve makes room for k ≤ lowMax more values in the bins' 32-bit
// counts: it keeps low, the number of values added since the counts
// were last folded into the 64-bit ones (or a bound on it after Merge),
// at most lowMax, folding first if k more would pass it. No count can
// then wrap round, so adding a value needs no test of its count. Every
// value is reserved once, by Add or AddSlice, before it is counted: a
// fold in the middle of a reserved run would reset low below the counts
// still to come.
func (s *Sketch) reserve(k int) {
	if s.low+uint64(k) > lowMax {
		s.pos.fold()
		s.neg.fold()
		s.low = 0
	}
	s.low += uint64(k)
}

// keyLess reports whether a comes before b in the order of radix.Key,
// for values that are not NaN: a < b, or −0 before +0. With it the
// extremes do not depend on the order of the values.
func keyLess(a, b float64) bool {
	return a < b || (a == b && math.Signbit(a) && !math.Signbit(b))
}

// AddSlice adds every value of xs, as Add would one by one.
func (s *Sketch) AddSlice(xs []float64) {
	for len(xs) > 0 {
		k := min(len(xs), s.mom.room())
		s.reserve(k)
		s.addRun(xs[:k])
		s.mom.counted(k)
		xs = xs[k:]
	}
}

// addRun adds xs, at most s.mom.room() values whose room in the bins the
// caller has reserved, to everything but the count of the moments'
// accumulators, which the caller records. It is add with
// the extremes held in locals and the work for a normal value — bin look-up
// (binTable.index), bin count (bins.inc) and sums (addBits) — written out;
// zeros, subnormals, infinities and NaNs go through add, and so does every
// value for resolutions finer than 7.6·10⁻⁶, whose bin look-up walks.
func (s *Sketch) addRun(xs []float64) {
	t := s.tab
	if t.multi {
		for _, x := range xs {
			s.add(x)
		}
		return
	}
	lo, hi := s.min, s.max
	acc := s.mom.acc
	// The shift is below 64; saying so (& 63) spares the compiled loop its
	// check of the shift's range.
	cell, frac, shift, k := t.cell, t.frac, (52-t.bits)&63, t.k
	before := s.n + s.nan // counts of the values that go through Add
	for _, x := range xs {
		u := math.Float64bits(x)
		a := u &^ (1 << 63) // bits of |x|
		// Below 2^−1022 (a − 2^52 wraps), ±Inf or NaN:
		if a-1<<52 >= 0x7ff0_0000_0000_0000-1<<52 {
			s.min, s.max = lo, hi
			s.add(x) // counts a subnormal once more towards the next fold: it only comes sooner
			lo, hi = s.min, s.max
			continue
		}
		if x < lo {
			lo = x
		}
		if x > hi {
			hi = x
		}
		// Bin: as binTable.index for a normal value.
		f := a & fracMask
		j := int(cell[f>>shift])
		j += int((frac[j+1] - 1 - f) >> 63)
		i := (int(a>>52)-1023)*k + j
		b := &s.pos
		if u>>63 != 0 {
			b = &s.neg
		}
		if k := i>>pageBits - b.first; uint(k) < uint(len(b.pages)) && b.pages[k] != nil {
			b.pages[k][i&(pageSize-1)]++
		} else {
			b.inc(i)
		}
		// Sums: as addBits for a normal value, whose significand has its
		// implicit bit.
		m := f | 1<<52
		e := &acc[a>>52]
		neg := int64(u) >> 63 // −1 for a negative value
		sm := uint64((int64(m) ^ neg) - neg)
		var c uint64
		e.sumLo, c = bits.Add64(e.sumLo, sm, 0)
		e.sumHi += uint64(neg) + c
		sh, sl := bits.Mul64(m, m)
		e.sqLo, c = bits.Add64(e.sqLo, sl, 0)
		e.sqHi += sh + c
	}
	s.min, s.max = lo, hi
	normal := uint64(len(xs)) - (s.n + s.nan - before)
	s.n += normal
	s.mom.n += int64(normal)
}

// Merge adds the values summarised by o to s; o is not changed. The
// sketches must come from NewSketch with the same relErr; Merge panics
// otherwise.
func (s *Sketch) Merge(o *Sketch) {
	if s.tab != o.tab {
		panic("stats: Merge of sketches with different relative errors")
	}
	s.pos.merge(&o.pos)
	s.neg.merge(&o.neg)
	s.zero += o.zero
	s.posInf += o.posInf
	s.negInf += o.negInf
	s.nan += o.nan
	s.n += o.n
	s.low = min(s.low+o.low, lowMax) // merge carried any sum past lowMax
	if keyLess(o.min, s.min) {
		s.min = o.min
	}
	if keyLess(s.max, o.max) {
		s.max = o.max
	}
	s.mom.merge(o.mom)
}

// Quantile returns the type-7 q-quantile (see Quantile) of the values
// added, within the error bound stated for Sketch. It panics if the sketch
// holds no values or q is outside [0, 1].
func (s *Sketch) Quantile(q float64) float64 {
	if s.n == 0 {
		panic("stats: Quantile of empty sketch")
	}
	return quantileAt(int(s.n), q, s.at)
}

// Exceedance returns the value exceeded with probability p (P90 for
// p = 0.9), Quantile(1−p); see Exceedance.
func (s *Sketch) Exceedance(p float64) float64 {
	if !(p >= 0 && p <= 1) {
		panic("stats: Exceedance probability outside [0, 1]")
	}
	return s.Quantile(1 - p)
}

// Summary returns the Summary of the values added, as Summarize would for
// the same values, except that each percentile and interval end is within
// the sketch's error bound of the exact one; N, NaN, Mean, SD, Min, Max,
// the interval levels and the mean interval are identical. The interval
// ends are the order statistics of the same binomial ranks
// (QuantileBounds). It panics if opt is invalid.
func (s *Sketch) Summary(opt Options) Summary {
	level := opt.Level()
	n := int(s.n)
	if n == 0 {
		return build(0, int(s.nan), s.at, s.mom, level)
	}
	ranks := summaryRanks(n, level)
	vals := s.orderStats(ranks) // one walk over the bins for all of them
	return build(n, int(s.nan), func(k int) float64 {
		i, ok := slices.BinarySearch(ranks, k)
		if !ok {
			return s.at(k)
		}
		return vals[i]
	}, s.mom, level)
}

// at returns the order statistic of 0-based rank k: the exact extreme for
// k = 0 and k = n−1, otherwise its bin's representative value clamped to
// [min, max].
func (s *Sketch) at(k int) float64 {
	switch uint64(k) {
	case 0:
		return s.min
	case s.n - 1:
		return s.max
	}
	v := s.rank(uint64(k))
	return math.Min(math.Max(v, s.min), s.max)
}

// rank returns the representative value of the value of rank r, 0 ≤ r < n.
func (s *Sketch) rank(r uint64) float64 {
	v := math.Inf(1)
	s.groups(func(g group, c uint64) bool {
		if r < c {
			v = s.value(g)
			return false
		}
		r -= c
		return true
	})
	return v
}

// orderStats returns at(k) for each k of ranks, which are ascending, in
// one walk over the bins.
func (s *Sketch) orderStats(ranks []int) []float64 {
	out := make([]float64, len(ranks))
	for i := range out {
		out[i] = math.Inf(1)
	}
	s.rankGroups(ranks, func(i int, g group) { out[i] = s.value(g) })
	for i, k := range ranks {
		switch uint64(k) {
		case 0:
			out[i] = s.min
		case s.n - 1:
			out[i] = s.max
		default:
			out[i] = math.Min(math.Max(out[i], s.min), s.max)
		}
	}
	return out
}

// rankKeyRanges returns, for each of ranks (ascending, in [0, n)), the
// closed range of radix keys of the group (bin, zeros or infinity) that
// holds the value of that rank (see keyRange).
func (s *Sketch) rankKeyRanges(ranks []int) [][2]uint64 {
	out := make([][2]uint64, len(ranks))
	if s.rankGroups(ranks, func(i int, g group) { out[i] = s.keyRange(g) }) < len(ranks) {
		panic("stats: rankKeyRanges with a rank beyond the values")
	}
	return out
}

// rankGroups calls f(i, g) with the group g that holds the value of rank
// ranks[i], for each of ranks (ascending), in one walk over the bins, and
// returns the number of ranks it found among the values.
func (s *Sketch) rankGroups(ranks []int, f func(i int, g group)) int {
	next, cum := 0, uint64(0)
	s.groups(func(g group, c uint64) bool {
		for next < len(ranks) && uint64(ranks[next]) < cum+c {
			f(next, g)
			next++
		}
		cum += c
		return next < len(ranks)
	})
	return next
}

// keyRange returns the closed range of radix keys of every value that
// group g takes: exactly the values of its bin (they are those whose
// bits, or whose bits scaled by 2^64 for a subnormal, lie between the
// bin's fraction bounds at its exponent), both zeros, or the infinity.
// The ranges of different groups do not overlap, so a range made of
// whole groups splits no group.
func (s *Sketch) keyRange(g group) [2]uint64 {
	switch g.kind {
	case zeroGroup:
		return [2]uint64{radix.Key(math.Copysign(0, -1)), radix.Key(0)}
	case negInfGroup:
		return [2]uint64{radix.Key(math.Inf(-1)), radix.Key(math.Inf(-1))}
	case posInfGroup:
		return [2]uint64{radix.Key(math.Inf(1)), radix.Key(math.Inf(1))}
	}
	lo, hi := s.tab.bitRange(g.index) // of |x|: lo ≤ bits(|x|) < hi
	if g.neg {
		return [2]uint64{^((hi - 1) | 1<<63), ^(lo | 1<<63)}
	}
	return [2]uint64{lo | 1<<63, (hi - 1) | 1<<63}
}

// bracketCounts returns, for each of brackets (closed key ranges, sorted
// and disjoint), the number of values below it and inside it, and true;
// or false if a bracket splits a group, whose values it cannot count.
func (s *Sketch) bracketCounts(brackets [][2]uint64) (below, inside []int, ok bool) {
	below, inside = make([]int, len(brackets)), make([]int, len(brackets))
	ok = true
	s.groups(func(g group, c uint64) bool {
		r := s.keyRange(g)
		for b, br := range brackets {
			switch {
			case r[1] < br[0]:
				below[b] += int(c)
			case r[0] >= br[0] && r[1] <= br[1]:
				inside[b] += int(c)
			case r[0] <= br[1]:
				ok = false // straddles an end
			}
		}
		return ok
	})
	return below, inside, ok
}

// Quantiles returns Quantile(q) for each q of qs, in one walk over the
// bins. It panics if the sketch holds no values or a q is outside [0, 1].
func (s *Sketch) Quantiles(qs []float64) []float64 {
	if s.n == 0 {
		panic("stats: Quantiles of empty sketch")
	}
	n := int(s.n)
	ranks := quantileRanks(nil, n, qs...)
	vals := s.orderStats(ranks)
	at := func(k int) float64 {
		i, _ := slices.BinarySearch(ranks, k)
		return vals[i]
	}
	out := make([]float64, len(qs))
	for i, q := range qs {
		out[i] = quantileAt(n, q, at)
	}
	return out
}

// group is a set of values that sort together: a bin of the sketch, or
// the zeros, or an infinity.
type group struct {
	neg   bool // a negative bin (by |x|), rather than a positive one
	index int  // bin index
	kind  groupKind
}

// groupKind tells a bin from the groups of the values no bin holds.
type groupKind int8

const (
	binGroup    groupKind = iota // a bin: neg and index say which
	zeroGroup                    // both zeros
	negInfGroup                  // −Inf
	posInfGroup                  // +Inf
	groupKinds                   // the number of kinds
)

// groups calls f with every group that holds values and its count, in
// ascending order of value, until f returns false.
func (s *Sketch) groups(f func(g group, c uint64) bool) {
	if s.negInf > 0 && !f(group{kind: negInfGroup}, s.negInf) {
		return
	}
	more := true
	s.neg.walk(true, func(i int, c uint64) bool {
		more = f(group{neg: true, index: i}, c)
		return more
	})
	if !more || (s.zero > 0 && !f(group{kind: zeroGroup}, s.zero)) {
		return
	}
	s.pos.walk(false, func(i int, c uint64) bool {
		more = f(group{index: i}, c)
		return more
	})
	if more && s.posInf > 0 {
		f(group{kind: posInfGroup}, s.posInf)
	}
}

// value returns the representative value of group g.
func (s *Sketch) value(g group) float64 {
	switch g.kind {
	case zeroGroup:
		return 0
	case negInfGroup:
		return math.Inf(-1)
	case posInfGroup:
		return math.Inf(1)
	}
	if g.neg {
		return -s.tab.value(g.index)
	}
	return s.tab.value(g.index)
}

// bins is a sparse histogram: the counts of bin indices in pages of
// pageSize bins, allocated only where values fall, so that values spread
// over hundreds of decades (a drawdown's late years, say) cost memory for
// the bins they occupy, not for the whole range between. pages[k] holds
// the bins of page number first+k, bin i being in page i>>pageBits at
// i&(pageSize−1); nil where no value fell. Page numbers are the same for
// every sketch, so pages merge one to one.
//
// A page's counts are 32-bit, which halves the memory, and the cache, that
// the bins take; Sketch.reserve folds them into wide, 64-bit counts, before
// any could wrap round, and a bin's count is its page's plus its wide one.
type bins struct {
	first int                       // page number of pages[0]
	pages []*binPage                // the page table; nil entries are empty pages
	used  int                       // pages allocated
	wide  map[int]*[pageSize]uint64 // page number → counts folded out of the page
}

const pageBits = 8

const pageSize = 1 << pageBits

type binPage [pageSize]uint32

func (b *bins) inc(i int) { b.page(i >> pageBits)[i&(pageSize-1)]++ }

// page returns page p, allocating it, and room for it in the page table
// (with slack of a quarter of the table on the side that grows, so that
// growth is amortised), if it is not there.
func (b *bins) page(p int) *binPage {
	k := p - b.first
	if uint(k) < uint(len(b.pages)) {
		if pg := b.pages[k]; pg != nil {
			return pg
		}
	} else {
		switch {
		case len(b.pages) == 0:
			b.first, b.pages = p, make([]*binPage, 1)
		case k < 0:
			slack := max(len(b.pages)/4, 4)
			t := make([]*binPage, len(b.pages)-k+slack)
			copy(t[-k+slack:], b.pages)
			b.first, b.pages = p-slack, t
		default:
			slack := max(len(b.pages)/4, 4)
			t := make([]*binPage, k+1+slack)
			copy(t, b.pages)
			b.pages = t
		}
		k = p - b.first
	}
	b.pages[k] = new(binPage)
	b.used++
	return b.pages[k]
}

// widePage returns the wide counts of page p, allocating them if need be.
func (b *bins) widePage(p int) *[pageSize]uint64 {
	w := b.wide[p]
	if w == nil {
		if b.wide == nil {
			b.wide = map[int]*[pageSize]uint64{}
		}
		w = new([pageSize]uint64)
		b.wide[p] = w
	}
	return w
}

// fold moves every page's 32-bit counts into its wide counts.
func (b *bins) fold() {
	for k, pg := range b.pages {
		if pg == nil {
			continue
		}
		w := b.widePage(b.first + k)
		for j, c := range pg {
			w[j] += uint64(c)
		}
		*pg = binPage{}
	}
}

// merge adds the counts of o to b; a 32-bit sum that wraps round carries
// 2³² into the wide count.
func (b *bins) merge(o *bins) {
	for k, op := range o.pages {
		if op == nil {
			continue
		}
		p := o.first + k
		pg := b.page(p)
		for j, c := range op {
			if pg[j] += c; pg[j] < c {
				b.widePage(p)[j] += 1 << 32
			}
		}
	}
	for p, ow := range o.wide {
		w := b.widePage(p)
		for j, c := range ow {
			w[j] += c
		}
	}
}

// walk calls f with the index and count of every bin with a count, in
// ascending order of index, or descending if down; it stops when f
// returns false.
func (b *bins) walk(down bool, f func(i int, c uint64) bool) {
	for kk := range b.pages {
		k := kk
		if down {
			k = len(b.pages) - 1 - kk
		}
		pg := b.pages[k]
		if pg == nil {
			continue
		}
		base := (b.first + k) << pageBits
		w := b.wide[b.first+k]
		for jj := range pg {
			j := jj
			if down {
				j = pageSize - 1 - jj
			}
			c := uint64(pg[j])
			if w != nil {
				c += w[j]
			}
			if c != 0 && !f(base+j, c) {
				return
			}
		}
	}
}

// binTable maps positive float64 values to logarithmic bins. With x =
// m·2^e, 1 ≤ m < 2, bin index e·k + j holds the values whose m is in
// [bound[j], bound[j+1]), bound[j] = 2^(j/k): every bin spans the ratio
// γ = 2^(1/k). Its representative is the harmonic mean of its ends, which
// is within (γ−1)/(γ+1) relative error of every value in it.
type binTable struct {
	k      int
	bits   uint      // fraction bits indexing cell
	cell   []uint32  // cell[c]: bin of the first mantissa of cell c (see newBinTable)
	multi  bool      // whether a cell may hold more than one bin end
	bound  []float64 // k+1 bin ends in [1, 2]
	frac   []uint64  // fraction bits of bound[0 … k−1], then 2^52 for bound[k] = 2
	rep    []float64 // k representatives
	relErr float64
}

var tables sync.Map // k → *binTable; tables are immutable once built

func tableFor(k int) *binTable {
	if t, ok := tables.Load(k); ok {
		return t.(*binTable)
	}
	t, _ := tables.LoadOrStore(k, newBinTable(k))
	return t.(*binTable)
}

func newBinTable(k int) *binTable {
	t := &binTable{k: k}
	t.bound = make([]float64, k+1)
	for j := range k {
		t.bound[j] = math.Exp2(float64(j) / float64(k))
	}
	t.bound[k] = 2
	t.rep = make([]float64, k)
	for j := range k {
		a, b := t.bound[j], t.bound[j+1]
		r := 2 * a * b / (a + b)
		t.rep[j] = r
		t.relErr = math.Max(t.relErr, math.Max((r-a)/a, (b-r)/b))
	}
	t.relErr += 4 * epsilon // rounding of the representative and of a scaled value
	t.frac = make([]uint64, k+1)
	for j := range k {
		t.frac[j] = math.Float64bits(t.bound[j]) & fracMask
	}
	t.frac[k] = 1 << 52
	// Cells are the 2^bits equal slices of the fraction bits; cell[c] is
	// the bin j of the cell's first mantissa (k < 2^19 for relErr ≥ 1e-6).
	// With enough bits a cell is narrower than the narrowest bin and holds
	// at most one bin end, so the look-up and one comparison with the end
	// of bin j find the bin. Past 16 bits (relErr < 7.6e-6) cells may hold
	// several ends and index walks frac from j.
	minWidth := t.bound[1] - t.bound[0]
	t.bits = 9
	for t.bits < 16 && math.Ldexp(1, -int(t.bits)) >= minWidth {
		t.bits++
	}
	t.multi = math.Ldexp(1, -int(t.bits)) >= minWidth
	t.cell = make([]uint32, 1<<t.bits)
	width := uint64(1) << (52 - t.bits)
	j := 0
	for c := range t.cell {
		start := uint64(c) * width
		for t.frac[j+1] <= start {
			j++
		}
		t.cell[c] = uint32(j)
	}
	return t
}

const fracMask = 1<<52 - 1

// index returns the bin index of the positive finite value x.
func (t *binTable) index(x float64) int {
	u := math.Float64bits(x)
	e := int(u >> 52)
	if e == 0 { // subnormal: scale into the normal range
		u = math.Float64bits(x * 0x1p64)
		e = int(u>>52) - 64
	}
	e -= 1023
	f := u & fracMask
	j := int(t.cell[f>>(52-t.bits)])
	// The mantissas in [1, 2) share their exponent, so comparing fraction
	// bits as integers compares them as numbers. f < 2^52 ≤ frac[j+1] + 2^52,
	// so the difference is negative, its top bit set, just when
	// f ≥ frac[j+1]: one step up without a branch.
	j += int((t.frac[j+1] - 1 - f) >> 63)
	if t.multi {
		for f >= t.frac[j+1] {
			j++
		}
	}
	return e*t.k + j
}

// bitRange returns the range [lo, hi) of the bits of the positive values
// of bin index i, which holds m·2^e with fraction bits f of m in
// [frac[j], frac[j+1]) for i = e·k + j. For a normal e that is the bits
// themselves; below (the subnormals, which index scales by 2^64 into the
// normal range), the multiples n of 2^−1074 with n·2^−1074 in the bin.
func (t *binTable) bitRange(i int) (lo, hi uint64) {
	e := i / t.k
	j := i - e*t.k
	if j < 0 {
		e--
		j += t.k
	}
	m0, m1 := 1<<52+t.frac[j], 1<<52+t.frac[j+1] // significands, 2^52 scale; m1 ≤ 2^53
	if be := e + 1023; be >= 1 {
		// m1 = 2^53 (the last bin of a binade) carries into the exponent.
		return uint64(be)<<52 + m0 - 1<<52, uint64(be)<<52 + m1 - 1<<52
	}
	// n·2^−1074 ≥ m·2^(e−52), n ≥ m·2^(e+1022): round the shift up.
	sh := uint(-(e + 1022)) // ≥ 1
	up := func(m uint64) uint64 { return (m + 1<<sh - 1) >> sh }
	return up(m0), up(m1)
}

// value returns the representative value of bin index i.
func (t *binTable) value(i int) float64 {
	e := i / t.k
	j := i - e*t.k
	if j < 0 {
		e--
		j += t.k
	}
	return math.Ldexp(t.rep[j], e)
}
