package water

import (
	"errors"
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
