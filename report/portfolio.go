package report

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"strings"

	"rockheat"
	"rockheat/stats"
)

// NonAdditive is the sentence that explains why a portfolio's percentiles
// are not the sums of its prospects'.
const NonAdditive = "Percentiles do not add: the portfolio's P90 is exceeded in 90% of trials of the total, " +
	"whereas the sum of the prospects' P90s supposes every prospect at its low case in the same trial, " +
	"which is rarer, so the sum of P90s usually lies below the portfolio's P90 (and the sum of P10s above its P10) " +
	"unless the prospects move fully together; means do add " +
	"(the SPE/AAPG/WPC/SPEE Petroleum Resources Management System warns against adding percentiles)."

// headlineIndex are the indices, in rockheat.PortfolioOutputs, of the
// outputs a portfolio report shows: heat in place and electric capacity.
var headlineIndex = []int{rockheat.PortfolioHeat, rockheat.PortfolioPower}

// portfolioTotals formats the totals of the headline outputs, unrisked
// and risked, each followed by the sums of the prospects' P90s and P10s:
// built once here so that the text and the HTML page agree.
func portfolioTotals(r *rockheat.PortfolioResult) []figureRow {
	var rows []figureRow
	for _, o := range headlineIndex {
		for _, t := range []struct {
			name string
			outs []rockheat.Output
		}{{"unrisked", r.Unrisked}, {"risked", r.Risked}} {
			out := t.outs[o]
			unit, _, scale := portfolioUnit(r, out)
			s := out.Summary
			rows = append(rows, figureRow{Doc: out.Spec.Doc + ", " + t.name, Unit: unit,
				P90: fig(s.P90 / scale), P50: fig(s.P50 / scale), P10: fig(s.P10 / scale), Mean: fig(s.Mean / scale),
				P90CI: ciText(s.P90CI, scale), P50CI: ciText(s.P50CI, scale), P10CI: ciText(s.P10CI, scale)})
		}
		unit, _, scale := portfolioUnit(r, r.Unrisked[o])
		rows = append(rows, figureRow{Doc: "sum of the prospects' P90 and P10", Unit: unit,
			P90: fig(r.SumP90[o] / scale), P10: fig(r.SumP10[o] / scale)})
	}
	return rows
}

// PortfolioText writes a portfolio result as a summary for people.
func PortfolioText(w io.Writer, r *rockheat.PortfolioResult) error {
	var b strings.Builder
	fmt.Fprintf(&b, "%s\n%s\n", r.Title, strings.Repeat("=", len([]rune(r.Title))))
	fmt.Fprintf(&b, "Portfolio of %d prospects; %s\n\n", len(r.Prospects), trialsText(r.Trials, r.Sampling, r.Seed))
	rows := [][]string{{"prospect", "chance", "share", "MWe P90", "P50", "P10", "mean", "risked mean"}}
	for _, p := range r.Prospects {
		s := p.Unrisked[rockheat.PortfolioPower].Summary
		rows = append(rows, []string{"  " + p.Name, pct(p.Chance), pct(p.Share), fig(s.P90), fig(s.P50), fig(s.P10), fig(s.Mean), fig(p.RiskedMean[rockheat.PortfolioPower])})
	}
	b.WriteString("Prospects (unrisked electric capacity, gross; risked mean net of share):\n")
	table(&b, rows, "lrrrrrrr")
	b.WriteString("\nTotals, net of shares:\n")
	rows = [][]string{{"", "P90 (low)", "P50 (best)", "P10 (high)", "mean", "unit"}}
	for _, f := range portfolioTotals(r) {
		rows = append(rows, []string{"  " + f.Doc, f.P90, f.P50, f.P10, f.Mean, f.Unit})
		if f.P90CI != "" {
			rows = append(rows, []string{"", f.P90CI, f.P50CI, f.P10CI, "", ""})
		}
	}
	table(&b, rows, "lrrrrl")
	b.WriteString("\n")
	wrap(&b, NonAdditive, 100)
	fmt.Fprintf(&b, "\nChance that no prospect succeeds: %s %s; expected number of successes: %.3g of %d.\n",
		pct(r.ChanceNone), ciPct(r.ChanceNoneCI), r.ExpectedSuccesses, len(r.Prospects))
	if t := r.Target; t != nil {
		fmt.Fprintf(&b, "Chance that the risked total reaches %g MWe: %s %s.\n", t.MWe, pct(t.Probability), ciPct(t.CI))
	}
	fmt.Fprintf(&b, "Brackets: %.0f%% confidence intervals (percentiles: order statistics; chances: Clopper–Pearson).\n", 100*r.Confidence)
	for _, line := range portfolioLinks(r) {
		b.WriteString(line + "\n")
	}
	b.WriteString("\n")
	wrap(&b, Convention, 100)
	for _, w := range r.Warnings {
		wrap(&b, "WARNING: "+w, 100)
	}
	b.WriteString("\n")
	wrap(&b, "CAUTION: "+Caution, 100)
	_, err := io.WriteString(w, b.String())
	return err
}

// portfolioUnit is the unit of a portfolio's output: one heat unit for the
// whole report, chosen from the unrisked totals.
func portfolioUnit(r *rockheat.PortfolioResult, o rockheat.Output) (long, short string, scale float64) {
	return outputUnit(&rockheat.Result{Outputs: r.Unrisked}, o)
}

// portfolioLinks describes the shared inputs and correlations.
func portfolioLinks(r *rockheat.PortfolioResult) []string {
	var lines []string
	for _, s := range r.Shared {
		who := "every prospect that has it"
		if len(s.Prospects) > 0 {
			who = strings.Join(s.Prospects, ", ")
		}
		lines = append(lines, fmt.Sprintf("Shared input %s: one draw per trial for %s.", s.Input, who))
	}
	for _, c := range r.Correlations {
		lines = append(lines, fmt.Sprintf("Outcome rank correlation %+.2f between %s and %s (Iman–Conover on electric capacity).", c.Rank, c.Prospects[0], c.Prospects[1]))
	}
	for _, c := range r.SuccessCorrelations {
		lines = append(lines, fmt.Sprintf("Success rank correlation %+.2f between %s and %s.", c.Rank, c.Prospects[0], c.Prospects[1]))
	}
	return lines
}

func pct(x float64) string { return fmt.Sprintf("%.1f%%", 100*x) }

// ciPct formats a confidence interval of a probability in percent.
func ciPct(iv stats.Interval) string { return "[" + pct(iv.Lo) + ", " + pct(iv.Hi) + "]" }

// jsonProspect is one prospect in the portfolio JSON contract.
type jsonProspect struct {
	Name       string             `json:"name"`
	Title      string             `json:"title"`
	Scenario   string             `json:"scenario"`
	SHA256     string             `json:"scenario_sha256"`
	Chance     float64            `json:"chance_of_success"`
	Factors    map[string]float64 `json:"chance_factors,omitempty"`
	Share      float64            `json:"share"`
	Unrisked   object             `json:"unrisked"`
	RiskedMean object             `json:"risked_mean"`
	ZeroHeat   int                `json:"zero_heat_trials"`
}

type jsonTarget struct {
	MWe         float64    `json:"mwe"`
	Probability float64    `json:"probability"`
	CI          [2]float64 `json:"ci"`
}

type jsonPortfolio struct {
	Title     string         `json:"title"`
	Trials    int            `json:"trials"`
	Seed      uint64         `json:"seed"`
	Sampling  string         `json:"sampling"`
	Prospects []jsonProspect `json:"prospects"`
	Total     struct {
		Unrisked object `json:"unrisked"`
		Risked   object `json:"risked"`
	} `json:"total"`
	SumP90            object      `json:"sum_of_prospect_p90"`
	SumP10            object      `json:"sum_of_prospect_p10"`
	ChanceNone        float64     `json:"chance_none_succeed"`
	ChanceNoneCI      [2]float64  `json:"chance_none_succeed_ci"`
	ExpectedSuccesses float64     `json:"expected_successes"`
	Target            *jsonTarget `json:"target,omitempty"`
	ConfidenceLevel   float64     `json:"confidence_level"`
	Percentiles       string      `json:"percentiles"`
	SketchRelErr      float64     `json:"sketch_relative_error"`
	NonAdditive       string      `json:"non_additive"`
	Convention        string      `json:"convention"`
	Warnings          []string    `json:"warnings"`
	Caution           string      `json:"caution"`
}

// numbers returns an object of one number per portfolio output.
func numbers(outs []rockheat.Output, v []float64) object {
	var o object
	for i, out := range outs {
		o.keys = append(o.keys, out.Spec.Name)
		o.values = append(o.values, v[i])
	}
	return o
}

// PortfolioJSON writes a portfolio result in its JSON contract: title,
// trials, seed, prospects (name, chance_of_success, share, unrisked
// figures per output in the shape of run's outputs, risked_mean per
// output), total (unrisked, risked), sum_of_prospect_p90 and _p10,
// chance_none_succeed, expected_successes and target (mwe, probability,
// ci), with the conventions, warnings and caution.
func PortfolioJSON(w io.Writer, r *rockheat.PortfolioResult) error {
	level := r.Confidence
	jp := jsonPortfolio{Title: r.Title, Trials: r.Trials, Seed: r.Seed, Sampling: r.Sampling.String(),
		SumP90: numbers(r.Unrisked, r.SumP90), SumP10: numbers(r.Unrisked, r.SumP10),
		ChanceNone: r.ChanceNone, ChanceNoneCI: [2]float64{r.ChanceNoneCI.Lo, r.ChanceNoneCI.Hi},
		ExpectedSuccesses: r.ExpectedSuccesses, ConfidenceLevel: level, Percentiles: "sketch",
		SketchRelErr: r.SketchRelErr, NonAdditive: NonAdditive, Convention: Convention,
		Warnings: append([]string{}, r.Warnings...), Caution: Caution}
	jp.Total.Unrisked, jp.Total.Risked = outputsObject(r.Unrisked, level), outputsObject(r.Risked, level)
	for _, p := range r.Prospects {
		j := jsonProspect{Name: p.Name, Title: p.Title, Scenario: p.Path, SHA256: p.SourceSHA256, Chance: p.Chance,
			Share: p.Share, Unrisked: outputsObject(p.Unrisked, level), RiskedMean: numbers(p.Unrisked, p.RiskedMean),
			ZeroHeat: p.ZeroHeatTrials}
		if len(p.Factors) > 0 {
			j.Factors = map[string]float64{}
			for _, f := range p.Factors {
				j.Factors[f.Name] = f.Chance
			}
		}
		jp.Prospects = append(jp.Prospects, j)
	}
	if t := r.Target; t != nil {
		jp.Target = &jsonTarget{MWe: t.MWe, Probability: t.Probability, CI: [2]float64{t.CI.Lo, t.CI.Hi}}
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(jp)
}

// PortfolioCSV writes a portfolio result as a flat table: one row per
// prospect and output (unrisked, gross, with its risked mean), then the
// unrisked and risked totals, with the sums of the prospects' P90s and
// P10s on the total rows.
func PortfolioCSV(w io.Writer, r *rockheat.PortfolioResult) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"row", "output", "unit", "chance_of_success", "share", "p90", "p50", "p10", "mean", "sd",
		"risked_mean", "sum_of_prospect_p90", "sum_of_prospect_p10"})
	for _, p := range r.Prospects {
		for o, out := range p.Unrisked {
			s := out.Summary
			cw.Write([]string{p.Name, out.Spec.Name, out.Spec.Unit, num(p.Chance), num(p.Share), num(s.P90), num(s.P50), num(s.P10),
				num(s.Mean), num(finiteOr0(s.SD)), num(p.RiskedMean[o]), "", ""})
		}
	}
	for _, t := range []struct {
		name string
		outs []rockheat.Output
	}{{"total_unrisked", r.Unrisked}, {"total_risked", r.Risked}} {
		for o, out := range t.outs {
			s := out.Summary
			row := []string{t.name, out.Spec.Name, out.Spec.Unit, "", "", num(s.P90), num(s.P50), num(s.P10), num(s.Mean), num(finiteOr0(s.SD)), "", "", ""}
			if t.name == "total_unrisked" {
				row[11], row[12] = num(r.SumP90[o]), num(r.SumP10[o])
			}
			cw.Write(row)
		}
	}
	cw.Flush()
	return cw.Error()
}
