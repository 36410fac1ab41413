package stats

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// wideFloats returns n finite values of random sign and of magnitudes
// spread over most of the float64 range, subnormals included.
func wideFloats(n int, stream uint64) []float64 {
	rng := rand.New(rand.NewPCG(stream, 7))
	x := make([]float64, n)
	for i := range x {
		v := math.Ldexp(1+rng.Float64(), rng.IntN(2000)-1070)
		if rng.IntN(2) == 0 {
			v = -v
		}
		x[i] = v
	}
	return x
}

// bigMeanSD computes the mean and sample standard deviation with
// math/big.Float at 12000 bits, enough for the exact sums of any float64
// values and squares: an independent reference.
func bigMeanSD(x []float64) (mean, sd float64) {
	const prec = 12000
	s1 := new(big.Float).SetPrec(prec)
	s2 := new(big.Float).SetPrec(prec)
	for _, v := range x {
		b := new(big.Float).SetPrec(prec).SetFloat64(v)
		s1.Add(s1, b)
		s2.Add(s2, b.Mul(b, b))
	}
	n := new(big.Float).SetPrec(prec).SetInt64(int64(len(x)))
	m := new(big.Float).SetPrec(prec).Quo(s1, n)
	mean, _ = m.Float64()
	// var = (S2 − S1·mean)/(n − 1)
	v := new(big.Float).SetPrec(prec).Mul(s1, m)
	v.Sub(s2, v)
	v.Quo(v, new(big.Float).SetPrec(prec).SetInt64(int64(len(x)-1)))
	vf, _ := v.Float64()
	return mean, math.Sqrt(vf)
}

func meanSDOf(x []float64) (float64, float64) {
	m := newMoments()
	for _, v := range x {
		m.add(v)
	}
	return m.meanSD()
}

// TestMomentsExact compares the accumulator's mean and standard deviation
// with the 12000-bit reference, bit for bit (both are correctly rounded),
// on values of wildly different magnitudes, and checks that the order of
// addition does not matter.
func TestMomentsExact(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		x    []float64
	}{
		{"wide", wideFloats(3000, 1)},
		{"lognormal", lognormal(5000, 40, 3, 2)},
		{"normal", normal(5000, 0, 1e-300, 3)},
	} {
		wantMean, wantSD := bigMeanSD(tc.x)
		gotMean, gotSD := meanSDOf(tc.x)
		if gotMean != wantMean || gotSD != wantSD {
			t.Errorf("%s: mean, sd = %v, %v; 12000-bit reference %v, %v", tc.name, gotMean, gotSD, wantMean, wantSD)
		}
		y := append([]float64(nil), tc.x...)
		rand.New(rand.NewPCG(9, 9)).Shuffle(len(y), func(i, j int) { y[i], y[j] = y[j], y[i] })
		if m, s := meanSDOf(y); m != gotMean || s != gotSD {
			t.Errorf("%s: shuffled order gives %v, %v; want %v, %v", tc.name, m, s, gotMean, gotSD)
		}
	}
}

// TestMomentsCancellation uses samples whose naive float sums are wrong.
func TestMomentsCancellation(t *testing.T) {
	t.Parallel()
	mx := math.MaxFloat64
	many := make([]float64, 1000)
	for i := range many {
		many[i] = mx
	}
	for _, tc := range []struct {
		name             string
		x                []float64
		wantMean, wantSD float64
	}{
		// Analytic: sum 2, mean 0.5; variance (2·10²⁰⁰ + …)/3 rounds to (2/3)·10²⁰⁰.
		{"1e100 cancels", []float64{1e100, 1, -1e100, 1}, 0.5, math.Sqrt(2.0/3) * 1e100},
		// Analytic: mean 10⁹+3, variance 2.5 (that of 1 … 5).
		{"shifted", []float64{1e9 + 1, 1e9 + 2, 1e9 + 3, 1e9 + 4, 1e9 + 5}, 1e9 + 3, math.Sqrt(2.5)},
		// The sum 1000·MaxFloat64 overflows float64 but not the accumulator.
		{"max float", many, mx, 0},
		// Analytic: mean 0, variance 2·MaxFloat64²/1 → SD overflows to +Inf.
		{"±max", []float64{mx, -mx}, 0, math.Inf(1)},
		{"zeros", []float64{0, 0, 0}, 0, 0},
	} {
		m, s := meanSDOf(tc.x)
		if m != tc.wantMean || !(within(s, tc.wantSD, 1e-15*tc.wantSD) || s == tc.wantSD) {
			t.Errorf("%s: mean, sd = %v, %v; want %v, %v", tc.name, m, s, tc.wantMean, tc.wantSD)
		}
	}
}

// TestMomentsSpecial covers infinities, one value and no value, whose
// results follow IEEE 754 arithmetic on the sum.
func TestMomentsSpecial(t *testing.T) {
	t.Parallel()
	inf, nan := math.Inf(1), math.NaN()
	for _, tc := range []struct {
		name             string
		x                []float64
		wantMean, wantSD float64
	}{
		{"none", nil, nan, nan},
		{"one", []float64{3}, 3, nan},
		{"+inf", []float64{1, inf}, inf, nan},
		{"-inf", []float64{1, -inf}, -inf, nan},
		{"both inf", []float64{inf, -inf}, nan, nan},
	} {
		m, s := meanSDOf(tc.x)
		same := func(a, b float64) bool { return a == b || (math.IsNaN(a) && math.IsNaN(b)) }
		if !same(m, tc.wantMean) || !same(s, tc.wantSD) {
			t.Errorf("%s: mean, sd = %v, %v; want %v, %v", tc.name, m, s, tc.wantMean, tc.wantSD)
		}
	}
}

// TestFixedCarry checks that carry propagation (normally every 2^30 adds
// to the limbs), folding the exponent accumulators (normally every 2^21
// values) and merging leave the value unchanged: folding and propagating
// carries after every value must give the same integers.
func TestFixedCarry(t *testing.T) {
	t.Parallel()
	x := wideFloats(2000, 4)
	a, b, c := newMoments(), newMoments(), newMoments()
	for i, v := range x {
		a.add(v)
		b.add(v)
		b.pending = carryEvery - 1 // propagate carries at this fold
		b.fold()
		if i%2 == 0 {
			c.add(v)
		}
	}
	d := newMoments()
	for i, v := range x {
		if i%2 == 1 {
			d.add(v)
		}
	}
	c.merge(d)
	a.fold()
	for _, m := range []*moments{b, c} {
		m.fold()
		if m.sum.int().Cmp(a.sum.int()) != 0 || m.sq.int().Cmp(a.sq.int()) != 0 || m.n != a.n {
			t.Errorf("sums differ after carries or merge")
		}
	}
}

// TestMomentsAccumulatorBound adds 2·accLimit + 5 values of the largest
// significand, 2^53 − 1, to one exponent accumulator, of each sign: the
// sums must be exactly N·m and N·m² (math/big), which fails if accLimit
// let the 128-bit accumulators overflow before a fold.
func TestMomentsAccumulatorBound(t *testing.T) {
	t.Parallel()
	const n = 2*accLimit + 5
	top := math.Nextafter(2, 0) // (2^53 − 1)·2^−52
	for _, v := range []float64{top, -top} {
		m := newMoments()
		for range n {
			m.add(v)
		}
		m.fold()
		sig := big.NewInt(1<<53 - 1)
		if v < 0 {
			sig.Neg(sig)
		}
		// Sum = n·sig·2^−52 = I·2^sumLSB, so I = n·sig·2^(−52−sumLSB).
		want := new(big.Int).Mul(big.NewInt(n), sig)
		want.Lsh(want, uint(-52-sumLSB))
		if m.sum.int().Cmp(want) != 0 {
			t.Errorf("sum of %d × %v is not exact", n, v)
		}
		want.Mul(big.NewInt(n), new(big.Int).Mul(sig, sig))
		want.Lsh(want, uint(-104-sqLSB))
		if m.sq.int().Cmp(want) != 0 {
			t.Errorf("sum of squares of %d × %v is not exact", n, v)
		}
	}
}

// TestMeanMatchesSketch: a Mean gives the bits of the mean of a Sketch
// (and of Summarize) of the same values, zeros, infinities and NaNs
// included, whatever the split into merged parts; those means are the
// exact rational mean correctly rounded (TestMomentsExact, math/big).
func TestMeanMatchesSketch(t *testing.T) {
	t.Parallel()
	x := lognormal(50000, 3, 2, 5)
	for i := range x {
		switch i % 5 {
		case 0:
			x[i] = 0
		case 1:
			x[i] = -x[i]
		}
	}
	x[17] = math.NaN()
	sk := NewSketch(DefaultRelErr)
	sk.AddSlice(x)
	want := sk.Summary(Options{}).Mean
	a, b := NewMean(), NewMean()
	a.AddSlice(x[:12345])
	b.AddSlice(x[12345:])
	a.Merge(b)
	if got := a.Value(); math.Float64bits(got) != math.Float64bits(want) || !(got == got) {
		t.Errorf("Mean %v, Sketch %v", got, want)
	}
	if got := Summarize(x, Options{}).Mean; math.Float64bits(got) != math.Float64bits(want) {
		t.Errorf("Summarize %v, Sketch %v", got, want)
	}
	// A risked output: values of one sign in a narrow range (summed in a
	// window) and zeros, against the reference copy of the sums, bit for
	// bit, added in runs as AddSlice is called.
	risked := withZeros(lognormal(70000, 2, 0.3, 6), true)
	ref := newRefMoments()
	m := NewMean()
	for i, v := range risked {
		ref.add(v)
		if i%10000 == 9999 {
			m.AddSlice(risked[i-9999 : i+1])
		}
	}
	if got, want := m.Value(), func() float64 { v, _ := ref.meanSD(); return v }(); math.Float64bits(got) != math.Float64bits(want) {
		t.Errorf("risked-like values: Mean %v, reference sums %v", got, want)
	}
	inf := NewMean()
	inf.AddSlice([]float64{1, math.Inf(1), 2})
	if got := inf.Value(); !math.IsInf(got, 1) {
		t.Errorf("mean with +Inf = %v", got)
	}
	if got := NewMean().Value(); got == got {
		t.Errorf("mean of nothing = %v, want NaN", got)
	}
}
