package rockheat_test

import (
	"fmt"
	"strings"
	"testing"

	"rockheat"
	"rockheat/scenarios"
)

// BenchmarkEstimatePortfolio runs portfolios of 4 and 16 invented
// prospects (the bundled examples in turn, each with a chance of 0.5) at
// 10⁵ trials. Run it with -benchmem: the bytes a run allocates grow with
// the prospects by their sketches, not by a batch's draws and outputs for
// every prospect at once.
func BenchmarkEstimatePortfolio(b *testing.B) {
	examples := []string{"demo", "boiling-if97", "hot-rock-demo", "hot-rock-layers", "depth-gradient",
		"sediment-direct", "volcanic-high-t", "radiogenic-rock"}
	for _, n := range []int{4, 16} {
		var src strings.Builder
		src.WriteString("title = \"benchmark portfolio (invented)\"\n[run]\ntrials = 100000\nseed = 5\n")
		for i := range n {
			fmt.Fprintf(&src, "[[prospects]]\nname = \"p%d\"\nscenario = %q\nchance_of_success = 0.5\n", i, examples[i%len(examples)])
		}
		pf, err := scenarios.ParsePortfolio("benchmark", "", []byte(src.String()))
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("prospects=%d", n), func(b *testing.B) {
			for b.Loop() {
				if _, err := rockheat.EstimatePortfolio(&pf.Portfolio, rockheat.Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
