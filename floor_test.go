package rockheat

import (
	"fmt"
	"sync"
	"sync/atomic"
	"testing"
	"time"

	"rockheat/sampler"
)

// floorRun is the least a run of the demo could do: the run's own plan
// and draws, and the volumetric model written out in one loop per batch
// over the columns (heat in place, recoverable heat, thermal and electric
// power, power density, in SI units), into preallocated slices, with no
// statistics. Estimate's time over the floor's is what the engine adds:
// unit conversions, the model through its general interface, the
// non-finite check, sketches, the selection of exact order statistics,
// sensitivity and the summary.
type floorRun struct {
	plan    *sampler.Plan
	col     map[string]int // sampled input name → column
	workers int
}

// demoRun is the bundled demo scenario (scenarios/examples/demo.toml),
// built in Go: this package's tests cannot read the scenarios package.
func demoRun(tb testing.TB) *Run {
	tb.Helper()
	must := func(d sampler.Distribution, err error) sampler.Distribution {
		if err != nil {
			tb.Fatal(err)
		}
		return d
	}
	m := &Reservoir{
		Area:                 Uncertain(must(sampler.NewTriangular(3, 6, 14)), SquareKilometre),
		Thickness:            Uncertain(must(sampler.NewUniform(800, 1600)), Metre),
		ReservoirTemp:        Uncertain(must(sampler.NewNormal(235, 12, 200, inf)), Celsius),
		ReferenceTemp:        Fixed(15, Celsius),
		Porosity:             Uncertain(must(sampler.NewPERT(0.02, 0.06, 0.12)), Fraction),
		RockDensity:          Fixed(2650, KgPerCubicMetre),
		RockHeatCapacity:     Uncertain(must(sampler.NewUniform(850, 1000)), JPerKgK),
		FluidDensity:         Fixed(850, KgPerCubicMetre),
		FluidHeatCapacity:    Fixed(4600, JPerKgK),
		RecoveryFactor:       Uncertain(must(sampler.NewUniform(0.08, 0.20)), Fraction),
		ConversionEfficiency: Uncertain(must(sampler.NewTriangular(0.08, 0.11, 0.14)), Fraction),
		CapacityFactor:       Fixed(0.9, Fraction),
		Life:                 Fixed(30, Year),
	}
	return &Run{Title: "demo, built in Go", Trials: 100_000, Seed: 12345, Model: m}
}

// newDemoRun returns the run state of the demo at n trials, and its
// settings.
func newDemoRun(tb testing.TB, n int) (*run, *settings) {
	tb.Helper()
	c, err := demoRun(tb).resolve()
	if err != nil {
		tb.Fatal(err)
	}
	set, err := resolveOptions(c, Options{Trials: n})
	if err != nil {
		tb.Fatal(err)
	}
	return newRun(c, set), set
}

// newFloorRun sets up the floor of the demo at n trials.
func newFloorRun(tb testing.TB, n int) *floorRun {
	tb.Helper()
	r, set := newDemoRun(tb, n)
	f := &floorRun{plan: r.plan, col: map[string]int{}, workers: set.workers}
	for j, in := range r.sampled {
		f.col[in.Base] = j
	}
	for _, name := range []string{"area", "thickness", "reservoir_temp", "porosity",
		"rock_heat_capacity", "recovery_factor", "conversion_efficiency"} {
		if _, ok := f.col[name]; !ok {
			tb.Fatalf("the demo no longer samples %s; update the floor", name)
		}
	}
	return f
}

// run draws and evaluates every batch on the workers.
func (f *floorRun) run(tb testing.TB) {
	var next atomic.Int64
	var wg sync.WaitGroup
	for range f.workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			in := columns(len(f.col), sampler.BatchSize)
			out := columns(5, sampler.BatchSize)
			for {
				b := int(next.Add(1) - 1)
				if b >= f.plan.Batches() {
					return
				}
				if err := f.plan.Fill(b, in); err != nil {
					tb.Error(err)
					return
				}
				_, n := f.plan.BatchRange(b)
				f.evaluate(in, out, n)
			}
		}()
	}
	wg.Wait()
}

// evaluate is the demo's model, fused: its fixed inputs written in.
func (f *floorRun) evaluate(in, out [][]float64, n int) {
	area, thick, temp := in[f.col["area"]][:n], in[f.col["thickness"]][:n], in[f.col["reservoir_temp"]][:n]
	phi, cr := in[f.col["porosity"]][:n], in[f.col["rock_heat_capacity"]][:n]
	rf, eta := in[f.col["recovery_factor"]][:n], in[f.col["conversion_efficiency"]][:n]
	q, qr, pt, pe, pd := out[0][:n], out[1][:n], out[2][:n], out[3][:n], out[4][:n]
	const (
		rhoR, rhoF, cf   = 2650, 850, 4600
		tRef, life, capf = 15, 30 * year, 0.9
	)
	for i := range q {
		a := area[i] * km2
		dT := max(temp[i]-tRef, 0)
		q[i] = a * thick[i] * ((1-phi[i])*rhoR*cr[i] + phi[i]*rhoF*cf) * dT
		qr[i] = rf[i] * q[i]
		pt[i] = qr[i] / life
		pe[i] = eta[i] * qr[i] / (capf * life)
		pd[i] = pe[i] / a
	}
}

// BenchmarkEstimateOverFloor runs the demo through Estimate and through
// its floor (floorRun) at 10^6 and 10^7 trials, alternately, and reports
// each one's time per trial and their ratio, "over-floor": what the
// engine costs beyond drawing the inputs and evaluating the model.
func BenchmarkEstimateOverFloor(b *testing.B) {
	AdviseHugeHeap() // as the command does, so that both see its memory
	rn := demoRun(b)
	for _, n := range []int{1_000_000, 10_000_000} {
		b.Run(fmt.Sprintf("trials=%d", n), func(b *testing.B) {
			f := newFloorRun(b, n)
			var est, floor time.Duration
			for b.Loop() {
				t0 := time.Now()
				f.run(b)
				t1 := time.Now()
				if _, err := Estimate(rn, Options{Trials: n}); err != nil {
					b.Fatal(err)
				}
				floor += t1.Sub(t0)
				est += time.Since(t1)
			}
			per := func(d time.Duration) float64 { return float64(d.Nanoseconds()) / float64(b.N*n) }
			b.ReportMetric(per(floor), "floor-ns/trial")
			b.ReportMetric(per(est), "estimate-ns/trial")
			b.ReportMetric(float64(est)/float64(floor), "over-floor")
		})
	}
}

// TestFloorMatchesEstimate: the floor computes what Estimate does: the
// same draws through the same formula give the same mean electric
// capacity (docs/references.md §1 for the formula) to a relative 1e-12,
// so the benchmark compares like with like.
func TestFloorMatchesEstimate(t *testing.T) {
	t.Parallel()
	const n = 300_000
	f := newFloorRun(t, n)
	var sum float64
	in := columns(len(f.col), sampler.BatchSize)
	out := columns(5, sampler.BatchSize)
	for b := range f.plan.Batches() {
		if err := f.plan.Fill(b, in); err != nil {
			t.Fatal(err)
		}
		_, m := f.plan.BatchRange(b)
		f.evaluate(in, out, m)
		for _, v := range out[3][:m] {
			sum += v / mega
		}
	}
	res, err := Estimate(demoRun(t), Options{Trials: n})
	if err != nil {
		t.Fatal(err)
	}
	for _, o := range res.Outputs {
		if o.Spec.Name == "electric_power" {
			if got := sum / n; !(got > 0) || abs(got/o.Summary.Mean-1) > 1e-12 {
				t.Errorf("floor mean %v MWe, Estimate %v", got, o.Summary.Mean)
			}
			return
		}
	}
	t.Fatal("no electric_power output")
}

func abs(x float64) float64 { return max(x, -x) }
