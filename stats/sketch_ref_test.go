package stats

import (
	"math"
	"math/big"
	"math/bits"
)

// This file keeps, for the tests, a plain copy (names prefixed "ref") of
// Sketch.Add with dense bins and exact sums as they were before AddSlice
// and the sums were rewritten for speed, its bins found from their
// definition (refBinTable) rather than from the bits: the tests hold the
// fast code to the same counts, extremes and sums, bit for bit.

// newRefSketch is NewSketch of the copy.
func newRefSketch(relErr float64) *refSketch {
	return &refSketch{
		tab: &refBinTable{bits: binBits(relErr)},
		min: math.Inf(1),
		max: math.Inf(-1),
		mom: newRefMoments(),
	}
}

type refSketch struct {
	tab      *refBinTable
	pos, neg refBins // counts of positive values and of negative values by |x|
	zero     uint64
	posInf   uint64
	negInf   uint64
	nan      uint64
	n        uint64 // values other than NaN
	min, max float64
	mom      *refMoments
}

// Add adds the value x. NaN is counted apart and excluded from every
// statistic, as in Summarize.
func (s *refSketch) Add(x float64) {
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
	if x < s.min {
		s.min = x
	}
	if x > s.max {
		s.max = x
	}
	s.mom.add(x)
}

// AddSlice adds every value of xs.
func (s *refSketch) AddSlice(xs []float64) {
	for _, x := range xs {
		s.Add(x)
	}
}

// Merge adds the values summarised by o to s; o is not changed. The
// sketches must come from NewSketch with the same relErr; Merge panics
// otherwise.
func (s *refSketch) Merge(o *refSketch) {
	if s.tab.bits != o.tab.bits {
		panic("stats: Merge of sketches with different relative errors")
	}
	s.pos.merge(&o.pos)
	s.neg.merge(&o.neg)
	s.zero += o.zero
	s.posInf += o.posInf
	s.negInf += o.negInf
	s.nan += o.nan
	s.n += o.n
	if o.min < s.min {
		s.min = o.min
	}
	if o.max > s.max {
		s.max = o.max
	}
	s.mom.merge(o.mom)
}

// refBins is a dense run of histogram counts; counts[i] is the count of bin
// index off+i.
type refBins struct {
	off    int
	counts []uint64
}

func (b *refBins) inc(i int) {
	k := i - b.off
	if uint(k) >= uint(len(b.counts)) {
		b.cover(i, i)
		k = i - b.off
	}
	b.counts[k]++
}

// cover grows b to hold bin indices lo … hi, with slack of a quarter of the
// current length on a side that grows, so growth is amortised.
func (b *refBins) cover(lo, hi int) {
	if len(b.counts) == 0 {
		const first = 256
		b.off = lo - first/2
		b.counts = make([]uint64, max(hi-lo+1+first, first))
		return
	}
	curLo, curHi := b.off, b.off+len(b.counts)-1
	if lo >= curLo && hi <= curHi {
		return
	}
	slack := max(len(b.counts)/4, 64)
	newLo, newHi := curLo, curHi
	if lo < curLo {
		newLo = lo - slack
	}
	if hi > curHi {
		newHi = hi + slack
	}
	c := make([]uint64, newHi-newLo+1)
	copy(c[curLo-newLo:], b.counts)
	b.off, b.counts = newLo, c
}

// merge adds the counts of o to b.
func (b *refBins) merge(o *refBins) {
	first, last := -1, -1
	for i, c := range o.counts {
		if c != 0 {
			if first < 0 {
				first = i
			}
			last = i
		}
	}
	if first < 0 {
		return
	}
	b.cover(o.off+first, o.off+last)
	d := o.off - b.off
	for i := first; i <= last; i++ {
		b.counts[i+d] += o.counts[i]
	}
}

// refBinTable finds a value's bin from the definition of the bins
// (binTable), with arithmetic rather than bits: a normal x = m·2^e,
// 1 ≤ m < 2, is in bin (e + 1023)·2^bits + ⌊(m − 1)·2^bits⌋, a subnormal
// x in bin ⌊x·2^(1022+bits)⌋ (all exact: scalings by powers of 2 and the
// subtraction of 1 from m).
type refBinTable struct{ bits uint }

// index returns the bin index of the positive finite value x.
func (t *refBinTable) index(x float64) int {
	if x < 0x1p-1022 {
		return int(math.Ldexp(x, 1022+int(t.bits)))
	}
	m, e := math.Frexp(x) // x = m·2^e, m in [0.5, 1)
	m, e = 2*m, e-1
	return (e+1023)<<t.bits + int(math.Ldexp(m-1, int(t.bits)))
}

// refFixed is an exact refFixed-point accumulator with least significant bit of
// weight 2^lsb. The value is Σ limb[i]·2^(32·i + lsb). Each add puts less
// than 2^32 into a limb; its owner calls normalize at least every
// carryEvery adds so that no limb overflows.
type refFixed struct {
	limb []int64
	lsb  int
}

// addSum adds (or subtracts, if neg) m·2^pos for m < 2^53: at most 85
// bits after the shift within a limb, so three limbs.
func (f *refFixed) addSum(m uint64, pos int, neg bool) {
	b := pos - f.lsb
	k := b / limbBits
	r := uint(b % limbBits)
	v0 := m << r
	var msk int64 // 0 to add, −1 to subtract: (c ^ msk) − msk = ±c
	if neg {
		msk = -1
	}
	l := f.limb[k : k+3 : k+3]
	l[0] += (int64(v0&limbMask) ^ msk) - msk
	l[1] += (int64(v0>>limbBits) ^ msk) - msk
	l[2] += (int64(m>>(64-r)) ^ msk) - msk
}

// addSq adds the 128-bit integer hi·2^64 + lo, of at most 106 bits, times
// 2^pos: at most 137 bits after the shift within a limb, so five limbs.
func (f *refFixed) addSq(hi, lo uint64, pos int) {
	b := pos - f.lsb
	k := b / limbBits
	r := uint(b % limbBits)
	v0 := lo << r
	v1 := hi<<r | lo>>(64-r)
	l := f.limb[k : k+5 : k+5]
	l[0] += int64(v0 & limbMask)
	l[1] += int64(v0 >> limbBits)
	l[2] += int64(v1 & limbMask)
	l[3] += int64(v1 >> limbBits)
	l[4] += int64(hi >> (64 - r))
}

// merge adds the value of o to f; both have the same lsb and length.
func (f *refFixed) merge(o *refFixed) {
	for i, v := range o.limb {
		f.limb[i] += v
	}
}

// normalize propagates carries so that every limb but the top one is in
// [0, 2^32); the value is unchanged.
func (f *refFixed) normalize() {
	for i := 0; i < len(f.limb)-1; i++ {
		c := f.limb[i] >> limbBits
		f.limb[i] -= c << limbBits
		f.limb[i+1] += c
	}
}

// int returns the value as I with value = I·2^lsb.
func (f *refFixed) int() *big.Int {
	f.normalize()
	x := new(big.Int)
	var t big.Int
	for i := len(f.limb) - 1; i >= 0; i-- {
		x.Lsh(x, limbBits)
		x.Add(x, t.SetInt64(f.limb[i]))
	}
	return x
}

// refSplit returns the integer significand m < 2^53 and exponent e with
// |x| = m·2^e, for finite x.
func refSplit(x float64) (m uint64, e int) {
	u := math.Float64bits(x)
	be := int(u >> 52 & 0x7ff)
	m = u & (1<<52 - 1)
	if be == 0 {
		return m, sumLSB
	}
	return m | 1<<52, be - 1075
}

// refMoments accumulates the exact count, sum and sum of squares of the
// values added, counting infinities apart. Build it with newRefMoments.
type refMoments struct {
	n       int64 // finite values
	posInf  int64
	negInf  int64
	sum, sq refFixed
	pending int // adds since the last carry propagation, as counted by merge
}

func newRefMoments() *refMoments {
	return &refMoments{
		sum: refFixed{limb: make([]int64, sumLimbs), lsb: sumLSB},
		sq:  refFixed{limb: make([]int64, sqLimbs), lsb: sqLSB},
	}
}

// add adds x, which must not be NaN.
func (m *refMoments) add(x float64) {
	switch {
	case math.IsInf(x, 1):
		m.posInf++
		return
	case math.IsInf(x, -1):
		m.negInf++
		return
	}
	m.n++
	if x == 0 {
		return
	}
	mant, e := refSplit(x)
	m.sum.addSum(mant, e, x < 0)
	hi, lo := bits.Mul64(mant, mant)
	m.sq.addSq(hi, lo, 2*e)
	m.pending++
	if m.pending >= carryEvery {
		m.normalize()
	}
}

func (m *refMoments) normalize() {
	m.sum.normalize()
	m.sq.normalize()
	m.pending = 0
}

// merge adds the values of o to m.
func (m *refMoments) merge(o *refMoments) {
	m.n += o.n
	m.posInf += o.posInf
	m.negInf += o.negInf
	m.sum.merge(&o.sum)
	m.sq.merge(&o.sq)
	// Limbs now hold less than 2^32·(pending+1) each: see refFixed.
	m.pending += o.pending + 1
	if m.pending >= carryEvery {
		m.normalize()
	}
}

// meanSD returns the correctly rounded mean and the sample standard
// deviation (divisor n−1, the square root of the correctly rounded
// variance) of the values added. The mean is ±Inf if infinities of one
// sign were added and NaN if of both; the standard deviation is NaN with
// any infinity or fewer than two values. Both are NaN with no values.
func (m *refMoments) meanSD() (mean, sd float64) {
	total := m.n + m.posInf + m.negInf
	switch {
	case total == 0:
		return math.NaN(), math.NaN()
	case m.posInf > 0 && m.negInf > 0:
		return math.NaN(), math.NaN()
	case m.posInf > 0:
		return math.Inf(1), math.NaN()
	case m.negInf > 0:
		return math.Inf(-1), math.NaN()
	}
	s1 := m.sum.int()
	// mean = s1·2^sumLSB / n
	den := new(big.Int).Lsh(big.NewInt(m.n), -sumLSB)
	mean, _ = new(big.Rat).SetFrac(s1, den).Float64()
	if m.n < 2 {
		return mean, math.NaN()
	}
	// variance = (n·S2 − S1²) / (n(n−1)) with S1 = s1·2^sumLSB,
	// S2 = s2·2^(2·sumLSB).
	s2 := m.sq.int()
	num := new(big.Int).Mul(s2, big.NewInt(m.n))
	num.Sub(num, new(big.Int).Mul(s1, s1))
	den = new(big.Int).Mul(big.NewInt(m.n), big.NewInt(m.n-1))
	den.Lsh(den, -sqLSB)
	v, _ := new(big.Rat).SetFrac(num, den).Float64()
	return mean, math.Sqrt(v)
}
