package stats_test

import (
	"fmt"
	"math/rand/v2"
	"slices"

	"gonum.org/v1/gonum/stat/distuv"

	"rockheat/stats"
)

// heatTrials returns n invented heat-in-place trials, in J, lognormal
// around 10¹⁸ J.
func heatTrials(n int) []float64 {
	d := distuv.LogNormal{Mu: 41.4, Sigma: 0.5, Src: rand.New(rand.NewPCG(1, 2))}
	x := make([]float64, n)
	for i := range x {
		x[i] = d.Rand()
	}
	return x
}

func ExampleSummarize() {
	heat := heatTrials(10000) // J
	s := stats.Summarize(heat, stats.DefaultOptions)
	fmt.Printf("N = %d, mean = %.4g J, SD = %.3g J\n", s.N, s.Mean, s.SD)
	fmt.Printf("P90 = %.4g J, 95 %% CI [%.4g, %.4g] (coverage %.3f)\n", s.P90, s.P90CI.Lo, s.P90CI.Hi, s.P90CI.Coverage)
	fmt.Printf("P50 = %.4g J\n", s.P50)
	fmt.Printf("P10 = %.4g J\n", s.P10)
	fmt.Printf("P50 precision ±%.2f %%\n", 100*stats.RelativeHalfWidth(s.P50CI, s.P50))
	// Output:
	// N = 10000, mean = 1.087e+18 J, SD = 5.83e+17 J
	// P90 = 5.046e+17 J, 95 % CI [4.971e+17, 5.128e+17] (coverage 0.951)
	// P50 = 9.584e+17 J
	// P10 = 1.827e+18 J
	// P50 precision ±1.33 %
}

func ExampleExceedance() {
	heat := heatTrials(1001) // J
	slices.Sort(heat)
	// P90, the low case, is exceeded by 90 % of the trials: the 10th percentile.
	p90 := stats.Exceedance(heat, 0.9)
	fmt.Printf("P90 = %.4g J = Quantile(0.1) = %.4g J\n", p90, stats.Quantile(heat, 0.1))
	fmt.Printf("P10 = %.4g J = Quantile(0.9) = %.4g J\n", stats.Exceedance(heat, 0.1), stats.Quantile(heat, 0.9))
	// Output:
	// P90 = 5.108e+17 J = Quantile(0.1) = 5.108e+17 J
	// P10 = 1.809e+18 J = Quantile(0.9) = 1.809e+18 J
}

func ExampleSketch() {
	sk := stats.NewSketch(stats.DefaultRelErr)
	sk.AddSlice(heatTrials(10000))
	fmt.Printf("P50 = %.4g J within ±%.0e relative\n", sk.Exceedance(0.5), sk.RelErr())
	// Output:
	// P50 = 9.584e+17 J within ±6e-05 relative
}
