package stats

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat/distuv"
)

// TestProportionInterval checks the Clopper–Pearson interval against its
// closed forms at the ends, (1 − level)/2 = a: for k = 0 the upper limit
// solves (1 − p)^n = a, p = 1 − a^(1/n); for k = n the lower limit solves
// p^n = a, p = a^(1/n) (Clopper & Pearson 1934); and, in between, against
// its definition: the binomial tails at the limits are a
// (gonum's distuv.Binomial CDF).
func TestProportionInterval(t *testing.T) {
	t.Parallel()
	const level = 0.95
	a := (1 - level) / 2
	for _, n := range []int{1, 10, 1000} {
		if iv := ProportionInterval(0, n, level); iv.Lo != 0 || !scalar.EqualWithinRel(iv.Hi, 1-math.Pow(a, 1/float64(n)), 1e-9) {
			t.Errorf("k = 0, n = %d: %+v, want [0, %g]", n, iv, 1-math.Pow(a, 1/float64(n)))
		}
		if iv := ProportionInterval(n, n, level); iv.Hi != 1 || !scalar.EqualWithinRel(iv.Lo, math.Pow(a, 1/float64(n)), 1e-9) {
			t.Errorf("k = n = %d: %+v, want [%g, 1]", n, iv, math.Pow(a, 1/float64(n)))
		}
	}
	for _, c := range []struct{ k, n int }{{3, 10}, {50, 100}, {417, 20000}} {
		iv := ProportionInterval(c.k, c.n, level)
		// P(X ≥ k | p = Lo) = a and P(X ≤ k | p = Hi) = a.
		upper := 1 - distuv.Binomial{N: float64(c.n), P: iv.Lo}.CDF(float64(c.k-1))
		lower := distuv.Binomial{N: float64(c.n), P: iv.Hi}.CDF(float64(c.k))
		if !scalar.EqualWithinAbs(upper, a, 1e-7) || !scalar.EqualWithinAbs(lower, a, 1e-7) {
			t.Errorf("k = %d, n = %d: [%g, %g] has tails %g and %g, want %g", c.k, c.n, iv.Lo, iv.Hi, upper, lower, a)
		}
		if p := float64(c.k) / float64(c.n); !(iv.Lo < p && p < iv.Hi) || !iv.OK() {
			t.Errorf("k = %d, n = %d: [%g, %g] does not hold k/n or is not OK", c.k, c.n, iv.Lo, iv.Hi)
		}
	}
}
