package stats

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"rockheat/stats/radix"
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
		// Parts made one by one, and by Parts with room reserved from
		// the pilot: the same figures.
		for _, parts := range [][]*SelectorPart{{sel.Part(), sel.Part(), sel.Part()}, sel.Parts(3)} {
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
		}
		// The pilot's estimate of what each bracket gathers is close to
		// what it does (binomial error of a 65 536-value pilot: well
		// within a quarter at these sizes).
		_, inside, _ := sk.bracketCounts(sel.brackets)
		for b, e := range sel.expect {
			if c := float64(inside[b]); !(float64(e) > 0.75*c && float64(e) < 1.25*c) {
				t.Errorf("n = %d, bracket %d: expected %d values from the pilot, gathered %d", n, b, e, inside[b])
			}
		}
		parts := sel.Parts(3)
		for i := 0; i < n; i += 1000 {
			parts[(i/1000)%3].AddSlice(x[i:min(i+1000, n)])
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

// TestSketchSelectorBrackets: the brackets a sketch of the pilot gives
// hold those taken from the pilot's sorted values (the construction the
// sketch replaces: each end the pilot's order statistic 7 standard errors
// plus 2/m from the needed rank's probability, overlapping brackets
// merged), one for one, and each end is at most a bin (relative 2α) and an
// ulp further out, for positive, mixed-sign and tied pilots.
func TestSketchSelectorBrackets(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(21, 22))
	draw := map[string]func() float64{
		"lognormal":  func() float64 { return math.Exp(rng.NormFloat64()) },
		"mixed sign": func() float64 { return rng.NormFloat64() - 0.3 },
		"ties":       func() float64 { return float64(rng.IntN(40)) - 5 },
	}
	for name, f := range draw {
		pilot := make([]float64, 1<<16)
		for i := range pilot {
			pilot[i] = f()
		}
		const n = 1_000_000
		got := NewSelector(n, DefaultOptions, pilot).brackets
		keys := make([]uint64, len(pilot))
		for i, v := range pilot {
			keys[i] = radix.Key(v)
		}
		slices.Sort(keys)
		m := float64(len(keys))
		var want [][2]uint64
		for _, r := range summaryRanks(n, DefaultOptions.Level()) {
			if r == 0 || r == n-1 {
				continue
			}
			p := float64(r) / float64(n-1)
			d := 7*math.Sqrt(p*(1-p)/m) + 2/m
			want = append(want, [2]uint64{keys[int(math.Floor((p-d)*(m-1)))], keys[int(math.Ceil((p+d)*(m-1)))]})
		}
		merged := mergeBrackets(want)
		if len(got) != len(merged) {
			t.Errorf("%s: %d brackets, want %d: %v", name, len(got), len(merged), got)
			continue
		}
		for i, w := range merged {
			g := got[i]
			lo, hi := radix.Float(w[0]), radix.Float(w[1])
			slack := func(end float64) float64 { return 2.01*DefaultRelErr*math.Abs(end) + 5e-324 }
			if g[0] > w[0] || g[1] < w[1] {
				t.Errorf("%s: bracket %d [%v, %v] does not hold the pilot's [%v, %v]", name, i, radix.Float(g[0]), radix.Float(g[1]), lo, hi)
			}
			if lo-radix.Float(g[0]) > slack(lo) || radix.Float(g[1])-hi > slack(hi) {
				t.Errorf("%s: bracket %d [%v, %v] is more than a bin wider than the pilot's [%v, %v]", name, i, radix.Float(g[0]), radix.Float(g[1]), lo, hi)
			}
		}
	}
}

// TestSelectorWholeBins: brackets of whole sketch bins give Summarize's
// summary, bit for bit (the reference: a full sort), for values of both
// signs with ties, subnormals and both zeros near the needed ranks; and a
// sketch at another resolution than the pilot's, whose bins the brackets
// split, is refused rather than trusted.
func TestSelectorWholeBins(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(51, 52))
	x := make([]float64, 200_000)
	for i := range x {
		switch i % 5 {
		case 0:
			x[i] = float64(rng.IntN(9)-4) * 0x1p-1070 // subnormals, ties and zeros
		case 1:
			x[i] = math.Copysign(0, -1)
		default:
			x[i] = rng.NormFloat64()*1e-300 - 0.3e-300
		}
	}
	sk := NewSketch(DefaultRelErr)
	sk.AddSlice(x)
	sel := NewSelector(len(x), DefaultOptions, x[:1<<16])
	p := sel.Part()
	p.AddSlice(x)
	got, ok := sel.Summary(sk, []*SelectorPart{p})
	if want := Summarize(slices.Clone(x), DefaultOptions); !ok || !identicalSummary(got, want) {
		t.Errorf("ok %v,\ngot  %+v\nwant %+v", ok, got, want)
	}
	coarse := NewSketch(0.01)
	coarse.AddSlice(x)
	if _, ok := sel.Summary(coarse, []*SelectorPart{p}); ok {
		t.Error("a sketch whose bins the brackets split was trusted")
	}
}

// TestSelectorNaNKeys: NaNs of extreme keys (the largest and the smallest
// of all) and others are left out with one, two and four brackets (fewer
// than a pass's slots, and more), and the summary of a selector as made
// is Summarize's (the reference: a full sort, which leaves NaNs out).
func TestSelectorNaNKeys(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(61, 62))
	nans := []float64{math.Float64frombits(0x7fff_ffff_ffff_ffff), math.Float64frombits(0xffff_ffff_ffff_ffff),
		math.Float64frombits(0x7ff8_0000_0000_0001), math.Float64frombits(0xfff0_0000_0000_0001)}
	for _, brackets := range []int{1, 2, 4} {
		x := make([]float64, 20_000)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		for i, v := range nans {
			x[100*i+7] = v
		}
		sk := NewSketch(DefaultRelErr)
		sk.AddSlice(x)
		n := len(x) - len(nans)
		sel := NewSelector(n, DefaultOptions, x[:5000])
		for len(sel.brackets) > brackets { // fewer brackets: drop some, as a merge would
			sel.brackets = sel.brackets[:len(sel.brackets)-1]
		}
		for len(sel.brackets) < brackets { // more: split the last in two
			last := sel.brackets[len(sel.brackets)-1]
			mid := last[0] + (last[1]-last[0])/2
			sel.brackets = append(sel.brackets[:len(sel.brackets)-1], [2]uint64{last[0], mid}, [2]uint64{mid + 1, last[1]})
		}
		p := sel.Part()
		p.AddSlice(x) // must not panic
		for b, in := range p.inside {
			for _, v := range in {
				if v != v {
					t.Fatalf("%d brackets: a NaN in bracket %d", brackets, b)
				}
			}
		}
		if brackets == 1 {
			// The selector as made, on the same values: exact.
			sel := NewSelector(n, DefaultOptions, x[:5000])
			p := sel.Part()
			p.AddSlice(x)
			got, ok := sel.Summary(sk, []*SelectorPart{p})
			if want := Summarize(slices.Clone(x), DefaultOptions); !ok || !identicalSummary(got, want) {
				t.Errorf("ok %v,\ngot  %+v\nwant %+v", ok, got, want)
			}
		}
	}
}

// TestSelectorOpenPilot: a pilot too small to bracket with (empty, one
// value, NaNs alone) leaves every bracket open, and the summary is still
// Summarize's, bit for bit (the reference: a full sort).
func TestSelectorOpenPilot(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(31, 32))
	x := make([]float64, 5000)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	sk := NewSketch(DefaultRelErr)
	sk.AddSlice(x)
	want := Summarize(slices.Clone(x), DefaultOptions)
	for name, pilot := range map[string][]float64{"empty": nil, "one value": {0.3}, "NaNs": {math.NaN(), math.NaN()}} {
		ps := NewSketch(DefaultRelErr)
		ps.AddSlice(pilot)
		sel := NewSketchSelector(len(x), DefaultOptions, ps)
		if len(sel.brackets) != 1 || sel.brackets[0] != [2]uint64{radix.Key(math.Inf(-1)), radix.Key(math.Inf(1))} {
			t.Errorf("%s: brackets %v, want one open bracket", name, sel.brackets)
		}
		p := sel.Part()
		p.AddSlice(x)
		got, ok := sel.Summary(sk, []*SelectorPart{p})
		if !ok || !identicalSummary(got, want) {
			t.Errorf("%s: ok %v,\ngot  %+v\nwant %+v", name, ok, got, want)
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
