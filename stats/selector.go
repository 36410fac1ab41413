package stats

import (
	"cmp"
	"math"
	"slices"

	"rockheat/stats/radix"
)

// Selector finds, in one streaming pass over n values, the exact order
// statistics that a Summary needs, without keeping the values: from a
// pilot sample of the same values it brackets each needed rank with a
// range of values wide enough to hold it with overwhelming probability,
// made of whole bins of the pilot's sketch, gathers the values inside the
// brackets, and after the pass selects each order statistic from its
// bracket; a sketch of the same values counts those below each bracket,
// bin by bin, and checks the count inside. A bracket holds a few per cent
// of the values.
//
// A pass is split into SelectorParts, one per goroutine, each fed its
// share of the values in any order; the result does not depend on the
// split. When a needed rank falls outside its bracket (the pilot misled;
// with brackets at least 7 pilot standard errors wide, a chance below 1e-11),
// Summary says so and the caller summarises another way (a second pass,
// SummarizeAt).
type Selector struct {
	n        int
	level    float64
	ranks    []int       // the order statistics needed, sorted
	brackets [][2]uint64 // [lo, hi] in radix.Key order, sorted, disjoint, of whole sketch groups
	expect   []int       // values each bracket should gather in the pass, from the pilot (0 if unknown)
}

// NewSelector returns a selector for a pass over n values that are not
// NaN (the pass may hold NaNs besides), whose summary's intervals are at
// opt's level, bracketing from pilot, a random sample of the values (not
// changed; its NaNs are left out, and a pilot of NaNs alone brackets
// everything). It is NewSketchSelector with a sketch of pilot. It panics
// if opt is invalid or n < 1 or the pilot is empty.
func NewSelector(n int, opt Options, pilot []float64) *Selector {
	if len(pilot) == 0 {
		panic("stats: NewSelector with no pilot")
	}
	sk := NewSketch(DefaultRelErr)
	sk.AddSlice(pilot)
	return NewSketchSelector(n, opt, sk)
}

// NewSketchSelector returns a selector for a pass over n values that are
// not NaN (the pass may hold NaNs besides), whose summary's intervals are
// at opt's level, bracketing from pilot, a sketch of a random sample of
// the values. Each bracket runs from the pilot's order statistic 7
// standard errors (plus 2/m, for a pilot of m values) below the needed
// rank's probability to the one as far above it, each widened to the
// edges of the sketch bin that holds it, so no sort of the pilot is
// needed; a pilot of fewer than two values brackets everything. pilot is
// not changed. It panics if opt is invalid or n < 1.
func NewSketchSelector(n int, opt Options, pilot *Sketch) *Selector {
	level := opt.Level()
	if n < 1 {
		panic("stats: NewSketchSelector with no values")
	}
	s := &Selector{n: n, level: level, ranks: summaryRanks(n, level)}
	ends := s.pilotEnds(int(pilot.n))
	var pilotRanks []int
	for _, e := range ends {
		pilotRanks = append(pilotRanks, e[0], e[1])
	}
	slices.Sort(pilotRanks)
	pilotRanks = slices.DeleteFunc(slices.Compact(pilotRanks), func(k int) bool { return k < 0 })
	keyRange := pilot.rankKeyRanges(pilotRanks)
	at := func(k int) [2]uint64 {
		i, _ := slices.BinarySearch(pilotRanks, k)
		return keyRange[i]
	}
	for _, e := range ends {
		lo, hi := radix.Key(math.Inf(-1)), radix.Key(math.Inf(1)) // never a NaN's key
		if e[0] >= 0 {
			lo = at(e[0])[0]
		}
		if e[1] >= 0 {
			hi = at(e[1])[1]
		}
		s.brackets = append(s.brackets, [2]uint64{lo, hi})
	}
	s.brackets = mergeBrackets(s.brackets)
	s.expect = make([]int, len(s.brackets))
	if m := int(pilot.n); m > 0 {
		if _, inside, ok := pilot.bracketCounts(s.brackets); ok {
			for b, c := range inside {
				s.expect[b] = int(float64(c) / float64(m) * float64(n))
			}
		}
	}
	return s
}

// pilotEnds returns, for each needed rank but the extremes (which are
// tracked exactly), the ranks among a pilot of m values of its bracket's
// ends, −1 for an open end.
func (s *Selector) pilotEnds(m int) [][2]int {
	var ends [][2]int
	for _, r := range s.ranks {
		if r == 0 || r == s.n-1 {
			continue
		}
		e := [2]int{-1, -1}
		if m > 1 {
			p := float64(r) / float64(s.n-1)
			d := 7*math.Sqrt(p*(1-p)/float64(m)) + 2/float64(m)
			if k := math.Floor((p - d) * float64(m-1)); k >= 0 {
				e[0] = int(k)
			}
			if k := math.Ceil((p + d) * float64(m-1)); k < float64(m) {
				e[1] = int(k)
			}
		}
		ends = append(ends, e)
	}
	return ends
}

// mergeBrackets returns brackets sorted and with overlapping ones merged.
func mergeBrackets(brackets [][2]uint64) [][2]uint64 {
	slices.SortFunc(brackets, func(a, b [2]uint64) int { return cmp.Compare(a[0], b[0]) })
	merged := brackets[:0]
	for _, b := range brackets {
		if k := len(merged); k > 0 && b[0] <= merged[k-1][1] {
			merged[k-1][1] = max(merged[k-1][1], b[1])
			continue
		}
		merged = append(merged, b)
	}
	return merged
}

// summaryRanks returns the order statistics a Summary of n values needs
// at the level: the extremes, those of the type-7 P90, P50 and P10, and
// the ends of their intervals.
func summaryRanks(n int, level float64) []int {
	ranks := []int{0, n - 1}
	for _, q := range []float64{0.1, 0.5, 0.9} {
		l, h, _ := QuantileBounds(n, q, level)
		ranks = append(ranks, l, h)
	}
	return quantileRanks(ranks, n, 0.1, 0.5, 0.9)
}

// SelectorPart is one goroutine's share of a Selector's pass. It is not
// safe for concurrent use.
type SelectorPart struct {
	s        *Selector
	inside   [][]float64 // values inside each bracket
	gathered []float64   // scratch: the values of a pass inside some bracket
}

// Part returns a new part of the pass.
func (s *Selector) Part() *SelectorPart {
	return &SelectorPart{s: s, inside: make([][]float64, len(s.brackets))}
}

// Parts returns k new parts of the pass, for k goroutines that share it
// about equally. Each has room for its share of the values the pilot
// says each bracket will gather, and a tenth more, so that gathering
// seldom grows a bracket's slice (a copy, and fresh memory to fault in).
func (s *Selector) Parts(k int) []*SelectorPart {
	parts := make([]*SelectorPart, k)
	for i := range parts {
		p := s.Part()
		for b, e := range s.expect {
			p.inside[b] = make([]float64, 0, e/k+e/(10*k)+64)
		}
		parts[i] = p
	}
	return parts
}

// AddSlice adds the values x. A NaN lies in no bracket, so NaNs are left
// out, as in Summarize.
func (p *SelectorPart) AddSlice(x []float64) {
	for g := 0; g < len(p.s.brackets); g += len(selectorSlots{}.lo) {
		p.pass(x, g) // a Summary's brackets take one pass
	}
}

// selectorSlots are the brackets one pass of a part handles: bracket i
// holds the keys k with k − lo[i] ≤ width[i]. An unused slot repeats the
// first (no key is above every other: a NaN's may be the largest), so
// that it takes no value the first does not.
type selectorSlots struct{ lo, width [3]uint64 }

// pass gathers the values of x in brackets g, g+1 and g+2 (those that
// exist). Each value costs a few instructions without a branch: the loop
// tests with comparisons and gathers into a small buffer that the next
// value overwrites unless the value lies in a bracket. The values below
// each bracket are not counted here: the sketch of the same values gives
// them (see Summary).
func (p *SelectorPart) pass(x []float64, g int) {
	br := p.s.brackets
	var sl selectorSlots
	for i := range sl.lo {
		b := br[g]
		if g+i < len(br) {
			b = br[g+i]
		}
		sl.lo[i], sl.width[i] = b[0], b[1]-b[0]
	}
	lo0, lo1, lo2 := sl.lo[0], sl.lo[1], sl.lo[2]
	w0, w1, w2 := sl.width[0], sl.width[1], sl.width[2]
	gathered := p.gathered[:0]
	var buf [256]float64
	for rest := x; len(rest) > 0; {
		chunk := rest[:min(len(buf), len(rest))]
		rest = rest[len(chunk):]
		m := 0
		for _, v := range chunk {
			k := radix.Key(v)
			buf[m&(len(buf)-1)] = v
			m += b2i(k-lo0 <= w0) | b2i(k-lo1 <= w1) | b2i(k-lo2 <= w2)
		}
		gathered = append(gathered, buf[:m]...)
	}
	p.gathered = gathered
	for _, v := range gathered { // into their brackets, which are disjoint
		k := radix.Key(v)
		for i := range sl.lo {
			if k-sl.lo[i] <= sl.width[i] {
				p.inside[g+i] = append(p.inside[g+i], v)
				break
			}
		}
	}
}

// selectBracket returns the values at offsets offs (ascending) among the
// size values the parts gathered in bracket b, in the order of radix.Key.
func selectBracket(parts []*SelectorPart, b, size int, offs []int) []float64 {
	if len(offs) == 0 {
		return nil
	}
	keys := make([]uint64, 0, size)
	for _, p := range parts {
		for _, v := range p.inside[b] {
			keys = append(keys, radix.Key(v))
		}
	}
	vals := make([]float64, len(offs))
	for i, k := range radix.Select(keys, make([]uint64, len(keys)), offs) {
		vals[i] = radix.Float(k)
	}
	return vals
}

// b2i returns 1 for true and 0 for false; the compiler makes it a flag
// move, without a branch.
func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// Summary returns the exact Summary of the values the parts were fed, with
// the moments, extremes and NaN count of sk, as Summarize would give, and
// true; or false when a needed order statistic lies outside its bracket.
// sk must be a sketch of exactly the values the parts were fed, at a
// resolution whose bins the brackets do not split (the pilot's): it alone
// counts the values below each bracket. A sketch whose bins a bracket
// splits, or whose count inside a bracket differs from the parts', gives
// false.
func (s *Selector) Summary(sk *Sketch, parts []*SelectorPart) (Summary, bool) {
	n := int(sk.n)
	if n != s.n {
		panic("stats: Selector.Summary with a sketch of another count")
	}
	below, want, ok := sk.bracketCounts(s.brackets)
	inside := make([]int, len(s.brackets))
	for _, p := range parts {
		for b := range s.brackets {
			inside[b] += len(p.inside[b])
		}
	}
	if !ok || !slices.Equal(inside, want) {
		return Summary{}, false // brackets not of whole groups, or other values: never by construction
	}
	// Each needed rank's offset in its bracket, ascending in each, and
	// the rank itself.
	offs, ranks := make([][]int, len(s.brackets)), make([][]int, len(s.brackets))
	for _, r := range s.ranks {
		if r == 0 || r == n-1 {
			continue
		}
		found := false
		for b := range s.brackets {
			if off := r - below[b]; off >= 0 && off < inside[b] {
				offs[b], ranks[b], found = append(offs[b], off), append(ranks[b], r), true
				break
			}
		}
		if !found {
			return Summary{}, false
		}
	}
	stat := map[int]float64{0: sk.min, n - 1: sk.max} // exact, in key order
	for b := range s.brackets {
		for i, v := range selectBracket(parts, b, inside[b], offs[b]) {
			stat[ranks[b][i]] = v
		}
	}
	at := func(i int) float64 {
		v, ok := stat[i]
		if !ok {
			panic("stats: Selector asked for an order statistic it did not bracket")
		}
		return v
	}
	return build(n, int(sk.nan), at, sk.mom, s.level), true
}
