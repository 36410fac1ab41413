package report

import (
	"bytes"
	"fmt"
	"html/template"
	"io"

	"rockheat"
)

// portfolioPage is what the portfolio HTML template shows.
type portfolioPage struct {
	Title, Run, Level    string
	Caution, Convention  string
	NonAdditive          string
	Prospects            []prospectRow
	Totals               []figureRow
	Chances              []string
	Links                []string
	Exceedance, Contrib  template.HTML
	ExceedNote, ContNote string
	Warnings             []string
	Prov                 provenance
}

type prospectRow struct {
	Name, Scenario, Chance, Factors, Share string
	P90, P50, P10, Mean, Risked            string
	HeatP50                                string
}

// PortfolioHTML writes a portfolio result as one self-contained HTML page:
// the caution first, each prospect's chance, share and unrisked figures,
// the unrisked and risked totals beside the sums of the prospects'
// percentiles, the chances of no success and of reaching the target, the
// charts (both totals' exceedance curves with the target; each prospect's
// contribution to the risked mean) and the reproducibility record. All
// text is HTML-escaped.
func PortfolioHTML(w io.Writer, r *rockheat.PortfolioResult) error {
	pg := newPortfolioPage(r)
	var b bytes.Buffer
	if err := portfolioTemplate.Execute(&b, pg); err != nil {
		return fmt.Errorf("rendering the portfolio HTML report: %w", err)
	}
	_, err := b.WriteTo(w)
	return err
}

func newPortfolioPage(r *rockheat.PortfolioResult) *portfolioPage {
	pg := &portfolioPage{Title: r.Title, Level: fmt.Sprintf("%.0f%%", 100*r.Confidence),
		Run:     fmt.Sprintf("%d prospects; %s", len(r.Prospects), trialsText(r.Trials, r.Sampling, r.Seed)),
		Caution: Caution, Convention: Convention, NonAdditive: NonAdditive, Links: portfolioLinks(r), Warnings: r.Warnings}
	var files []fileHash
	_, heatUnitName, heatScale := portfolioUnit(r, r.Unrisked[0])
	for _, p := range r.Prospects {
		s := p.Unrisked[rockheat.PortfolioPower].Summary
		row := prospectRow{Name: p.Name, Scenario: p.Path, Chance: pct(p.Chance), Share: pct(p.Share),
			P90: fig(s.P90), P50: fig(s.P50), P10: fig(s.P10), Mean: fig(s.Mean), Risked: fig(p.RiskedMean[rockheat.PortfolioPower]),
			HeatP50: fig(p.Unrisked[0].Summary.P50/heatScale) + " " + heatUnitName}
		for i, f := range p.Factors {
			if i > 0 {
				row.Factors += " × "
			}
			row.Factors += fmt.Sprintf("%s %s", f.Name, pct(f.Chance))
		}
		pg.Prospects = append(pg.Prospects, row)
		files = append(files, fileHash{Name: p.Name, Path: p.Path, SHA256: p.SourceSHA256})
	}
	pg.Totals = portfolioTotals(r)
	pg.Chances = append(pg.Chances, fmt.Sprintf("Chance that no prospect succeeds: %s %s; expected number of successes %.3g of %d.",
		pct(r.ChanceNone), ciPct(r.ChanceNoneCI), r.ExpectedSuccesses, len(r.Prospects)))
	if t := r.Target; t != nil {
		pg.Chances = append(pg.Chances, fmt.Sprintf("Chance that the risked total electric capacity reaches %g MWe: %s %s.", t.MWe, pct(t.Probability), ciPct(t.CI)))
	}
	untitled := *r
	untitled.Title = ""
	var err error
	if pg.Exceedance, err = inlineSVG("probability of exceeding: total electric capacity", func(w io.Writer) error { return PortfolioExceedanceSVG(w, &untitled) }); err != nil {
		pg.ExceedNote = "No exceedance chart: " + err.Error()
	}
	if pg.Contrib, err = inlineSVG("contributions to the risked mean electric capacity", func(w io.Writer) error { return PortfolioContributionSVG(w, &untitled) }); err != nil {
		pg.ContNote = "No contribution chart: " + err.Error()
	}
	pg.Prov = newProvenance(r.Seed, r.Trials, samplingName(r.Sampling), files)
	return pg
}

var portfolioTemplate = template.Must(template.New("portfolio").Parse(styleHTML + provenanceHTML + `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>{{.Title}} · rockheat portfolio</title>
{{template "style"}}
</head>
<body>
<main>
<h1>{{.Title}}</h1>
<p class="run">{{.Run}}</p>
<div class="caution"><strong>Caution.</strong> {{.Caution}}</div>
<h2>Prospects</h2>
<table>
<tr><th>prospect</th><th>scenario</th><th class="n">chance of success</th><th class="n">share</th><th class="n">MWe P90</th><th class="n">P50</th><th class="n">P10</th><th class="n">mean</th><th class="n">risked mean</th><th class="n">heat in place P50</th></tr>
{{range .Prospects}}<tr><td>{{.Name}}</td><td><code>{{.Scenario}}</code></td><td class="n">{{.Chance}}{{if .Factors}}<br><span class="note">{{.Factors}}</span>{{end}}</td><td class="n">{{.Share}}</td><td class="n">{{.P90}}</td><td class="n">{{.P50}}</td><td class="n">{{.P10}}</td><td class="n">{{.Mean}}</td><td class="n">{{.Risked}}</td><td class="n">{{.HeatP50}}</td></tr>
{{end}}</table>
<p class="note">Electric capacity in MWe, unrisked and gross (as if the prospect succeeds, before its share); the risked mean is net: chance × share × mean.</p>
<h2>Totals, net of shares</h2>
<table>
<tr><th></th><th class="n">P90 (low)</th><th class="n">P50 (best)</th><th class="n">P10 (high)</th><th class="n">mean</th><th>unit</th></tr>
{{range .Totals}}<tr class="fig"><td>{{.Doc}}</td><td class="n">{{.P90}}</td><td class="n">{{.P50}}</td><td class="n">{{.P10}}</td><td class="n">{{.Mean}}</td><td>{{.Unit}}</td></tr>
{{if .P90CI}}<tr class="ci"><td></td><td class="n">{{.P90CI}}</td><td class="n">{{.P50CI}}</td><td class="n">{{.P10CI}}</td><td></td><td></td></tr>{{end}}
{{end}}</table>
<p class="note">Ranges in brackets are {{.Level}} confidence intervals (order statistics; for chances, Clopper–Pearson).</p>
<p>{{.NonAdditive}}</p>
{{range .Chances}}<p>{{.}}</p>
{{end}}
<h2>Charts</h2>
{{if .Exceedance}}<figure>{{.Exceedance}}</figure>{{else}}<p class="note">{{.ExceedNote}}</p>{{end}}
{{if .Contrib}}<figure>{{.Contrib}}</figure>{{else}}<p class="note">{{.ContNote}}</p>{{end}}
{{if .Links}}<h2>Dependence</h2>
{{range .Links}}<p class="note">{{.}}</p>
{{end}}{{end}}
<p class="convention">{{.Convention}}</p>
{{if .Warnings}}<h2>Warnings</h2>
{{range .Warnings}}<p class="warning">{{.}}</p>
{{end}}{{end}}
{{template "provenance" .Prov}}
</main>
</body>
</html>
`))
