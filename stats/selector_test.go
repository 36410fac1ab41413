package stats

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestSelectorMatchesSort streams values through a Selector in parts, in
// any order, with a pilot of the first values, and checks its Summary
// against Summarize's full sort, bit for bit; and that a pilot from other
// values (a misleading one) is caught rather than believed.
func TestSelectorMatchesSort(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(11, 12))
	for _, n := range []int{70_000, 300_000} {
		x := make([]float64, n)
		for i := range x {
			x[i] = math.Exp(rng.NormFloat64())
			if i%1000 == 0 {
				x[i] = 0
			}
		}
		sk := NewSketch(DefaultRelErr)
		sk.AddSlice(x)
		sel := NewSelector(n, DefaultOptions, x[:65536])
		parts := []*SelectorPart{sel.Part(), sel.Part(), sel.Part()}
		for i := 0; i < n; i += 1000 { // interleaved chunks, as workers take batches
			parts[(i/1000)%3].AddSlice(x[i:min(i+1000, n)])
		}
		got, ok := sel.Summary(sk, parts)
		if !ok {
			t.Fatalf("n = %d: a rank fell outside its bracket", n)
		}
		if want := Summarize(slices.Clone(x), DefaultOptions); !identicalSummary(got, want) {
			t.Errorf("n = %d:\ngot  %+v\nwant %+v", n, got, want)
		}
		gathered := 0
		for _, p := range parts {
			for _, in := range p.inside {
				gathered += len(in)
			}
		}
		if frac := float64(gathered) / float64(n); frac > 0.1 {
			t.Errorf("n = %d: gathered %.1f%% of the values, want a few per cent", n, 100*frac)
		}
		// A pilot of shifted values brackets the wrong place: detected.
		bad := slices.Clone(x[:65536])
		for i := range bad {
			bad[i] *= 3
		}
		wrong := NewSelector(n, DefaultOptions, bad)
		p := wrong.Part()
		p.AddSlice(x)
		if _, ok := wrong.Summary(sk, []*SelectorPart{p}); ok {
			t.Errorf("n = %d: a misleading pilot was not detected", n)
		}
	}
}
