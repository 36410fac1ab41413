//go:build !amd64

package rockheat

// reportUnitPairs converts the leading even number of values of x as
// reportUnitLoop does, and reports whether any result is infinite or NaN.
func reportUnitPairs(x []float64, inv, off float64) bool {
	return reportUnitLoop(x[:len(x)&^1], inv, off)
}

// nonFinitePairs reports whether any of the leading even number of values
// of x is infinite or NaN.
func nonFinitePairs(x []float64) bool { return firstNonFinite(x[:len(x)&^1]) >= 0 }
