package radix

import (
	"fmt"
	"math/bits"
	"slices"
)

// Select returns the keys of the given ranks in increasing order of keys:
// out[i] is the key that sorted keys would hold at ranks[i]. ranks must be
// ascending (repeats allowed) and each in [0, len(keys)). It reorders
// keys; buf, at least as long, is scratch. It costs a few passes over keys
// (most-significant digit first, into the buckets that hold a wanted rank
// only: radix selection, common practice), instead of a sort's eight. It panics if the ranks are out of
// range or out of order, or buf is short.
func Select(keys, buf []uint64, ranks []int) []uint64 {
	for i, r := range ranks {
		if r < 0 || r >= len(keys) {
			panic(fmt.Sprintf("radix: Select rank %d outside [0, %d)", r, len(keys)))
		}
		if i > 0 && r < ranks[i-1] {
			panic(fmt.Sprintf("radix: Select ranks not ascending: %d after %d", r, ranks[i-1]))
		}
	}
	if len(buf) < len(keys) {
		panic("radix: Select scratch shorter than the keys")
	}
	out := make([]uint64, len(ranks))
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
	for _, w := range gatherWanted(keys, buf, shift, ranks, base) {
		seg := buf[w.at : w.at+w.count]
		selectInto(seg, keys[:w.count], ranks[w.ranks[0]:w.ranks[1]], base+w.start, out[w.ranks[0]:w.ranks[1]])
	}
}

// wantedBucket is a bucket of selectInto that holds wanted ranks: its
// start among the keys, its size, its place in buf, and its ranks,
// ranks[r0:r1].
type wantedBucket struct {
	start, count, at int
	ranks            [2]int
}

// gatherWanted copies, in one pass, the keys of every bucket of the digit
// at shift that holds a wanted rank into buf, bucket after bucket, and
// returns those buckets in ascending order.
func gatherWanted(keys, buf []uint64, shift uint, ranks []int, base int) []wantedBucket {
	var count [256]int
	for _, k := range keys {
		count[byte(k>>shift)]++
	}
	var wanted []wantedBucket
	var slot [256]int // 1 + the bucket's index in wanted, or 0
	s, at, r := 0, 0, 0
	for d := range 256 {
		r0 := r
		for r < len(ranks) && ranks[r]-base < s+count[d] {
			r++
		}
		if r > r0 {
			wanted = append(wanted, wantedBucket{start: s, count: count[d], at: at, ranks: [2]int{r0, r}})
			slot[d] = len(wanted)
			at += count[d]
		}
		s += count[d]
	}
	var pos [256]int
	for d := range 256 {
		if slot[d] > 0 {
			pos[d] = wanted[slot[d]-1].at
		}
	}
	for _, k := range keys {
		if d := byte(k >> shift); slot[d] > 0 {
			buf[pos[d]] = k
			pos[d]++
		}
	}
	return wanted
}
