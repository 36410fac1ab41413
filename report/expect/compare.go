package expect

import (
	"fmt"
	"math"
	"strconv"
)

// Check is the comparison of one figure of two expectations.
type Check struct {
	// Figure names the figure, e.g. "heat_in_place.p50" (Figures).
	Figure string
	// Expected and Got are the figure in the two records; "" when the
	// record lacks it.
	Expected, Got Number
	// Exact is true when the text was compared. Otherwise Limit is the
	// largest absolute difference allowed, in the figure's unit (trials
	// for zero_heat_trials).
	Exact bool
	Limit float64
	Held  bool
}

// Allowed describes what the check allowed: "exact", or "±limit".
func (c Check) Allowed() string {
	if c.Exact {
		return "exact"
	}
	return "±" + strconv.FormatFloat(c.Limit, 'g', 4, 64)
}

// Drifts returns the checks that did not hold.
func Drifts(cs []Check) []Check {
	var out []Check
	for _, c := range cs {
		if !c.Held {
			out = append(out, c)
		}
	}
	return out
}

// Compare checks the record got of a new run against the expectation
// want, figure by figure, under tol. Exact compares the text of the run
// settings (trials, seed, sampling, confidence, percentiles) and of every
// figure; Statistical compares p90, p50, p10, mean and sd of every output
// and the zero-heat count within their Monte Carlo tolerances. A figure in
// only one record is a check that does not hold.
func Compare(want, got *Expectation, tol Tolerance) []Check {
	if tol.Mode == Statistical {
		return compareStat(want, got, tol.Z)
	}
	cs := []Check{
		textCheck("trials", Number(strconv.Itoa(want.Trials)), Number(strconv.Itoa(got.Trials))),
		textCheck("seed", Number(strconv.FormatUint(want.Seed, 10)), Number(strconv.FormatUint(got.Seed, 10))),
		textCheck("sampling", Number(want.Sampling), Number(got.Sampling)),
		textCheck("confidence", Num(want.Confidence), Num(got.Confidence)),
		textCheck("percentiles", Number(want.Percentiles), Number(got.Percentiles)),
	}
	has := map[string]Number{}
	for _, f := range got.Figures() {
		has[f.Name] = f.Text
	}
	seen := map[string]bool{}
	for _, f := range want.Figures() {
		seen[f.Name] = true
		cs = append(cs, textCheck(f.Name, f.Text, has[f.Name]))
	}
	for _, f := range got.Figures() {
		if !seen[f.Name] {
			cs = append(cs, textCheck(f.Name, "", f.Text))
		}
	}
	return cs
}

func textCheck(name string, want, got Number) Check {
	return Check{Figure: name, Expected: want, Got: got, Exact: true, Held: want != "" && want == got}
}

// compareStat is Compare in Statistical mode at the per-figure quantile z.
func compareStat(want, got *Expectation, z float64) []Check {
	var cs []Check
	byName := map[string]*Output{}
	for i := range got.Outputs {
		byName[got.Outputs[i].Name] = &got.Outputs[i]
	}
	for i := range want.Outputs {
		w := &want.Outputs[i]
		g, ok := byName[w.Name]
		if !ok {
			cs = append(cs, Check{Figure: w.Name, Expected: "present", Exact: true})
			continue
		}
		delete(byName, w.Name)
		cs = append(cs, outputChecks(want, got, w, g, z)...)
	}
	for _, g := range got.Outputs {
		if _, extra := byName[g.Name]; extra {
			cs = append(cs, Check{Figure: g.Name, Got: "present", Exact: true})
		}
	}
	nw, ng := want.Trials, got.Trials
	lim := proportionAllowed(want.ZeroHeatTrials, nw, got.ZeroHeatTrials, ng, z)
	d := math.Abs(float64(want.ZeroHeatTrials)/float64(nw) - float64(got.ZeroHeatTrials)/float64(ng))
	return append(cs, Check{Figure: "zero_heat_trials", Expected: Number(strconv.Itoa(want.ZeroHeatTrials)),
		Got: Number(strconv.Itoa(got.ZeroHeatTrials)), Limit: lim * float64(nw), Held: d <= lim})
}

// outputChecks compares the statistics of one output present in both
// records.
func outputChecks(want, got *Expectation, w, g *Output, z float64) []Check {
	nw, ng := want.Trials, got.Trials
	pct := func(name string, wx, gx Number, wci, gci Interval) Check {
		lim := z * math.Hypot(percentileSE(wci, want.Confidence), percentileSE(gci, got.Confidence))
		lim += want.SketchRelErr*math.Abs(wx.value()) + got.SketchRelErr*math.Abs(gx.value())
		return statCheck(w.Name+"."+name, wx, gx, lim)
	}
	return []Check{
		pct("p90", w.P90, g.P90, w.P90CI, g.P90CI),
		pct("p50", w.P50, g.P50, w.P50CI, g.P50CI),
		pct("p10", w.P10, g.P10, w.P10CI, g.P10CI),
		statCheck(w.Name+".mean", w.Mean, g.Mean, z*math.Hypot(meanSE(w, nw), meanSE(g, ng))),
		statCheck(w.Name+".sd", w.SD, g.SD, z*math.Hypot(sdSE(w, nw), sdSE(g, ng))),
	}
}

// statCheck holds when |got − want| ≤ limit; two NaNs (an undefined
// figure in both runs) hold, one NaN does not.
func statCheck(name string, want, got Number, limit float64) Check {
	w, g := want.value(), got.value()
	held := w == g || math.Abs(g-w) <= limit
	if math.IsNaN(w) || math.IsNaN(g) {
		held = math.IsNaN(w) && math.IsNaN(g)
	}
	if math.IsNaN(limit) {
		limit = 0
	}
	return Check{Figure: name, Expected: want, Got: got, Limit: limit, Held: held}
}

// String formats c as "figure: expected want, got got (allowed)".
func (c Check) String() string {
	return fmt.Sprintf("%s: expected %s, got %s (%s)", c.Figure, orMissing(c.Expected), orMissing(c.Got), c.Allowed())
}

func orMissing(n Number) string {
	if n == "" {
		return "(missing)"
	}
	return string(n)
}
