package stats

import (
	"fmt"
	"math"
	"slices"
	"sync"

	"rockheat/stats/radix"
)

// DefaultRelErr is the relative error bound of rockheat's sketches. Its
// bins keep 13 bits of the fraction, 8 192 bins (32 kB) per binade and
// 27 213 (109 kB) per decade of values, at most 2^−13 = 1.2·10⁻⁴ wide in
// relative terms, so that every value lies within 6.1·10⁻⁵ of its bin's
// representative (RelErr).
const DefaultRelErr = 1e-4

// Sketch is a bounded-memory, mergeable summary of a stream of values, for
// runs too long to keep every trial. It keeps exact counts in a histogram of
// bins named by the top bits of a value (binTable: an exponent and the
// leading bits of the fraction, so bins of relative width at most 2^−bits;
// one histogram for positive values, a mirrored one for negative values,
// and counters for zeros, infinities and NaNs), the exact minimum and
// maximum (−0 before +0), and exact sums of the values and of their
// squares.
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
// fall: at most 2^bits bins per sign for each binade (factor of 2) of the
// range of magnitudes seen (32 kB a binade, 109 kB a decade at the
// default resolution), far fewer when values are spread thinly over many
// decades; a page table of 8 bytes a page of the range; and 66 kB of sums
// (1.7 kB of limbs and 64 kB of accumulators, one per binary exponent);
// Bins reports the count. The representatives of a resolution (64 kB at
// the default) are computed once and shared by all sketches.
//
// Add costs a shift of the value's bits and a few integer additions.
// AddSlice does the same work in two loops, one for the bins and one for
// the sums, each without a call per value and with its state in
// registers; the sums of a run of values of one sign within 11 binades
// go straight to the exact accumulators (moments.addWindow). A Sketch is
// not safe for concurrent use; give each goroutine its own and merge
// them. The zero Sketch is not usable; use NewSketch.
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
	return &Sketch{
		tab: tableFor(binBits(relErr)),
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
// accumulators, which the caller records. It is add, value by value, in
// two loops: one counts the bins (binRun) and one sums (moments.addWindow
// for a run of one sign within 11 binades, else moments.addExps), each
// with its state in registers. Zeros, subnormals, infinities and NaNs go
// through add instead, as a whole.
func (s *Sketch) addRun(xs []float64) {
	before := s.n + s.nan // counts of the values that go through add
	lo, hi, odd := s.binRun(xs)
	normal := uint64(len(xs)) - (s.n + s.nan - before)
	if normal == 0 {
		return
	}
	if keyLess(lo, s.min) {
		s.min = lo
	}
	if keyLess(s.max, hi) {
		s.max = hi
	}
	s.mom.addNormals(xs, lo, hi, odd)
	s.n += normal
	s.mom.n += int64(normal)
}

// binRun counts the normal values of xs in the bins, hands the others to
// add, and returns the least and greatest normal value (+Inf and −Inf if
// none) and whether it met any value but a normal one or a zero. Runs of
// values of one sign go through countSigned; values of mixed signs, once
// a run of one sign proves short, through countBins.
func (s *Sketch) binRun(xs []float64) (lo, hi float64, odd bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	mixed := false
	for len(xs) > 0 {
		var k int
		if mixed {
			k, lo, hi = countBins(&s.pos, &s.neg, s.tab.shift, xs, lo, hi)
		} else {
			k, lo, hi = s.countRun(xs, lo, hi)
			// A run of one sign cut short, after fewer than shortRun
			// values, by a normal value of the other sign: the signs
			// alternate too often for countRun's restarts to pay.
			mixed = k < shortRun && k < len(xs) && math.Signbit(xs[k]) != math.Signbit(xs[0]) &&
				isNormal(math.Float64bits(xs[k])&^(1<<63))
		}
		if k == len(xs) {
			break
		}
		// Stopped at a value that is not normal, of the other sign, or
		// whose bin has no page.
		x := xs[k]
		switch a := math.Float64bits(x) &^ (1 << 63); {
		case !isNormal(a):
			s.add(x) // counts a subnormal once more towards the next fold: it only comes sooner
			odd = odd || x != 0
		case x > 0:
			s.pos.inc(s.tab.index(x))
			lo, hi = min(lo, x), max(hi, x)
		default:
			s.neg.inc(s.tab.index(-x))
			lo, hi = min(lo, x), max(hi, x)
		}
		xs = xs[k+1:]
	}
	return lo, hi, odd
}

// shortRun is the length below which a run of one sign, ended by the
// other sign, sends the rest of binRun's values to countBins.
const shortRun = 16

// countRun counts, by countSigned, the leading values of xs that have the
// sign of the first, and returns the index where it stopped and the
// extremes lo and hi updated.
func (s *Sketch) countRun(xs []float64, lo, hi float64) (int, float64, float64) {
	b, sign := &s.pos, uint64(0)
	if math.Signbit(xs[0]) {
		b, sign = &s.neg, 1<<63
	}
	k, amin, amax := countSigned(b, sign, s.tab.shift, xs)
	if k > 0 {
		a, z := math.Float64frombits(amin|sign), math.Float64frombits(amax|sign)
		if sign != 0 {
			a, z = z, a // the greatest magnitude is the least value
		}
		lo, hi = min(lo, a), max(hi, z)
	}
	return k, lo, hi
}

// isNormal reports whether a, the bits of a value's magnitude, are those
// of a normal value: not zero, subnormal, infinite or NaN.
func isNormal(a uint64) bool { return a>>52-1 < 0x7fe }

// countSigned counts in b the leading values of xs that are normal, of
// the sign whose bit is sign (0 or 1<<63), and whose bin has a page, and
// returns how many it counted and the least and greatest bits of their
// magnitudes (whose order is that of the magnitudes). Making no call,
// and finding the values of the other sign, the zeros, subnormals,
// infinities and NaNs with one comparison of the exponent bits, it keeps
// its state in registers.
func countSigned(b *bins, sign uint64, shift uint, xs []float64) (k int, amin, amax uint64) {
	shift &= 63 // below 64; saying so spares the loop a check
	pages, first := b.pages, b.first
	amin = math.MaxUint64
	for k, x := range xs {
		a := math.Float64bits(x) ^ sign // bits of |x| if x has the sign
		if !isNormal(a) {               // (the other sign sets the top bit)
			return k, amin, amax
		}
		i := int(a >> shift)
		p := i>>pageBits - first
		if uint(p) >= uint(len(pages)) || pages[p] == nil {
			return k, amin, amax
		}
		pages[p][i&(pageSize-1)]++
		amin, amax = min(amin, a), max(amax, a)
	}
	return len(xs), amin, amax
}

// countBins counts the values of xs in pos and neg, keeping lo and hi,
// the least and greatest, until a value that is not normal or whose bin
// has no page, whose index it returns (len(xs) if none). Making no call,
// it keeps its state in registers.
func countBins(pos, neg *bins, shift uint, xs []float64, lo, hi float64) (int, float64, float64) {
	shift &= 63
	pp, pf, np, nf := pos.pages, pos.first, neg.pages, neg.first
	for k, x := range xs {
		u := math.Float64bits(x)
		a := u &^ (1 << 63) // bits of |x|
		if !isNormal(a) {
			return k, lo, hi
		}
		i := int(a >> shift)
		pages, first := pp, pf
		if u>>63 != 0 {
			pages, first = np, nf
		}
		p := i>>pageBits - first
		if uint(p) >= uint(len(pages)) || pages[p] == nil {
			return k, lo, hi
		}
		pages[p][i&(pageSize-1)]++
		if x < lo {
			lo = x
		}
		if x > hi {
			hi = x
		}
	}
	return len(xs), lo, hi
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

// binTable maps positive float64 values to bins by their bits: bin i
// holds the values whose bits, shifted right by shift = 52 − bits, are i,
// that is a binary exponent and the top bits bits of the fraction. So the
// index is one shift, bins keep the order of the values, and a normal
// value m·2^e, 1 ≤ m < 2, lies in the bin [a, b)·2^e with
// a = 1 + j·2^−bits and b = a + 2^−bits: a ratio b/a of at most
// 1 + 2^−bits. Its representative is the harmonic mean of its ends,
// within (b − a)/(b + a) < 2^−(bits+1) relative error of every value in
// it. Subnormal values, whose exponent field is 0, fall in bins of
// absolute width 2^−(1022+bits), and so lose relative precision.
type binTable struct {
	bits   uint      // fraction bits that name a bin within its binade
	shift  uint      // 52 − bits
	rep    []float64 // representatives of the 2^bits bins of [1, 2)
	relErr float64
}

var tables sync.Map // bits → *binTable; tables are immutable once built

func tableFor(bits uint) *binTable {
	if t, ok := tables.Load(bits); ok {
		return t.(*binTable)
	}
	t, _ := tables.LoadOrStore(bits, newBinTable(bits))
	return t.(*binTable)
}

// binBits returns the fewest fraction bits whose bins keep every value
// within relErr of its bin's representative: the widest bin, [1, 1 + w)
// with w = 2^−bits, has the error w/(2 + w).
func binBits(relErr float64) uint {
	bits := uint(1)
	for w := 0.5; w/(2+w) > relErr; w /= 2 {
		bits++
	}
	return bits
}

func newBinTable(bits uint) *binTable {
	t := &binTable{bits: bits, shift: 52 - bits, rep: make([]float64, 1<<bits)}
	w := math.Ldexp(1, -int(bits))
	for j := range t.rep {
		a, b := 1+float64(j)*w, 1+float64(j+1)*w // exact: bits ≤ 52
		r := 2 * a * b / (a + b)
		t.rep[j] = r
		t.relErr = math.Max(t.relErr, math.Max((r-a)/a, (b-r)/b))
	}
	t.relErr += 4 * epsilon // rounding of the representative and of a scaled value
	return t
}

const fracMask = 1<<52 - 1

// index returns the bin index of the positive finite value x.
func (t *binTable) index(x float64) int { return int(math.Float64bits(x) >> t.shift) }

// bitRange returns the range [lo, hi) of the bits of the positive values
// of bin index i: the bits that index shifts down to i, but for the bits
// of zero, which no bin holds.
func (t *binTable) bitRange(i int) (lo, hi uint64) {
	return max(uint64(i)<<t.shift, 1), uint64(i+1) << t.shift
}

// value returns the representative value of bin index i: for a normal
// binade its table value scaled by 2^e, for the subnormal one the middle
// of the bin.
func (t *binTable) value(i int) float64 {
	be, j := i>>t.bits, i&(1<<t.bits-1)
	if be == 0 {
		lo, hi := t.bitRange(i)
		a, b := math.Float64frombits(lo), math.Float64frombits(hi)
		return a + (b-a)/2
	}
	return math.Ldexp(t.rep[j], be-1023)
}
