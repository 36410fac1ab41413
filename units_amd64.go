package rockheat

// reportUnitPairs converts the leading even number of values of x as
// reportUnitLoop does, two at a time (units_amd64.s), and reports whether
// any result is infinite or NaN.
//
//go:noescape
func reportUnitPairs(x []float64, inv, off float64) bool

// nonFinitePairs reports whether any of the leading even number of values
// of x is infinite or NaN, two at a time (units_amd64.s).
//
//go:noescape
func nonFinitePairs(x []float64) bool
