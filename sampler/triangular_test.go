package sampler

import (
	"math"
	"math/rand/v2"
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
		for _, p := range ps {
			if p < 0 || p > 1 {
				continue
			}
			if got, want := d.Quantile(p), ref.Quantile(p); !sameBits(got, want) {
				t.Fatalf("triangular(%g, %g, %g): Quantile(%v) = %v, distuv.Triangle %v", c.min, c.mode, c.max, p, got, want)
			}
		}
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
