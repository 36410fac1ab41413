package expect

import (
	"math"
	"strconv"
	"testing"
)

// fixture is a hand-made record of one output of 1000 trials: P50 100 with
// the interval [98, 102] at 95 %, mean 100, sd 10, range 70 … 140, and
// 10 trials of 1000 without heat.
func fixture() *Expectation {
	return &Expectation{Format: Format, ScenarioSHA256: Hash(nil), Trials: 1000, Seed: 1, Sampling: "random",
		Confidence: 0.95, Percentiles: "exact", ZeroHeatTrials: 10,
		Outputs: []Output{{Name: "heat_in_place", Unit: "J", P90: "90", P50: "100", P10: "110", Mean: "100", SD: "10",
			Min: "70", Max: "140", P90CI: Interval{"89", "91"}, P50CI: Interval{"98", "102"}, P10CI: Interval{"109", "111"},
			MeanCI: Interval{"99", "101"}}}}
}

// TestStatisticalLimits checks each tolerance against a hand calculation
// at z = 3 with trials n = 1000 on both sides, Φ⁻¹(0.975) = 1.959964
// (standard normal table):
//
//	p50:  se = (102 − 98)/(2·1.959964) = 1.020426; 3·√2·se = 4.329303
//	mean: se = 10/√1000 = 0.316228;                3·√2·se = 1.341641
//	sd:   R = 40, se = √((40² − s²)/(4·1000)): 0.612372 for s = 10, 0.600781 for
//	      12.5, 0.599731 for 12.7; 3·√(se₁² + se₂²) = 2.573604 and 2.571399
//	zero-heat, 10 vs 20: p = 0.015, 3·√(p(1−p)·2/1000) = 0.0163081, 16.3081 trials
//	zero-heat, 10 vs 30: p = 0.02,  3·√(p(1−p)·2/1000) = 0.0187830, 18.7830 trials
func TestStatisticalLimits(t *testing.T) {
	t.Parallel()
	cases := []struct {
		figure string
		set    func(e *Expectation)
		limit  float64
		held   bool
	}{
		{"heat_in_place.p50", func(e *Expectation) { e.Outputs[0].P50 = "104.3" }, 4.329303, true},
		{"heat_in_place.p50", func(e *Expectation) { e.Outputs[0].P50 = "95.6" }, 4.329303, false},
		{"heat_in_place.mean", func(e *Expectation) { e.Outputs[0].Mean = "101.3" }, 1.341641, true},
		{"heat_in_place.mean", func(e *Expectation) { e.Outputs[0].Mean = "101.4" }, 1.341641, false},
		{"heat_in_place.sd", func(e *Expectation) { e.Outputs[0].SD = "12.5" }, 2.573604, true},
		{"heat_in_place.sd", func(e *Expectation) { e.Outputs[0].SD = "12.7" }, 2.571399, false},
		{"zero_heat_trials", func(e *Expectation) { e.ZeroHeatTrials = 20 }, 16.3081, true},
		{"zero_heat_trials", func(e *Expectation) { e.ZeroHeatTrials = 30 }, 18.7830, false},
	}
	for _, c := range cases {
		got := fixture()
		c.set(got)
		var found bool
		for _, ch := range Compare(fixture(), got, Tolerance{Mode: Statistical, Z: 3}) {
			if ch.Figure != c.figure {
				if !ch.Held {
					t.Errorf("%s: %s does not hold", c.figure, ch)
				}
				continue
			}
			found = true
			if ch.Exact || math.Abs(ch.Limit-c.limit) > 1e-5*c.limit || ch.Held != c.held {
				t.Errorf("%s = %s vs %s: limit %.7g held %v, want %.7g %v", c.figure, ch.Got, ch.Expected, ch.Limit, ch.Held, c.limit, c.held)
			}
		}
		if !found {
			t.Errorf("%s not compared", c.figure)
		}
	}
}

// TestExact: one unit in the last place of any figure, or a missing one,
// is a drift; identical records hold everywhere.
func TestExact(t *testing.T) {
	t.Parallel()
	if d := Drifts(Compare(fixture(), fixture(), Tolerance{})); len(d) != 0 {
		t.Errorf("identical records drift: %v", d)
	}
	got := fixture()
	got.Outputs[0].P10CI[1] = Num(math.Nextafter(111, 200))
	got.Seed = 2
	d := Drifts(Compare(fixture(), got, Tolerance{Mode: Exact}))
	if len(d) != 2 || d[0].Figure != "seed" || d[1].Figure != "heat_in_place.p10_ci.hi" || d[1].Allowed() != "exact" {
		t.Errorf("drifts = %v, want seed and heat_in_place.p10_ci.hi", d)
	}
	got = fixture()
	got.Outputs = append(got.Outputs, Output{Name: "extra", P90: "1"})
	if d := Drifts(Compare(fixture(), got, Tolerance{Mode: Exact})); len(d) != 15 || d[0].Expected != "" {
		t.Errorf("an extra output gives %d drifts (%v), want its 15 figures", len(d), d)
	}
	if d := Drifts(Compare(got, fixture(), Tolerance{Mode: Statistical, Z: 3})); len(d) != 1 || d[0].Figure != "extra" {
		t.Errorf("a missing output in Statistical mode gives %v", d)
	}
}

// TestStatisticalSpecialValues: NaN figures hold only against NaN; equal
// infinities hold.
func TestStatisticalSpecialValues(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		want, got Number
		held      bool
	}{{"NaN", "NaN", true}, {"NaN", "1", false}, {"1", "NaN", false}, {"+Inf", "+Inf", true}, {"+Inf", "-Inf", false}} {
		if ch := statCheck("x", c.want, c.got, 1); ch.Held != c.held {
			t.Errorf("%s vs %s: held %v, want %v", c.want, c.got, ch.Held, c.held)
		}
	}
}

// TestBonferroniZ: the upper tail of the standard normal beyond z, by the
// standard library's math.Erfc (P(|N(0,1)| > z) = erfc(z/√2)), is α/m; and
// z = 1.959964 for α = 0.05, m = 1 (standard normal table).
func TestBonferroniZ(t *testing.T) {
	t.Parallel()
	if z := BonferroniZ(0.05, 1); math.Abs(z-1.959964) > 1e-6 {
		t.Errorf("BonferroniZ(0.05, 1) = %v", z)
	}
	for _, c := range []struct {
		alpha float64
		m     int
	}{{0.01, 1}, {0.01, 21}, {0.01, 274}, {0.001, 5000}} {
		z := BonferroniZ(c.alpha, c.m)
		if p := math.Erfc(z / math.Sqrt2); math.Abs(p-c.alpha/float64(c.m)) > 1e-9*c.alpha {
			t.Errorf("BonferroniZ(%g, %d) = %v: tail %g, want %g", c.alpha, c.m, z, p, c.alpha/float64(c.m))
		}
	}
}

func TestParseMode(t *testing.T) {
	t.Parallel()
	for _, m := range []Mode{Exact, Statistical} {
		if got, err := ParseMode(m.String()); err != nil || got != m {
			t.Errorf("ParseMode(%q) = %v, %v", m, got, err)
		}
	}
	if _, err := ParseMode("loose"); err == nil {
		t.Error("ParseMode(loose) gave no error")
	}
	if got := strconv.Quote(Check{Limit: 16.30812}.Allowed()); got != `"±16.31"` {
		t.Errorf("Allowed() = %s", got)
	}
}
