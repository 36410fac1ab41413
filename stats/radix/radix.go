// Package radix sorts float64 values, and the uint64 keys that stand for
// them, by least-significant-digit radix sort: 8 passes of 8 bits over an
// order-preserving integer image of the values, a pass skipped when all
// keys share its digit. The sort is stable and takes O(n) time, several
// times faster than a comparison sort at 10⁶ values. Package stats uses it
// for percentiles and ranks, package sampler for Iman–Conover reordering.
package radix

import (
	"math"
	"slices"
)

// MinLen is the length below which Float64s uses a comparison sort.
const MinLen = 512

// Key maps x to an unsigned integer in the same order as x, with −0 just
// below +0 and NaNs at the ends; Float inverts it exactly.
func Key(x float64) uint64 {
	u := math.Float64bits(x)
	if u>>63 != 0 {
		return ^u
	}
	return u | 1<<63
}

// Float returns the float64 whose Key is k.
func Float(k uint64) float64 {
	if k>>63 != 0 {
		return math.Float64frombits(k &^ (1 << 63))
	}
	return math.Float64frombits(^k)
}

// Float64s sorts x, which holds no NaN, in ascending order, −0 before +0
// (the order of Key) whatever its length.
func Float64s(x []float64) {
	if len(x) < MinLen {
		slices.Sort(x)
		signZeros(x)
		return
	}
	keys := make([]uint64, len(x))
	for i, v := range x {
		keys[i] = Key(v)
	}
	keys, _ = Sort(keys, make([]uint64, len(x)), 0, nil, nil)
	for i, k := range keys {
		x[i] = Float(k)
	}
}

// Sort sorts keys in increasing order of their bytes from, from+1, …, 7
// (counting from the least significant; from = 0 sorts fully), carrying
// idx along if it is not nil. buf and ibuf, of the same lengths, are
// scratch. The sort is stable, so keys equal in those bytes keep their
// order. It returns the sorted keys and indices, which are either the
// arguments or the scratch slices.
func Sort(keys, buf []uint64, from int, idx, ibuf []int32) ([]uint64, []int32) {
	n := len(keys)
	if n < 2 {
		return keys, idx
	}
	var count [8][256]int
	for _, k := range keys {
		for p := range 8 {
			count[p][byte(k>>(8*p))]++
		}
	}
	for p := from; p < 8; p++ {
		c := &count[p]
		shift := uint(8 * p)
		if c[byte(keys[0]>>shift)] == n {
			continue
		}
		var offs [256]int
		s := 0
		for d := range 256 {
			offs[d] = s
			s += c[d]
		}
		if idx == nil {
			for _, k := range keys {
				d := byte(k >> shift)
				buf[offs[d]] = k
				offs[d]++
			}
		} else {
			for i, k := range keys {
				d := byte(k >> shift)
				buf[offs[d]] = k
				ibuf[offs[d]] = idx[i]
				offs[d]++
			}
			idx, ibuf = ibuf, idx
		}
		keys, buf = buf, keys
	}
	return keys, idx
}

// signZeros puts the −0s of sorted x before its +0s: a comparison sort
// holds them equal and leaves them in any order.
func signZeros(x []float64) {
	lo, _ := slices.BinarySearch(x, 0) // the first zero, if any
	neg := 0
	hi := lo
	for ; hi < len(x) && x[hi] == 0; hi++ {
		if math.Signbit(x[hi]) {
			neg++
		}
	}
	for i := lo; i < hi; i++ {
		x[i] = 0
		if i < lo+neg {
			x[i] = math.Copysign(0, -1)
		}
	}
}
