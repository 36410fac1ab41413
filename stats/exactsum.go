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
	// limbs touched by a 106-bit term: 138 limbs.
	sqLSB   = 2 * sumLSB
	sqLimbs = 138
)

// fixed is an exact fixed-point accumulator with least significant bit of
// weight 2^lsb. The value is Σ limb[i]·2^(32·i + lsb). Each add puts less
// than 2^32 into a limb; its owner calls normalize at least every
// carryEvery adds so that no limb overflows.
type fixed struct {
	limb []int64
	lsb  int
}

// addSum adds (or subtracts, if neg) m·2^pos for m < 2^53: at most 85
// bits after the shift within a limb, so three limbs.
func (f *fixed) addSum(m uint64, pos int, neg bool) {
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
func (f *fixed) addSq(hi, lo uint64, pos int) {
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

// split returns the integer significand m < 2^53 and exponent e with
// |x| = m·2^e, for finite x.
func split(x float64) (m uint64, e int) {
	u := math.Float64bits(x)
	be := int(u >> 52 & 0x7ff)
	m = u & (1<<52 - 1)
	if be == 0 {
		return m, sumLSB
	}
	return m | 1<<52, be - 1075
}

// moments accumulates the exact count, sum and sum of squares of the
// values added, counting infinities apart. Build it with newMoments.
type moments struct {
	n       int64 // finite values
	posInf  int64
	negInf  int64
	sum, sq fixed
	pending int // adds since the last carry propagation, as counted by merge
}

func newMoments() *moments {
	return &moments{
		sum: fixed{limb: make([]int64, sumLimbs), lsb: sumLSB},
		sq:  fixed{limb: make([]int64, sqLimbs), lsb: sqLSB},
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
	mant, e := split(x)
	m.sum.addSum(mant, e, x < 0)
	hi, lo := bits.Mul64(mant, mant)
	m.sq.addSq(hi, lo, 2*e)
	m.pending++
	if m.pending >= carryEvery {
		m.normalize()
	}
}

func (m *moments) normalize() {
	m.sum.normalize()
	m.sq.normalize()
	m.pending = 0
}

// merge adds the values of o to m.
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
