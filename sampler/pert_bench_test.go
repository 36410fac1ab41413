package sampler

import (
	"testing"
)

// benchProbs returns n probabilities in (0, 1) drawn as Fill draws them.
func benchProbs(n int) []float64 {
	rng := newPCG(1, 1)
	p := make([]float64, n)
	for i := range p {
		p[i] = open01(rng)
	}
	return p
}

// pertBenchShapes are the (min, mode, max) of the PERT benchmarks: skewed
// (α = 2.6), symmetric (α = 3), mode at the lower limit (α = 1) and at a
// quarter of the range (α = 2, where p^(1/α) is a square root).
var pertBenchShapes = []struct {
	name           string
	min, mode, max float64
}{
	{"skewed", 0.02, 0.06, 0.12},
	{"symmetric", 0, 0.5, 1},
	{"mode=min", 0, 0, 1},
	{"alpha=2", 0, 0.25, 1},
}

// BenchmarkPERTQuantile measures one PERT draw through the Distribution
// interface, as Plan.Fill makes it.
func BenchmarkPERTQuantile(b *testing.B) {
	ps := benchProbs(1 << 12)
	for _, c := range pertBenchShapes {
		pert, err := NewPERT(c.min, c.mode, c.max)
		if err != nil {
			b.Fatal(err)
		}
		var d Distribution = pert
		b.Run(c.name, func(b *testing.B) {
			s := 0.0
			for b.Loop() {
				for _, p := range ps {
					s += d.Quantile(p)
				}
			}
			sink = s
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(ps)), "ns/draw")
		})
	}
}

// BenchmarkTriangularQuantile measures one triangular draw through the
// Distribution interface, as Plan.Fill makes it.
func BenchmarkTriangularQuantile(b *testing.B) {
	ps := benchProbs(1 << 12)
	tri, err := NewTriangular(3, 6, 14)
	if err != nil {
		b.Fatal(err)
	}
	var d Distribution = tri
	s := 0.0
	for b.Loop() {
		for _, p := range ps {
			s += d.Quantile(p)
		}
	}
	sink = s
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(ps)), "ns/draw")
}

var sink float64

// BenchmarkNewPERT measures the building of a PERT's quantile tables,
// which every run with a PERT input pays once per distribution.
func BenchmarkNewPERT(b *testing.B) {
	for b.Loop() {
		if _, err := NewPERT(0.02, 0.06, 0.12); err != nil {
			b.Fatal(err)
		}
	}
}
