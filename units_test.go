package rockheat

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestToReportUnit: the conversion to report units gives every value as
// float64(v·(1/Scale)) − Offset, bit for bit, two at a time or one
// (odd lengths), for the identity (only the check), a pure scaling
// (J → EJ), a pure shift (K → °C) and both, and finds the first value
// that is infinite or NaN, wherever it lies in a pair, including one that
// only the scaling makes infinite.
func TestToReportUnit(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(5, 6))
	base := make([]float64, 1001)
	for i := range base {
		base[i] = math.Ldexp(rng.Float64()+0.5, rng.IntN(120)-40) * float64(1-2*rng.IntN(2))
	}
	base[7], base[8] = 0, math.Copysign(0, -1)
	for _, sp := range []OutputSpec{{Scale: 1}, {Scale: 1e18}, {Scale: 1, Offset: 273.15}, {Scale: 1e6, Offset: -3}, {Scale: 1e-300}} {
		inv, off := 1/sp.Scale, sp.Offset
		for _, n := range []int{0, 1, 2, 3, 1000, 1001} {
			x := slices.Clone(base[:n])
			bad := toReportUnit(x, sp)
			wantBad := -1
			for i, v := range base[:n] {
				want := float64(v*inv) - off
				if !sameBits(x[i], want) {
					t.Fatalf("scale %g, offset %g, length %d: value %d = %v, want %v", sp.Scale, sp.Offset, n, i, x[i], want)
				}
				if wantBad < 0 && (math.IsInf(want, 0) || math.IsNaN(want)) {
					wantBad = i
				}
			}
			if bad != wantBad || (sp.Scale == 1e-300 && n >= 1000 && bad < 0) {
				t.Errorf("scale %g, offset %g, length %d: first non-finite %d, want %d", sp.Scale, sp.Offset, n, bad, wantBad)
			}
		}
		for _, at := range []int{0, 1, 4, 5, 10} {
			for _, v := range []float64{math.Inf(1), math.Inf(-1), math.NaN()} {
				x := slices.Clone(base[:11])
				x[at] = v
				if got := toReportUnit(x, sp); got != at && !(sp.Scale == 1e-300 && got < at) {
					t.Errorf("scale %g: %v at %d reported at %d", sp.Scale, v, at, got)
				}
			}
		}
	}
}

// sameBits reports whether a and b have the same bits.
func sameBits(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
