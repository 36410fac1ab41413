package stats

import (
	"maps"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestSummarizeAtMatchesSort checks SummarizeAt against Summarize, the
// full sort it replaces, and Quantile on the sorted values: the summary
// and every quantile identical to the bit, on data with ties, both zeros,
// infinities, NaNs, negative values, one distinct value, and a wide spread
// of magnitudes, at sizes below and above the interval's binomial window.
func TestSummarizeAtMatchesSort(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(9, 10))
	qs := make([]float64, 101)
	for k := range qs {
		qs[k] = float64(k) / 100
	}
	cases := map[string]func(n int) []float64{
		"lognormal": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = math.Exp(2 * rng.NormFloat64())
			}
			return x
		},
		"signed with zeros": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				switch rng.IntN(10) {
				case 0:
					x[i] = 0
				case 1:
					x[i] = math.Copysign(0, -1)
				default:
					x[i] = rng.NormFloat64() * 1e6
				}
			}
			return x
		},
		"ties": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = float64(rng.IntN(7)) * 0.1
			}
			return x
		},
		"one value": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = 4.2
			}
			return x
		},
		"specials": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = rng.Float64()
			}
			if n >= 3 {
				x[0], x[1], x[2] = math.Inf(1), math.Inf(-1), math.NaN()
			}
			return x
		},
		"wide": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = math.Ldexp(rng.Float64(), rng.IntN(400)-200)
			}
			return x
		},
	}
	for _, name := range slices.Sorted(maps.Keys(cases)) { // a fixed order of draws
		gen := cases[name]
		for _, n := range []int{1, 2, 5, 30, 1000, 100_000} {
			x := gen(n)
			orig := slices.Clone(x)
			got, curve := SummarizeAt(x, DefaultOptions, qs)
			if !slices.EqualFunc(x, orig, func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }) {
				t.Fatalf("%s, n = %d: SummarizeAt changed x", name, n)
			}
			sorted := slices.Clone(x)
			want := Summarize(sorted, DefaultOptions)
			if !identicalSummary(got, want) {
				t.Errorf("%s, n = %d:\ngot  %+v\nwant %+v", name, n, got, want)
			}
			for k, q := range qs {
				if want.N == 0 {
					break
				}
				if w := Quantile(sorted[want.NaN:], q); math.Float64bits(curve[k]) != math.Float64bits(w) {
					t.Errorf("%s, n = %d: quantile %g = %v, sorted %v", name, n, q, curve[k], w)
				}
			}
		}
	}
}

// identicalSummary compares two summaries bit for bit (NaN equal to NaN).
func identicalSummary(a, b Summary) bool {
	same := func(x, y float64) bool { return math.Float64bits(x) == math.Float64bits(y) || (x != x && y != y) }
	iv := func(x, y Interval) bool {
		return same(x.Lo, y.Lo) && same(x.Hi, y.Hi) && same(x.Level, y.Level) && same(x.Coverage, y.Coverage)
	}
	return a.N == b.N && a.NaN == b.NaN && same(a.Mean, b.Mean) && same(a.SD, b.SD) && same(a.Min, b.Min) && same(a.Max, b.Max) &&
		same(a.P90, b.P90) && same(a.P50, b.P50) && same(a.P10, b.P10) &&
		iv(a.P90CI, b.P90CI) && iv(a.P50CI, b.P50CI) && iv(a.P10CI, b.P10CI) && iv(a.MeanCI, b.MeanCI) &&
		len(a.Warnings) == len(b.Warnings)
}

func BenchmarkSummarizeAt(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 1))
	x := make([]float64, 1_000_000)
	for i := range x {
		x[i] = math.Exp(rng.NormFloat64())
	}
	qs := make([]float64, 101)
	for k := range qs {
		qs[k] = float64(k) / 100
	}
	b.Run("select", func(b *testing.B) {
		for b.Loop() {
			SummarizeAt(x, DefaultOptions, qs)
		}
	})
	b.Run("sort", func(b *testing.B) {
		y := make([]float64, len(x))
		for b.Loop() {
			copy(y, x)
			Summarize(y, DefaultOptions)
		}
	})
}
