package stats

import (
	"math"
	"math/big"
	"math/bits"
)

// Exact accumulators. A sum of float64 values (and of their squares) is
// kept as a fixed-point integer wide enough for every finite float64 and
// 2^63 terms, in 32-bit digits held in int64 limbs so that carries can wait.
// Addition is then exact, hence associative and commutative: the mean and
// standard deviation do not depend on the order in which values are added
// or sketches merged, and they are correctly rounded.
//
// Values do not go to the limbs one by one: each is added, as an integer
// significand, to a 128-bit accumulator of its binary exponent (two
// integer additions for the value, two for its square), and the
// accumulators are folded into the limbs every accLimit values and before
// any result is read. The sums are the same integers either way.

const (
	limbBits   = 32
	limbMask   = 1<<limbBits - 1
	carryEvery = 1 << 30 // adds between carry propagations; each adds < 2^32 to a limb

	// sumLSB is the weight 2^sumLSB of the least significant bit of a sum:
	// the smallest subnormal float64. Values reach 2^1024, so 2^63 of them
	// need 1024+63+1074 bits plus a sign: 72 limbs.
	sumLSB   = -1074
	sumLimbs = 72
	// sqLSB is the weight of the least significant bit of a sum of squares;
	// squares reach 2^2048, so 2^63 of them need 2048+63+2148 bits, plus 5
	// limbs touched by a term of up to 128 bits: 138 limbs.
	sqLSB   = 2 * sumLSB
	sqLimbs = 138

	// accLimit is the number of values added to the exponent accumulators
	// between folds: a square is below 2^106, so 2^21 of them stay below
	// 2^127, and 2^21 significands below 2^53 stay below 2^74 in size.
	accLimit = 1 << 21
	// exponents is the number of biased float64 exponents (the last, of
	// infinities and NaN, is never used; it lets an exponent index acc
	// without a bounds check).
	exponents = 2048
)

// fixed is an exact fixed-point accumulator with least significant bit of
// weight 2^lsb. The value is Σ limb[i]·2^(32·i + lsb). Each add puts less
// than 2^32 into a limb; its owner calls normalize at least every
// carryEvery adds so that no limb overflows.
type fixed struct {
	limb []int64
	lsb  int
}

// add adds (or subtracts, if neg) the 128-bit integer hi·2^64 + lo times
// 2^pos: at most 159 bits after the shift within a limb, so five limbs,
// each given less than 2^32.
func (f *fixed) add(hi, lo uint64, pos int, neg bool) {
	b := pos - f.lsb
	k := b / limbBits
	r := uint(b % limbBits)
	v0 := lo << r
	v1 := hi<<r | lo>>(64-r)
	v2 := hi >> (64 - r)
	var msk int64 // 0 to add, −1 to subtract: (c ^ msk) − msk = ±c
	if neg {
		msk = -1
	}
	l := f.limb[k : k+5 : k+5]
	l[0] += (int64(v0&limbMask) ^ msk) - msk
	l[1] += (int64(v0>>limbBits) ^ msk) - msk
	l[2] += (int64(v1&limbMask) ^ msk) - msk
	l[3] += (int64(v1>>limbBits) ^ msk) - msk
	l[4] += (int64(v2) ^ msk) - msk
}

// merge adds the value of o to f; both have the same lsb and length.
func (f *fixed) merge(o *fixed) {
	for i, v := range o.limb {
		f.limb[i] += v
	}
}

// normalize propagates carries so that every limb but the top one is in
// [0, 2^32); the value is unchanged.
func (f *fixed) normalize() {
	for i := 0; i < len(f.limb)-1; i++ {
		c := f.limb[i] >> limbBits
		f.limb[i] -= c << limbBits
		f.limb[i+1] += c
	}
}

// int returns the value as I with value = I·2^lsb.
func (f *fixed) int() *big.Int {
	f.normalize()
	x := new(big.Int)
	var t big.Int
	for i := len(f.limb) - 1; i >= 0; i-- {
		x.Lsh(x, limbBits)
		x.Add(x, t.SetInt64(f.limb[i]))
	}
	return x
}

// expAcc accumulates the values of one biased exponent be since the last
// fold: the sum of their signed integer significands (two's complement,
// 128 bits) and the sum of the squares of the significands. The values are
// significand·2^(max(be, 1) − 1075).
type expAcc struct {
	sumLo, sumHi uint64
	sqLo, sqHi   uint64
}

// addBits adds the finite float64 whose bits are u to the accumulator of
// its exponent.
func addBits(acc *[exponents]expAcc, u uint64) {
	be := u >> 52 & 0x7ff
	m := u&(1<<52-1) | 1<<52
	if be == 0 { // subnormal or zero: no implicit bit
		m = u & (1<<52 - 1)
	}
	acc[be].add(m, int64(u)>>63)
}

// add adds the significand m, negated if neg is −1 (0 for a positive
// value), and its square.
func (a *expAcc) add(m uint64, neg int64) {
	sm := uint64((int64(m) ^ neg) - neg)
	var c uint64
	a.sumLo, c = bits.Add64(a.sumLo, sm, 0)
	a.sumHi += uint64(neg) + c
	hi, lo := bits.Mul64(m, m)
	a.sqLo, c = bits.Add64(a.sqLo, lo, 0)
	a.sqHi += hi + c
}

// addNormals adds the normal values of xs, whose least and greatest are lo
// and hi, to the sums (the others are left out; others says whether xs
// holds any but zeros, which add nothing to a sum): by addWindow if they
// are all of one sign within its window; by addWindowBelow if of one sign
// but wider, the window taking the top windowBinades of them; else by
// addExps. The caller counts them (n, counted).
func (m *moments) addNormals(xs []float64, lo, hi float64, others bool) {
	a, b := math.Float64bits(math.Abs(lo)), math.Float64bits(math.Abs(hi))
	emin, emax := min(a, b)>>52, max(a, b)>>52
	e0 := max(emin, emax-(windowBinades-1)) // (emax ≥ 1: values are normal)
	switch {
	case others || !(lo > 0 || hi < 0) || e0 < windowLeast:
		m.addExps(xs)
	case e0 == emin:
		m.addWindow(xs, e0, hi < 0)
	default:
		m.addWindowBelow(xs, e0, hi < 0)
	}
}

// addExps adds the normal values of xs (the others are left out) to the
// exponent accumulators; the caller counts them (counted).
func (m *moments) addExps(xs []float64) {
	acc := m.acc
	for _, x := range xs {
		u := math.Float64bits(x)
		a := u &^ (1 << 63)
		if !isNormal(a) {
			continue
		}
		// As addBits for a normal value, whose significand has its
		// implicit bit.
		acc[a>>52].add(a&fracMask|1<<52, int64(u)>>63)
	}
}

// windowBinades is the number of binary exponents a window sum spans
// (addWindow): a significand below 2^53 shifted by at most 10 stays below
// 2^63, so that it converts from a float64 to an int64 exactly.
const windowBinades = 11

// windowLeast is the least biased exponent of a window (addWindow): the
// scale 2^(1075 − e0) is then a normal float64.
const windowLeast = 52

// addWindow adds xs, at most accLimit values, straight to the limbs:
// normal values of one sign (negative if neg) whose biased exponents lie
// in [e0, e0 + windowBinades), e0 ≥ windowLeast, and zeros, whose terms
// are 0. Each value is
// m·2^(be − 1075) for its significand m and biased exponent be, so the sum
// of the values is 2^(e0 − 1075)·Σ v and of their squares
// 2^(2·e0 − 2150)·Σ v², with v = m·2^(be − e0) below 2^63 and v² below
// 2^126, whose sums, over at most 2^21 terms, lie below 2^84 and 2^147:
// two and three 64-bit words, kept in registers. v is |x|·2^(1075 − e0),
// a power-of-two scaling and so exact, converted to an integer, also
// exactly. The limbs get the same integers as from the exponent
// accumulators; the caller counts the values (counted).
func (m *moments) addWindow(xs []float64, e0 uint64, neg bool) {
	scale := windowScale(e0, neg)
	var s0, s1, q0, q1, q2 uint64
	for _, x := range xs {
		s0, s1, q0, q1, q2 = windowTerm(s0, s1, q0, q1, q2, uint64(int64(x*scale)))
	}
	m.addWindowSums(s0, s1, q0, q1, q2, e0, neg)
}

// addWindowBelow is addWindow for values of one sign that reach below the
// window (a wide run's few smallest): those go to their exponent
// accumulators, as addExps would take them. The sums are of integers,
// exact, and so the same whichever way a value goes. It is a loop of its
// own because the test for a value below costs a narrow run a fifth of
// its time.
func (m *moments) addWindowBelow(xs []float64, e0 uint64, neg bool) {
	scale := windowScale(e0, neg)
	acc := m.acc
	var s0, s1, q0, q1, q2 uint64
	for _, x := range xs {
		u := math.Float64bits(x)
		if a := u &^ (1 << 63); a>>52 < e0 {
			if a != 0 { // zeros add nothing
				addBits(acc, u)
			}
			continue
		}
		s0, s1, q0, q1, q2 = windowTerm(s0, s1, q0, q1, q2, uint64(int64(x*scale)))
	}
	m.addWindowSums(s0, s1, q0, q1, q2, e0, neg)
}

// windowScale returns ±2^(1075 − e0), negative for a window of negative
// values (neg), whose product with a value of the window is its term v.
func windowScale(e0 uint64, neg bool) float64 {
	scale := math.Ldexp(1, 1075-int(e0))
	if neg {
		return -scale
	}
	return scale
}

// windowTerm returns a window's Σ v (s1, s0) and Σ v² (q2, q1, q0), in
// 64-bit words, with the term v added. (Five words in a struct would
// not stay in registers; five values do.)
func windowTerm(s0, s1, q0, q1, q2, v uint64) (uint64, uint64, uint64, uint64, uint64) {
	var c uint64
	s0, c = bits.Add64(s0, v, 0)
	s1 += c
	h, l := bits.Mul64(v, v)
	q0, c = bits.Add64(q0, l, 0)
	q1, c = bits.Add64(q1, h, c)
	return s0, s1, q0, q1, q2 + c
}

// addWindowSums adds the sums of windowTerm, of the window at e0, to the
// limbs.
func (m *moments) addWindowSums(s0, s1, q0, q1, q2, e0 uint64, neg bool) {
	e := int(e0) - 1075
	m.sum.add(s1, s0, e, neg)
	m.sq.add(q1, q0, 2*e, false)
	m.sq.add(0, q2, 2*e+128, false)
	m.pending += 3
	if m.pending >= carryEvery {
		m.normalize()
	}
}

// moments accumulates the exact count, sum and sum of squares of the
// values added, counting infinities apart. Build it with newMoments.
type moments struct {
	n       int64 // finite values
	posInf  int64
	negInf  int64
	sum, sq fixed
	pending int // adds to the limbs since the last carry propagation, as counted by merge
	acc     *[exponents]expAcc
	accN    int // at least the number of values added to acc since the last fold; below accLimit
}

func newMoments() *moments {
	return &moments{
		sum: fixed{limb: make([]int64, sumLimbs), lsb: sumLSB},
		sq:  fixed{limb: make([]int64, sqLimbs), lsb: sqLSB},
		acc: new([exponents]expAcc),
	}
}

// add adds x, which must not be NaN.
func (m *moments) add(x float64) {
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
	addBits(m.acc, math.Float64bits(x))
	m.counted(1)
}

// room returns how many finite values may go to the exponent accumulators
// (by addBits) before the next call of counted; at least 1.
func (m *moments) room() int { return accLimit - m.accN }

// counted records k ≤ room() values added by addBits, folding the
// accumulators into the limbs when they are full.
func (m *moments) counted(k int) {
	m.accN += k
	if m.accN >= accLimit {
		m.fold()
	}
}

// fold empties the exponent accumulators into the limbs.
func (m *moments) fold() {
	m.addAcc(m.acc)
	clear(m.acc[:])
	m.accN = 0
}

// addAcc adds the values held in the exponent accumulators acc to the
// limbs of m; acc is not changed.
func (m *moments) addAcc(acc *[exponents]expAcc) {
	for be := range acc {
		a := &acc[be]
		if a.sqLo|a.sqHi == 0 { // no value since the last fold
			continue
		}
		e := max(be, 1) - 1075
		lo, hi := a.sumLo, a.sumHi
		neg := int64(hi) < 0
		if neg { // magnitude of the two's-complement sum
			var b uint64
			lo, b = bits.Sub64(0, lo, 0)
			hi = -hi - b
		}
		m.sum.add(hi, lo, e, neg)
		m.sq.add(a.sqHi, a.sqLo, 2*e, false)
		m.pending++
		if m.pending >= carryEvery {
			m.normalize()
		}
	}
}

func (m *moments) normalize() {
	m.sum.normalize()
	m.sq.normalize()
	m.pending = 0
}

// merge adds the values of o to m; o is not changed.
func (m *moments) merge(o *moments) {
	m.n += o.n
	m.posInf += o.posInf
	m.negInf += o.negInf
	m.sum.merge(&o.sum)
	m.sq.merge(&o.sq)
	// Limbs now hold less than 2^32·(pending+1) each: see fixed.
	m.pending += o.pending + 1
	if m.pending >= carryEvery {
		m.normalize()
	}
	m.addAcc(o.acc)
}

// meanSD returns the correctly rounded mean and the sample standard
// deviation (divisor n−1, the square root of the correctly rounded
// variance) of the values added. The mean is ±Inf if infinities of one
// sign were added and NaN if of both; the standard deviation is NaN with
// any infinity or fewer than two values. Both are NaN with no values.
func (m *moments) meanSD() (mean, sd float64) {
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
	m.fold()
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

// Mean accumulates the exact mean of a stream of values: the same
// correctly rounded mean that a Sketch or Summarize gives for the same
// values, without order statistics, and so at a fraction of a Sketch's
// cost and memory (66 kB). NaNs are left out, as there. Merging is
// order-free: the mean does not depend on the order of values or merges.
// A Mean is not safe for concurrent use. The zero Mean is not usable;
// use NewMean.
type Mean struct{ m *moments }

// NewMean returns an empty Mean.
func NewMean() *Mean { return &Mean{m: newMoments()} }

// AddSlice adds every value of xs but NaNs.
func (a *Mean) AddSlice(xs []float64) {
	for len(xs) > 0 {
		k := min(len(xs), a.m.room())
		a.m.addSlice(xs[:k])
		xs = xs[k:]
	}
}

// addSlice adds xs, at most room() values, but NaNs, as add would one by
// one: the normal values in one loop (addNormals), the others by add.
func (m *moments) addSlice(xs []float64) {
	lo, hi := math.Inf(1), math.Inf(-1)
	normal, odd := 0, false
	for _, x := range xs {
		if !isNormal(math.Float64bits(x) &^ (1 << 63)) {
			if x == x {
				m.add(x)
			}
			odd = odd || x != 0
			continue
		}
		normal++
		lo, hi = min(lo, x), max(hi, x)
	}
	if normal == 0 {
		return
	}
	m.addNormals(xs, lo, hi, odd)
	m.n += int64(normal)
	m.counted(normal)
}

// Merge adds the values of o to a; o is not changed.
func (a *Mean) Merge(o *Mean) { a.m.merge(o.m) }

// Value returns the correctly rounded mean of the values added: ±Inf if
// infinities of one sign were added, NaN if of both or with no values.
func (a *Mean) Value() float64 {
	mean, _ := a.m.meanSD()
	return mean
}
