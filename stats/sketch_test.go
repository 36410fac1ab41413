package stats

import (
	"cmp"
	"math"
	"math/rand/v2"
	"reflect"
	"slices"
	"testing"

	"rockheat/stats/radix"
)

// errBound is the bound stated for Sketch.Quantile: α·((1−f)|x(lo)| + f|x(lo+1)|).
func errBound(sorted []float64, q, alpha float64) float64 {
	lo, f := position(len(sorted), q)
	if f == 0 {
		return alpha * math.Abs(sorted[lo])
	}
	return alpha * ((1-f)*math.Abs(sorted[lo]) + f*math.Abs(sorted[lo+1]))
}

// TestSketchQuantiles checks the stated error bound against the exact
// type-7 Quantile of the same values, on 10⁶ lognormal values and on
// mixed-sign and zero-heavy samples, at the default and a coarse α (at
// which a bin off by one would exceed the bound).
func TestSketchQuantiles(t *testing.T) {
	t.Parallel()
	withZeros := normal(20000, 0, 1, 4)
	for i := range withZeros {
		withZeros[i] = math.Max(withZeros[i], 0) // half zeros
	}
	for _, tc := range []struct {
		name  string
		x     []float64
		alpha float64
	}{
		{"lognormal 1e6", lognormal(1e6, 40, 1.5, 1), DefaultRelErr},
		{"lognormal coarse", lognormal(1e5, 0, 2, 2), 0.01},
		{"normal mixed sign", normal(1e5, 0.3, 1, 3), 0.003},
		{"half zeros", withZeros, 0.01},
	} {
		s := NewSketch(tc.alpha)
		s.AddSlice(tc.x)
		if s.RelErr() > tc.alpha*(1+1e-9) {
			t.Errorf("%s: RelErr %g above the %g asked", tc.name, s.RelErr(), tc.alpha)
		}
		sorted := slices.Clone(tc.x)
		slices.Sort(sorted)
		for _, q := range []float64{0, 0.01, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99, 1} {
			got, want := s.Quantile(q), Quantile(sorted, q)
			if tol := errBound(sorted, q, s.RelErr()); !within(got, want, tol) {
				t.Errorf("%s: q=%g: sketch %v, exact %v, bound %g", tc.name, q, got, want, tol)
			}
		}
		if got, want := s.Exceedance(0.9), s.Quantile(0.1); got != want {
			t.Errorf("%s: Exceedance(0.9) %v, Quantile(0.1) %v", tc.name, got, want)
		}
	}
	if got := NewSketchOf(withZeros).Quantile(0.25); got != 0 {
		t.Errorf("half zeros: Quantile(0.25) = %v, want 0 exactly", got)
	}
}

// NewSketchOf is a test shorthand for a default sketch of x.
func NewSketchOf(x []float64) *Sketch {
	s := NewSketch(DefaultRelErr)
	s.AddSlice(x)
	return s
}

// TestSketchOrderStatistics checks every order statistic of a sample with
// both signs, zeros, infinities and a wide range of magnitudes against the
// exact one: within α relative, and exact at the ends.
func TestSketchOrderStatistics(t *testing.T) {
	t.Parallel()
	x := normal(5000, 0, 1, 5)
	for i := range x {
		x[i] = math.Copysign(math.Pow(10, 40*x[i]), x[i]-0.1)
	}
	x = append(x, 0, 0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), math.Inf(-1), math.NaN())
	s := NewSketch(0.001)
	s.AddSlice(x)
	sorted := slices.DeleteFunc(slices.Clone(x), math.IsNaN)
	slices.Sort(sorted)
	if s.N() != len(sorted) {
		t.Fatalf("N = %d, want %d", s.N(), len(sorted))
	}
	for k, want := range sorted {
		got := s.at(k)
		if !within(got, want, s.RelErr()*math.Abs(want)) && got != want {
			t.Errorf("rank %d: %v, exact %v", k, got, want)
		}
	}
	if s.at(0) != sorted[0] || s.at(len(sorted)-1) != sorted[len(sorted)-1] {
		t.Errorf("extremes %v, %v; want %v, %v", s.at(0), s.at(len(sorted)-1), sorted[0], sorted[len(sorted)-1])
	}
}

// TestSketchRankKeyRanges: the key range the sketch gives for each rank
// holds the exact order statistic of that rank, for every rank of a sample
// with both signs, both zeros, infinities, subnormals and magnitudes over
// hundreds of decades, at a fine and a coarse resolution; the ranges of
// different groups do not overlap.
// Reference: the sample sorted by radix.Key with the standard library's
// slices.SortFunc, the order every exact order statistic here follows.
func TestSketchRankKeyRanges(t *testing.T) {
	t.Parallel()
	x := normal(5000, 0, 1, 6)
	for i := range x {
		x[i] = math.Copysign(math.Pow(10, 300*x[i]), x[i]-0.1) // reaches the subnormals
	}
	x = append(x, 0, 0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), 5e-324, -5e-324,
		math.SmallestNonzeroFloat64*3, math.MaxFloat64, -math.MaxFloat64, 0x1p-1022, -0x1p-1022, math.NaN())
	sorted := slices.DeleteFunc(slices.Clone(x), math.IsNaN)
	slices.SortFunc(sorted, func(a, b float64) int { return cmp.Compare(radix.Key(a), radix.Key(b)) })
	ranks := make([]int, len(sorted))
	for k := range ranks {
		ranks[k] = k
	}
	for _, alpha := range []float64{DefaultRelErr, 0.01} {
		s := NewSketch(alpha)
		s.AddSlice(x)
		rs := s.rankKeyRanges(ranks)
		for k, r := range rs {
			v := sorted[k]
			if key := radix.Key(v); key < r[0] || key > r[1] {
				t.Fatalf("α %g, rank %d: value %v outside its range [%v, %v]", alpha, k, v, radix.Float(r[0]), radix.Float(r[1]))
			}
			if k > 0 && r != rs[k-1] && r[0] <= rs[k-1][1] {
				t.Fatalf("α %g, rank %d: range %v overlaps the one before, %v", alpha, k, r, rs[k-1])
			}
		}
	}
}

// TestBinBitRange: bitRange is exact, against binTable.index (the
// reference: the bin every value is counted in): bins meet end to end
// with neither gap nor overlap over whole binades (the subnormals, the
// subnormal–normal boundary at 2^−1022, around 1, and the top, whose last
// bin ends at +Inf's bits), and the first and last bits of each bin index
// to it, at coarse, default and fine resolutions.
func TestBinBitRange(t *testing.T) {
	t.Parallel()
	for _, alpha := range []float64{0.1, 0.01, DefaultRelErr, 1e-6} {
		tab := NewSketch(alpha).tab
		index := func(u uint64) int { return tab.index(math.Float64frombits(u)) }
		per := 1 << tab.bits // bins a binade
		for _, be := range []int{0, 1, 2, 1022, 1023, 1024, 2046} {
			first := be * per
			end := uint64(1) // the smallest subnormal
			if be > 0 {
				_, end = tab.bitRange(first - 1)
			}
			for i := first; i < first+per; i++ {
				lo, hi := tab.bitRange(i)
				if lo != end {
					t.Fatalf("α %g, bin %d: starts at %#x, the bin before ends at %#x", alpha, i, lo, end)
				}
				if index(lo) != i || index(hi-1) != i {
					t.Fatalf("α %g, bin %d: range [%#x, %#x) indexes to %d … %d", alpha, i, lo, hi, index(lo), index(hi-1))
				}
				end = hi
			}
			if be == 2046 && end != math.Float64bits(math.Inf(1)) {
				t.Errorf("α %g: the last bin ends at %#x, not at +Inf", alpha, end)
			}
		}
	}
}

// TestSketchSignedZeroExtremes: with both zeros among the values, the
// minimum is −0 and the maximum +0 (the order of radix.Key, which
// Summarize's sort follows), whatever the order of adding and merging.
func TestSketchSignedZeroExtremes(t *testing.T) {
	t.Parallel()
	neg, pos := math.Copysign(0, -1), 0.0
	for _, order := range [][]float64{{pos, neg}, {neg, pos}, {pos, neg, pos}} {
		one := NewSketchOf(order)
		a, b := NewSketchOf(order[:1]), NewSketchOf(order[1:])
		a.Merge(b)
		for name, s := range map[string]*Sketch{"added": one, "merged": a} {
			sum := s.Summary(DefaultOptions)
			if !math.Signbit(sum.Min) || math.Signbit(sum.Max) {
				t.Errorf("%v, %s: min %v (sign %v), max %v (sign %v); want −0 and +0", order, name,
					sum.Min, math.Signbit(sum.Min), sum.Max, math.Signbit(sum.Max))
			}
		}
	}
}

// TestSketchMerge: sketches of the parts, merged in any order or grouping,
// give a Summary identical, bit for bit, to the sketch of the whole.
func TestSketchMerge(t *testing.T) {
	t.Parallel()
	x := lognormal(200000, 30, 2, 6)
	x[3] = math.NaN()
	whole := NewSketchOf(x)
	want := whole.Summary(DefaultOptions)
	cuts := []int{0, 17, 5000, 5001, 90000, 150000, len(x)}
	parts := make([]*Sketch, len(cuts)-1)
	for i := range parts {
		parts[i] = NewSketchOf(x[cuts[i]:cuts[i+1]])
	}
	rng := rand.New(rand.NewPCG(1, 2))
	orders := [][]int{{0, 1, 2, 3, 4, 5}, {5, 4, 3, 2, 1, 0}, rng.Perm(6), rng.Perm(6)}
	for _, order := range orders {
		m := NewSketch(DefaultRelErr)
		for _, i := range order {
			m.Merge(parts[i])
		}
		if got := m.Summary(DefaultOptions); !sameSummary(got, want) {
			t.Errorf("merge order %v: %+v\nwant %+v", order, got, want)
		}
	}
	// Tree: ((0+1)+(2+3))+(4+5), built into the parts' own sketches.
	a, b, c := NewSketch(DefaultRelErr), NewSketch(DefaultRelErr), NewSketch(DefaultRelErr)
	a.Merge(parts[0])
	a.Merge(parts[1])
	b.Merge(parts[2])
	b.Merge(parts[3])
	c.Merge(parts[4])
	c.Merge(parts[5])
	b.Merge(a)
	c.Merge(b)
	if got := c.Summary(DefaultOptions); !sameSummary(got, want) {
		t.Errorf("tree merge: %+v\nwant %+v", got, want)
	}
	for _, q := range []float64{0.01, 0.1, 0.5, 0.9, 0.99} {
		if c.Quantile(q) != whole.Quantile(q) {
			t.Errorf("q=%g: merged %v, whole %v", q, c.Quantile(q), whole.Quantile(q))
		}
	}
}

func sameSummary(a, b Summary) bool {
	ea, eb := a.Warnings, b.Warnings
	a.Warnings, b.Warnings = nil, nil
	return reflect.DeepEqual(a, b) && len(ea) == len(eb)
}

// TestSketchSummary: the sketch's Summary matches Summarize exactly in
// count, moments, extremes and levels (same exact sums, same ranks), and
// within the error bound in percentiles and interval ends.
func TestSketchSummary(t *testing.T) {
	t.Parallel()
	x := lognormal(50000, 35, 1, 7)
	s := NewSketchOf(x)
	got := s.Summary(DefaultOptions)
	want := Summarize(slices.Clone(x), DefaultOptions)
	if got.N != want.N || got.Mean != want.Mean || got.SD != want.SD || got.Min != want.Min ||
		got.Max != want.Max || got.MeanCI != want.MeanCI {
		t.Errorf("sketch %+v\nexact %+v", got, want)
	}
	a := s.RelErr()
	for _, c := range []struct {
		what      string
		got, want Interval
		gv, wv    float64
	}{
		{"P90", got.P90CI, want.P90CI, got.P90, want.P90},
		{"P50", got.P50CI, want.P50CI, got.P50, want.P50},
		{"P10", got.P10CI, want.P10CI, got.P10, want.P10},
	} {
		if c.got.Coverage != c.want.Coverage || !within(c.got.Lo, c.want.Lo, a*c.want.Lo) ||
			!within(c.got.Hi, c.want.Hi, a*c.want.Hi) || !within(c.gv, c.wv, a*c.wv) {
			t.Errorf("%s: sketch %v %+v, exact %v %+v", c.what, c.gv, c.got, c.wv, c.want)
		}
	}
}

// TestSketchDegenerate: an all-equal sample is summarised exactly.
func TestSketchDegenerate(t *testing.T) {
	t.Parallel()
	for _, v := range []float64{3.7, -2.5e18, 0} {
		x := make([]float64, 1000)
		for i := range x {
			x[i] = v
		}
		s := NewSketchOf(x).Summary(DefaultOptions)
		for _, got := range []float64{s.P90, s.P50, s.P10, s.Mean, s.Min, s.Max,
			s.P90CI.Lo, s.P90CI.Hi, s.P50CI.Lo, s.P10CI.Hi} {
			if got != v {
				t.Errorf("all %v: summary value %v in %+v", v, got, s)
				break
			}
		}
		if s.SD != 0 {
			t.Errorf("all %v: SD %v, want 0", v, s.SD)
		}
	}
}

// TestSketchEmpty: an empty sketch summarises to N = 0 with a warning, and
// Quantile panics (programmer error).
func TestSketchEmpty(t *testing.T) {
	t.Parallel()
	s := NewSketch(DefaultRelErr)
	s.Add(math.NaN())
	sum := s.Summary(DefaultOptions)
	if sum.N != 0 || sum.NaN != 1 || len(sum.Warnings) != 2 {
		t.Errorf("empty sketch: %+v", sum)
	}
	defer func() {
		if recover() == nil {
			t.Errorf("Quantile of empty sketch did not panic")
		}
	}()
	s.Quantile(0.5)
}

// TestSketchMergeMismatch: sketches of different resolutions cannot merge.
func TestSketchMergeMismatch(t *testing.T) {
	t.Parallel()
	defer func() {
		if recover() == nil {
			t.Errorf("Merge of different relErr did not panic")
		}
	}()
	NewSketch(1e-4).Merge(NewSketch(1e-3))
}

// TestSketchMemory checks the stated memory: at most 2^bits bins a binade
// (factor of 2) of the range of values, in whole pages, and, for values
// spread over hundreds of decades, only the pages where values fall.
func TestSketchMemory(t *testing.T) {
	t.Parallel()
	x := lognormal(100000, 40, 1, 8)
	s := NewSketchOf(x)
	sum := s.Summary(DefaultOptions)
	need := (math.Log2(sum.Max/sum.Min) + 1) * float64(int(1)<<s.tab.bits)
	if b := float64(s.Bins()); b > need+2*pageSize {
		t.Errorf("%d bins for a range needing %.0f", s.Bins(), need)
	}
	// 1000 values at each of 1e-300, 1e-200, …, 1e300: 7 occupied bins
	// across 600 decades, so 7 pages, not 16 million bins.
	wide := NewSketch(DefaultRelErr)
	for e := -300; e <= 300; e += 100 {
		for range 1000 {
			wide.Add(math.Pow(10, float64(e)))
		}
	}
	if b := wide.Bins(); b > 7*pageSize {
		t.Errorf("%d bins for 7 occupied bins over 600 decades", b)
	}
	if q := wide.Quantile(0.5); math.Abs(q/1-1) > DefaultRelErr {
		t.Errorf("median of the wide sketch %g, want 1", q)
	}
}

// TestBinIndex checks the bin look-up against its definition (binTable):
// a normal x = m·2^e, 1 ≤ m < 2, in bin (e + 1023)·2^bits + j with
// 1 + j·2^−bits ≤ m < 1 + (j+1)·2^−bits, a subnormal x in bin j with
// j·2^−bits ≤ x·2^1022 < (j+1)·2^−bits; on random values, on the bin ends
// themselves and on the extremes, at coarse, default and fine resolutions.
// It also checks that the table's error bound is below the one asked.
func TestBinIndex(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 2))
	for _, alpha := range []float64{0.1, 0.01, DefaultRelErr, 1e-6} {
		tab := NewSketch(alpha).tab
		if tab.relErr > alpha {
			t.Errorf("α=%g: table bound %g", alpha, tab.relErr)
		}
		w := math.Ldexp(1, -int(tab.bits))
		check := func(x float64) {
			i := tab.index(x)
			be, j := i>>tab.bits, i&(1<<tab.bits-1)
			a := float64(j) * w    // bin start: of m − 1, or of x·2^1022 for a subnormal
			m, fe := math.Frexp(x) // x = m·2^fe, m in [0.5, 1)
			m, fe = 2*m-1, fe-1
			if be == 0 {
				m, fe = math.Ldexp(x, 1022), -1023
			}
			if fe != be-1023 || m < a || m >= a+w {
				t.Fatalf("α=%g: x=%v in bin (be=%d, j=%d) = [%v, %v); holds %v at e=%d", alpha, x, be, j, a, a+w, m, fe)
			}
		}
		for range 20000 {
			check(math.Ldexp(1+rng.Float64(), rng.IntN(200)-100))
			check(rng.Float64() * 0x1p-1022)
		}
		for j := 1; j < 1<<tab.bits; j += max(1, (1<<tab.bits)/5000) {
			b := 1 + float64(j)*w
			check(math.Ldexp(b, 7))
			check(math.Ldexp(math.Nextafter(b, 0), -3))
		}
		check(5e-324) // the smallest subnormal
		check(0x1p-1022)
		check(math.MaxFloat64)
	}
}

// TestSketchQuantilesOneWalk: Quantiles, one walk over the bins, gives
// Quantile's value for every q, bit for bit, and Summary's figures are
// those of the order statistics Quantile reads.
func TestSketchQuantilesOneWalk(t *testing.T) {
	t.Parallel()
	for _, x := range [][]float64{lognormal(50_000, 40, 1, 3), adversarial(20_000, 5)} {
		s := NewSketchOf(x)
		qs := []float64{0, 1e-9, 0.01, 0.1, 0.25, 0.5, 0.5, 0.9, 0.999, 1}
		got := s.Quantiles(qs)
		for i, q := range qs {
			if want := s.Quantile(q); math.Float64bits(got[i]) != math.Float64bits(want) {
				t.Errorf("Quantiles at %g = %v, Quantile %v", q, got[i], want)
			}
		}
		sum := s.Summary(DefaultOptions)
		if sum.P50 != s.Exceedance(0.5) || sum.P90 != s.Exceedance(0.9) || sum.P10 != s.Exceedance(0.1) {
			t.Errorf("Summary P90/P50/P10 %v %v %v; Exceedance %v %v %v", sum.P90, sum.P50, sum.P10,
				s.Exceedance(0.9), s.Exceedance(0.5), s.Exceedance(0.1))
		}
	}
}

// binCounts returns every bin's count, positive bins at their index and
// negative ones at −1 − index, read through the walk that every order
// statistic uses.
func binCounts(s *Sketch) map[int]uint64 {
	m := map[int]uint64{}
	s.pos.walk(false, func(i int, c uint64) bool { m[i] = c; return true })
	s.neg.walk(false, func(i int, c uint64) bool { m[-1-i] = c; return true })
	return m
}

// TestSketchFoldMidStream: the 32-bit counts are folded into the wide
// ones when reserve would pass lowMax (after 2³² − 1 values, forced here
// by setting low), and a fold in the middle of a stream changes nothing:
// the summary, quantiles and bin counts are those of the same values
// added without it, and a merge of a folded sketch gives the same as one
// of an unfolded sketch.
func TestSketchFoldMidStream(t *testing.T) {
	t.Parallel()
	x := normal(100000, 3, 2, 9) // both signs
	plain := NewSketchOf(x)
	folded := NewSketch(DefaultRelErr)
	folded.AddSlice(x[:40000])
	folded.low = lowMax - 10 // as if 2³² − 11 values had been added since the last fold
	folded.AddSlice(x[40000:70000])
	if folded.pos.wide == nil || folded.neg.wide == nil || folded.low != 30000 {
		t.Fatalf("no fold: wide %v/%v, low %d", folded.pos.wide != nil, folded.neg.wide != nil, folded.low)
	}
	for _, v := range x[70000:] {
		folded.Add(v)
	}
	if got, want := folded.Summary(DefaultOptions), plain.Summary(DefaultOptions); !sameSummary(got, want) {
		t.Errorf("folded sketch: %+v\nwant %+v", got, want)
	}
	if got, want := binCounts(folded), binCounts(plain); !reflect.DeepEqual(got, want) {
		t.Error("bin counts differ after a fold")
	}
	qs := []float64{0, 0.01, 0.1, 0.5, 0.9, 0.99, 1}
	if got, want := folded.Quantiles(qs), plain.Quantiles(qs); !reflect.DeepEqual(got, want) {
		t.Errorf("quantiles %v, want %v", got, want)
	}
	a, b := NewSketch(DefaultRelErr), NewSketch(DefaultRelErr)
	a.Merge(folded)
	b.Merge(plain)
	if !reflect.DeepEqual(binCounts(a), binCounts(b)) || !sameSummary(a.Summary(DefaultOptions), b.Summary(DefaultOptions)) {
		t.Error("merging a folded sketch differs from merging an unfolded one")
	}
}

// TestSketchCountsPast32Bits: counts past 2³² are kept exactly, by the
// fold (a bin at 2³² − 2 given 3 more values) and by the carry of Merge
// (two bins at 2³¹ + 5 and 2³¹ + 7 and a folded wide count). The large
// counts are set by hand, as adding 2³² values would take a minute.
func TestSketchCountsPast32Bits(t *testing.T) {
	t.Parallel()
	const v = 2.5
	s := NewSketch(DefaultRelErr)
	s.Add(v)
	i := s.tab.index(v)
	pg := s.pos.pages[i>>pageBits-s.pos.first]
	pg[i&(pageSize-1)] = lowMax - 1
	s.low = lowMax - 1
	s.AddSlice([]float64{v, v, v})
	if got, want := binCounts(s)[i], uint64(1<<32+1); got != want {
		t.Errorf("after a fold: count %d, want %d", got, want)
	}

	a, b := NewSketch(DefaultRelErr), NewSketch(DefaultRelErr)
	a.Add(v)
	b.Add(v)
	b.Add(-v)
	a.pos.pages[i>>pageBits-a.pos.first][i&(pageSize-1)] = 1<<31 + 5
	b.pos.pages[i>>pageBits-b.pos.first][i&(pageSize-1)] = 1<<31 + 7
	b.neg.fold() // −v's count now wide
	a.low, b.low = 1<<31+5, 1<<31+8
	a.Merge(b)
	a.Merge(s)
	want := map[int]uint64{i: 1<<32 + 12 + 1<<32 + 1, -1 - i: 1}
	if got := binCounts(a); !reflect.DeepEqual(got, want) {
		t.Errorf("after merges: counts %v, want %v", got, want)
	}
	if a.low != lowMax {
		t.Errorf("merged bound on the 32-bit counts %d, want it capped at %d", a.low, uint64(lowMax))
	}
	a.Add(v) // the capped bound folds before this value
	if got := binCounts(a)[i]; got != want[i]+1 || a.low != 1 {
		t.Errorf("after one more value: count %d (want %d), low %d (want 1)", got, want[i]+1, a.low)
	}
}

// TestSketchReserveBoundsCounts: low stays a bound on every 32-bit count
// when a run that AddSlice reserved whole reaches lowMax with values that
// go through add (a subnormal, a zero, a NaN) in its middle: they must not
// reserve again and fold while the rest of the run is still to come.
func TestSketchReserveBoundsCounts(t *testing.T) {
	t.Parallel()
	const v = 2.5
	xs := []float64{v, v, v, 5e-324, v, 0, v, math.NaN(), v, v}
	s := NewSketch(DefaultRelErr)
	s.low = lowMax - uint64(len(xs)) // the run fits exactly, with no fold
	s.AddSlice(xs)
	var most uint32
	for _, b := range []*bins{&s.pos, &s.neg} {
		for _, pg := range b.pages {
			if pg != nil {
				most = max(most, slices.Max(pg[:]))
			}
		}
	}
	if most != 7 || s.low < uint64(most) {
		t.Errorf("largest 32-bit count %d (want 7), bound low %d", most, s.low)
	}
}
