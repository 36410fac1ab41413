//go:build !amd64

package sampler

// triangularPairs replaces none of ps: Triangular.Quantiles takes them
// one at a time.
func triangularPairs(ps []float64, k *[6]float64) int { return 0 }
