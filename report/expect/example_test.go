package expect_test

import (
	"fmt"

	"rockheat/report/expect"
)

// ExampleCompare checks a new record against an expectation: the P50 moved
// by 0.4 %, which exact mode reports and statistical mode, at z = 4 and
// 10 000 trials with a P50 interval of ±1 %, allows.
func ExampleCompare() {
	record := func(p50 expect.Number) *expect.Expectation {
		return &expect.Expectation{Trials: 10000, Seed: 1, Sampling: "lhs", Confidence: 0.95, Percentiles: "exact",
			Outputs: []expect.Output{{Name: "heat_in_place", Unit: "J", P90: "6e17", P50: p50, P10: "1.4e18",
				Mean: "1e18", SD: "3e17", Min: "2e17", Max: "3e18", P90CI: expect.Interval{"5.9e17", "6.1e17"},
				P50CI: expect.Interval{"0.99e18", "1.01e18"}, P10CI: expect.Interval{"1.38e18", "1.42e18"},
				MeanCI: expect.Interval{"0.994e18", "1.006e18"}}}}
	}
	want, got := record("1e18"), record("1.004e18")
	for _, c := range expect.Drifts(expect.Compare(want, got, expect.Tolerance{Mode: expect.Exact})) {
		fmt.Println("exact:", c)
	}
	stat := expect.Compare(want, got, expect.Tolerance{Mode: expect.Statistical, Z: 4})
	fmt.Println("stat:", stat[1], "held:", stat[1].Held)
	// Output:
	// exact: heat_in_place.p50: expected 1e18, got 1.004e18 (exact)
	// stat: heat_in_place.p50: expected 1e18, got 1.004e18 (±2.886e+16) held: true
}
