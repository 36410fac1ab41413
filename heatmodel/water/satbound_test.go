package water

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestSaturationBound: the table bound is at or above Eq. 30 as computed
// (saturationPressure) at every grid temperature, its neighbours a few
// units in the last place away, and 200 000 random temperatures across
// region 1, and below Eq. 30 two steps higher, so that it stays useful;
// and the decision it shortens is Eq. 30's for states on, just above and
// just below the saturation line.
func TestSaturationBound(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(31, 32))
	var Ts []float64
	for i := 0; MinTemperature+float64(i)*satBoundStep <= Region1MaxTemperature; i++ {
		g := MinTemperature + float64(i)*satBoundStep
		Ts = append(Ts, g, math.Nextafter(g, 0), math.Nextafter(g, 1e3),
			math.Nextafter(math.Nextafter(g, 1e3), 1e3), g-1e-9, g+1e-9)
	}
	for range 200_000 {
		Ts = append(Ts, MinTemperature+rng.Float64()*(Region1MaxTemperature-MinTemperature))
	}
	for _, T := range Ts {
		if T < MinTemperature || T > Region1MaxTemperature {
			continue
		}
		ps, bound := saturationPressure(T), saturationBound(T)
		if !(bound >= ps) {
			t.Fatalf("T = %v K: bound %v Pa below p_s %v Pa", T, bound, ps)
		}
		if T+2*satBoundStep <= Region1MaxTemperature && !(bound < saturationPressure(T+2*satBoundStep)) {
			t.Fatalf("T = %v K: bound %v Pa not below p_s two steps higher, %v Pa", T, bound, saturationPressure(T+2*satBoundStep))
		}
		for _, p := range []float64{ps, math.Nextafter(ps, 0), math.Nextafter(ps, math.Inf(1)), ps * (1 + 1e-12), ps * (1 - 1e-12), bound, math.Nextafter(bound, 0)} {
			pe, sat, ok := liquidPressure(p, T)
			wantSat := p < ps
			if want := map[bool]float64{true: ps, false: p}[wantSat]; !ok || sat != wantSat || pe != want {
				t.Fatalf("T = %v K, p = %v Pa (p_s %v): liquidPressure %v, %v, %v; want %v, %v", T, p, ps, pe, sat, ok, want, wantSat)
			}
		}
	}
}
