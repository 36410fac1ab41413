package stats

import (
	"fmt"
	"testing"
)

var benchSizes = []int{1e3, 1e5, 1e6, 1e7}

func BenchmarkSummarize(b *testing.B) {
	for _, n := range benchSizes {
		x := lognormal(n, 40, 1, 1)
		work := make([]float64, n)
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			for b.Loop() {
				copy(work, x) // Summarize sorts in place
				Summarize(work, DefaultOptions)
			}
		})
	}
}

func BenchmarkSketchAdd(b *testing.B) {
	for _, n := range benchSizes {
		x := lognormal(n, 40, 1, 1)
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			for b.Loop() {
				s := NewSketch(DefaultRelErr)
				s.AddSlice(x)
			}
		})
	}
}

func BenchmarkSketchSummary(b *testing.B) {
	s := NewSketch(DefaultRelErr)
	s.AddSlice(lognormal(1e6, 40, 1, 1))
	for b.Loop() {
		s.Summary(DefaultOptions)
	}
}

func BenchmarkSpearman(b *testing.B) {
	for _, n := range benchSizes {
		x, y := lognormal(n, 0, 1, 1), normal(n, 0, 1, 2)
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			for b.Loop() {
				Spearman(x, y)
			}
		})
	}
}

func BenchmarkQuantileBounds(b *testing.B) {
	for _, n := range []int{1e3, 1e6, 1e9} {
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			for b.Loop() {
				QuantileBounds(n, 0.1, 0.95)
			}
		})
	}
}
