package sampler

import (
	"errors"
	"math/rand/v2"

	"gonum.org/v1/gonum/mat"
)

// TEMPORARY until correlate.go lands.
func correlate(cols [][]float64, target *mat.SymDense, rng *rand.Rand) error {
	return errors.New("correlation not wired yet")
}
