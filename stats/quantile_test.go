package stats

import (
	"math"
	"slices"
	"testing"
)

func TestQuantileType7(t *testing.T) {
	t.Parallel()
	oneToTen := []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10}
	numpyDoc := []float64{1, 2, 3, 4, 7, 10} // numpy.percentile docs array [[10, 7, 4], [3, 2, 1]], sorted
	for _, tc := range []struct {
		name string
		x    []float64
		q    float64
		want float64
	}{
		// R: quantile(1:10) (default type 7) prints 1.00 3.25 5.50 7.75 10.00 — from memory.
		{"R 1:10 q=0", oneToTen, 0, 1},
		{"R 1:10 q=0.25", oneToTen, 0.25, 3.25},
		{"R 1:10 q=0.5", oneToTen, 0.5, 5.5},
		{"R 1:10 q=0.75", oneToTen, 0.75, 7.75},
		{"R 1:10 q=1", oneToTen, 1, 10},
		// numpy.percentile documentation: np.percentile(a, 50) = 3.5 — from memory.
		{"numpy doc median", numpyDoc, 0.5, 3.5},
		// Derived from the type-7 formula, Hyndman & Fan (1996): h = 3·0.25 = 0.75.
		{"formula 1..4 q=0.25", []float64{1, 2, 3, 4}, 0.25, 1.75},
		// Derived: h = 4·0.1 = 0.4 → 10 + 0.4·(20 − 10).
		{"formula q=0.1", []float64{10, 20, 30, 40, 50}, 0.1, 14},
		{"single value", []float64{7.5}, 0.3, 7.5},
		{"ties", []float64{2, 2, 2, 5}, 0.5, 2},
		{"equal infinite ends", []float64{math.Inf(-1), math.Inf(-1), 1}, 0.25, math.Inf(-1)},
		// The limit of the formula as an end goes to ±∞ (analytic).
		{"-Inf and finite", []float64{math.Inf(-1), 1, 2}, 0.25, math.Inf(-1)},
		{"finite and +Inf", []float64{1, math.Inf(1)}, 0.5, math.Inf(1)},
	} {
		if got := Quantile(tc.x, tc.q); got != tc.want {
			t.Errorf("%s: Quantile(%v, %g) = %g, want %g", tc.name, tc.x, tc.q, got, tc.want)
		}
	}
}

// TestQuantileOrderStatistics checks the property of type 7 that
// q = k/(n−1) returns the order statistic x[k], and that the quantile
// function is non-decreasing in q.
func TestQuantileOrderStatistics(t *testing.T) {
	t.Parallel()
	for _, n := range []int{2, 3, 11, 101, 1000} {
		x := lognormal(n, 0, 1, uint64(n))
		slices.Sort(x)
		for k := range n {
			q := float64(k) / float64(n-1)
			if got := Quantile(x, q); got != x[k] {
				t.Errorf("n=%d: Quantile(q=%d/%d) = %v, want x[%d] = %v", n, k, n-1, got, k, x[k])
			}
		}
		prev := math.Inf(-1)
		for i := 0; i <= 1000; i++ {
			v := Quantile(x, float64(i)/1000)
			if v < prev {
				t.Fatalf("n=%d: Quantile decreases at q=%g: %v < %v", n, float64(i)/1000, v, prev)
			}
			prev = v
		}
	}
}

func TestExceedance(t *testing.T) {
	t.Parallel()
	for _, n := range []int{11, 101, 1001, 12345} {
		x := lognormal(n, 2, 0.5, uint64(n))
		slices.Sort(x)
		p90, p50, p10 := Exceedance(x, 0.9), Exceedance(x, 0.5), Exceedance(x, 0.1)
		// The exceedance convention of the package doc: P90 = Q(0.1), P10 = Q(0.9).
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"P90", p90, Quantile(x, 0.1)},
			{"P50", p50, Quantile(x, 0.5)},
			{"P10", p10, Quantile(x, 0.9)},
		} {
			if c.got != c.want {
				t.Errorf("n=%d: %s = %v, want %v", n, c.name, c.got, c.want)
			}
		}
		if !(p90 <= p50 && p50 <= p10) {
			t.Errorf("n=%d: P90 %v, P50 %v, P10 %v not ordered", n, p90, p50, p10)
		}
		// At n = 10k+1, h = (n−1)·0.1 is an integer: P90 is an order statistic.
		if (n-1)%10 == 0 && p90 != x[(n-1)/10] {
			t.Errorf("n=%d: P90 = %v, want order statistic x[%d] = %v", n, p90, (n-1)/10, x[(n-1)/10])
		}
	}
}

func TestQuantilePanics(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		f    func()
	}{
		{"empty", func() { Quantile(nil, 0.5) }},
		{"q<0", func() { Quantile([]float64{1}, -0.1) }},
		{"q>1", func() { Quantile([]float64{1}, 1.1) }},
		{"q NaN", func() { Quantile([]float64{1}, math.NaN()) }},
		{"p>1", func() { Exceedance([]float64{1}, 2) }},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", tc.name)
				}
			}()
			tc.f()
		}()
	}
}
