package stats

import (
	"fmt"
	"testing"
)

// BenchmarkSketchAddSlice measures AddSlice per value on one batch of
// 2^16 values (the size a run adds at a time) into a long-lived sketch:
// lognormal values of one sign, spread over more binades than a window
// sum takes (moments.addExps) and over fewer, as a reservoir's outputs
// (moments.addWindow), and normal values of both signs.
func BenchmarkSketchAddSlice(b *testing.B) {
	const n = 1 << 16
	for _, c := range []struct {
		name string
		x    []float64
	}{
		{"lognormal", lognormal(n, 40, 1, 1)},
		{"lognormal-narrow", lognormal(n, 40, 0.3, 1)},
		{"normal", normal(n, 0, 1, 2)},
	} {
		b.Run(c.name, func(b *testing.B) {
			s := NewSketch(DefaultRelErr)
			for b.Loop() {
				s.AddSlice(c.x)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*n), "ns/value")
		})
	}
}

// BenchmarkSketchAddOne measures Add, one value at a time.
func BenchmarkSketchAddOne(b *testing.B) {
	const n = 1 << 16
	x := lognormal(n, 40, 1, 1)
	s := NewSketch(DefaultRelErr)
	for b.Loop() {
		for _, v := range x {
			s.Add(v)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*n), "ns/value")
}

// BenchmarkSketchMerge measures merging two sketches of 10⁵ values each.
func BenchmarkSketchMerge(b *testing.B) {
	for _, n := range []int{1e5} {
		a, o := NewSketch(DefaultRelErr), NewSketch(DefaultRelErr)
		a.AddSlice(lognormal(n, 40, 1, 1))
		o.AddSlice(lognormal(n, 40, 1, 2))
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			for b.Loop() {
				a.Merge(o)
			}
		})
	}
}
