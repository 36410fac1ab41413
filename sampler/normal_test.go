package sampler

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mathext"
)

// TestNormalQuantileTable checks the tabulated standard normal quantile
// against gonum's mathext.NormalQuantile (Wichura's AS 241, accurate to
// about 1e-16 relative) to the bound stated at normalCells, 1e-12, over
// random p, every node of the middle and tail tables, the p just below
// each node, a random p in each tail step, and the ends of the tables;
// and that it is odd about p = 1/2 and increasing.
func TestNormalQuantileTable(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(7, 8))
	var probes []float64
	for range 200_000 {
		probes = append(probes, rng.Float64())
	}
	for k := range normalTable.node {
		p := normalLo + float64(k)*normalTable.step
		probes = append(probes, p, math.Nextafter(p, 0), 1-p, math.Nextafter(1-p, 1))
	}
	for _, b := range normalTail.bin { // every tail node, and just below it
		for k := range b.node {
			p := b.lo + float64(k)*b.step
			probes = append(probes, p, math.Nextafter(p, 0), 1-p, b.lo+(float64(k)+rng.Float64())*b.step)
		}
	}
	probes = append(probes, 0x1p-20, math.Nextafter(0x1p-20, 0), 1-0x1p-20, 1e-300, 1e-10, normalLo, math.Nextafter(normalLo, 0), 0.5, 1-normalLo, 1-1e-10)
	worst := 0.0
	for _, p := range probes {
		got, want := normalQuantile(p), mathext.NormalQuantile(p)
		worst = max(worst, math.Abs(got-want))
	}
	if worst > 1e-12 {
		t.Errorf("max |z − z_gonum| = %.3g, want ≤ 1e-12", worst)
	}
	for range 10_000 {
		p := 0.5 + rng.Float64()*(0.5-0x1p-20) // 1 − p exact (Sterbenz)
		if a, b := normalQuantile(p), normalQuantile(1-p); a != -b {
			t.Fatalf("z(%v) = %v but z(1 − p) = %v", p, a, b)
		}
		q := math.Nextafter(p, 1)
		if normalQuantile(q) < normalQuantile(p) {
			t.Fatalf("z decreases from %v to %v", p, q)
		}
	}
}

// BenchmarkNormalQuantile measures the tabulated quantile on increasing p,
// as a Latin hypercube's strata take it, beside gonum's.
func BenchmarkNormalQuantile(b *testing.B) {
	ps := make([]float64, 1<<16)
	for i := range ps {
		ps[i] = (float64(i) + 0.5) / float64(len(ps))
	}
	for _, c := range []struct {
		name string
		f    func(float64) float64
	}{{"table", normalQuantile}, {"gonum", mathext.NormalQuantile}} {
		b.Run(c.name, func(b *testing.B) {
			s := 0.0
			for b.Loop() {
				for _, p := range ps {
					s += c.f(p)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(ps)), "ns/value")
			_ = s
		})
	}
}
