package sampler

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestTriangularQuantileIdentical holds Triangular.Quantile to the bits of
// gonum's distuv.Triangle.Quantile, for shapes skewed both ways, with the
// mode at either limit, symmetric, far from zero and of tiny width, at a
// dense grid of p, random p, the p on and next to the CDF at the mode, and
// the ends.
func TestTriangularQuantileIdentical(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(7, 7))
	for _, c := range []struct{ min, mode, max float64 }{
		{3, 6, 14}, {0, 0, 1}, {0, 1, 1}, {-1, 0, 1}, {150, 320, 200 + 170}, {1e9, 1e9 + 3, 1e9 + 7},
		{-5e-7, 1e-9, 2e-7}, {0.1, 0.7, 0.9}, {-300, -250, -1},
	} {
		d, err := NewTriangular(c.min, c.mode, c.max)
		check(t, err)
		ref := distuv.NewTriangle(c.min, c.max, c.mode, nil)
		f := (c.mode - c.min) / (c.max - c.min)
		ps := append(nudge(f, 8), 0, math.Copysign(0, -1), 1, math.Nextafter(1, 0), 0x1p-1074, 0x1p-1022, math.NaN())
		for i := range 20001 {
			ps = append(ps, float64(i)/20000)
		}
		for range 20000 {
			ps = append(ps, rng.Float64(), f*rng.Float64(), 1-math.Ldexp(rng.Float64(), -rng.IntN(50)))
		}
		var in []float64
		for _, p := range ps {
			if p < 0 || p > 1 {
				continue
			}
			if got, want := d.Quantile(p), ref.Quantile(p); !sameBits(got, want) {
				t.Fatalf("triangular(%g, %g, %g): Quantile(%v) = %v, distuv.Triangle %v", c.min, c.mode, c.max, p, got, want)
			}
			in = append(in, p)
		}
		// Quantiles, the column form (in pairs on amd64), in the order
		// above, sorted as a Latin hypercube takes them, and of odd and
		// even lengths.
		sorted := slices.Sorted(slices.Values(in))
		for _, col := range [][]float64{in, in[1:], sorted, sorted[:1], sorted[:2], sorted[:3]} {
			got := slices.Clone(col)
			d.Quantiles(got)
			for i, p := range col {
				if want := ref.Quantile(p); !sameBits(got[i], want) && !(math.IsNaN(got[i]) && math.IsNaN(want)) {
					t.Fatalf("triangular(%g, %g, %g): Quantiles gave %v at p = %v, distuv.Triangle %v", c.min, c.mode, c.max, got[i], p, want)
				}
			}
		}
	}
}

// TestTriangularQuantilesPanics: the column form panics at a p outside
// [0, 1] as Quantile does, first or second of a pair or last, after
// replacing the values before it.
func TestTriangularQuantilesPanics(t *testing.T) {
	t.Parallel()
	d, err := NewTriangular(0, 1, 2)
	check(t, err)
	for _, at := range []int{0, 3, 4, 6} {
		ps := []float64{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7}
		ps[at] = 1 + 1e-15
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("p out of range at %d: Quantiles did not panic", at)
				}
				for i := range at {
					if want := d.Quantile(float64(i+1) / 10); !sameBits(ps[i], want) {
						t.Errorf("p out of range at %d: value %d is %v before the panic, want %v", at, i, ps[i], want)
					}
				}
			}()
			d.Quantiles(ps)
		}()
	}
}

// TestTriangularQuantilePanics: p outside [0, 1] is a programmer's error,
// as in distuv.Triangle.
func TestTriangularQuantilePanics(t *testing.T) {
	t.Parallel()
	d, err := NewTriangular(0, 1, 2)
	check(t, err)
	for _, p := range []float64{-1e-300, 1 + 1e-15, math.Inf(1)} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("Quantile(%v) did not panic", p)
				}
			}()
			d.Quantile(p)
		}()
	}
}
