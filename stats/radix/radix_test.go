package radix

import (
	"cmp"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// values returns n values: the special ones (±0, ±Inf, subnormals, the
// largest, ties) first when n is large enough, then normal draws spread
// over many decades.
func values(n int, rng *rand.Rand) []float64 {
	special := []float64{0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), 5e-324, -5e-324,
		math.MaxFloat64, -math.MaxFloat64, 1, 1, -1, -1, 0.5}
	x := make([]float64, n)
	for i := range x {
		if i < len(special) && n >= len(special) {
			x[i] = special[i]
		} else {
			x[i] = rng.NormFloat64() * math.Exp(10*rng.NormFloat64())
		}
	}
	return x
}

// TestSortMatchesLibrary checks Sort against the standard library's sort
// (slices.Sort), and the keys against the order of float64 values.
func TestSortMatchesLibrary(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 13, 1000, 70000} {
		x := values(n, rng)
		keys := make([]uint64, n)
		for i, v := range x {
			keys[i] = Key(v)
			if back := Float(keys[i]); math.Float64bits(back) != math.Float64bits(v) {
				t.Fatalf("Float(Key(%v)) = %v", v, back)
			}
		}
		want := slices.Clone(keys)
		slices.Sort(want)
		got, _ := Sort(keys, make([]uint64, n), 0, nil, nil)
		if !slices.Equal(got, want) {
			t.Fatalf("n = %d: radix sort differs from slices.Sort", n)
		}
		slices.Sort(x) // −0 and +0 compare equal here, so check order only
		for i := range x {
			if f := Float(got[i]); f != x[i] {
				t.Fatalf("n = %d: value %d in key order is %v, in float order %v", n, i, f, x[i])
			}
		}
	}
}

// TestSortCarriesIndex checks that the indices follow their keys and that
// the sort is stable: with the low bytes skipped (from > 0), keys equal in
// the sorted bytes keep their input order, as slices.SortStableFunc keeps it.
func TestSortCarriesIndex(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(3, 4))
	const n = 5000
	keys := make([]uint64, n)
	idx := make([]int32, n)
	for i := range keys {
		keys[i] = rng.Uint64() &^ 0xffff // many ties in bytes 2…7 after masking below
		keys[i] |= uint64(rng.IntN(1 << 16))
		keys[i] &= 0xff_ff_ff_00_00_00_ff_ff // bytes 2…4 zero: ties in the sorted bytes are rare but possible
		idx[i] = int32(i)
	}
	want := slices.Clone(idx)
	slices.SortStableFunc(want, func(a, b int32) int {
		ka, kb := keys[a]>>16, keys[b]>>16
		switch {
		case ka < kb:
			return -1
		case ka > kb:
			return 1
		}
		return 0
	})
	orig := slices.Clone(keys)
	gotKeys, gotIdx := Sort(keys, make([]uint64, n), 2, idx, make([]int32, n))
	if !slices.Equal(gotIdx, want) {
		t.Fatal("indices differ from a stable sort on bytes 2…7")
	}
	for i, j := range gotIdx {
		if gotKeys[i] != orig[j] {
			t.Fatalf("key %d is %x, want the key of index %d, %x", i, gotKeys[i], j, orig[j])
		}
	}
}

// TestFloat64s compares Float64s with slices.Sort on both of its paths.
func TestFloat64s(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(5, 6))
	for _, n := range []int{10, MinLen - 1, MinLen, 5000, 100000} {
		x := values(n, rng)
		for i := 0; i < n; i += 7 { // plenty of ±0 ties, which slices.Sort leaves in any order
			x[i] = math.Copysign(0, float64(i%2)-0.5)
		}
		want := slices.Clone(x)
		slices.SortFunc(want, func(a, b float64) int { return cmp.Compare(Key(a), Key(b)) })
		Float64s(x)
		if !slices.EqualFunc(x, want, func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }) {
			t.Errorf("n = %d: Float64s differs from a sort by Key", n)
		}
	}
}

func BenchmarkFloat64s(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 1))
	x := values(1<<20, rng)
	y := make([]float64, len(x))
	for b.Loop() {
		copy(y, x)
		Float64s(y)
	}
}
