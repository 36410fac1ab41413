package sampler

import "math"

// The tail tables of a quantile function cover p in [2^−20, 2^−5): below
// the middle tables, which start at 1/32 = 2^−5, down to where a draw is
// rare enough (one in a million) for the exact method to serve. Each
// binade [2^−(j+1), 2^−j) has its own table of equal steps, so that the
// step shrinks with p as the tail's curvature grows, and a draw finds its
// binade from the exponent of p and its step from the fraction, without a
// power, logarithm or search.
const (
	tailTop     = 5  // the tail tables end at 2^−tailTop
	tailBinades = 15 // and begin at 2^−(tailTop+tailBinades)
)

// tailTable tabulates a quantile function x(p) on its lower tail, one
// hermiteTable per binade of p: bin[i] covers [2^−(tailTop+i+1),
// 2^−(tailTop+i)]. Its nodes at the binades' ends are the same values, so
// the pieces join into one increasing function.
type tailTable struct{ bin []hermiteTable }

// newTailTable tabulates f, which returns x(p) and dx/dp, at cells+1
// equal steps of each binade of the tail. It returns false, and an
// empty table, if newHermiteTable refuses a binade.
func newTailTable(cells int, f func(p float64) (x, slope float64)) (tailTable, bool) {
	t := tailTable{bin: make([]hermiteTable, tailBinades)}
	for i := range t.bin {
		hi := math.Ldexp(1, -(tailTop + i))
		b, ok := newHermiteTable(hi/2, hi, cells, f)
		if !ok {
			return tailTable{}, false
		}
		t.bin[i] = b
	}
	return t, true
}

// tailBin returns the index in a tailTable of the binade that holds p, or
// a number of at least tailBinades when p is outside the tail (p ≥ 2^−5,
// below 2^−20, negative, zero or NaN): the biased exponent of p, 1023 − j
// for p in [2^−j, 2^−(j−1)), counted down from that of 2^−(tailTop+1).
func tailBin(p float64) uint {
	return uint(1023 - (tailTop + 1) - int(math.Float64bits(p)>>52))
}

// at returns x(p) for p in the tail, and false (with 0) for p outside it.
func (t *tailTable) at(p float64) (float64, bool) {
	i := tailBin(p)
	if i >= uint(len(t.bin)) {
		return 0, false
	}
	return t.bin[i].at(p), true
}
