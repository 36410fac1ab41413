package expect

import (
	"math"
	"strconv"
)

// Figure is one recorded figure of an expectation, by name: an output's
// statistic ("heat_in_place.p50"), an interval end ("heat_in_place.p50_ci.lo")
// or a count ("zero_heat_trials").
type Figure struct {
	Name string
	Text Number
}

// Figures lists every figure of e in a fixed order: for each output its
// p90, p50, p10, mean, sd, min, max and the ends of p90_ci, p50_ci, p10_ci
// and mean_ci, then zero_heat_trials.
func (e *Expectation) Figures() []Figure {
	var fs []Figure
	for _, o := range e.Outputs {
		for _, f := range o.figures() {
			fs = append(fs, Figure{o.Name + "." + f.Name, f.Text})
		}
	}
	return append(fs, Figure{"zero_heat_trials", Number(strconv.Itoa(e.ZeroHeatTrials))})
}

// figures lists the figures of o, named within the output.
func (o *Output) figures() []Figure {
	fs := []Figure{{"p90", o.P90}, {"p50", o.P50}, {"p10", o.P10}, {"mean", o.Mean}, {"sd", o.SD}, {"min", o.Min}, {"max", o.Max}}
	for _, ci := range []struct {
		name string
		iv   Interval
	}{{"p90_ci", o.P90CI}, {"p50_ci", o.P50CI}, {"p10_ci", o.P10CI}, {"mean_ci", o.MeanCI}} {
		fs = append(fs, Figure{ci.name + ".lo", ci.iv[0]}, Figure{ci.name + ".hi", ci.iv[1]})
	}
	return fs
}

// Move is a figure that changed between two expectations.
type Move struct {
	Figure   string
	Old, New Number // "" when the figure is not in that expectation
	// Rel is (new − old)/|old|; NaN when either is missing or old is 0.
	Rel float64
}

// Moves lists the figures whose text differs between old and new, in the
// order of new's figures, then those only in old.
func Moves(old, new *Expectation) []Move {
	was := map[string]Number{}
	for _, f := range old.Figures() {
		was[f.Name] = f.Text
	}
	var ms []Move
	seen := map[string]bool{}
	for _, f := range new.Figures() {
		seen[f.Name] = true
		if o, ok := was[f.Name]; !ok || o != f.Text {
			ms = append(ms, Move{Figure: f.Name, Old: o, New: f.Text, Rel: relChange(o, f.Text)})
		}
	}
	for _, f := range old.Figures() {
		if !seen[f.Name] {
			ms = append(ms, Move{Figure: f.Name, Old: f.Text, Rel: relChange(f.Text, "")})
		}
	}
	return ms
}

func relChange(old, new Number) float64 {
	o, err1 := old.Float()
	n, err2 := new.Float()
	if err1 != nil || err2 != nil || o == 0 {
		return math.NaN()
	}
	return (n - o) / math.Abs(o)
}
