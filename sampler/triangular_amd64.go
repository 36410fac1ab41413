package sampler

// triangularPairs is Triangular.Quantiles for the leading pairs of ps
// whose p lie in [0, 1], two at a time in SSE2, with k = {f, ba, ca, bc,
// min, max}; it returns how many values it replaced (see
// triangular_amd64.s).
//
//go:noescape
func triangularPairs(ps []float64, k *[6]float64) int
