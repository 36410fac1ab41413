package heatmodel

// AvailableWork returns the specific available work (exergy) of a fluid at
// wellhead enthalpy h (J/kg) and entropy s (J/(kg·K)) relative to a dead
// state h0, s0 at absolute temperature t0 (K), J/kg:
//
//	w = (h − h0) − T0·(s − s0)
//
// as in the USGS assessments (USGS Circular 790, Muffler ed. 1979;
// Williams, Reed & Mariner 2008), where the wellhead fluid is saturated
// liquid at the reservoir temperature.
func AvailableWork(h, s, h0, s0, t0 float64) float64 {
	return (h - h0) - t0*(s-s0)
}

// ExergyFraction returns the available work per joule of recoverable heat,
// W/Qr, dimensionless: with the produced mass m = Qr/(h − h0) of the USGS
// method, W = m·[(h − h0) − T0·(s − s0)], so
//
//	W/Qr = 1 − T0·(s − s0)/(h − h0).
//
// It is 0 when h ≤ h0 (no heat above the dead state). Units as
// AvailableWork.
func ExergyFraction(h, s, h0, s0, t0 float64) float64 {
	if h <= h0 {
		return 0
	}
	return AvailableWork(h, s, h0, s0, t0) / (h - h0)
}
