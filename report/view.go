package report

import (
	"fmt"
	"math"
	"strings"

	"rockheat"
	"rockheat/sampler"
	"rockheat/stats"
)

// The formatted figures of a Result that the text report and the HTML page
// both show, built once here so that the two always agree.

// energyUnit picks a readable unit for heat figures of magnitude x, J.
func energyUnit(x float64) (name string, scale float64) {
	switch ax := math.Abs(x); {
	case ax >= 1e18:
		return "EJ (10^18 J)", 1e18
	case ax >= 1e15:
		return "PJ (10^15 J)", 1e15
	case ax >= 1e12:
		return "TJ (10^12 J)", 1e12
	}
	return "J", 1
}

// heatUnit returns the one energy unit of a report's heat figures, chosen
// from the largest heat median (or, if every median is 0, the largest heat
// on any curve) so that the figures compare at a glance.
func heatUnit(r *rockheat.Result) (name string, scale float64) {
	var big float64
	for _, o := range r.Outputs {
		if o.Spec.Unit == "J" && finite(o.Summary.P50) {
			big = math.Max(big, math.Abs(o.Summary.P50))
		}
	}
	if big == 0 {
		for _, o := range r.Outputs {
			for _, v := range o.Curve {
				if o.Spec.Unit == "J" && finite(v) {
					big = math.Max(big, math.Abs(v))
				}
			}
		}
	}
	return energyUnit(big)
}

// outputUnit returns the unit output o of r is shown in, in tables and
// charts alike: the report's heat unit for energies, else its own. long is
// for axis labels, short for figures; value shown = value / scale.
func outputUnit(r *rockheat.Result, o rockheat.Output) (long, short string, scale float64) {
	if o.Spec.Unit != "J" {
		return o.Spec.Unit, o.Spec.Unit, 1
	}
	long, scale = heatUnit(r)
	return long, strings.Fields(long)[0], scale
}

// figureRow is one output of the summary table, formatted.
type figureRow struct {
	Name, Doc, Unit     string
	P90, P50, P10, Mean string
	P90CI, P50CI, P10CI string
}

// figureRows formats the summary of the outputs of r that keep accepts.
func figureRows(r *rockheat.Result, keep func(rockheat.OutputSpec) bool) []figureRow {
	var rows []figureRow
	for _, o := range r.Outputs {
		if !keep(o.Spec) {
			continue
		}
		unit, _, scale := outputUnit(r, o)
		s := o.Summary
		rows = append(rows, figureRow{Name: o.Spec.Name, Doc: o.Spec.Doc, Unit: unit,
			P90: fig(s.P90 / scale), P50: fig(s.P50 / scale), P10: fig(s.P10 / scale), Mean: fig(s.Mean / scale),
			P90CI: ciText(s.P90CI, scale), P50CI: ciText(s.P50CI, scale), P10CI: ciText(s.P10CI, scale)})
	}
	return rows
}

// notYearZero keeps every output but the thermal power at year 0, which
// is the initial thermal power, shown once.
func notYearZero(o rockheat.OutputSpec) bool {
	return !(o.Group == rockheat.DeclineGroup && o.Year == 0)
}

// notDecline keeps every output but the power at the report years.
func notDecline(o rockheat.OutputSpec) bool { return o.Group != rockheat.DeclineGroup }

// ciText formats a confidence interval in a unit of the given scale, or
// says "n/a" where the run is too short to give one at its level.
func ciText(iv stats.Interval, scale float64) string {
	if !iv.OK() {
		return "n/a"
	}
	return ci(iv.Lo/scale, iv.Hi/scale)
}

// headline lists the outputs whose drivers the reports show.
var headline = map[string]bool{"heat_in_place": true, "electric_power": true}

// sensSection is the sensitivity table of one headline output.
type sensSection struct {
	Doc, Unit string
	Rows      []sensRow
}

// sensRow is one input's influence, formatted; Share is a fraction.
type sensRow struct {
	Input, Rho, Low, High string
	Share                 float64
}

// sensSections formats the sensitivity of every headline output of r.
func sensSections(r *rockheat.Result) []sensSection {
	var secs []sensSection
	for _, s := range r.Sensitivity {
		if !headline[s.Output] || len(s.Influences) == 0 {
			continue
		}
		o, err := findOutput(r, s.Output)
		if err != nil {
			continue
		}
		_, unit, scale := outputUnit(r, o)
		sec := sensSection{Doc: o.Spec.Doc, Unit: unit}
		for _, f := range s.Influences {
			rho := f.RankCorrelation
			if math.Abs(rho) < 0.005 {
				rho = 0 // no "-0.00"
			}
			sec.Rows = append(sec.Rows, sensRow{Input: f.Input, Rho: fmt.Sprintf("%+.2f", rho), Share: f.VarianceShare,
				Low: swingFig(f.SwingLow / scale), High: swingFig(f.SwingHigh / scale)})
		}
		secs = append(secs, sec)
	}
	return secs
}

// sensNotes are the sentences that qualify the sensitivities of r.
func sensNotes(r *rockheat.Result) []string {
	var notes []string
	if len(r.Correlations) > 0 && len(r.Sensitivity) > 0 {
		notes = append(notes, "Some inputs are correlated: their variance shares overlap and only rank their influence.")
	}
	if len(r.Sensitivity) > 0 && r.SensitivityN < r.Trials {
		notes = append(notes, fmt.Sprintf("Sensitivities come from the first %d trials.", r.SensitivityN))
	}
	return notes
}

// correlationLines describes the target rank correlations of r.
func correlationLines(r *rockheat.Result) []string {
	var lines []string
	for _, c := range r.Correlations {
		lines = append(lines, fmt.Sprintf("rank correlation %+.2f between %s and %s (Iman–Conover)", c.Rank, c.Inputs[0], c.Inputs[1]))
	}
	return lines
}

// runLine says how many trials ran, how they were drawn and the seed.
func runLine(r *rockheat.Result) string { return trialsText(r.Trials, r.Sampling, r.Seed) }

// trialsText is the sentence every report and chart uses for a run's
// trials, sampling and seed.
func trialsText(trials int, m sampler.Method, seed uint64) string {
	return fmt.Sprintf("%d trials (%s), seed %d", trials, samplingName(m), seed)
}

// swingFig formats a swing figure, or a dash where the model gave none.
func swingFig(x float64) string {
	if !finite(x) {
		return "–"
	}
	return fig(x)
}

// Bar is the share of variance in whole percent, for a bar's width.
func (f sensRow) Bar() int { return int(math.Round(100 * f.Share)) }

// Percent is the share of variance, formatted.
func (f sensRow) Percent() string { return fmt.Sprintf("%.0f%%", 100*f.Share) }
