package heatmodel

import (
	"math"
	"testing"

	"rockheat/heatmodel/water"
)

// TestAvailableWorkSaturatedLiquid checks the specific available work of
// saturated liquid against the dead state at 15 °C and 0.101325 MPa,
// h0 = 63.0790 kJ/kg, s0 = 0.224456 kJ/(kg·K), with IAPWS-IF97 properties
// (package water), against the values of docs/references.md §8 (derived from the
// USGS Circular 790 formula with IF97): 150 °C 103.091 kJ/kg, 200 °C
// 182.371, 250 °C 282.370, 300 °C 408.516.
func TestAvailableWorkSaturatedLiquid(t *testing.T) {
	t.Parallel()
	const t0 = 288.15
	dead, err := water.Liquid(101325, t0)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(dead.Enthalpy/1e3-63.0790) > 5e-4 || math.Abs(dead.Entropy/1e3-0.224456) > 5e-6 {
		t.Errorf("dead state h0 = %.4f kJ/kg, s0 = %.6f kJ/(kg·K)", dead.Enthalpy/1e3, dead.Entropy/1e3)
	}
	for _, c := range []struct{ tc, w float64 }{{150, 103.091}, {200, 182.371}, {250, 282.370}, {300, 408.516}} {
		wh, err := water.SaturatedLiquid(c.tc + 273.15)
		if err != nil {
			t.Fatal(err)
		}
		w := AvailableWork(wh.Enthalpy, wh.Entropy, dead.Enthalpy, dead.Entropy, t0) / 1e3
		if math.Abs(w-c.w) > 1e-3 {
			t.Errorf("%g °C: w = %.4f kJ/kg, want %.3f", c.tc, w, c.w)
		}
		// W/Qr times the enthalpy drop is the work itself.
		f := ExergyFraction(wh.Enthalpy, wh.Entropy, dead.Enthalpy, dead.Entropy, t0)
		if math.Abs(f*(wh.Enthalpy-dead.Enthalpy)/1e3-w) > 1e-9 {
			t.Errorf("%g °C: fraction %g inconsistent with w", c.tc, f)
		}
	}
	if f := ExergyFraction(dead.Enthalpy, dead.Entropy, dead.Enthalpy, dead.Entropy, t0); f != 0 {
		t.Errorf("fraction at the dead state = %g, want 0", f)
	}
}
