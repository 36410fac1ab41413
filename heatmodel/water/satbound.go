package water

import "math"

// The saturation bound: an upper bound of the saturation pressure by a
// table, so that a state whose pressure clears it is liquid without
// Eq. 30 (saturationPressure, with a division and a square root). The
// table holds p_s at every satBoundStep from MinTemperature to
// Region1MaxTemperature, raised by satBoundMargin; p_s increases with T,
// so the entry at the grid point at or above T bounds p_s(T). The margin
// covers the rounding of Eq. 30 as computed (a few units in the last
// place, far below 10⁻⁹) and of the grid index; TestSaturationBound
// checks the bound at a dense sample of temperatures and at every grid
// point and its neighbours. A state below the bound is decided by Eq. 30
// itself, so the outcome is always saturationPressure's.
const (
	satBoundStep   = 0.5  // K
	satBoundMargin = 1e-9 // relative
)

// satBound is the table of the bound: satBound[i] ≥ p_s(T) for T at or
// below MinTemperature + i·satBoundStep.
var satBound = func() []float64 {
	n := int(math.Ceil((Region1MaxTemperature-MinTemperature)/satBoundStep)) + 2
	t := make([]float64, n)
	for i := range t {
		t[i] = saturationPressure(MinTemperature+float64(i)*satBoundStep) * (1 + satBoundMargin)
	}
	return t
}()

// saturationBound returns an upper bound of the saturation pressure at T,
// Pa, for MinTemperature ≤ T ≤ Region1MaxTemperature.
func saturationBound(T float64) float64 {
	return satBound[int((T-MinTemperature)*(1/satBoundStep))+1]
}
