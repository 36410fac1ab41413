package stats

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// sameAsRef reports how the state of s differs from that of r, the
// verbatim copy of the old Sketch.Add fed the same values: counts, bins
// (offsets and counts), extremes and exact sums must all be the same, bit
// for bit, and so the mean and standard deviation. It folds the exponent
// accumulators of s, which leaves its value unchanged.
func sameAsRef(t *testing.T, name string, s *Sketch, r *refSketch) {
	t.Helper()
	bitsEq := func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
	switch {
	case s.zero != r.zero || s.posInf != r.posInf || s.negInf != r.negInf || s.nan != r.nan || s.n != r.n:
		t.Errorf("%s: counts zero %d +inf %d −inf %d NaN %d n %d; old Add %d %d %d %d %d", name,
			s.zero, s.posInf, s.negInf, s.nan, s.n, r.zero, r.posInf, r.negInf, r.nan, r.n)
	case !bitsEq(s.min, r.min) || !bitsEq(s.max, r.max):
		t.Errorf("%s: min, max %v, %v; old Add %v, %v", name, s.min, s.max, r.min, r.max)
	case !slices.Equal(binList(&s.pos), r.pos.list()):
		t.Errorf("%s: positive bins differ from old Add's", name)
	case !slices.Equal(binList(&s.neg), r.neg.list()):
		t.Errorf("%s: negative bins differ from old Add's", name)
	case s.mom.n != r.mom.n || s.mom.posInf != r.mom.posInf || s.mom.negInf != r.mom.negInf:
		t.Errorf("%s: moment counts differ from old Add's", name)
	}
	s.mom.fold()
	if s.mom.sum.int().Cmp(r.mom.sum.int()) != 0 || s.mom.sq.int().Cmp(r.mom.sq.int()) != 0 {
		t.Errorf("%s: exact sums differ from old Add's", name)
	}
	m, sd := s.mom.meanSD()
	rm, rsd := r.mom.meanSD()
	if !sameFloat(m, rm) || !sameFloat(sd, rsd) {
		t.Errorf("%s: mean, sd %v, %v; old Add %v, %v", name, m, sd, rm, rsd)
	}
}

// binList returns the bins of b that hold values, as (index, count), in
// ascending order of index.
func binList(b *bins) [][2]int {
	var l [][2]int
	b.walk(false, func(i int, c uint64) bool {
		l = append(l, [2]int{i, int(c)})
		return true
	})
	return l
}

// list is binList for the dense bins of the old code.
func (b *refBins) list() [][2]int {
	var l [][2]int
	for k, c := range b.counts {
		if c != 0 {
			l = append(l, [2]int{b.off + k, int(c)})
		}
	}
	return l
}

func sameFloat(a, b float64) bool {
	return math.Float64bits(a) == math.Float64bits(b) || (math.IsNaN(a) && math.IsNaN(b))
}

// adversarial returns n values mixing the float64 extremes — zeros of both
// signs, infinities, NaN, subnormals, the normal limit, the largest
// finite values, values that cancel — with wideFloats, in random order.
func adversarial(n int, stream uint64) []float64 {
	mx, inf := math.MaxFloat64, math.Inf(1)
	special := []float64{0, math.Copysign(0, -1), inf, -inf, math.NaN(), 5e-324, -5e-324, 0x1p-1073,
		0x1p-1022, math.Nextafter(0x1p-1022, 0), -0x1p-1022, mx, -mx, math.Nextafter(mx, 0), 1e300, -1e300,
		1, -1, math.Nextafter(2, 0), 0x1p-1000, -0x1p1000}
	x := wideFloats(n, stream)
	rng := rand.New(rand.NewPCG(stream, 11))
	for i := range x {
		if rng.IntN(4) == 0 {
			x[i] = special[rng.IntN(len(special))]
		}
	}
	return x
}

// chunks adds x to s in runs of random length from 1 to maxRun.
func chunks(s *Sketch, x []float64, maxRun int, stream uint64) {
	rng := rand.New(rand.NewPCG(stream, 12))
	for len(x) > 0 {
		k := min(len(x), 1+rng.IntN(maxRun))
		s.AddSlice(x[:k])
		x = x[k:]
	}
}

// TestSketchAddIdentical holds AddSlice and Add to the old Add, value by
// value, on ordinary and adversarial samples, at several resolutions.
func TestSketchAddIdentical(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name   string
		x      []float64
		relErr float64
	}{
		{"lognormal", lognormal(1e5, 40, 1.5, 1), DefaultRelErr},
		// Narrow ranges of one sign, whose sums go through addWindow.
		{"lognormal narrow", lognormal(1e5, 40, 0.3, 7), DefaultRelErr},
		{"negative narrow", negate(lognormal(1e5, -3, 0.3, 8)), DefaultRelErr},
		{"narrow with zeros", withZeros(lognormal(1e5, 40, 0.3, 9), false), DefaultRelErr},
		// Wide ranges of one sign: addWindow takes the top 11 binades and
		// the few values below them one by one, zeros and values far
		// below the least window among them.
		{"negative wide", negate(lognormal(1e5, -3, 2, 13)), DefaultRelErr},
		{"wide with zeros", withZeros(lognormal(1e5, 40, 2, 14), false), DefaultRelErr},
		{"wide far below", append(lognormal(1e4, 1, 0.3, 15), 0x1p-1000, 0x1p-1021, 3e-300), DefaultRelErr},
		{"normal", normal(1e5, 0, 1, 2), DefaultRelErr},
		{"normal fine", normal(3e4, 5, 1, 3), 1e-6},
		{"adversarial", adversarial(3e4, 4), 0.1},
		{"wide", wideFloats(3e4, 5), 0.05},
		{"constant", slices.Repeat([]float64{-7.25}, 1000), DefaultRelErr},
	} {
		r := newRefSketch(tc.relErr)
		r.AddSlice(tc.x)
		whole, runs, one := NewSketch(tc.relErr), NewSketch(tc.relErr), NewSketch(tc.relErr)
		whole.AddSlice(tc.x)
		chunks(runs, tc.x, 3000, 6)
		for _, v := range tc.x {
			one.Add(v)
		}
		sameAsRef(t, tc.name+" AddSlice", whole, r)
		sameAsRef(t, tc.name+" AddSlice in runs", runs, r)
		sameAsRef(t, tc.name+" Add", one, r)
		// Values added after a fold go on from the folded sums.
		r.AddSlice(tc.x[:len(tc.x)/3])
		whole.AddSlice(tc.x[:len(tc.x)/3])
		sameAsRef(t, tc.name+" after a fold", whole, r)
	}
}

// TestSketchAddFolds adds more than accLimit values, so that the exponent
// accumulators fill and fold during AddSlice and Add, including runs of
// the largest significand 2^53 − 1 of either sign, whose sums and squares
// come closest to the accumulators' 128 bits.
func TestSketchAddFolds(t *testing.T) {
	t.Parallel()
	top := math.Nextafter(2, 0) // significand 2^53 − 1
	for _, tc := range []struct {
		name string
		x    []float64
	}{
		{"lognormal", lognormal(accLimit+12345, 40, 1, 7)},
		{"largest significands", slices.Repeat([]float64{top, -top * 0x1p900, top * 0x1p-1000}, accLimit/3+777)},
		{"negative", slices.Repeat([]float64{-top * 0x1p1000}, accLimit+3)},
		// The widest window of addWindow (10 binades apart) at its
		// largest significands, which bring its terms closest to 2^63
		// and its sums of squares to 2^147; and a window of the least
		// exponent it takes, and of the greatest.
		{"window edges", slices.Repeat([]float64{top * 0x1p-20, top * 0x1p-10}, accLimit/2+5)},
		{"window least", slices.Repeat([]float64{0x1p-971, top * 0x1p-962}, 1000)},
		{"window greatest", slices.Repeat([]float64{-top * 0x1p1023, -0x1p1013}, 1000)},
	} {
		r := newRefSketch(DefaultRelErr)
		r.AddSlice(tc.x)
		s, one := NewSketch(DefaultRelErr), NewSketch(DefaultRelErr)
		chunks(s, tc.x, 70000, 8)
		for _, v := range tc.x {
			one.Add(v)
		}
		sameAsRef(t, tc.name+" AddSlice", s, r)
		sameAsRef(t, tc.name+" Add", one, r)
	}
}

// TestSketchMergeIdentical: merging sketches whose accumulators hold
// values not yet folded gives the old merge's state, and leaves the
// merged-in sketch unchanged.
func TestSketchMergeIdentical(t *testing.T) {
	t.Parallel()
	x := adversarial(20000, 9)
	y := normal(20000, -3, 2, 10)
	ra, rb := newRefSketch(0.01), newRefSketch(0.01)
	ra.AddSlice(x)
	rb.AddSlice(y)
	a, b := NewSketch(0.01), NewSketch(0.01)
	a.AddSlice(x)
	b.AddSlice(y)
	a.Merge(b)
	ra.Merge(rb)
	sameAsRef(t, "merged", a, ra)
	sameAsRef(t, "merged-in", b, rb)
}

// negate returns x with every value's sign flipped, in place.
func negate(x []float64) []float64 {
	for i := range x {
		x[i] = -x[i]
	}
	return x
}

// withZeros returns x with every seventh value +0, as a risked output
// holds where a prospect fails, and if negZero every 1000th −0, in place.
// (The reference copy of Add orders −0 and +0 as equal, so its minimum
// may be either.)
func withZeros(x []float64, negZero bool) []float64 {
	for i := range x {
		switch {
		case negZero && i%1000 == 3:
			x[i] = math.Copysign(0, -1)
		case i%7 == 0:
			x[i] = 0
		}
	}
	return x
}
