package stats

import (
	"math"
	"slices"
	"sort"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/stat"
)

// TestSummarize checks a Summary against gonum (stat.Mean, stat.StdDev,
// floats.Min, floats.Max) and against Quantile and QuantileInterval on a
// copy sorted by sort.Float64s, and the properties P90 ≤ P50 ≤ P10 and
// Lo ≤ estimate ≤ Hi.
func TestSummarize(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		x    []float64
	}{
		{"lognormal 1000", lognormal(1000, 3, 1, 1)},
		{"normal 5000", normal(5000, -2, 10, 2)},
		{"lognormal 100000", lognormal(100000, 40, 0.3, 3)},
	} {
		ref := append([]float64(nil), tc.x...)
		sort.Float64s(ref)
		s := Summarize(append([]float64(nil), tc.x...), Options{})
		if s.N != len(ref) || s.NaN != 0 || len(s.Warnings) != 0 {
			t.Errorf("%s: N %d, NaN %d, warnings %v", tc.name, s.N, s.NaN, s.Warnings)
		}
		for _, c := range []struct {
			what      string
			got, want float64
			tol       float64 // relative
		}{
			{"mean", s.Mean, stat.Mean(ref, nil), 1e-13},
			{"sd", s.SD, stat.StdDev(ref, nil), 1e-12},
			{"min", s.Min, floats.Min(ref), 0},
			{"max", s.Max, floats.Max(ref), 0},
			{"P90", s.P90, Quantile(ref, 0.1), 0},
			{"P50", s.P50, Quantile(ref, 0.5), 0},
			{"P10", s.P10, Quantile(ref, 0.9), 0},
		} {
			if !within(c.got, c.want, c.tol*math.Abs(c.want)) {
				t.Errorf("%s: %s = %v, want %v", tc.name, c.what, c.got, c.want)
			}
		}
		for _, c := range []struct {
			what string
			got  Interval
			q    float64
		}{{"P90CI", s.P90CI, 0.1}, {"P50CI", s.P50CI, 0.5}, {"P10CI", s.P10CI, 0.9}} {
			if want := QuantileInterval(ref, c.q, DefaultConfidence); c.got != want {
				t.Errorf("%s: %s = %+v, want %+v", tc.name, c.what, c.got, want)
			}
		}
		if !(s.P90 <= s.P50 && s.P50 <= s.P10) {
			t.Errorf("%s: P90 %v, P50 %v, P10 %v not ordered", tc.name, s.P90, s.P50, s.P10)
		}
		for _, c := range []struct {
			iv Interval
			v  float64
		}{{s.P90CI, s.P90}, {s.P50CI, s.P50}, {s.P10CI, s.P10}, {s.MeanCI, s.Mean}} {
			if !(c.iv.Lo <= c.v && c.v <= c.iv.Hi) || c.iv.Coverage < DefaultConfidence {
				t.Errorf("%s: interval %+v does not hold %v at level ≥ 0.95", tc.name, c.iv, c.v)
			}
		}
	}
}

// TestSummarizeMeanCI checks the mean's interval against the Student t
// value t(0.975; 9) = 2.262157 of published t tables (common practice).
func TestSummarizeMeanCI(t *testing.T) {
	t.Parallel()
	x := []float64{12, 15, 9, 11, 14, 10, 13, 16, 8, 12}
	s := Summarize(x, DefaultOptions)
	h := 2.262157 * s.SD / math.Sqrt(10)
	if !within(s.MeanCI.Lo, s.Mean-h, 1e-6) || !within(s.MeanCI.Hi, s.Mean+h, 1e-6) || s.MeanCI.Level != 0.95 {
		t.Errorf("MeanCI = %+v, want %v ± %v at 0.95", s.MeanCI, s.Mean, h)
	}
	if s.Mean != 12 { // analytic: the sum is 120
		t.Errorf("Mean = %v, want 12", s.Mean)
	}
}

// TestSummarizeInPlace checks the documented side effect: NaNs first,
// then the values in ascending order.
func TestSummarizeInPlace(t *testing.T) {
	t.Parallel()
	x := lognormal(2000, 0, 1, 5)
	x[7], x[1500] = math.NaN(), math.NaN()
	want := slices.Clone(x)
	slices.Sort(want) // NaNs first
	s := Summarize(x, DefaultOptions)
	if !slices.EqualFunc(x, want, func(a, b float64) bool { return a == b || (a != a && b != b) }) {
		t.Errorf("x is not sorted in place with NaNs first")
	}
	if s.N != 1998 || s.NaN != 2 || len(s.Warnings) != 1 || !strings.Contains(s.Warnings[0].Error(), "2 of 2000 values are NaN") {
		t.Errorf("N %d, NaN %d, warnings %v", s.N, s.NaN, s.Warnings)
	}
	if s.Mean != Summarize(x[2:], DefaultOptions).Mean {
		t.Errorf("NaNs changed the mean")
	}
}

// TestSummarizeSmall: too few values for an interval or a standard
// deviation give warnings with the number of trials needed, from
// 1 − q^n − (1−q)^n ≥ 0.95 (analytic): 6 for the median, 29 for P90/P10.
func TestSummarizeSmall(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name     string
		x        []float64
		warnings []string
	}{
		{"none", nil, []string{"no values"}},
		{"nan only", []float64{math.NaN()}, []string{"NaN", "no values"}},
		{"one", []float64{4}, []string{"for P90, P50, P10, so none is shown; run at least 29 trials", "at least 2 values"}},
		{"six", []float64{1, 2, 3, 4, 5, 6}, []string{"for P90, P10, so none is shown; run at least 29 trials"}},
		{"thirty", normal(30, 0, 1, 1), nil},
	} {
		s := Summarize(tc.x, DefaultOptions)
		if len(s.Warnings) != len(tc.warnings) {
			t.Errorf("%s: warnings %v, want %d", tc.name, s.Warnings, len(tc.warnings))
			continue
		}
		for i, w := range tc.warnings {
			if !strings.Contains(s.Warnings[i].Error(), w) {
				t.Errorf("%s: warning %q does not contain %q", tc.name, s.Warnings[i], w)
			}
		}
		if s.N == 6 && (!s.P50CI.OK() || s.P90CI.OK() || s.P10CI.OK()) {
			t.Errorf("%s: intervals OK: P90 %v, P50 %v, P10 %v; want only P50's (6 values suffice for the median)", tc.name, s.P90CI.OK(), s.P50CI.OK(), s.P10CI.OK())
		}
		if s.N == 1 && (s.P50 != 4 || s.Min != 4 || !math.IsNaN(s.SD)) {
			t.Errorf("%s: %+v", tc.name, s)
		}
		if s.N == 0 && !math.IsNaN(s.Mean) {
			t.Errorf("%s: mean %v, want NaN", tc.name, s.Mean)
		}
	}
}

func TestOptionsValidate(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		c  float64
		ok bool
	}{{0, true}, {0.95, true}, {0.5, true}, {1, false}, {-0.1, false}, {95, false}, {math.NaN(), false}} {
		err := Options{Confidence: tc.c}.Validate()
		if (err == nil) != tc.ok {
			t.Errorf("Confidence %g: Validate() = %v", tc.c, err)
		}
	}
}
