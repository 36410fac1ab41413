package sampler

import (
	"math"
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
