package water

import (
	"errors"
	"math"
	"testing"
)

// TestLiquidOrSaturated: the state is Liquid's where the water is liquid
// and SaturatedLiquid's where Liquid calls it steam, bit for bit, and the
// errors elsewhere are Liquid's.
func TestLiquidOrSaturated(t *testing.T) {
	t.Parallel()
	for _, T := range []float64{273.16, 300, 373.15, 450, 520, 600, 623.15} {
		for _, p := range []float64{1e3, 1e5, 1e6, 3e6, 1e7, 5e7, 1e8} {
			st, sat, err := LiquidOrSaturated(p, T)
			want, werr := Liquid(p, T)
			var se *StateError
			if errors.As(werr, &se) && se.Region == 2 {
				want, werr = SaturatedLiquid(T)
				if !sat {
					t.Errorf("p = %g, T = %g: steam side not reported as saturated", p, T)
				}
			} else if sat {
				t.Errorf("p = %g, T = %g: reported saturated, but Liquid gave %v", p, T, werr)
			}
			if (err == nil) != (werr == nil) || st != want {
				t.Errorf("p = %g, T = %g: %+v, %v; want %+v, %v", p, T, st, err, want, werr)
			}
		}
	}
	if _, _, err := LiquidOrSaturated(1e6, 700); err == nil {
		t.Error("T = 700 K, above region 1: no error")
	}
}

// TestLiquidOrSaturatedDensityCp: the density and heat capacity are those
// of LiquidOrSaturated's State, bit for bit, with the same saturated flag
// and the same errors, on a grid across region 1 and both sides of
// saturation, at its edges, and at 20 000 reservoir-like states.
func TestLiquidOrSaturatedDensityCp(t *testing.T) {
	t.Parallel()
	ps, Ts := benchStates(20_000)
	for _, T := range []float64{273.15, 273.16, 300, 373.15, 450, 520, 600, 623.15, 623.16, 700} {
		for _, p := range []float64{0, 1e3, 1e5, 1e6, 3e6, 1e7, 5e7, 1e8, 1.0001e8} {
			ps, Ts = append(ps, p), append(Ts, T)
		}
	}
	same := func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
	for i, p := range ps {
		T := Ts[i]
		rho, cp, sat, err := LiquidOrSaturatedDensityCp(p, T)
		st, wsat, werr := LiquidOrSaturated(p, T)
		switch {
		case (err == nil) != (werr == nil) || (err != nil && err.Error() != werr.Error()):
			t.Fatalf("p = %g, T = %g: error %v, LiquidOrSaturated %v", p, T, err, werr)
		case err == nil && (!same(rho, st.Density) || !same(cp, st.Cp) || sat != wsat):
			t.Fatalf("p = %g, T = %g: %v, %v, %v; LiquidOrSaturated %v, %v, %v", p, T, rho, cp, sat, st.Density, st.Cp, wsat)
		}
	}
}
