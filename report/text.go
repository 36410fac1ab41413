package report

import (
	"fmt"
	"io"
	"math"
	"strings"

	"rockheat"
	"rockheat/heatmodel"
	"rockheat/sampler"
)

// Text writes r as a summary table for people: the headline figures in
// readable units, the percentile convention and method, the inputs, any
// warnings and the caution.
func Text(w io.Writer, r *rockheat.Result) error {
	var b strings.Builder
	fmt.Fprintf(&b, "%s\n", r.Title)
	fmt.Fprintf(&b, "%s\n", strings.Repeat("=", len([]rune(r.Title))))
	fmt.Fprintf(&b, "Scenario  %s\n", r.Path)
	fmt.Fprintf(&b, "Model     %s\n", modelLine(r))
	// A labelled line like Scenario and Model, so not trialsText's sentence.
	fmt.Fprintf(&b, "Trials    %d (%s), seed %d\n\n", r.Trials, samplingName(r.Sampling), r.Seed)

	level := r.Confidence
	rows := [][]string{{"", "P90 (low)", "P50 (best)", "P10 (high)", "mean", "unit"}}
	for _, f := range figureRows(r, notYearZero) {
		rows = append(rows, []string{f.Doc, f.P90, f.P50, f.P10, f.Mean, f.Unit}, []string{"", f.P90CI, f.P50CI, f.P10CI, "", ""})
	}
	table(&b, rows, "lrrrrl")
	fmt.Fprintf(&b, "\nRanges in brackets are %.0f%% distribution-free confidence intervals of each percentile\n(order statistics, binomial; Hahn & Meeker 1991): how far the figure could move with more trials.\n", 100*level)
	wrap(&b, Convention, 100)
	for _, note := range runNotes(r) {
		wrap(&b, note, 100)
	}
	declineComparisonText(&b, r)
	sensitivityText(&b, r)

	b.WriteString("\nInputs\n")
	var in [][]string
	for _, x := range r.Inputs {
		in = append(in, []string{"  " + x.Key, x.Unit, x.Dist})
	}
	table(&b, in, "lll")
	for _, line := range correlationLines(r) {
		b.WriteString("  " + line + "\n")
	}

	b.WriteString("\nMethod\n")
	wrap(&b, methodText(r), 100)
	for _, wmsg := range r.Warnings {
		wrap(&b, "WARNING: "+wmsg, 100)
	}
	b.WriteString("\n")
	wrap(&b, "CAUTION: "+Caution, 100)
	_, err := io.WriteString(w, b.String())
	return err
}

// declineComparisonText writes the thermal power at each report year
// with both declines, when r has a comparison.
func declineComparisonText(b *strings.Builder, r *rockheat.Result) {
	outs, alt := declineOutputs(r), comparedDecline(r)
	if alt == nil {
		return
	}
	fmt.Fprintf(b, "\nThermal power, %s decline against %s, on the same draws (%s):\n", r.Decline, r.Comparison.Decline, outs[0].Spec.Unit)
	rows := [][]string{{"  year", "P90 " + r.Decline.String(), "P50", "P10", "P50 " + r.Comparison.Decline.String()}}
	for i, o := range outs {
		s := o.Summary
		rows = append(rows, []string{fmt.Sprintf("  %g", o.Spec.Year), fig(s.P90), fig(s.P50), fig(s.P10), fig(alt[i].Summary.P50)})
	}
	table(b, rows, "rrrrr")
}

// runNotes are the sentences that qualify a run's figures: zero-heat
// trials, the power-density cross-check, the percentile method, the
// stratification and the precision.
func runNotes(r *rockheat.Result) []string {
	notes := []string{zeroHeatNote(r)}
	if _, err := findOutput(r, "power_density"); err == nil {
		notes = append(notes, PowerDensityNote)
	}
	if r.Streaming {
		notes = append(notes, fmt.Sprintf("Percentiles come from a streaming quantile sketch, within %.2g%% (relative) of the exact order statistics.", 100*r.SketchRelErr))
	}
	if r.PerBatch {
		notes = append(notes, fmt.Sprintf("The Latin hypercube is stratified per batch of %d trials.", sampler.BatchSize))
	}
	if r.Precision > 0 {
		if r.Converged {
			notes = append(notes, fmt.Sprintf("Ran until every P90, P50 and P10 interval was within ±%.3g%%: %d trials.", 100*r.Precision, r.Trials))
		} else {
			notes = append(notes, fmt.Sprintf("Stopped at the trial cap (%d trials) before every interval was within ±%.3g%%.", r.Trials, 100*r.Precision))
		}
	}
	return notes
}

// PowerDensityNote sets a reservoir's implied power density beside those
// of producing fields.
const PowerDensityNote = "Implied power density: electric capacity per km² of reservoir area. Producing fields above 200 °C " +
	"have a median of 12.0 MWe/km² (mean 16.2, standard deviation 9.9; Wilmarth & Stimac 2014, 53 fields), rising by about " +
	"2 MWe/km² per 10 °C; a figure far outside that range deserves a second look at the area, recovery or conversion inputs."

// zeroHeatNote says how many trials held no heat, and why a trial can.
func zeroHeatNote(r *rockheat.Result) string {
	if r.Kind == heatmodel.KindPowerDensity {
		return "The power-density kind scales an area by analog fields; it holds no heat in place."
	}
	what := "reservoir temperature at or below the reference temperature"
	if r.Kind == heatmodel.KindHotRock {
		what = "no rock at or above the minimum useful temperature between the top and the maximum depth"
	}
	if r.ZeroHeatTrials > 0 {
		return fmt.Sprintf("%d of %d trials (%.2f%%) had %s; they hold no heat and count as zero.",
			r.ZeroHeatTrials, r.Trials, 100*float64(r.ZeroHeatTrials)/float64(r.Trials), what)
	}
	if r.Kind == heatmodel.KindHotRock {
		return "Every trial had rock at or above the minimum useful temperature between the top and the maximum depth."
	}
	return fmt.Sprintf("No trial had %s.", what)
}

// sensitivityText writes, for the headline outputs, the inputs that drive
// them most, with a bar for each one's share of the variance.
func sensitivityText(b *strings.Builder, r *rockheat.Result) {
	const top, barWidth = 6, 20
	for _, sec := range sensSections(r) {
		fmt.Fprintf(b, "\nWhat drives %s (Spearman rank correlation, share of variance, and %s with the input at its P90 → P10):\n", sec.Doc, sec.Unit)
		var rows [][]string
		for _, f := range sec.Rows[:min(top, len(sec.Rows))] {
			n := int(math.Round(f.Share * barWidth))
			bar := strings.Repeat("█", n) + strings.Repeat("·", barWidth-n)
			rows = append(rows, []string{"  " + f.Input, f.Rho, bar, fmt.Sprintf("%3.0f%%", 100*f.Share), f.Low + " → " + f.High})
		}
		table(b, rows, "lrlrl")
		if more := len(sec.Rows) - top; more > 0 {
			fmt.Fprintf(b, "  (%d more with smaller shares)\n", more)
		}
	}
	for _, note := range sensNotes(r) {
		b.WriteString(note + "\n")
	}
}

func modelLine(r *rockheat.Result) string {
	s := r.Kind.String()
	switch r.Kind {
	case heatmodel.KindReservoir:
		s = "reservoir (volumetric heat in place)"
	case heatmodel.KindHotRock:
		s = "hot-rock (conductive column, heat mined by circulated water)"
	}
	if r.Fluid == heatmodel.FluidIF97 {
		s += ", fluid properties from IAPWS-IF97"
	}
	if r.Conversion == heatmodel.ConversionExergy {
		s += ", electric capacity by the exergy route"
	}
	return s
}

// hasInput reports whether r has an input of the key.
func hasInput(r *rockheat.Result, key string) bool {
	for _, in := range r.Inputs {
		if in.Key == key {
			return true
		}
	}
	return false
}

func methodText(r *rockheat.Result) string {
	var fluid string
	if r.Fluid == heatmodel.FluidIF97 {
		fluid = " Fluid density and heat capacity: IAPWS-IF97 region 1 liquid at the sampled temperature and pressure" +
			" (saturated liquid where the pressure is below saturation)."
		if r.Kind == heatmodel.KindReservoir && !hasInput(r, "reservoir_pressure_mpa") && !hasInput(r, "depth_m") {
			fluid += " The pressure is hydrostatic at each trial's reservoir middle, top_depth_m + thickness_m/2."
		}
	}
	switch r.Kind {
	case heatmodel.KindReservoir:
		s := "Volumetric heat in place (Muffler & Cataldi 1978; USGS Circular 790): Q = A·h·[(1−φ)·ρr·cr + φ·ρf·cf]·(Tr − Tref); " +
			"recoverable heat Qr = R·Q; mean thermal power Qr/L; "
		if r.Conversion == heatmodel.ConversionExergy {
			s += "electric capacity by the exergy route Pe = ηu·W/(F·L), W = m·[(h − h0) − T0·(s − s0)], m = Qr/(h − h0), " +
				"with the wellhead fluid saturated liquid at Tr and the dead state liquid at Tref and 1 atm " +
				"(USGS Circular 790; Williams et al. 2008; IAPWS-IF97 properties), ηu utilization efficiency, "
		} else {
			s += "electric capacity η·Qr/(F·L), with η conversion efficiency, "
		}
		return s + "R recovery factor, F capacity factor and L plant life (years of 365.25 days)." + fluid
	case heatmodel.KindHotRock:
		s := "Conductive rock column T(z) = Ts + G·z (or piecewise layers). Useful heat above the minimum useful temperature " +
			"Tmin between z1, where the rock reaches Tmin (or the top depth if deeper), and the maximum depth z2: " +
			"E0 = A·ρr·cr·∫(T − Tmin)dz, = A·ρr·cr·G·(z2 − z1)²/2 for one gradient. "
		if r.Decline == heatmodel.DeclineFractures {
			s += "Water flows through parallel fractures of spacing S and flow path L across the area (Gringarten, " +
				"Witherspoon & Ohnishi 1975), the heat reaching them by conduction through rock of conductivity k; " +
				"the outlet cooling follows from its Laplace transform, inverted numerically, from the initial power " +
				"E0/τ = ρw·cw·V̇·(T̄ − Tmin); heat mined over the life L: the integral of P(t) over it; "
		} else {
			s += "A circulated water flow V̇ mines it exponentially (heat-mining model, Armstead & Tester 1987): " +
				"τ = ρr·cr·(z2 − z1)/((V̇/A)·ρw·cw), P(t) = (E0/τ)·e^(−t/τ); heat mined over the life L: E0·(1 − e^(−L/τ)); "
		}
		return s + "mean thermal power over the life = that / L; electric capacity = η·mean thermal power / F." + fluid
	}
	return ""
}

func samplingName(m sampler.Method) string {
	switch m {
	case sampler.LatinHypercube:
		return "Latin hypercube"
	case sampler.Random:
		return "plain Monte Carlo"
	}
	return m.String()
}

// fig formats a figure with four significant digits.
func fig(x float64) string {
	if x == 0 {
		return "0"
	}
	ax := math.Abs(x)
	if ax >= 1e6 || ax < 1e-3 {
		return fmt.Sprintf("%.3e", x)
	}
	d := 3 - int(math.Floor(math.Log10(ax)))
	if d < 0 {
		d = 0
	}
	return fmt.Sprintf("%.*f", d, x)
}

func ci(lo, hi float64) string { return "[" + fig(lo) + ", " + fig(hi) + "]" }

// table writes rows with columns padded, column i aligned left or right
// as align[i] is 'l' or 'r'.
func table(b *strings.Builder, rows [][]string, align string) {
	var width []int
	for _, r := range rows {
		for i, c := range r {
			if i >= len(width) {
				width = append(width, 0)
			}
			width[i] = max(width[i], len([]rune(c)))
		}
	}
	for _, r := range rows {
		var line strings.Builder
		for i, c := range r {
			pad := strings.Repeat(" ", width[i]-len([]rune(c)))
			sep := "  "
			if i == 0 {
				sep = ""
			}
			if align[i] == 'l' {
				line.WriteString(sep + c + pad)
			} else {
				line.WriteString(sep + pad + c)
			}
		}
		b.WriteString(strings.TrimRight(line.String(), " ") + "\n")
	}
}

// wrap writes text folded at width columns.
func wrap(b *strings.Builder, text string, width int) {
	n := 0
	for i, w := range strings.Fields(text) {
		l := len([]rune(w))
		if i > 0 && n+1+l > width {
			b.WriteString("\n")
			n = 0
		} else if i > 0 {
			b.WriteString(" ")
			n++
		}
		b.WriteString(w)
		n += l
	}
	b.WriteString("\n")
}
