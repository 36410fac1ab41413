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
			switch i % 1000 {
			case 0:
				x[i] = 0
			case 1:
				x[i] = math.Copysign(0, -1)
			}
			if i%25_000 == 2 { // NaNs of both signs, left out as Summarize leaves them
				x[i] = math.Copysign(math.NaN(), float64(i%2)-0.5)
			}
		}
		sk := NewSketch(DefaultRelErr)
		sk.AddSlice(x)
		sel := NewSelector(n-countNaN(x), DefaultOptions, x[:65536])
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
		if len(sel.brackets) > 4 {
			t.Errorf("n = %d: %d brackets; this case is meant for AddSlice's fast path", n, len(sel.brackets))
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
		wrong := NewSelector(n-countNaN(x), DefaultOptions, bad)
		p := wrong.Part()
		p.AddSlice(x)
		if _, ok := wrong.Summary(sk, []*SelectorPart{p}); ok {
			t.Errorf("n = %d: a misleading pilot was not detected", n)
		}
	}
}

// BenchmarkSelectorAddSlice measures a part's AddSlice per value on
// batches of 2^16 lognormal values, bracketed for a pass of 10^6.
func BenchmarkSelectorAddSlice(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 2))
	x := make([]float64, 1<<16)
	for i := range x {
		x[i] = math.Exp(rng.NormFloat64())
	}
	sel := NewSelector(1_000_000, DefaultOptions, x)
	p := sel.Part()
	for b.Loop() {
		p.AddSlice(x)
		for i := range p.inside {
			p.inside[i] = p.inside[i][:0] // as a long pass, whose brackets have grown
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(x)), "ns/value")
}

func countNaN(x []float64) int {
	k := 0
	for _, v := range x {
		if v != v {
			k++
		}
	}
	return k
}
