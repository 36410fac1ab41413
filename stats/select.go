package stats

import (
	"math"

	"rockheat/stats/radix"
)

// SummarizeAt returns the Summary of x, exactly as Summarize does, and
// x's type-7 quantiles (see Quantile) at the probabilities qs, without
// sorting x and without a copy of it. A quantile sketch, filled in one
// pass, locates the bins that hold the order statistics the summary and
// the quantiles need; a second pass gathers just the values in those
// bins, and sorting them gives the exact order statistics, bit for bit
// those of a full sort (−0 before +0, as Summarize orders them). x is not
// changed. It costs two passes over x and memory for the sketch and the
// gathered values, typically a few per cent of x, instead of Summarize's
// 16 bytes a value. It panics if opt is invalid or a q is outside [0, 1].
func SummarizeAt(x []float64, opt Options, qs []float64) (Summary, []float64) {
	level := opt.Level()
	sk := NewSketch(DefaultRelErr)
	sk.AddSlice(x)
	n := int(sk.n)
	curve := make([]float64, len(qs))
	if n == 0 {
		for i := range curve {
			curve[i] = math.NaN()
		}
		return build(0, int(sk.nan), nil, sk.mom, level), curve
	}
	ranks := quantileRanks(summaryRanks(n, level), n, qs...)
	stat := sk.orderStatistics(x, ranks)
	at := func(i int) float64 {
		v, ok := stat[i]
		if !ok {
			panic("stats: SummarizeAt asked for an order statistic it did not gather")
		}
		return v
	}
	for i, q := range qs {
		curve[i] = quantileAt(n, q, at)
	}
	return build(n, int(sk.nan), at, sk.mom, level), curve
}

// orderStatistics returns the order statistics of x (whose values s
// holds, x itself) at ranks, which are sorted and in [0, n).
func (s *Sketch) orderStatistics(x []float64, ranks []int) map[int]float64 {
	// Walk the groups in ascending order of value, noting the group and
	// the offset of each rank.
	type want struct{ rank, group, offset int }
	var wants []want
	var groups []group
	next, cum := 0, 0
	s.groups(func(g group, c uint64) bool {
		end := cum + int(c)
		for next < len(ranks) && ranks[next] < end {
			if len(groups) == 0 || groups[len(groups)-1] != g {
				groups = append(groups, g)
			}
			wants = append(wants, want{ranks[next], len(groups) - 1, ranks[next] - cum})
			next++
		}
		cum = end
		return next < len(ranks)
	})

	// Look-ups from a value's bin to its wanted group (number + 1, or 0):
	// dense over the span of wanted bins of each sign.
	var pos, neg wantSpan
	var special [groupKinds]int32
	for gi, g := range groups {
		switch {
		case g.kind != binGroup:
			special[g.kind] = int32(gi + 1)
		case g.neg:
			neg.cover(g.index)
		default:
			pos.cover(g.index)
		}
	}
	pos.make()
	neg.make()
	for gi, g := range groups {
		if g.kind == binGroup {
			if g.neg {
				neg.set(g.index, int32(gi+1))
			} else {
				pos.set(g.index, int32(gi+1))
			}
		}
	}
	vals := make([][]float64, len(groups))
	for _, v := range x {
		var gi int32
		switch {
		case v > 0 && v <= math.MaxFloat64:
			gi = pos.get(s.tab.index(v))
		case v < 0 && v >= -math.MaxFloat64:
			gi = neg.get(s.tab.index(-v))
		case v == 0:
			gi = special[zeroGroup]
		case v > 0:
			gi = special[posInfGroup]
		case v < 0:
			gi = special[negInfGroup]
		}
		if gi > 0 {
			vals[gi-1] = append(vals[gi-1], v)
		}
	}
	for _, vs := range vals {
		sortKeyed(vs)
	}
	out := make(map[int]float64, len(wants))
	for _, w := range wants {
		out[w.rank] = vals[w.group][w.offset]
	}
	return out
}

// wantSpan maps the bin indices lo … hi to group numbers (+1; 0 for
// none), densely.
type wantSpan struct {
	lo, hi int
	set0   bool
	at     []int32
}

func (w *wantSpan) cover(i int) {
	if !w.set0 {
		w.lo, w.hi, w.set0 = i, i, true
	}
	w.lo, w.hi = min(w.lo, i), max(w.hi, i)
}

func (w *wantSpan) make() {
	if w.set0 {
		w.at = make([]int32, w.hi-w.lo+1)
	}
}

func (w *wantSpan) set(i int, g int32) { w.at[i-w.lo] = g }

func (w *wantSpan) get(i int) int32 {
	if k := i - w.lo; uint(k) < uint(len(w.at)) {
		return w.at[k]
	}
	return 0
}

// sortKeyed sorts x, which holds no NaN, in the order of radix.Key (−0
// before +0), as Summarize's sort orders values.
func sortKeyed(x []float64) {
	if len(x) < 2 {
		return
	}
	keys := make([]uint64, len(x))
	for i, v := range x {
		keys[i] = radix.Key(v)
	}
	keys, _ = radix.Sort(keys, make([]uint64, len(x)), 0, nil, nil)
	for i, k := range keys {
		x[i] = radix.Float(k)
	}
}
