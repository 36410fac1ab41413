package stats

import (
	"math"
	"slices"
)

// Sorting by least-significant-digit radix sort on an order-preserving
// integer image of the float64 values: 8 passes of 8 bits, a pass skipped
// when all keys share its digit. It is stable and takes O(n) time, several
// times faster than a comparison sort at 10⁶ values.

// radixMin is the length below which a comparison sort is used instead.
const radixMin = 512

// key maps x to an unsigned integer with the same order (−0 just below +0).
func key(x float64) uint64 {
	u := math.Float64bits(x)
	if u>>63 != 0 {
		return ^u
	}
	return u | 1<<63
}

// unkey inverts key.
func unkey(k uint64) float64 {
	if k>>63 != 0 {
		return math.Float64frombits(k &^ (1 << 63))
	}
	return math.Float64frombits(^k)
}

// sortFloats sorts x, which holds no NaN, in ascending order.
func sortFloats(x []float64) {
	if len(x) < radixMin {
		slices.Sort(x)
		return
	}
	keys := make([]uint64, len(x))
	for i, v := range x {
		keys[i] = key(v)
	}
	keys, _ = radixSort(keys, make([]uint64, len(x)), nil, nil)
	for i, k := range keys {
		x[i] = unkey(k)
	}
}

// radixSort sorts keys (and carries idx along, if not nil) using buf and
// ibuf of the same lengths as scratch, and returns the sorted keys and
// indices, which are either the arguments or the scratch slices.
func radixSort(keys, buf []uint64, idx, ibuf []int32) ([]uint64, []int32) {
	n := len(keys)
	var count [8][256]int
	for _, k := range keys {
		for p := range 8 {
			count[p][byte(k>>(8*p))]++
		}
	}
	for p := range 8 {
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
