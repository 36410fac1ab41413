package radix

import (
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
)

// TestSelectMatchesSort: Select gives the keys a full sort (the standard
// library's) puts at the ranks, for wide, narrow (a shared prefix, as the
// values of one bracket share theirs), tied and tiny key sets, asked for
// every rank, for a few, and for none.
func TestSelectMatchesSort(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(5, 6))
	gen := map[string]func() uint64{
		"wide":   rng.Uint64,
		"narrow": func() uint64 { return Key(1e6 * (1 + 0.03*rng.Float64())) },
		"ties":   func() uint64 { return Key(float64(rng.IntN(7)) - 3) },
		"zeros":  func() uint64 { return Key(math.Copysign(0, float64(rng.IntN(2))-0.5)) },
		"one":    func() uint64 { return 42 },
	}
	for name, f := range gen {
		for _, n := range []int{1, 2, 63, 64, 65, 300, 5000, 100_000} {
			keys := make([]uint64, n)
			for i := range keys {
				keys[i] = f()
			}
			sorted := slices.Clone(keys)
			slices.Sort(sorted)
			all := make([]int, n)
			for i := range all {
				all[i] = i
			}
			some := []int{0, n / 10, n / 10, n / 2, min(n/2+1, n-1), n * 9 / 10, n - 1}
			slices.Sort(some)
			for _, ranks := range [][]int{all, some, nil} {
				got := Select(slices.Clone(keys), make([]uint64, n), ranks)
				for i, r := range ranks {
					if got[i] != sorted[r] {
						t.Fatalf("%s, n = %d: rank %d is %d, a sort gives %d", name, n, r, got[i], sorted[r])
					}
				}
				if len(got) != len(ranks) {
					t.Fatalf("%s, n = %d: %d keys for %d ranks", name, n, len(got), len(ranks))
				}
			}
		}
	}
}

// BenchmarkSelect asks the ranks a summary asks of one bracket (three)
// among 28 000 keys of a narrow range, beside a full Sort of them.
func BenchmarkSelect(b *testing.B) {
	rng := rand.New(rand.NewPCG(7, 8))
	keys := make([]uint64, 28_000)
	for i := range keys {
		keys[i] = Key(1e6 * (1 + 0.03*rng.Float64()))
	}
	work, buf := make([]uint64, len(keys)), make([]uint64, len(keys))
	b.Run("select", func(b *testing.B) {
		for b.Loop() {
			copy(work, keys)
			Select(work, buf, []int{9000, 14000, 19000})
		}
	})
	b.Run("sort", func(b *testing.B) {
		for b.Loop() {
			copy(work, keys)
			Sort(work, buf, 0, nil, nil)
		}
	})
}

// TestSelectRefusesBadRanks: ranks out of order or out of range panic
// with a message that says which, rather than loop or index wrongly.
func TestSelectRefusesBadRanks(t *testing.T) {
	t.Parallel()
	keys := make([]uint64, 1000)
	for i := range keys {
		keys[i] = uint64(i * 7 % 1000)
	}
	for _, tc := range []struct {
		ranks []int
		want  string
	}{
		{[]int{5, 2000, 3}, "outside [0, 1000)"},
		{[]int{900, 5, 950}, "not ascending"},
		{[]int{-1}, "outside [0, 1000)"},
	} {
		func() {
			defer func() {
				msg, _ := recover().(string)
				if !strings.Contains(msg, tc.want) {
					t.Errorf("ranks %v: panic %q, want one saying %q", tc.ranks, msg, tc.want)
				}
			}()
			Select(slices.Clone(keys), make([]uint64, len(keys)), tc.ranks)
		}()
	}
}
