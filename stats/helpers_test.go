package stats

import (
	"math/rand/v2"

	"gonum.org/v1/gonum/stat/distuv"
)

// lognormal returns n draws of LogNormal(mu, sigma) from a fixed random stream.
func lognormal(n int, mu, sigma float64, stream uint64) []float64 {
	d := distuv.LogNormal{Mu: mu, Sigma: sigma, Src: rand.New(rand.NewPCG(stream, 2))}
	x := make([]float64, n)
	for i := range x {
		x[i] = d.Rand()
	}
	return x
}

// normal returns n draws of Normal(mu, sigma) from a fixed random stream.
func normal(n int, mu, sigma float64, stream uint64) []float64 {
	d := distuv.Normal{Mu: mu, Sigma: sigma, Src: rand.New(rand.NewPCG(stream, 3))}
	x := make([]float64, n)
	for i := range x {
		x[i] = d.Rand()
	}
	return x
}

// within reports whether |got − want| ≤ tol.
func within(got, want, tol float64) bool {
	d := got - want
	return d <= tol && -d <= tol
}
