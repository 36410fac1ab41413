package radix

import (
	"math/bits"
	"slices"
)

// Select returns the keys of the given ranks in increasing order of keys:
// out[i] is the key that sorted keys would hold at ranks[i]. ranks must be
// ascending and each in [0, len(keys)). It reorders keys; buf, at least as
// long, is scratch. It costs a few passes over keys (most-significant
// digit first, into the buckets that hold a wanted rank only), instead of
// a sort's eight. It panics if a rank is out of range.
func Select(keys, buf []uint64, ranks []int) []uint64 {
	out := make([]uint64, len(ranks))
	if len(ranks) > 0 && (ranks[0] < 0 || ranks[len(ranks)-1] >= len(keys)) {
		panic("radix: Select rank out of range")
	}
	selectInto(keys, buf[:len(keys)], ranks, 0, out)
	return out
}

// selectMin is the length below which selectInto sorts.
const selectMin = 64

// selectInto sets out[i] to the key of rank ranks[i]−base among keys,
// using buf (as long as keys) as scratch.
func selectInto(keys, buf []uint64, ranks []int, base int, out []uint64) {
	if len(keys) <= selectMin {
		slices.Sort(keys)
		for i, r := range ranks {
			out[i] = keys[r-base]
		}
		return
	}
	lo, hi := keys[0], keys[0]
	for _, k := range keys {
		lo, hi = min(lo, k), max(hi, k)
	}
	if lo == hi {
		for i := range out {
			out[i] = lo
		}
		return
	}
	// The keys share their bits above the highest one in which lo and hi
	// differ; the digit is the 8 bits that end with it.
	shift := uint(max(0, 56-bits.LeadingZeros64(lo^hi)))
	var count [256]int
	for _, k := range keys {
		count[byte(k>>shift)]++
	}
	// The buckets that hold a wanted rank, their start among keys, and
	// their place in buf, where one pass gathers them.
	var start, at [256]int
	var want [256]bool
	s, w, r := 0, 0, 0
	for d := range 256 {
		start[d] = s
		s += count[d]
		for r < len(ranks) && ranks[r]-base < s {
			if !want[d] {
				want[d], at[d] = true, w
				w += count[d]
			}
			r++
		}
	}
	pos := at
	for _, k := range keys {
		if d := byte(k >> shift); want[d] {
			buf[pos[d]] = k
			pos[d]++
		}
	}
	for i := 0; i < len(ranks); {
		d := 0
		for d = range 256 { // the bucket of ranks[i]
			if want[d] && ranks[i]-base < start[d]+count[d] {
				break
			}
		}
		j := i
		for j < len(ranks) && ranks[j]-base < start[d]+count[d] {
			j++
		}
		seg := buf[at[d] : at[d]+count[d]]
		selectInto(seg, keys[:count[d]], ranks[i:j], base+start[d], out[i:j])
		i = j
	}
}
