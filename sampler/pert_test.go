package sampler

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// sameBits reports whether a and b are the same float64, or both NaN.
func sameBits(a, b float64) bool {
	return math.Float64bits(a) == math.Float64bits(b) || (math.IsNaN(a) && math.IsNaN(b))
}

// nudge returns the values within n ulps of p.
func nudge(p float64, n int) []float64 {
	out := []float64{p}
	lo, hi := p, p
	for range n {
		lo, hi = math.Nextafter(lo, math.Inf(-1)), math.Nextafter(hi, math.Inf(1))
		out = append(out, lo, hi)
	}
	return out
}

// TestBetaDensityMatchesGonum: the direct table's density is gonum's
// distuv.Beta.Prob, bit for bit, at shapes of PERT halves and at x across
// [0, 1] including its ends.
func TestBetaDensityMatchesGonum(t *testing.T) {
	t.Parallel()
	for _, sh := range [][2]float64{{1, 1}, {1.8, 3.4}, {3, 3}, {1.04, 4.96}, {4.9, 1.1}, {2.5, 1}} {
		ref := distuv.Beta{Alpha: sh[0], Beta: sh[1]}
		d := newBetaDensity(ref)
		for i := 0; i <= 1000; i++ {
			x := float64(i) / 1000
			if got, want := d.prob(x), ref.Prob(x); math.Float64bits(got) != math.Float64bits(want) {
				t.Errorf("Beta(%g, %g) at %g: %v, gonum %v", sh[0], sh[1], x, got, want)
			}
		}
	}
}

// TestPERTSearchIndex: the search index finds, for any t, the node a
// binary search of the nodes finds (sort.Search, the reference it
// replaces): at every node's t and the floats next to it, at 0 and past
// the last node, and at random t, for skewed, symmetric and extreme
// shapes, in both halves.
func TestPERTSearchIndex(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(5, 6))
	for _, c := range [][3]float64{{0.02, 0.06, 0.12}, {0, 0.5, 1}, {0, 0, 1}, {0, 1, 1}, {0, 0.25, 1}} {
		d, err := NewPERT(c[0], c[1], c[2])
		check(t, err)
		for _, h := range []*halfTable{&d.tab.lo, &d.tab.hi} {
			if h.start == nil {
				t.Fatalf("pert%v: no search index", c)
			}
			last := h.node[len(h.node)-1].t
			probes := []float64{0, last, 2 * last, math.Inf(1)}
			for _, n := range h.node {
				probes = append(probes, nudge(n.t, 2)...)
			}
			for range 20000 {
				probes = append(probes, rng.Float64()*last*1.01)
			}
			for _, tv := range probes {
				want := sort.Search(len(h.node), func(i int) bool { return h.node[i].t >= tv })
				if got := h.above(tv); got != want {
					t.Fatalf("pert%v, a = %g: above(%v) = %d, binary search %d", c, h.a, tv, got, want)
				}
			}
		}
	}
}

// TestClampSameBits: clamp gives the bits of the built-in min(max(x, lo),
// hi) (Go specification, "Min and max") for every x, limits included,
// signed zeros, infinities and NaN among them.
func TestClampSameBits(t *testing.T) {
	t.Parallel()
	inf, nan := math.Inf(1), math.NaN()
	vals := []float64{-inf, -2, -1, math.Copysign(0, -1), 0, 1e-310, 1, 2, inf, nan}
	for _, x := range vals {
		for _, lo := range vals {
			for _, hi := range vals {
				if got, want := clamp(x, lo, hi), min(max(x, lo), hi); !sameBits(got, want) {
					t.Errorf("clamp(%v, %v, %v) = %v, min(max(…)) %v", x, lo, hi, got, want)
				}
			}
		}
	}
}
